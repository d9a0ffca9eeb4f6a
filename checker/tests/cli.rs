//! The `ramsift-check` binary end to end: verdicts, exit codes and bad input.

use std::path::PathBuf;
use std::process::{Command, Output};

struct Scratch(tempfile::TempDir);

impl Scratch {
    fn new() -> Self {
        Scratch(tempfile::tempdir().unwrap())
    }
    fn file(&self, name: &str, content: &[u8]) -> PathBuf {
        let path = self.0.path().join(name);
        std::fs::write(&path, content).unwrap();
        path
    }
}

fn check(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_ramsift-check")).args(args).output().expect("ramsift-check runs")
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

/// The pentagon 0-1-2-3-4-0 in colour 1, the complementary pentagon in colour 2:
/// the (3,3;5) colouring, so R(3,3) > 5 (Greenwood & Gleason 1955).
const PENTAGON: &str = "ramsift-colouring spec=3,3 order=5\n\
    . 1 2 2 1\n1 . 1 2 2\n2 1 . 1 2\n2 2 1 . 1\n1 2 2 1 .\n";

#[test]
fn valid_colouring_exits_0() {
    let s = Scratch::new();
    let path = s.file("p.colouring", PENTAGON.as_bytes());
    let o = check(&["colouring", path.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "{}", text(&o.stderr));
    assert!(text(&o.stdout).starts_with("PASS: R(3,3) > 5"), "{}", text(&o.stdout));
    assert!(text(&o.stdout).contains("R(3,3) > 5"));
}

#[test]
fn monochromatic_triangle_exits_1_and_names_it() {
    let s = Scratch::new();
    // Recolour edge {0,2} to colour 1: triangle 0-1-2 in colour 1.
    let bad = PENTAGON.replace(". 1 2 2 1\n", ". 1 1 2 1\n").replace("2 1 . 1 2\n", "1 1 . 1 2\n");
    let path = s.file("bad.colouring", bad.as_bytes());
    let o = check(&["colouring", path.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(1), "{}", text(&o.stderr));
    assert!(text(&o.stdout).contains("colour 1 has a monochromatic K3 on vertices [0, 1, 2]"), "{}", text(&o.stdout));
}

#[test]
fn forbid_overrides_the_header_claim() {
    let s = Scratch::new();
    let path = s.file("p.colouring", PENTAGON.as_bytes());
    // Colour 2 is a pentagon, which has an edge: K2 is present.
    let o = check(&["colouring", path.to_str().unwrap(), "--forbid", "3,2"]);
    assert_eq!(o.status.code(), Some(1));
    let o = check(&["colouring", path.to_str().unwrap(), "--forbid", "4,4", "--json"]);
    assert_eq!(o.status.code(), Some(0));
    assert!(text(&o.stdout).contains("\"verdict\": \"PASS\""));
}

#[test]
fn graph6_files_need_and_use_forbid() {
    let s = Scratch::new();
    // C5 is "Dhc" (McKay's graph6 description).
    let path = s.file("c5.g6", b">>graph6<<Dhc\n");
    let p = path.to_str().unwrap();
    assert_eq!(check(&["colouring", p, "--forbid", "3,3"]).status.code(), Some(0));
    assert_eq!(check(&["colouring", p, "--forbid", "2,3"]).status.code(), Some(1));
    let o = check(&["colouring", p]);
    assert_eq!(o.status.code(), Some(2));
    assert!(text(&o.stderr).contains("needs --forbid"));
    let o = check(&["colouring", p, "--forbid", "3,3,3"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(text(&o.stderr).contains("exactly two"));
}

fn assert_unreadable(name: &str, content: &[u8], extra: &[&str], expected: &str) {
    let s = Scratch::new();
    let path = s.file(name, content);
    let mut args = vec!["colouring", path.to_str().unwrap()];
    args.extend_from_slice(extra);
    let o = check(&args);
    let err = text(&o.stderr);
    assert_eq!(o.status.code(), Some(2), "{name}: {err}");
    assert!(err.contains(expected), "{name}: {err:?} lacks {expected:?}");
    assert!(!err.contains("panicked"));
}

#[test]
fn malformed_colouring_files_exit_2_with_position() {
    assert_unreadable("empty", b"", &["--forbid", "3,3"], "graph6");
    assert_unreadable("header-only", b"ramsift-colouring spec=3,3 order=5\n", &[], "ends after 0 matrix rows");
    assert_unreadable("bad-key", b"ramsift-colouring spec=3,3 order=5 colour=2\n", &[], ":1: unknown header field");
    assert_unreadable("bad-order", b"ramsift-colouring spec=3,3 order=abc\n", &[], "order=abc");
    assert_unreadable("huge-order", b"ramsift-colouring spec=3,3 order=99999999999\n", &[], "from 1 to");
    assert_unreadable("bad-spec", b"ramsift-colouring spec=3 order=2\n. 1\n1 .\n", &[], "spec");
    assert_unreadable(
        "short-row",
        b"# c\nramsift-colouring spec=3,3 order=2\n. 1\n1\n",
        &[],
        ":4: row 1 has 1 entries",
    );
    assert_unreadable("asymmetric", b"ramsift-colouring spec=3,3 order=2\n. 1\n2 .\n", &[], "symmetric");
    assert_unreadable("colour-0", b"ramsift-colouring spec=3,3 order=2\n. 0\n0 .\n", &[], "colour from 1 to 2");
    assert_unreadable("diagonal", b"ramsift-colouring spec=3,3 order=2\n1 1\n1 .\n", &[], "diagonal");
    assert_unreadable("trailing", b"ramsift-colouring spec=3,3 order=1\n.\n.\n", &[], "after the 1 matrix rows");
    assert_unreadable("binary", b"ramsift-colouring spec=3,3 order=1\n\xff\n", &[], "not UTF-8");
    assert_unreadable("forbid", PENTAGON.as_bytes(), &["--forbid", "3,x"], "--forbid: entry 2");
}

#[test]
fn malformed_graph6_exits_2_with_byte_offset() {
    assert_unreadable("short.g6", b"Dh\n", &["--forbid", "3,3"], "needs 2 bytes");
    assert_unreadable("char.g6", b"Dhc\nD c\n", &["--forbid", "3,3"], "byte 5");
    assert_unreadable("padding.g6", b"Dhd\n", &["--forbid", "3,3"], "padding");
    assert_unreadable("blank.g6", b"\n\n", &["--forbid", "3,3"], "no graph6 string");
}

#[test]
fn missing_file_exits_2() {
    let o = check(&["colouring", "/nonexistent/ramsift/file"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(text(&o.stderr).contains("cannot read"));
}

#[test]
fn forbidden_graphs_are_searched_directly() {
    let s = Scratch::new();
    // Colour 1 is the pentagon C5 ("Dhc", McKay's graph6 description); colour 2, its
    // complement, is another pentagon.
    let path = s.file("c5.g6", b"Dhc\n");
    let p = path.to_str().unwrap();
    // No 4-cycle in a pentagon, no triangle in its complement.
    assert_eq!(check(&["colouring", p, "--forbid", "C4,3"]).status.code(), Some(0));
    // The pentagon itself, and a path on 3 vertices, are in colour 1.
    for forbid in ["C5,3", "P3,3", "G6:Dhc,3", "E:0-1/1-2/2-3,3"] {
        let o = check(&["colouring", p, "--forbid", forbid]);
        assert_eq!(o.status.code(), Some(1), "{forbid}");
        assert!(text(&o.stdout).contains("colour 1"), "{forbid}: {}", text(&o.stdout));
    }
    let o = check(&["colouring", p, "--forbid", "C2,3"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(text(&o.stderr).contains("--forbid: entry 1"));
}
