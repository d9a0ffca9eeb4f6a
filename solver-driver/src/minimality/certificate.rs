//! The file of minimality clauses (`minimality.txt` in a bundle): each clause the
//! search added, with the relabelling that justifies it, one per line.
//!
//! ```text
//! ramsift minimality clauses 1
//! vertices 23 colours 2 order edge-index,colour-ascending
//! 1 0 2 3 … 22 / 1 2 / -1 3 -7 0
//! ```
//!
//! A clause line is the vertex map (position i holds vertex `p[i]`, n numbers),
//! the colour map (colour c becomes `s[c]`, r numbers) and the clause in DIMACS
//! literals ending with 0. The order names how matrices are compared: edge {i,j}
//! (i<j) at index j(j-1)/2+i, earlier edges first, colour 1 smallest.

use std::io::{self, Write};

use crate::minimality::search::Witness;

/// The first line of the file.
pub const CERTIFICATE_FORMAT: &str = "ramsift minimality clauses 1";
/// The comparison order, as the file header and the manifest name it.
pub const MATRIX_ORDER: &str = "edge-index,colour-ascending";
/// The file's name inside a bundle.
pub const CERTIFICATE_FILE: &str = "minimality.txt";

/// Writes the file line by line.
pub struct CertificateWriter<W: Write> {
    out: W,
}

impl<W: Write> CertificateWriter<W> {
    pub fn new(mut out: W, order: usize, colours: usize) -> io::Result<Self> {
        let header = format!(
            "{CERTIFICATE_FORMAT}\nvertices {order} colours {colours} order {MATRIX_ORDER}\n"
        );
        out.write_all(header.as_bytes())?;
        Ok(CertificateWriter { out })
    }

    pub fn write(&mut self, witness: &Witness, clause: &[i32]) -> io::Result<()> {
        let mut line = String::with_capacity(8 * (witness.vertices.len() + clause.len()));
        for v in &witness.vertices {
            line.push_str(&v.to_string());
            line.push(' ');
        }
        line.push('/');
        for c in &witness.colours[1..] {
            line.push(' ');
            line.push_str(&c.to_string());
        }
        line.push_str(" /");
        for l in clause {
            line.push(' ');
            line.push_str(&l.to_string());
        }
        line.push_str(" 0\n");
        self.out.write_all(line.as_bytes())
    }

    pub fn finish(mut self) -> io::Result<W> {
        self.out.flush()?;
        Ok(self.out)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lines_follow_the_documented_layout() {
        let mut writer = CertificateWriter::new(Vec::new(), 3, 2).unwrap();
        let witness = Witness {
            vertices: vec![1, 0, 2],
            colours: vec![0, 1, 2],
            edges: vec![0, 1],
        };
        writer.write(&witness, &[-1, 2]).unwrap();
        let text = String::from_utf8(writer.finish().unwrap()).unwrap();
        assert_eq!(
            text,
            "ramsift minimality clauses 1\nvertices 3 colours 2 order edge-index,colour-ascending\n1 0 2 / 1 2 / -1 2 0\n"
        );
    }
}
