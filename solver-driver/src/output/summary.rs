//! The summary file of a `find` run (summary.json in its output directory): the
//! same record `--json` prints, written atomically.

use std::io;
use std::path::{Path, PathBuf};

use ramsift_encoder::atomic_file::ensure_dir;

use super::json_file::write_json;

use super::records::FindSummary;

/// The name of the summary file in an output directory.
pub const SUMMARY_FILE: &str = "summary.json";

/// Writes the summary JSON into `dir`.
pub fn write_summary(dir: &Path, summary: &FindSummary) -> io::Result<PathBuf> {
    ensure_dir(dir)?;
    let path = dir.join(SUMMARY_FILE);
    write_json(&path, summary)?;
    Ok(path)
}
