//! Binary DRAT output (the format of the SAT competitions' proof checkers): an
//! addition is the byte `a`, each literal as the variable-length encoding of
//! 2·v (positive) or 2·v + 1 (negative), seven bits a byte with the high bit
//! set on all but the last, and a closing 0.

use std::io::{self, Write};

/// Writes the addition of `literals` (DIMACS numbering).
pub fn write_addition(out: &mut dyn Write, literals: &[i32]) -> io::Result<()> {
    let mut bytes = vec![b'a'];
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
    }
}
