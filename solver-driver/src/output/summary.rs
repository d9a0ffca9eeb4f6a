//! The summary file of a `find` run (summary.json in its output directory): the
//! same record `--json` prints, written atomically.

use std::io;
use std::path::{Path, PathBuf};

use ramsift_encoder::atomic_file::{ensure_dir, write_atomically};

use super::records::FindSummary;

/// The name of the summary file in an output directory.
pub const SUMMARY_FILE: &str = "summary.json";

/// Writes the summary JSON into `dir`.
pub fn write_summary(dir: &Path, summary: &FindSummary) -> io::Result<PathBuf> {
    ensure_dir(dir)?;
    let path = dir.join(SUMMARY_FILE);
    let json = serde_json::to_string_pretty(summary).map_err(io::Error::other)?;
    write_atomically(&path, |w| {
        w.write_all(json.as_bytes())
            .and_then(|_| w.write_all(b"\n"))
    })?;
    Ok(path)
}
