//! Reading input files as a referee must assume they were crafted by someone else:
//! only regular files are read (a device, FIFO, socket or directory is refused by
//! its type, so nothing blocks or streams forever), and gzip (magic bytes 1f 8b,
//! RFC 1952) is decompressed transparently but never beyond a bounded multiple of
//! the compressed size, so a small file cannot expand into all of memory.

use std::io::Read;
use std::path::Path;

use crate::input_error::InputError;

/// Decompressed data may be at most this many times the compressed size…
pub const MAX_GZIP_RATIO: u64 = 200;
/// …plus this much, so that small, highly regular files still decompress.
pub const GZIP_ALLOWANCE: u64 = 64 << 20;

/// Refuses anything that is not a regular file (symlinks are followed first).
pub fn require_regular_file(path: &Path) -> Result<std::fs::Metadata, InputError> {
    let name = path.display().to_string();
    let meta = std::fs::metadata(path).map_err(|e| InputError::whole(&name, format!("cannot read: {e}")))?;
    if meta.is_file() {
        return Ok(meta);
    }
    let kind = if meta.is_dir() { "a directory" } else { "a device, FIFO or socket" };
    Err(InputError::whole(&name, format!("is {kind}: only regular files are read (give - for standard input)")))
}

/// Reads a regular file, decompressing it if it is gzip.
pub fn read_input(path: &Path) -> Result<Vec<u8>, InputError> {
    let name = path.display().to_string();
    require_regular_file(path)?;
    let raw = std::fs::read(path).map_err(|e| InputError::whole(&name, format!("cannot read: {e}")))?;
    expand_gzip(&name, raw)
}

/// `raw` itself, or its gzip decompression, never beyond the bounded multiple.
pub fn expand_gzip(name: &str, raw: Vec<u8>) -> Result<Vec<u8>, InputError> {
    if !raw.starts_with(&[0x1f, 0x8b]) {
        return Ok(raw);
    }
    let limit = raw.len() as u64 * MAX_GZIP_RATIO + GZIP_ALLOWANCE;
    // The trailer's size field (RFC 1952, ISIZE: the last member's size mod 2^32)
    // sizes the buffer for an honest file; a false one costs at most growth as usual.
    let stated = raw.len().checked_sub(4).map_or(0, |at| u32::from_le_bytes(raw[at..].try_into().unwrap_or([0; 4])));
    let mut out = Vec::with_capacity((stated as u64).min(limit) as usize);
    let decoded = flate2::read::MultiGzDecoder::new(&raw[..]).take(limit + 1).read_to_end(&mut out);
    decoded.map_err(|e| InputError::whole(name, format!("gzip data is damaged: {e}")))?;
    if out.len() as u64 > limit {
        let why = format!("gzip data expands beyond {limit} bytes ({MAX_GZIP_RATIO}x its size plus 64 MiB): refused");
        return Err(InputError::whole(name, why));
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::io::Write;

    /// gzip of `size` zero bytes whose header carries a comment of `pad` bytes
    /// (RFC 1952 FCOMMENT): the padding sets the compressed size.
    fn zeros(size: usize, pad: usize) -> Vec<u8> {
        let builder = flate2::GzBuilder::new().comment(vec![b'x'; pad]);
        let mut encoder = builder.write(Vec::new(), flate2::Compression::best());
        encoder.write_all(&vec![0u8; size]).unwrap();
        encoder.finish().unwrap()
    }

    /// `size` zeros compressed into exactly `compressed` bytes.
    fn zeros_in(size: usize, compressed: usize) -> Vec<u8> {
        let bare = zeros(size, 0).len();
        let padded = zeros(size, compressed - bare);
        assert_eq!(padded.len(), compressed);
        padded
    }

    #[test]
    fn gzip_expands_up_to_its_limit_and_not_a_byte_more() {
        let compressed = 100_000;
        let limit = compressed as u64 * MAX_GZIP_RATIO + GZIP_ALLOWANCE;
        let at_limit = expand_gzip("z", zeros_in(limit as usize, compressed)).unwrap();
        assert_eq!(at_limit.len() as u64, limit);
        let over = expand_gzip("z", zeros_in(limit as usize + 1, compressed)).unwrap_err();
        assert!(over.to_string().contains("expands beyond 87108864 bytes"), "{over}");
    }
}
