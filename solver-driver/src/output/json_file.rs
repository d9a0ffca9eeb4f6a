//! JSON files (manifests, plans, shard results, summaries): pretty-printed with a
//! final newline, and written atomically (a temporary name, then a rename), so a
//! reader never sees half a file.

use std::io;
use std::path::Path;

use serde::Serialize;

use ramsift_encoder::atomic_file::write_atomically;

/// Writes `value` as pretty JSON to `path`, atomically.
pub fn write_json(path: &Path, value: &impl Serialize) -> io::Result<()> {
    let json = serde_json::to_string_pretty(value).map_err(io::Error::other)?;
    write_atomically(path, |w| {
        w.write_all(json.as_bytes())
            .and_then(|_| w.write_all(b"\n"))
    })
}
