//! Writing output files so that a reader never sees half of one: the content goes to
//! a temporary file in the same directory, is flushed to disk, and is then renamed
//! over the final name. If writing fails, the temporary file is removed. Work that
//! streams an output while it runs (a proof trace) uses the two halves directly:
//! [`temporary_in`], then [`persist_finished`] once the work succeeded.

use std::fs;
use std::io::{self, BufWriter, Write};
use std::path::Path;

use flate2::write::GzEncoder;
use flate2::Compression;

/// Writes `path` atomically; `fill` produces the content. A name ending in `.gz`
/// is gzip-compressed on the way.
pub fn write_atomically<T>(
    path: &Path,
    fill: impl FnOnce(&mut dyn Write) -> io::Result<T>,
) -> io::Result<T> {
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    let file_name = path.file_name().ok_or_else(|| {
        io::Error::new(io::ErrorKind::InvalidInput, "output path has no file name")
    })?;
    let mut prefix = std::ffi::OsString::from(".");
    prefix.push(file_name);
    prefix.push(".");
    let temp = temporary_in(dir, &prefix)?;
    let gzip = path.extension().is_some_and(|e| e == "gz");
    let mut buffered = BufWriter::with_capacity(1 << 20, temp.as_file());
    let value = if gzip {
        let mut encoder = GzEncoder::new(&mut buffered, Compression::default());
        let value = fill(&mut encoder)?;
        encoder.finish()?;
        value
    } else {
        fill(&mut buffered)?
    };
    buffered.flush()?;
    drop(buffered);
    persist_finished(temp, path)?;
    Ok(value)
}

/// A temporary file `{prefix}<random>.tmp` in `dir` (give a prefix starting with `.`
/// to keep it hidden), removed if dropped before [`persist_finished`].
pub fn temporary_in(
    dir: &Path,
    prefix: impl AsRef<std::ffi::OsStr>,
) -> io::Result<tempfile::NamedTempFile> {
    tempfile::Builder::new()
        .prefix(&prefix)
        .suffix(".tmp")
        .tempfile_in(dir)
}

/// Puts a finished temporary file (every write to it flushed) in place as an
/// ordinary file: readable by all (temporary files are created 0600), synced to
/// disk, renamed to `path`.
pub fn persist_finished(temp: tempfile::NamedTempFile, path: &Path) -> io::Result<()> {
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        temp.as_file()
            .set_permissions(fs::Permissions::from_mode(0o644))?;
    }
    temp.as_file().sync_all()?;
    temp.persist(path).map(|_| ()).map_err(|e| e.error)
}

/// Creates a directory (and its parents) for output, with a clear error.
pub fn ensure_dir(dir: &Path) -> io::Result<()> {
    fs::create_dir_all(dir)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::io::Read;

    #[test]
    fn failed_write_leaves_nothing_behind() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("out.cnf");
        let result: io::Result<()> = write_atomically(&path, |w| {
            w.write_all(b"partial")?;
            Err(io::Error::other("disk full"))
        });
        assert!(result.is_err());
        assert_eq!(fs::read_dir(dir.path()).unwrap().count(), 0);
    }

    #[test]
    fn gz_names_are_compressed() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("out.cnf.gz");
        write_atomically(&path, |w| w.write_all(b"p cnf 1 1\n1 0\n")).unwrap();
        let mut text = String::new();
        flate2::read::GzDecoder::new(fs::File::open(&path).unwrap())
            .read_to_string(&mut text)
            .unwrap();
        assert_eq!(text, "p cnf 1 1\n1 0\n");
    }
}
