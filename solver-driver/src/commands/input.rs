//! Reading a file argument of the binary, where `-` names standard input.

use std::path::Path;

use anyhow::{Context, Result};

/// The bytes of `path`, or of standard input for `-`.
pub fn read_file_or_stdin(path: &Path) -> Result<Vec<u8>> {
    if path.as_os_str() == "-" {
        let mut bytes = Vec::new();
        std::io::Read::read_to_end(&mut std::io::stdin(), &mut bytes)
            .context("reading standard input")?;
        return Ok(bytes);
    }
    std::fs::read(path).with_context(|| format!("reading {}", path.display()))
}
