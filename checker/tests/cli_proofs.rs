//! `ramsift-check drat`, `lrat` and `bundle` end to end: verdicts and bad input.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn check(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_ramsift-check")).args(args).output().expect("ramsift-check runs")
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

fn write(dir: &Path, name: &str, content: &[u8]) -> PathBuf {
    let path = dir.join(name);
    std::fs::write(&path, content).unwrap();
    path
}

// The worked example of the LRAT paper (Cruz-Filipe, Heule, Hunt, Kaufmann &
// Schneider-Kamp, CADE 2017): all four clauses over two variables.
const CNF: &[u8] = b"p cnf 2 4\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n";
const LRAT: &[u8] = b"5 -2 0 4 3 0\n5 d 3 4 0\n6 1 0 5 1 0\n6 d 1 0\n7 0 5 2 6 0\n";
/// A DRAT refutation of the same formula: -2 is RUP, then 1, then the empty clause.
const DRAT: &[u8] = b"-2 0\nd 1 -2 0\n1 0\n0\n";

fn p(path: &Path) -> &str {
    path.to_str().unwrap()
}

#[test]
fn worked_examples_verify_and_lrat_is_emitted() {
    let dir = tempfile::tempdir().unwrap();
    let cnf = write(dir.path(), "f.cnf", CNF);
    let lrat = write(dir.path(), "p.lrat", LRAT);
    let o = check(&["lrat", p(&cnf), p(&lrat)]);
    assert_eq!(o.status.code(), Some(0), "{}", text(&o.stderr));
    assert!(text(&o.stdout).starts_with("PASS: "), "{}", text(&o.stdout));

    let drat = write(dir.path(), "p.drat", DRAT);
    let emitted = dir.path().join("emitted.lrat");
    let o = check(&["drat", p(&cnf), p(&drat), "--emit-lrat", p(&emitted), "--json"]);
    assert_eq!(o.status.code(), Some(0), "{}", text(&o.stderr));
    assert!(text(&o.stdout).contains("\"verdict\": \"PASS\""));
    let o = check(&["lrat", p(&cnf), p(&emitted)]);
    assert_eq!(o.status.code(), Some(0), "emitted LRAT: {}", text(&o.stdout));

    // Binary form of the same proof: a -2 0, d 1 -2 0, a 1 0, a 0.
    let binary = write(dir.path(), "p.bin", &[b'a', 5, 0, b'd', 2, 5, 0, b'a', 2, 0, b'a', 0]);
    assert_eq!(check(&["drat", p(&cnf), p(&binary)]).status.code(), Some(0));
}

#[test]
fn wrong_proofs_exit_1_naming_the_step() {
    let dir = tempfile::tempdir().unwrap();
    let cnf = write(dir.path(), "f.cnf", CNF);
    // Only three of the four clauses: satisfiable (1, 2 true), so no proof may pass.
    let sat = write(dir.path(), "sat.cnf", b"p cnf 2 3\n1 2 0\n-1 2 0\n1 -2 0\n");
    let drat = write(dir.path(), "p.drat", DRAT);
    let o = check(&["drat", p(&sat), p(&drat)]);
    assert_eq!(o.status.code(), Some(1));
    assert!(text(&o.stdout).starts_with("FAIL: "), "{}", text(&o.stdout));
    let bad = write(dir.path(), "bad.drat", b"3 0\n0\n");
    let o = check(&["drat", p(&cnf), p(&bad)]);
    assert_eq!(o.status.code(), Some(1));
    assert!(text(&o.stdout).contains("outside") || text(&o.stdout).contains("step"), "{}", text(&o.stdout));
    let lemma_bad = write(dir.path(), "lemma.drat", b"-1 -2 0\n1 0\n0\n");
    let o = check(&["drat", p(&sat), p(&lemma_bad)]);
    assert_eq!(o.status.code(), Some(1));
    assert!(text(&o.stdout).contains("proof step"), "{}", text(&o.stdout));
    let lrat_bad = write(dir.path(), "bad.lrat", b"5 -2 0 4 0\n");
    let o = check(&["lrat", p(&cnf), p(&lrat_bad)]);
    assert_eq!(o.status.code(), Some(1));
    assert!(text(&o.stdout).contains("line 1"), "{}", text(&o.stdout));
}

fn assert_unreadable(args: &[&str], expected: &str) {
    let o = check(args);
    let err = text(&o.stderr);
    assert_eq!(o.status.code(), Some(2), "{args:?}: {err} / {}", text(&o.stdout));
    assert!(err.contains(expected), "{args:?}: {err:?} lacks {expected:?}");
    assert!(!err.contains("panicked"));
}

#[test]
fn malformed_inputs_exit_2_with_their_position() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let cnf = write(d, "f.cnf", CNF);
    let drat = write(d, "p.drat", DRAT);
    let cases: Vec<(PathBuf, PathBuf, &str, &str)> = vec![
        (write(d, "a.cnf", b"p cnf 2 1\n1 x 0\n"), drat.clone(), "drat", ":2: \"x\" is not an integer"),
        (write(d, "b.cnf", b"1 2 0\n"), drat.clone(), "drat", ":1: clause before the problem line"),
        (write(d, "c.cnf", b"p cnf 2 2\n1 2 0\n"), drat.clone(), "drat", "promises 2 clauses"),
        (write(d, "d.cnf", b"p cnf 1 1\n2 0\n"), drat.clone(), "drat", "outside the 1 declared variables"),
        (write(d, "e.cnf", b"\x1f\x8b\x08garbage"), drat.clone(), "drat", "gzip data is damaged"),
        (cnf.clone(), write(d, "a.drat", b"1 2 0\n-1 q 0\n"), "drat", "byte 9"),
        (cnf.clone(), write(d, "b.drat", b"1 2 0\n-1"), "drat", "not ended by 0"),
        (cnf.clone(), write(d, "c.drat", &[b'a', 0x82]), "drat", "cut off"),
        (cnf.clone(), write(d, "d.drat", &[b'a', 2, 0, b'z', 2, 0]), "drat", "byte 3"),
        (cnf.clone(), write(d, "e.drat", b"1 d 0\n"), "drat", "'d' inside a clause"),
        (cnf.clone(), write(d, "a.lrat", b"5 -2 0 4 3\n"), "lrat", ":1: expected `id literals 0 hints 0`"),
        (cnf.clone(), write(d, "b.lrat", b"5 -2 0 4 3 0\nx 1 0 0\n"), "lrat", ":2: expected a positive clause id"),
        (cnf.clone(), write(d, "c.lrat", b"5 d 3 -4 0\n"), "lrat", "deletion line"),
        (cnf.clone(), d.join("missing.drat"), "drat", "cannot read"),
        (d.join("missing.cnf"), drat.clone(), "drat", "cannot read"),
    ];
    for (cnf_path, proof_path, command, expected) in &cases {
        assert_unreadable(&[command, p(cnf_path), p(proof_path)], expected);
    }
}

#[test]
fn malformed_manifests_exit_2() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    assert_unreadable(&["bundle", p(d)], "manifest.json: cannot read");
    write(d, "manifest.json", b"{ \"bundle_format\": ");
    assert_unreadable(&["bundle", p(d)], "not a ramsift bundle manifest");
    write(d, "manifest.json", b"{ \"bundle_format\": \"something else\" }");
    assert_unreadable(&["bundle", p(d)], "expected \"ramsift-bundle 1\"");
    write(d, "manifest.json", b"{ \"bundle_format\": \"ramsift-bundle 1\" }");
    assert_unreadable(&["bundle", p(d)], "missing field `claim`");
    write(
        d,
        "manifest.json",
        br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"order": 6, "statement": "R(3,3) <= 6"}, "encoding": {"symmetry": []}, "files": [] }"#,
    );
    assert_unreadable(&["bundle", p(d)], "neither forbidden nor clique_sizes");
    write(d, "manifest.json", br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"forbidden": ["C4", "Q9"], "order": 6, "statement": ""}, "encoding": {"symmetry": []}, "files": [] }"#);
    assert_unreadable(&["bundle", p(d)], "claim.forbidden: entry 2");
    write(
        d,
        "manifest.json",
        br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"forbidden": ["C4", 4], "order": 6, "statement": ""} }"#,
    );
    assert_unreadable(&["bundle", p(d)], "expected a string");
    write(d, "manifest.json", br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"forbidden": ["4", "4"], "clique_sizes": [3, 4], "order": 6, "statement": ""}, "encoding": {"symmetry": []}, "files": [] }"#);
    assert_unreadable(&["bundle", p(d)], "disagree");
    write(
        d,
        "manifest.json",
        br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"clique_sizes": [3, "x"], "order": 6, "statement": ""} }"#,
    );
    assert_unreadable(&["bundle", p(d)], "expected usize");
    write(d, "manifest.json", br#"{ "bundle_format": "ramsift-bundle 1", "claim": {"clique_sizes": [3, 3], "order": 99999999, "statement": ""}, "encoding": {"symmetry": []}, "files": [] }"#);
    assert_unreadable(&["bundle", p(d)], "not a question this checker accepts");
}
