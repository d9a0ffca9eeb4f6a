//! Crafted checker inputs that are small on disk and costly to check naively: the
//! hostile-checker tests run them through `ramsift-check` under a memory limit,
//! and the `hostile_inputs` example writes them for the benchmarks. Each function
//! edits a bundle made by `ramsift refute 3,3 6` (R(3,3) = 6: Greenwood & Gleason
//! 1955) and records the new hashes, so the check reaches the step under test.

use std::io::Write;
use std::path::Path;

use crate::bundle_files::{edit_manifest, set_hash};

/// gzip of `bytes` (RFC 1952).
pub fn gzip(bytes: &[u8]) -> Vec<u8> {
    let mut encoder = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::best());
    encoder.write_all(bytes).expect("writing to memory");
    encoder.finish().expect("writing to memory")
}

/// Replaces a bundle file's content and records its new hash.
pub fn replace_file(bundle: &Path, file: &str, content: &[u8]) {
    std::fs::write(bundle.join(file), content).expect("the bundle is writable");
    set_hash(bundle, file);
}

/// Puts `count` copies of the one-literal lemma "1" (binary DRAT: 61 02 00) before
/// the bundle's binary trace, gzipped; returns the expanded size.
pub fn unit_lemma_trace(bundle: &Path, count: usize) -> usize {
    let mut trace = b"a\x02\x00".repeat(count);
    trace.extend(std::fs::read(bundle.join("proof.drat")).expect("the bundle has a trace"));
    replace_file(bundle, "proof.drat", &gzip(&trace));
    trace.len()
}

/// Replaces the formula by `count` unit clauses under a header that says so, gzipped.
pub fn unit_clause_formula(bundle: &Path, count: usize) -> usize {
    let mut formula = format!("p cnf 15 {count}\n").into_bytes();
    formula.extend(b"1 0\n".repeat(count));
    replace_file(bundle, "formula.cnf.gz", &gzip(&formula));
    formula.len()
}

/// One minimality clause line of `tokens` literals "1" (plain text).
pub fn long_minimality_line(bundle: &Path, tokens: usize) -> usize {
    let mut text = b"ramsift minimality clauses 1\nvertices 6 colours 2 order edge-index,colour-ascending\n0 1 2 3 4 5 / 1 2 / ".to_vec();
    text.extend(b"1 ".repeat(tokens));
    text.extend(b"0\n");
    replace_file(bundle, "minimality.txt", &text);
    text.len()
}

/// The claim R(1000,1000) <= 1000 (a two-clause formula) with `lines` minimality
/// lines at n = 1000, each the K_3 example of checker/src/minimality.rs (vertices
/// 1 and 2 swapped). The trace is left as it is, so the check ends at the proof.
pub fn many_minimality_lines(bundle: &Path, lines: usize) {
    let n = 1000usize;
    let edges = n * (n - 1) / 2;
    let clause: Vec<String> = (1..=edges).map(|v| format!("-{v}")).collect();
    let clause = clause.join(" ");
    let formula = format!(
        "p cnf {edges} 2\n{clause} 0\n{} 0\n",
        clause.replace('-', "")
    );
    replace_file(bundle, "formula.cnf.gz", &gzip(formula.as_bytes()));
    let mut map: Vec<String> = (0..n).map(|v| v.to_string()).collect();
    map.swap(1, 2);
    let line = format!("{} / 1 2 / 1 -2 0\n", map.join(" "));
    let header = format!(
        "ramsift minimality clauses 1\nvertices {n} colours 2 order edge-index,colour-ascending\n"
    );
    replace_file(
        bundle,
        "minimality.txt",
        (header + &line.repeat(lines)).as_bytes(),
    );
    edit_manifest(bundle, |m| {
        m["claim"]["clique_sizes"] = serde_json::json!([n, n]);
        m["claim"]["order"] = serde_json::json!(n);
        m["claim"]["statement"] = serde_json::json!(format!("R({n},{n}) <= {n}"));
        m["encoding"]["symmetry"] = serde_json::json!(["minimality"]);
    });
}

/// The claim that one edge among ten vertices (graph6 "I_???????") is forbidden in
/// both colours of K20: 20!/10! placements, C(20,2) = 190 copies.
pub fn isolated_vertices_claim(bundle: &Path) {
    edit_manifest(bundle, |m| {
        m["claim"]["forbidden"] = serde_json::json!(["G6:I_???????", "G6:I_???????"]);
        m["claim"]["clique_sizes"] = serde_json::Value::Null;
        m["claim"]["order"] = serde_json::json!(20);
        m["claim"]["statement"] = serde_json::json!("R(G6:I_???????,G6:I_???????) <= 20");
    });
}

/// A colouring file of K_(parts·size): colour 1 between parts, colour 2 inside them
/// (largest clique `parts` in colour 1 and `size` in colour 2), claiming
/// R(parts+1, size+1) > parts·size.
pub fn multipartite_colouring(parts: usize, size: usize) -> String {
    let n = parts * size;
    let mut text = format!(
        "ramsift-colouring spec={},{} order={n}\n",
        parts + 1,
        size + 1
    );
    for i in 0..n {
        let row: Vec<&str> = (0..n)
            .map(|j| match () {
                _ if i == j => ".",
                _ if i / size == j / size => "2",
                _ => "1",
            })
            .collect();
        text.push_str(&row.join(" "));
        text.push('\n');
    }
    text
}

/// Binary DRAT of `count` one-literal lemmas, each on a new variable (3, 4, …),
/// then the refutation -2, 1, empty of the four clauses over variables 1 and 2
/// (the LRAT paper's worked example): every lemma widens the checker's variables.
pub fn distinct_variable_trace(count: u32) -> Vec<u8> {
    let mut trace = Vec::new();
    let mut step = |lit: i64| {
        trace.push(b'a');
        let mut value = if lit > 0 {
            2 * lit as u64
        } else {
            (-2 * lit + 1) as u64
        };
        while value >= 0x80 {
            trace.push((value as u8 & 0x7f) | 0x80);
            value >>= 7;
        }
        trace.extend([value as u8, 0]);
    };
    (3..3 + count as i64).chain([-2, 1]).for_each(&mut step);
    trace.extend(b"a\x00");
    trace
}

/// The four clauses over two variables of the LRAT paper's worked example.
pub const FOUR_CLAUSES: &str = "p cnf 2 4\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n";
