//! DIMACS CNF output (SAT Competition format): `c` comment lines, the problem line
//! `p cnf V C`, then one clause per line as signed integers ending in 0.
//!
//! The comment header makes each file self-describing: the tool version, the
//! specification and order, the variable map and the symmetry breaking applied,
//! so that any external solver's model can be decoded and any reader can tell
//! exactly which question the file asks.

use std::io::{self, Write};
use std::path::Path;

use crate::atomic_file::write_atomically;
use crate::clauses::RamseyEncoding;
use crate::spec::Forbidden;
use crate::VERSION;

/// The comment lines describing an encoding (without the leading `c `).
pub fn header_lines(encoding: &RamseyEncoding) -> Vec<String> {
    let instance = encoding.instance();
    let r = instance.colours();
    let mut lines = vec![
        format!("ramsift-encoder {VERSION}: clique encoding"),
        format!("spec {} order {}", instance.spec(), instance.order()),
    ];
    for colour in 1..=r {
        match instance.spec().forbidden_in(colour) {
            Forbidden::Clique(k) => lines.push(format!("colour {colour} forbids K{k}")),
            Forbidden::Graph(g) => {
                let edges: Vec<String> = g
                    .graph
                    .edges()
                    .iter()
                    .map(|(a, b)| format!("{a}-{b}"))
                    .collect();
                lines.push(format!(
                    "colour {colour} forbids {} ({} vertices, edges {}; one clause per copy)",
                    g.token,
                    g.graph.vertex_count(),
                    edges.join(" ")
                ));
            }
        }
    }
    lines.push("edge {i,j} with 0 <= i < j has index e = j(j-1)/2 + i".to_string());
    if r == 2 {
        lines.push("variable e+1 is true iff edge e has colour 1 (false: colour 2)".to_string());
    } else {
        lines.push(format!(
            "variable e*{r}+c (c = 1..{r}) is true iff edge e may have colour c; decode as the smallest true c"
        ));
    }
    lines.push(format!("symmetry {}", encoding.symmetry()));
    for scheme in encoding.symmetry().schemes() {
        lines.push(format!(
            "symmetry {}: {}",
            scheme.name(),
            scheme.justification()
        ));
    }
    let extra = encoding.symmetry_clauses();
    if extra.aux_variables > 0 || !extra.clauses.is_empty() {
        lines.push(format!(
            "symmetry adds {} clauses and auxiliary variables {}..{}",
            extra.clauses.len(),
            encoding.variables().colour_variable_count() + 1,
            encoding.variable_count()
        ));
    }
    for premise in &extra.premises {
        match &premise.source {
            Some(source) => lines.push(format!("premise {} ({source})", premise.statement())),
            None => lines.push(format!("premise {} (by definition)", premise.statement())),
        }
    }
    lines
}

/// Writes the encoding as DIMACS to `out`. Returns the number of bytes written.
pub fn write_encoding(encoding: &RamseyEncoding, out: &mut dyn Write) -> io::Result<u64> {
    let mut writer = ClauseWriter::new(out);
    for line in header_lines(encoding) {
        writer.comment(&line)?;
    }
    writer.problem_line(encoding.variable_count(), encoding.clause_count())?;
    encoding.for_each_clause(|clause| writer.clause(clause))?;
    Ok(writer.bytes)
}

/// Writes the encoding to `path` atomically (gzip when the name ends in `.gz`).
pub fn write_encoding_to(encoding: &RamseyEncoding, path: &Path) -> io::Result<u64> {
    write_atomically(path, |out| write_encoding(encoding, out))
}

/// A small DIMACS writer with fast integer formatting.
pub struct ClauseWriter<'a> {
    out: &'a mut dyn Write,
    line: Vec<u8>,
    bytes: u64,
}

impl<'a> ClauseWriter<'a> {
    pub fn new(out: &'a mut dyn Write) -> Self {
        ClauseWriter {
            out,
            line: Vec::with_capacity(256),
            bytes: 0,
        }
    }

    pub fn comment(&mut self, text: &str) -> io::Result<()> {
        self.line.clear();
        self.line.extend_from_slice(b"c ");
        self.line.extend_from_slice(text.as_bytes());
        self.line.push(b'\n');
        self.flush_line()
    }

    pub fn problem_line(&mut self, variables: usize, clauses: u64) -> io::Result<()> {
        self.line.clear();
        self.line
            .extend_from_slice(format!("p cnf {variables} {clauses}\n").as_bytes());
        self.flush_line()
    }

    pub fn clause(&mut self, literals: &[i32]) -> io::Result<()> {
        self.line.clear();
        let mut buffer = itoa::Buffer::new();
        for &lit in literals {
            self.line.extend_from_slice(buffer.format(lit).as_bytes());
            self.line.push(b' ');
        }
        self.line.extend_from_slice(b"0\n");
        self.flush_line()
    }

    fn flush_line(&mut self) -> io::Result<()> {
        self.bytes += self.line.len() as u64;
        self.out.write_all(&self.line)
    }

    /// Bytes written so far.
    pub fn bytes(&self) -> u64 {
        self.bytes
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::clauses::EncodingLimits;
    use crate::spec::{Instance, RamseySpec};

    #[test]
    fn triangle_free_k3_file() {
        let instance = Instance::new(RamseySpec::cliques(&[3, 3]).unwrap(), 3).unwrap();
        let enc = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
        let mut out = Vec::new();
        write_encoding(&enc, &mut out).unwrap();
        let text = String::from_utf8(out).unwrap();
        let body: Vec<&str> = text.lines().filter(|l| !l.starts_with('c')).collect();
        // Edges {0,1}=1, {0,2}=2, {1,2}=3: not all colour 1, not all colour 2.
        assert_eq!(body, vec!["p cnf 3 2", "-1 -2 -3 0", "1 2 3 0"]);
        assert!(text.contains("c spec 3,3 order 3\n"));
    }
}
