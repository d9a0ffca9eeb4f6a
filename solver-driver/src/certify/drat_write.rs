//! Binary DRAT output (the format of the SAT competitions' proof checkers): an
//! addition is the byte `a`, each literal as the variable-length encoding of
//! 2·v (positive) or 2·v + 1 (negative), seven bits a byte with the high bit
//! set on all but the last, and a closing 0; a deletion is the same after `d`.
//! [`DratSink`] takes the hooked solver's steps in this format or as text.

use std::io::{self, Write};
use std::sync::atomic::{AtomicU64, Ordering};

use ramsift_cdcl::ProofSink;

/// Writes the addition of `literals` (DIMACS numbering).
pub fn write_addition(out: &mut dyn Write, literals: &[i32]) -> io::Result<()> {
    write_step(out, b'a', literals)
}

/// Writes the deletion of `literals` (DIMACS numbering).
pub fn write_deletion(out: &mut dyn Write, literals: &[i32]) -> io::Result<()> {
    write_step(out, b'd', literals)
}

fn write_step(out: &mut dyn Write, tag: u8, literals: &[i32]) -> io::Result<()> {
    let mut bytes = vec![tag];
    for &l in literals {
        let mut u = 2 * l.unsigned_abs() as u64 + u64::from(l < 0);
        loop {
            let low = (u & 0x7f) as u8;
            u >>= 7;
            if u == 0 {
                bytes.push(low);
                break;
            }
            bytes.push(low | 0x80);
        }
    }
    bytes.push(0);
    out.write_all(&bytes)
}

/// A proof sink writing DRAT (binary, or text when `text`), counting bytes in
/// `bytes_seen` for progress, and keeping the first write error.
pub struct DratSink<'a, W: Write> {
    pub out: W,
    pub text: bool,
    pub bytes_seen: Option<&'a AtomicU64>,
    pub bytes: u64,
    pub error: Option<io::Error>,
}

impl<'a, W: Write> DratSink<'a, W> {
    pub fn new(out: W, text: bool, bytes_seen: Option<&'a AtomicU64>) -> Self {
        DratSink {
            out,
            text,
            bytes_seen,
            bytes: 0,
            error: None,
        }
    }

    fn step(&mut self, tag: u8, clause: &[i32]) {
        if self.error.is_some() {
            return;
        }
        let mut bytes = Vec::new();
        let written = if self.text {
            if tag == b'd' {
                bytes.extend_from_slice(b"d ");
            }
            for l in clause {
                bytes.extend_from_slice(l.to_string().as_bytes());
                bytes.push(b' ');
            }
            bytes.extend_from_slice(b"0\n");
            Ok(())
        } else {
            write_step(&mut bytes, tag, clause)
        };
        match written.and_then(|()| self.out.write_all(&bytes)) {
            Ok(()) => {
                self.bytes += bytes.len() as u64;
                if let Some(seen) = self.bytes_seen {
                    seen.fetch_add(bytes.len() as u64, Ordering::Relaxed);
                }
            }
            Err(e) => self.error = Some(e),
        }
    }

    /// Flushes; returns the first error met.
    pub fn finish(mut self) -> io::Result<u64> {
        if let Some(e) = self.error.take() {
            return Err(e);
        }
        self.out.flush()?;
        Ok(self.bytes)
    }
}

impl<W: Write> ProofSink for DratSink<'_, W> {
    fn add(&mut self, clause: &[i32]) {
        self.step(b'a', clause);
    }
    fn delete(&mut self, clause: &[i32]) {
        self.step(b'd', clause);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn additions_follow_the_binary_drat_encoding() {
        // Binary DRAT as the SAT Competition's proof format defines it (common
        // practice): the lemma 1 -2 3 is 0x61, then 2, 5, 6, then 0; literal 64
        // maps to 128, which needs two bytes, 0x80 0x01.
        let mut out = Vec::new();
        write_addition(&mut out, &[1, -2, 3]).unwrap();
        assert_eq!(out, vec![0x61, 2, 5, 6, 0]);
        out.clear();
        write_addition(&mut out, &[64]).unwrap();
        assert_eq!(out, vec![0x61, 0x80, 0x01, 0]);
        out.clear();
        write_deletion(&mut out, &[-1]).unwrap();
        assert_eq!(out, vec![0x64, 3, 0]);
    }

    #[test]
    fn the_sink_writes_text_drat_and_counts_bytes() {
        let mut sink = DratSink::new(Vec::new(), true, None);
        sink.add(&[1, -2]);
        sink.delete(&[1, -2]);
        sink.add(&[]);
        assert_eq!(sink.bytes, 18);
        assert_eq!(sink.out, b"1 -2 0\nd 1 -2 0\n0\n");
    }
}
