//! Output directories: every command that writes a directory of results starts
//! from an empty one, so results of different runs are never mixed. A directory
//! that already holds anything is refused, unless `--force`, which clears it
//! first (never the working directory or one of its ancestors).

use std::io;
use std::path::{Path, PathBuf};

use thiserror::Error;

#[derive(Debug, Error)]
pub enum OutputDirError {
    #[error("{dir} already holds files (for example {example}); choose a new directory, or pass --force to clear it first")]
    NotEmpty { dir: PathBuf, example: String },
    #[error("{dir} exists and is not a directory")]
    NotADirectory { dir: PathBuf },
    #[error(
        "--force would clear {dir}, which holds the working directory; choose another directory"
    )]
    HoldsWorkingDirectory { dir: PathBuf },
    #[error("preparing {dir}: {source}")]
    Io {
        dir: PathBuf,
        #[source]
        source: io::Error,
    },
}

/// Makes `dir` an empty directory: created if missing, refused if it holds
/// anything (cleared first with `force`).
pub fn prepare(dir: &Path, force: bool) -> Result<(), OutputDirError> {
    let io_error = |source| OutputDirError::Io {
        dir: dir.to_path_buf(),
        source,
    };
    if !dir.exists() {
        return std::fs::create_dir_all(dir).map_err(io_error);
    }
    if !dir.is_dir() {
        return Err(OutputDirError::NotADirectory {
            dir: dir.to_path_buf(),
        });
    }
    let first = std::fs::read_dir(dir)
        .map_err(io_error)?
        .next()
        .transpose()
        .map_err(io_error)?;
    let Some(entry) = first else { return Ok(()) };
    if !force {
        let example = entry.file_name().to_string_lossy().into_owned();
        return Err(OutputDirError::NotEmpty {
            dir: dir.to_path_buf(),
            example,
        });
    }
    let canonical = dir.canonicalize().map_err(io_error)?;
    if std::env::current_dir().is_ok_and(|cwd| cwd.starts_with(&canonical)) {
        return Err(OutputDirError::HoldsWorkingDirectory {
            dir: dir.to_path_buf(),
        });
    }
    std::fs::remove_dir_all(dir).map_err(io_error)?;
    std::fs::create_dir_all(dir).map_err(io_error)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fresh_empty_used_and_forced_directories() {
        let base = tempfile::tempdir().unwrap();
        let dir = base.path().join("out");
        prepare(&dir, false).unwrap();
        prepare(&dir, false).unwrap();
        std::fs::write(dir.join("old.txt"), "stale").unwrap();
        let refused = prepare(&dir, false).unwrap_err().to_string();
        assert!(
            refused.contains("old.txt") && refused.contains("--force"),
            "{refused}"
        );
        prepare(&dir, true).unwrap();
        assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 0);
        let file = base.path().join("file");
        std::fs::write(&file, "x").unwrap();
        assert!(matches!(
            prepare(&file, true),
            Err(OutputDirError::NotADirectory { .. })
        ));
    }
}
