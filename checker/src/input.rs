//! Reading input files: whole-file reads with transparent gzip decompression
//! (detected by the gzip magic bytes 1f 8b, RFC 1952), so every reader sees plain bytes.

use std::io::Read;
use std::path::Path;

use crate::input_error::InputError;

/// Reads a file, decompressing it if it is gzip.
pub fn read_input(path: &Path) -> Result<Vec<u8>, InputError> {
    let name = path.display().to_string();
    let raw =
        std::fs::read(path).map_err(|e| InputError::whole(&name, format!("cannot read: {e}")))?;
    if raw.starts_with(&[0x1f, 0x8b]) {
        let mut out = Vec::new();
        flate2::read::MultiGzDecoder::new(&raw[..])
            .read_to_end(&mut out)
            .map_err(|e| InputError::whole(&name, format!("gzip data is damaged: {e}")))?;
        Ok(out)
    } else {
        Ok(raw)
    }
}
