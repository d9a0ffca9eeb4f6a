//! The `ramsift` binary end to end: exit codes, output files, and bad input.

use std::path::Path;
use std::process::{Command, Output};

use ramsift_checker::check_colouring;
use ramsift_checker::colouring_file::{parse_colouring_file, ColouringFile};
use ramsift_checker::graph6::decode_graph6_file;

fn ramsift(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_ramsift"))
        .args(args)
        .output()
        .expect("ramsift runs")
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// A colouring file's text, parsed, and passed by the checker's code.
fn checked_colouring(name: &str, text: &str) -> ColouringFile {
    let file = parse_colouring_file(name, text).unwrap();
    assert!(
        check_colouring(&file.matrix, &file.claim).is_valid(),
        "{name}"
    );
    file
}

/// The colouring file at `path`, parsed, and passed by the checker's code.
fn checked_witness(path: &Path) -> ColouringFile {
    checked_colouring(
        &path.display().to_string(),
        &std::fs::read_to_string(path).unwrap(),
    )
}

#[test]
fn find_reports_found_with_exit_10_and_writes_checkable_files() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("w");
    let o = ramsift(&["find", "3,5", "13", "--out", out.to_str().unwrap(), "-q"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    assert!(stdout(&o).contains("R(3,5) > 13"));
    // R(3,5) = 14 (Greenwood & Gleason 1955; Radziszowski DS1): the witness must check.
    let path = out.join("witness.colouring");
    let file = checked_witness(&path);
    assert_eq!(file.claim.clique_sizes(), Some(vec![3, 5]));
    let graphs =
        decode_graph6_file("g", &std::fs::read(out.join("witness-colour1.g6")).unwrap()).unwrap();
    assert_eq!(graphs[0], file.matrix);
    let summary: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).unwrap()).unwrap();
    assert_eq!(summary["result"], "found");
    assert_eq!(summary["exit_code"], 10);
    assert_eq!(summary["verified_by_checker"], true);
}

#[test]
fn find_reports_none_with_exit_20() {
    // R(3,4) = 9 (Greenwood & Gleason 1955): no colouring of K9.
    let o = ramsift(&["find", "3,4", "9", "--json"]);
    assert_eq!(o.status.code(), Some(20), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["result"], "none");
    assert_eq!(summary["instance"], "(3,4;9)");
}

#[test]
fn find_times_out_with_exit_1() {
    // (4,4;18) has no colouring (R(4,4) = 18) and plain search cannot show it quickly.
    let o = ramsift(&["find", "4,4", "18", "--timeout", "0.5", "--json"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["result"], "unknown");
}

#[test]
fn three_colour_search_prints_the_matrix() {
    // R(3,3,3) = 17 (Greenwood & Gleason 1955).
    let o = ramsift(&["find", "3,3,3", "16", "--threads", "2", "--seed", "5"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let text = stdout(&o);
    let body = &text[text.find("ramsift-colouring").unwrap()..];
    checked_colouring("stdout", body);
}

#[test]
fn encode_writes_plain_and_gzip_dimacs() {
    let dir = tempfile::tempdir().unwrap();
    for name in ["r44.cnf", "r44.cnf.gz"] {
        let path = dir.path().join(name);
        let o = ramsift(&["encode", "4,4", "17", "--out", path.to_str().unwrap()]);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        let bytes = std::fs::read(&path).unwrap();
        let text = if name.ends_with(".gz") {
            let mut s = String::new();
            std::io::Read::read_to_string(&mut flate2::read::GzDecoder::new(&bytes[..]), &mut s)
                .unwrap();
            s
        } else {
            String::from_utf8(bytes).unwrap()
        };
        // 136 edge variables; 2·C(17,4) = 4760 clauses.
        assert!(text.contains("\np cnf 136 4760\n"), "{name}");
        assert!(text.contains("c spec 4,4 order 17\n"));
        assert_eq!(text.lines().filter(|l| l.ends_with(" 0")).count(), 4760);
    }
}

/// Runs ramsift with bad arguments: exit 2, a message containing `expected`, no panic.
fn assert_bad_input(args: &[&str], expected: &str) {
    let o = ramsift(args);
    let err = stderr(&o);
    assert_eq!(o.status.code(), Some(2), "{args:?}: {err}");
    assert!(
        err.contains(expected),
        "{args:?}: message {err:?} lacks {expected:?}"
    );
    assert!(!err.contains("panicked"), "{args:?} panicked: {err}");
}

#[test]
fn bad_specifications_are_refused() {
    assert_bad_input(&["find", "", "5"], "empty specification");
    assert_bad_input(&["find", "4", "5"], "1 colour(s)");
    assert_bad_input(&["find", "4,x", "5"], "entry 2");
    assert_bad_input(&["find", "4,,4", "5"], "entry 2");
    assert_bad_input(&["find", "4,1", "5"], "at least 2 vertices");
    assert_bad_input(
        &["find", "3,3,3,3,3,3,3,3,3,3,3,3,3,3,3,3,3", "20"],
        "at most 16",
    );
}

#[test]
fn impossible_orders_are_refused() {
    assert_bad_input(&["find", "3,3", "0"], "order 0");
    assert_bad_input(&["find", "5,5", "4"], "more vertices than K_4");
    assert_bad_input(&["find", "3,3", "-3"], "unexpected argument");
    assert_bad_input(&["find", "3,3", "five"], "invalid value");
    assert_bad_input(&["find", "10,10", "1000"], "over the limit");
    assert_bad_input(
        &["find", "3,3", "100000"],
        "above the largest supported order",
    );
    assert_bad_input(&["find", "3,3,3", "40000"], "more than DIMACS literals");
    assert_bad_input(
        &["find", "5,5", "43", "--max-clauses", "1000"],
        "1925196 clauses",
    );
    assert_bad_input(
        &["encode", "30,30", "18446744073709551615", "--out", "x.cnf"],
        "above the largest supported order",
    );
}

#[test]
fn bad_options_are_refused() {
    assert_bad_input(&["find", "3,3", "5", "--timeout=-1"], "--timeout");
    assert_bad_input(&["find", "3,3", "5", "--timeout", "nan"], "--timeout");
    assert_bad_input(&["find", "3,3", "5", "--threads", "0"], "--threads 0");
    assert_bad_input(&["encode", "3,3", "5"], "--out");
}

#[test]
fn unwritable_outputs_fail_cleanly_and_leave_nothing() {
    let dir = tempfile::tempdir().unwrap();
    let missing = dir.path().join("no/such/dir/f.cnf");
    assert_bad_input(
        &["encode", "3,3", "5", "--out", missing.to_str().unwrap()],
        "writing",
    );
    let blocker = dir.path().join("file");
    std::fs::write(&blocker, "x").unwrap();
    assert_bad_input(
        &["find", "3,3", "5", "--out", blocker.to_str().unwrap(), "-q"],
        "exists and is not a directory",
    );
    // A refused instance never creates its output file.
    let refused = dir.path().join("big.cnf");
    assert_bad_input(
        &[
            "encode",
            "5,5",
            "43",
            "--max-clauses",
            "10",
            "--out",
            refused.to_str().unwrap(),
        ],
        "over the limit",
    );
    assert!(!refused.exists());
    let leftovers: Vec<_> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name())
        .collect();
    assert_eq!(
        leftovers,
        vec![std::ffi::OsString::from("file")],
        "temporary files left behind"
    );
    assert!(Path::new(&blocker).is_file());
}

#[test]
fn refute_writes_a_bundle_that_passes_unconditionally() {
    use ramsift_checker::bundle::check_bundle;
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("r44");
    // R(4,4) = 18 (Greenwood & Gleason 1955; Radziszowski DS1).
    let o = ramsift(&[
        "refute",
        "4,4",
        "18",
        "--out",
        out.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(20), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["proves"], "R(4,4) <= 18");
    assert_eq!(summary["premises"][0], "R(3,4) <= 9");
    // The default is minimality with degree bounds, run by the hooked solver.
    assert_eq!(
        summary["symmetry"],
        serde_json::json!(["degree-bounds", "minimality"])
    );
    assert!(summary["search"]["conflicts"].as_u64().unwrap() > 0);
    assert!(summary["search"]["checks"].as_u64().unwrap() > 0);
    assert!(out.join("minimality.txt").is_file());
    let verdict = check_bundle(&out, &[]).unwrap();
    assert!(verdict.passed(), "{:?}", verdict.failure);
    assert!(
        verdict.unconditional(),
        "the premise bundle in premises/ certifies R(3,4) <= 9"
    );
    let guide = std::fs::read_to_string(out.join("REFEREE.txt")).unwrap();
    assert!(guide.contains("R(4,4) <= 18") && guide.contains("ramsift-check bundle"));

    let assumed = dir.path().join("assumed");
    let o = ramsift(&[
        "refute",
        "4,4",
        "18",
        "--out",
        assumed.to_str().unwrap(),
        "--assume-premises",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(20));
    assert!(!assumed.join("premises").exists());
    assert!(!check_bundle(&assumed, &[]).unwrap().unconditional());
    // Given the premise bundle explicitly, it becomes unconditional.
    let premise = out.join("premises").join("R3-4-9");
    assert!(check_bundle(&assumed, &[premise]).unwrap().unconditional());
}

#[test]
fn refute_of_a_satisfiable_instance_exits_10_with_the_witness() {
    let dir = tempfile::tempdir().unwrap();
    // R(3,4) = 9: K8 has a good colouring (Greenwood & Gleason 1955).
    let o = ramsift(&[
        "refute",
        "3,4",
        "8",
        "--out",
        dir.path().to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    assert!(dir.path().join("witness.colouring").exists());
    assert!(!dir.path().join("manifest.json").exists());
}

#[test]
fn refute_timeout_leaves_no_bundle() {
    let dir = tempfile::tempdir().unwrap();
    // (3,5;14) without symmetry breaking does not finish quickly (BENCHMARKS.md).
    let o = ramsift(&[
        "refute",
        "3,5",
        "14",
        "--symmetry",
        "none",
        "--timeout",
        "0.3",
        "--out",
        dir.path().to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert_eq!(
        std::fs::read_dir(dir.path()).unwrap().count(),
        0,
        "no files, no temporary trace"
    );
    // The hooked solver (default minimality): (4,5;25) is far from refuted in 0.5 s.
    let hooked = dir.path().join("hooked");
    let o = ramsift(&[
        "refute",
        "4,5",
        "25",
        "--timeout",
        "0.5",
        "-q",
        "--out",
        hooked.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert_eq!(
        std::fs::read_dir(&hooked).unwrap().count(),
        0,
        "no trace, no minimality clauses left behind"
    );
    assert_bad_input(
        &["refute", "3,3", "6", "--out", "x", "--symmetry", "lex"],
        "unknown symmetry scheme \"lex\"",
    );
    assert_bad_input(
        &[
            "refute",
            "3,3",
            "6",
            "--out",
            "x",
            "--symmetry",
            "minimality,lex-leader",
        ],
        "minimality cannot be combined with lex-leader",
    );
    assert_bad_input(
        &[
            "encode",
            "3,3",
            "6",
            "--out",
            "x.cnf",
            "--symmetry",
            "minimality",
        ],
        "applied during the search",
    );
}

#[cfg(not(feature = "cadical"))]
#[test]
fn cadical_backend_absent_is_a_clear_error() {
    assert_bad_input(
        &["find", "3,3", "5", "--solver", "cadical"],
        "built without CaDiCaL",
    );
    assert_bad_input(
        &["find", "3,3", "5", "--solver", "minisat"],
        "invalid value 'minisat'",
    );
}

#[cfg(feature = "cadical")]
#[test]
fn cadical_backend_answers_both_ways() {
    // R(3,4) = 9 (Greenwood & Gleason 1955): a colouring of K8, none of K9.
    let o = ramsift(&["find", "3,4", "8", "--solver", "cadical", "--json"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["verified_by_checker"], true);
    assert_eq!(
        ramsift(&["find", "3,4", "9", "--solver", "cadical", "-q"])
            .status
            .code(),
        Some(20)
    );
}

#[test]
fn circulant_find_reports_found_and_none_in_family() {
    // Paley(17) is circulant and R(4,4) = 18 (Radziszowski DS1).
    let o = ramsift(&["find", "4,4", "17", "--circulant", "--json"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["result"], "found");
    assert_eq!(summary["method"], "circulant");
    assert!(summary["found_by"].as_str().unwrap().contains("Z17"));
    // (3,6;17): colourings exist (R(3,6) = 18) but none is circulant (OEIS A000789:
    // the largest circulant (3,6)-colouring has order 16). Exit 1, not 20.
    let o = ramsift(&["find", "3,6", "17", "--circulant"]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert!(stdout(&o).contains("NONE-IN-FAMILY"), "{}", stdout(&o));
    let o = ramsift(&[
        "find", "3,3,3", "16", "--method", "cayley", "--group", "Z2^4", "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
}

#[test]
fn fixed_vertices_and_clique_weights_find_checked_colourings() {
    // The Paley colouring of K17 has an automorphism of order 8 with two orbits
    // and one fixed vertex (x -> 2x mod 17), so the 2-block, 1-fixed family holds
    // a (4,4)-colouring of K17 (Greenwood & Gleason 1955; Radziszowski DS1).
    let out = ramsift(&[
        "find",
        "4,4",
        "17",
        "--method",
        "block-circulant",
        "--blocks",
        "2",
        "--fixed",
        "1",
        "-q",
    ]);
    assert_eq!(out.status.code(), Some(10), "{}", stderr(&out));
    assert!(
        stdout(&out).contains("block-circulant (2 blocks, 1 fixed)"),
        "{}",
        stdout(&out)
    );
    let out = ramsift(&[
        "scan",
        "4,4",
        "--family",
        "fixed-vertices",
        "--from",
        "17",
        "--to",
        "18",
        "--json",
        "-q",
    ]);
    let report: serde_json::Value = serde_json::from_str(&stdout(&out)).unwrap();
    // R(4,4) = 18 (DS1): found at 17, none at 18 in every family of the choice.
    assert_eq!(report["largest_found"], 17, "{report}");
    // R(4,4) = 18: (4,4;16) colourings exist; the weighted rule finds one.
    let out = ramsift(&[
        "find",
        "4,4",
        "16",
        "--method",
        "local",
        "--rule",
        "weighted",
        "--threads",
        "1",
        "-q",
    ]);
    assert_eq!(out.status.code(), Some(10), "{}", stderr(&out));
}

#[test]
fn local_search_over_an_automorphisms_orbits_finds_an_invariant_colouring() {
    // R(4,5) = 25 (DS1) with a circulant (4,5;24) colouring; rotating Z_24 by 3
    // has three 8-cycles, so an automorphism with three 8-cycles admits one.
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("found");
    let o = ramsift(&[
        "find",
        "4,5",
        "24",
        "--method",
        "local",
        "--automorphism",
        "8x3",
        "--threads",
        "1",
        "--json",
        "--out",
        out.to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!(
        summary["found_by"]
            .as_str()
            .is_some_and(|s| s.contains("edge orbits of an automorphism with cycles 8x3")),
        "{summary}"
    );
    let file = checked_witness(&out.join("witness.colouring"));
    // Invariant under v -> v + 1 within each block of 8 vertices.
    let sigma = |v: usize| v / 8 * 8 + (v % 8 + 1) % 8;
    for u in 0..24 {
        for v in 0..24 {
            if u != v {
                assert_eq!(
                    file.matrix.colour(u, v),
                    file.matrix.colour(sigma(u), sigma(v)),
                    "{{{u},{v}}}"
                );
            }
        }
    }
    // The cycles must cover the order, and go with local search.
    assert_bad_input(
        &[
            "find",
            "4,5",
            "24",
            "--method",
            "local",
            "--automorphism",
            "8x2",
        ],
        "move 16 vertices, but K_24 has 24",
    );
    assert_bad_input(
        &["find", "4,5", "24", "--automorphism", "8x3"],
        "--automorphism goes with --method local or automorphism",
    );
    assert_bad_input(
        &[
            "find",
            "4,5",
            "24",
            "--method",
            "local",
            "--automorphism",
            "8x",
        ],
        "expected a comma list of lengths",
    );
}

#[test]
fn local_search_over_every_involution_finds_the_paley_colouring() {
    // R(4,4) = 18 (DS1); the one (4,4;17) colouring is Paley's, and x -> -x (-1 is
    // a square mod 17) is an automorphism of it with eight 2-cycles and 0 fixed:
    // among the shapes --involutions takes in turn.
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("found");
    let o = ramsift(&[
        "find",
        "4,4",
        "17",
        "--method",
        "local",
        "--involutions",
        "--threads",
        "1",
        "--json",
        "--out",
        out.to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let by = summary["found_by"].as_str().unwrap_or_default();
    assert!(
        by.contains("edge orbits of an automorphism with cycles 2x"),
        "{by}"
    );
    checked_witness(&out.join("witness.colouring"));
    assert_bad_input(
        &["find", "4,4", "17", "--involutions"],
        "--involutions goes with --method local",
    );
}

#[test]
fn exhaustive_search_among_the_colourings_with_a_prescribed_automorphism() {
    // R(4,4) = 18 (DS1). Paley's (4,4;17) colouring has the automorphism x -> 2x
    // (2 is a square mod 17), with two 8-cycles and the fixed vertex 0: the family
    // of two 8-cycles and a fixed vertex holds a colouring, checked here.
    let o = ramsift(&[
        "find",
        "4,4",
        "17",
        "--method",
        "automorphism",
        "--automorphism",
        "8x2,1",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    checked_colouring("stdout", &stdout(&o));
    assert!(
        stdout(&o).contains("invariant under cycles 8x2,1"),
        "{}",
        stdout(&o)
    );
    // No (4,4;18) colouring exists at all, so none with three 6-cycles.
    let o = ramsift(&[
        "find",
        "4,4",
        "18",
        "--method",
        "automorphism",
        "--automorphism",
        "6x3",
        "--json",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["result"], "none-in-family", "{summary}");
    // Aut(Paley 17) = {x -> ax + b, a a nonzero square} has no element of order
    // 16, so a 16-cycle and a fixed vertex admit no (4,4;17) colouring; given
    // first, that family is tried and found empty, then the next one holds one.
    let o = ramsift(&[
        "find",
        "4,4",
        "17",
        "--method",
        "automorphism",
        "--automorphism",
        "16,1",
        "--automorphism",
        "8x2,1",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    assert!(
        stdout(&o).contains("2 attempts, invariant under cycles 8x2,1"),
        "{}",
        stdout(&o)
    );
    let o = ramsift(&[
        "find",
        "4,4",
        "17",
        "--method",
        "automorphism",
        "--automorphism",
        "16,1",
        "--json",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert_bad_input(
        &["find", "4,4", "17", "--method", "automorphism"],
        "--method automorphism needs --automorphism CYCLES",
    );
}

#[test]
fn distance_colourings_reach_the_paley_order() {
    // R(4,4) = 18 (DS1); Paley's (4,4;17) colouring is circulant, hence a
    // distance colouring (Kuznetsov, arXiv:1505.07186: circulants are the
    // distance colourings with symmetric masks). None at 18, as none at all.
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("scan");
    let o = ramsift(&[
        "scan",
        "4,4",
        "--family",
        "distance",
        "--from",
        "16",
        "--to",
        "18",
        "--json",
        "--out",
        out.to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["largest_found"], 17, "{summary}");
    let verdicts: Vec<&str> = summary["orders"]
        .as_array()
        .unwrap()
        .iter()
        .map(|o| o["result"].as_str().unwrap())
        .collect();
    assert_eq!(verdicts, ["found", "found", "none"]);
    let file = checked_witness(&out.join("order-17/witness.colouring"));
    // The colour of {i, j} depends on |i - j| only.
    for j in 1..17 {
        for i in 0..j {
            assert_eq!(file.matrix.colour(i, j), file.matrix.colour(0, j - i));
        }
    }
}

#[test]
fn scan_reports_every_order_and_writes_witnesses() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("scan");
    let o = ramsift(&[
        "scan",
        "3,5",
        "--circulant",
        "--from",
        "12",
        "--to",
        "14",
        "--json",
        "--out",
        out.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    // R(3,5) = 14 with the cyclic (3,5;13) colouring (DS1): found at 13, none at 14.
    let verdicts: Vec<&str> = summary["orders"]
        .as_array()
        .unwrap()
        .iter()
        .map(|o| o["result"].as_str().unwrap())
        .collect();
    assert_eq!(verdicts[1..], ["found", "none"]);
    assert_eq!(summary["largest_found"], 13);
    checked_witness(&out.join("order-13/witness.colouring"));
    assert!(out.join("scan.json").exists());
}

#[test]
fn local_search_method_finds_a_witness() {
    let o = ramsift(&[
        "find", "3,5", "13", "--method", "local", "--seed", "2", "--json",
    ]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["method"], "local");
    assert!(summary["found_by"].as_str().unwrap().contains("tabu"));
}

#[test]
fn bad_structured_options_are_refused() {
    assert_bad_input(
        &["find", "3,3", "5", "--method", "cayley", "--group", "Z1"],
        "--group",
    );
    assert_bad_input(
        &["find", "3,3", "5", "--method", "cayley", "--group", "Z2xZ3"],
        "has 6 elements",
    );
    assert_bad_input(
        &["find", "3,3", "5", "--group", "Z5"],
        "goes with --method cayley",
    );
    assert_bad_input(
        &[
            "find",
            "3,3",
            "7",
            "--method",
            "block-circulant",
            "--blocks",
            "3",
        ],
        "divisible by 3",
    );
    assert_bad_input(
        &["find", "3,3", "5", "--fixed", "1"],
        "--blocks and --fixed go with --method block-circulant",
    );
    assert_bad_input(
        &[
            "find",
            "4,4",
            "17",
            "--method",
            "block-circulant",
            "--blocks",
            "3",
            "--fixed",
            "1",
        ],
        "less 1 to be divisible by 3",
    );
    assert_bad_input(
        &["find", "3,3", "200", "--method", "local"],
        "orders 2 to 128",
    );
    assert_bad_input(&["scan", "3,3", "--from", "9", "--to", "5"], "FROM <= TO");
    assert_bad_input(
        &[
            "scan", "3,3", "--from", "5", "--to", "9", "--family", "petersen",
        ],
        "--family",
    );
    assert_bad_input(
        &[
            "scan",
            "3,3",
            "--from",
            "5",
            "--to",
            "9",
            "--per-order",
            "0",
        ],
        "--per-order",
    );
}

#[test]
fn forbidden_graphs_work_end_to_end_and_bad_ones_are_refused() {
    // R(C4,C4) = 6 (Chvátal & Harary 1972; DS1, from memory; confirmed both ways in
    // tests/tests/graph_ramsey.rs).
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("w");
    let o = ramsift(&["find", "C4,C4", "5", "--out", out.to_str().unwrap(), "-q"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let file = checked_witness(&out.join("witness.colouring"));
    assert_eq!(file.claim.to_string(), "C4,C4");
    assert_eq!(
        ramsift(&["find", "C4,C4", "6", "-q"]).status.code(),
        Some(20)
    );

    assert_bad_input(&["find", "C2,4", "5"], "at least 3 vertices");
    assert_bad_input(&["find", "Q4,4", "5"], "entry 1");
    assert_bad_input(&["find", "G6:D,4", "5"], "graph6");
    assert_bad_input(&["find", "E:0-0/1-2,4", "5"], "loop");
    assert_bad_input(&["find", "C11,3", "12"], "at most 10");
    assert_bad_input(&["find", "C4,4", "3"], "more vertices than K_3");
    assert_bad_input(
        &[
            "refute",
            "C4,4",
            "10",
            "--symmetry",
            "degree-bounds",
            "--out",
            out.to_str().unwrap(),
        ],
        "degree-bounds",
    );
    assert_bad_input(
        &["find", "C4,4", "9", "--circulant"],
        "structured searches handle",
    );
    // Local search takes graph specifications too: a (C4,K4;9) colouring exists
    // (R(C4,K4) = 10, Chvátal & Harary 1972; DS1, from memory).
    let o = ramsift(&["find", "C4,4", "9", "--method", "local", "--json"]);
    assert_eq!(o.status.code(), Some(10), "{}", stderr(&o));
    let found: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!(found["verified_by_checker"].as_bool().unwrap());
    assert!(found["found_by"].as_str().unwrap().contains("focused tabu"));
}

#[test]
fn bounds_report_and_certificates_on_disk() {
    let o = ramsift(&["bounds", "5,5", "--json"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let report: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let value = |bound: &str| {
        report["rows"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["bound"] == bound)
            .unwrap()["value"]
            .clone()
    };
    // Erdős 1947 at k = 5: C(11,5)·2^-9 = 462/512 < 1 ≤ 792/512 = C(12,5)·2^-9.
    assert_eq!(value("first moment"), 11, "numbers as numbers");
    // Published range [43, 46] (Exoo 1989; Angeltveit & McKay 2024; DS1).
    assert_eq!(value("published range"), serde_json::json!([43, 46]));

    // Certificates: a refutation of R(3,3) <= 6 and a witness of R(3,3) > 5.
    let dir = tempfile::tempdir().unwrap();
    let bundle = dir.path().join("r33-6");
    assert_eq!(
        ramsift(&[
            "refute",
            "3,3",
            "6",
            "--out",
            bundle.to_str().unwrap(),
            "-q"
        ])
        .status
        .code(),
        Some(20)
    );
    let witness = dir.path().join("r33-5");
    assert_eq!(
        ramsift(&["find", "3,3", "5", "--out", witness.to_str().unwrap(), "-q"])
            .status
            .code(),
        Some(10)
    );
    let o = ramsift(&[
        "bounds",
        "3,3",
        "--bundles",
        dir.path().to_str().unwrap(),
        "--json",
    ]);
    let report: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let kinds: Vec<(String, u64)> = report["certified"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| {
            (
                c["kind"].as_str().unwrap().to_string(),
                c["order"].as_u64().unwrap(),
            )
        })
        .collect();
    assert_eq!(
        kinds,
        vec![("lower".to_string(), 5), ("upper".to_string(), 6)]
    );
    assert_bad_input(&["bounds", "C4,4"], "for cliques");
}

#[test]
fn draw_writes_svg_and_tikz_and_refuses_bad_input() {
    let dir = tempfile::tempdir().unwrap();
    let witness = dir.path().join("w");
    ramsift(&[
        "find",
        "3,5",
        "13",
        "--circulant",
        "--out",
        witness.to_str().unwrap(),
        "-q",
    ]);
    for (name, layout, marker) in [
        ("f.svg", "circle", "<svg"),
        ("m.svg", "matrix", "url(#fill2)"),
        ("f.tex", "circle", "\\begin{tikzpicture}"),
    ] {
        let out = dir.path().join(name);
        let o = ramsift(&[
            "draw",
            witness.join("witness.colouring").to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
            "--layout",
            layout,
        ]);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        assert!(std::fs::read_to_string(&out).unwrap().contains(marker));
    }
    let w = witness.join("witness.colouring");
    let w = w.to_str().unwrap();
    let png = dir.path().join("f.png");
    assert_bad_input(&["draw", w, "--out", png.to_str().unwrap()], ".svg");
    assert!(!png.exists());
    assert_bad_input(
        &["draw", w, "--out", "x.svg", "--colours", "3"],
        "--colours",
    );
    let broken = dir.path().join("broken.colouring");
    std::fs::write(&broken, "ramsift-colouring spec=3,3 order=3\n. 1\n").unwrap();
    assert_bad_input(
        &["draw", broken.to_str().unwrap(), "--out", "x.svg"],
        ":2: row 0 has 2 entries",
    );
}

#[test]
fn enumerate_writes_one_graph6_line_per_class() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("r34-8.g6");
    let o = ramsift(&[
        "enumerate",
        "3,4",
        "8",
        "--out",
        out.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    // Three (3,4;8)-graphs (McKay's data page; DS1).
    assert_eq!(summary["classes"], 3);
    let graphs = decode_graph6_file("g", &std::fs::read(&out).unwrap()).unwrap();
    assert_eq!(graphs.len(), 3);
    let claim = ramsift_checker::Claim::cliques(&[3, 4]);
    assert!(graphs.iter().all(|m| check_colouring(m, &claim).is_valid()));
    // A timeout that cannot be met writes nothing and exits 1.
    let late = dir.path().join("late.g6");
    let o = ramsift(&[
        "enumerate",
        "4,4",
        "16",
        "--out",
        late.to_str().unwrap(),
        "--timeout",
        "0.05",
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert!(!late.exists());
}

/// Runs ramsift under an address-space limit (KiB), returning the output and the
/// wall time.
fn ramsift_bounded(args: &[&str], memory_kib: u64) -> (Output, std::time::Duration) {
    let started = std::time::Instant::now();
    let o = Command::new("bash")
        .arg("-c")
        .arg(format!("ulimit -v {memory_kib}; exec \"$0\" \"$@\""))
        .arg(env!("CARGO_BIN_EXE_ramsift"))
        .args(args)
        .output()
        .expect("bash runs");
    (o, started.elapsed())
}

#[test]
fn formulas_too_large_for_memory_are_never_built() {
    // (3,9;36) has C(36,9) = 94,143,280 clauses of 36 literals (binomial by hand):
    // about 42 GiB for one solver. find with a timeout falls back to the structured
    // and local searches and ends unknown at the timeout, within 4 GiB.
    let (o, _) = ramsift_bounded(
        &[
            "find",
            "3,9",
            "36",
            "--timeout",
            "3",
            "--max-memory",
            "2G",
            "--json",
        ],
        4 << 20,
    );
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(summary["result"], "unknown");
    // The methods that need the formula refuse, saying the estimate.
    for args in [
        &[
            "find",
            "4,6",
            "34",
            "--method",
            "sat",
            "--max-memory",
            "100M",
        ][..],
        &[
            "refute",
            "3,9",
            "36",
            "--max-memory",
            "1G",
            "--out",
            "/nonexistent/never-written",
        ],
        &[
            "enumerate",
            "3,9",
            "36",
            "--max-memory",
            "1G",
            "--out",
            "/nonexistent/never-written",
        ],
    ] {
        let o = ramsift(args);
        assert_eq!(o.status.code(), Some(2), "{args:?}: {}", stderr(&o));
        assert!(
            stderr(&o).contains("needs about") && stderr(&o).contains("--max-memory"),
            "{}",
            stderr(&o)
        );
    }
    let o = ramsift(&["find", "3,3", "5", "--max-memory", "12Q"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("expected a size such as 512M"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn find_stops_near_its_timeout_whatever_stage_it_is_in() {
    // (4,6;34): no structured colouring exists (the scan of the lower-bound tests),
    // so every stage runs: structured, the formula, seeded SAT and local search.
    // Loading the 1.39 M clauses into a solver takes seconds and used to run past
    // the deadline (18 s for a 10 s timeout); the bound here is generous for load.
    let (o, elapsed) = ramsift_bounded(&["find", "4,6", "34", "--timeout", "8", "-q"], 8 << 20);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    assert!(
        elapsed < std::time::Duration::from_secs(13),
        "took {elapsed:?} for --timeout 8"
    );
}

#[test]
fn used_output_directories_are_refused_or_cleared_with_force() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("w");
    std::fs::create_dir(&out).unwrap();
    std::fs::write(
        out.join("witness.colouring"),
        "stale witness of another run",
    )
    .unwrap();
    let o_path = out.to_str().unwrap();
    // R(3,4) = 9 (Greenwood & Gleason 1955): nothing at 9, so an old witness must not survive.
    for args in [
        &["find", "3,4", "9", "--out", o_path, "-q"][..],
        &["refute", "3,4", "9", "--out", o_path, "-q"],
        &[
            "scan",
            "3,4",
            "--from",
            "8",
            "--to",
            "9",
            "--circulant",
            "--out",
            o_path,
        ],
        &[
            "shard", "plan", "3,4", "9", "--shards", "2", "--out", o_path,
        ],
    ] {
        let o = ramsift(args);
        assert_eq!(o.status.code(), Some(2), "{args:?}: {}", stderr(&o));
        assert!(
            stderr(&o).contains("already holds files") && stderr(&o).contains("--force"),
            "{}",
            stderr(&o)
        );
        assert!(
            out.join("witness.colouring").exists(),
            "a refused run must not touch the directory"
        );
    }
    let o = ramsift(&["find", "3,4", "9", "--out", o_path, "--force", "-q"]);
    assert_eq!(o.status.code(), Some(20), "{}", stderr(&o));
    assert!(
        !out.join("witness.colouring").exists(),
        "--force clears the old witness"
    );
    // --force never clears the working directory or one holding it.
    let o = Command::new(env!("CARGO_BIN_EXE_ramsift"))
        .args(["find", "3,3", "5", "--out", ".", "--force", "-q"])
        .current_dir(&out)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("holds the working directory"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn signals_stop_runs_cleanly_with_their_summary() {
    // (4,5;25) is far from refuted in a few seconds (BENCHMARKS.md), so the run is
    // still solving, its trace and minimality clauses growing in hidden temporary
    // files, when the signal comes.
    let dir = tempfile::tempdir().unwrap();
    for (signal, args) in [
        (libc::SIGINT, vec!["refute", "4,5", "25", "-q", "--out"]),
        (libc::SIGTERM, vec!["find", "4,6", "35", "-q", "--out"]),
    ] {
        let out = dir.path().join(format!("run{signal}"));
        let child = Command::new(env!("CARGO_BIN_EXE_ramsift"))
            .args(&args)
            .arg(&out)
            .stdout(std::process::Stdio::piped())
            .spawn()
            .unwrap();
        std::thread::sleep(std::time::Duration::from_secs(2));
        // SAFETY: kill(2) on the pid of our own child process.
        assert_eq!(unsafe { libc::kill(child.id() as libc::pid_t, signal) }, 0);
        let started = std::time::Instant::now();
        let o = child.wait_with_output().unwrap();
        assert!(
            started.elapsed() < std::time::Duration::from_secs(10),
            "{args:?} ignored the signal"
        );
        assert_eq!(o.status.code(), Some(1), "{args:?}");
        assert!(
            stdout(&o).contains("interrupted by a signal"),
            "{}",
            stdout(&o)
        );
        let left: Vec<String> = std::fs::read_dir(&out)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        assert!(
            left.iter().all(|name| !name.ends_with(".tmp")),
            "{args:?} left {left:?}"
        );
        if args[0] == "find" {
            let summary: serde_json::Value =
                serde_json::from_slice(&std::fs::read(out.join("summary.json")).unwrap()).unwrap();
            assert_eq!(summary["result"], "unknown");
        }
    }
}

/// Runs `program args` with `input` on standard input.
fn run_with_input(program: &str, args: &[&str], input: &[u8]) -> Output {
    use std::io::Write;
    let mut child = Command::new(program)
        .args(args)
        .stdin(std::process::Stdio::piped())
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    child.stdin.take().unwrap().write_all(input).unwrap();
    child.wait_with_output().unwrap()
}

#[test]
fn witnesses_pass_along_by_pipe_json_and_streams() {
    let checker = ramsift_tests_checker();
    // The Paley colouring of order 17 is the unique (4,4;17) colouring (DS1).
    let o = ramsift(&["find", "4,4", "17", "-q"]);
    assert_eq!(o.status.code(), Some(10));
    let checked = run_with_input(&checker, &["colouring", "-"], &o.stdout);
    assert_eq!(checked.status.code(), Some(0), "{}", stdout(&checked));
    assert!(
        stdout(&checked).starts_with("PASS: R(4,4) > 17"),
        "{}",
        stdout(&checked)
    );
    // --json carries the colouring itself: rows, and graph6 for two colours.
    let o = ramsift(&["find", "3,3,3", "16", "--json"]);
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let rows = summary["colouring"].as_array().unwrap();
    assert_eq!(rows.len(), 16);
    assert!(rows
        .iter()
        .enumerate()
        .all(|(i, r)| r[i] == 0 && r.as_array().unwrap().len() == 16));
    let o = ramsift(&["find", "3,3", "5", "--json"]);
    let summary: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!(summary["graph6_colour1"].is_string() && summary["colouring"][0][1].is_number());
    // Three-colour enumeration writes a stream of colouring files that the checker
    // and draw read: (3,3,3;16) has 2 colourings up to isomorphism and colour
    // permutation (Kalbfleisch & Stanton 1968).
    let dir = tempfile::tempdir().unwrap();
    let stream = dir.path().join("classes.txt");
    let o = ramsift(&[
        "enumerate",
        "3,3,3",
        "16",
        "--swap-colours",
        "--out",
        stream.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let checked = Command::new(&checker)
        .args(["colouring", stream.to_str().unwrap()])
        .output()
        .unwrap();
    assert_eq!(checked.status.code(), Some(0), "{}", stdout(&checked));
    assert!(
        stdout(&checked).contains("2 colouring(s) checked"),
        "{}",
        stdout(&checked)
    );
    let figure = dir.path().join("first.svg");
    let o = run_with_input(
        env!("CARGO_BIN_EXE_ramsift"),
        &["draw", "-", "--out", figure.to_str().unwrap()],
        &std::fs::read(&stream).unwrap(),
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert!(std::fs::read_to_string(&figure)
        .unwrap()
        .contains("the first of 2"));
}

/// The checker binary beside this package's binary (built by `cargo test --workspace`).
fn ramsift_tests_checker() -> String {
    let path = std::path::Path::new(env!("CARGO_BIN_EXE_ramsift")).with_file_name("ramsift-check");
    if !path.is_file() {
        let mut build = Command::new(env!("CARGO"));
        build.args(["build", "-p", "ramsift-checker", "--bin", "ramsift-check"]);
        if path.parent().is_some_and(|dir| dir.ends_with("release")) {
            build.arg("--release");
        }
        let status = build.status().unwrap();
        assert!(status.success());
    }
    path.to_str().unwrap().to_string()
}

#[test]
fn input_errors_under_json_are_json_records() {
    for args in [
        &["find", "3,x", "5", "--json"][..],
        &[
            "refute",
            "3,3",
            "6",
            "--out",
            "/nonexistent/r",
            "--max-memory",
            "1M",
            "--json",
        ],
        &["scan", "3,3", "--from", "9", "--to", "5", "--json"],
    ] {
        let o = ramsift(args);
        assert_eq!(o.status.code(), Some(2), "{args:?}");
        let record: serde_json::Value =
            serde_json::from_str(stdout(&o).trim()).expect("one JSON record");
        assert_eq!(record["result"], "error", "{args:?}");
        assert_eq!(record["exit_code"], 2);
        assert!(!record["error"].as_str().unwrap().is_empty());
    }
    // Counts read as words: one attempt, not "1 attempts".
    let o = ramsift(&["find", "3,3", "5"]);
    assert!(stdout(&o).contains("1 attempt,"), "{}", stdout(&o));
}

#[test]
fn every_command_speaks_the_same_json() {
    let dir = tempfile::tempdir().unwrap();
    let p = |name: &str| dir.path().join(name).to_str().unwrap().to_string();
    let (plan, witness) = (p("plan"), p("w"));
    ramsift(&["find", "3,3", "5", "--out", &witness, "-q"]);
    // Each command with the fields its record documents (README "One JSON record").
    let runs: Vec<(Vec<String>, &[&str])> = vec![
        (
            vec!["find".into(), "3,3".into(), "5".into()],
            &["instance", "proves", "colouring", "seconds"],
        ),
        (
            vec![
                "refute".into(),
                "3,3".into(),
                "6".into(),
                "--out".into(),
                p("r"),
            ],
            &["proves", "bundle", "seconds", "files"],
        ),
        (
            vec![
                "scan".into(),
                "3,4".into(),
                "--from".into(),
                "7".into(),
                "--to".into(),
                "8".into(),
                "--circulant".into(),
            ],
            &["orders", "largest_found", "seconds"],
        ),
        (
            vec![
                "encode".into(),
                "3,3".into(),
                "5".into(),
                "--out".into(),
                p("f.cnf"),
            ],
            &["variables", "clauses", "seconds"],
        ),
        (
            vec![
                "enumerate".into(),
                "3,3".into(),
                "5".into(),
                "--out".into(),
                p("e.g6"),
            ],
            &["classes", "seconds"],
        ),
        (vec!["bounds".into(), "3,4".into()], &["rows", "spec"]),
        (
            vec![
                "draw".into(),
                format!("{witness}/witness.colouring"),
                "--out".into(),
                p("f.svg"),
            ],
            &["figure", "order"],
        ),
        (
            vec![
                "shard".into(),
                "plan".into(),
                "3,4".into(),
                "9".into(),
                "--shards".into(),
                "2".into(),
                "--symmetry".into(),
                "lex-leader".into(),
                "--out".into(),
                plan.clone(),
            ],
            &["cubes", "shards"],
        ),
        (
            vec!["shard".into(), "status".into(), plan.clone()],
            &["done", "missing"],
        ),
        (
            vec![
                "shard".into(),
                "run".into(),
                plan.clone(),
                "--index".into(),
                "0".into(),
            ],
            &["shard"],
        ),
        (
            vec!["shard".into(), "local".into(), plan.clone()],
            &["ran", "found"],
        ),
        (
            vec![
                "shard".into(),
                "merge".into(),
                plan.clone(),
                "--out".into(),
                p("m"),
            ],
            &["proves", "bundle", "seconds"],
        ),
        (vec!["find".into(), "3,x".into(), "5".into()], &["error"]),
    ];
    for (mut args, fields) in runs {
        args.push("--json".into());
        let refs: Vec<&str> = args.iter().map(String::as_str).collect();
        let o = ramsift(&refs);
        let record: serde_json::Value = serde_json::from_str(&stdout(&o))
            .unwrap_or_else(|e| panic!("{args:?}: not one JSON record ({e}): {}", stdout(&o)));
        assert!(record["result"].is_string(), "{args:?}: {record}");
        assert_eq!(
            record["exit_code"].as_i64(),
            o.status.code().map(i64::from),
            "{args:?}"
        );
        for field in fields {
            assert!(
                record.get(*field).is_some(),
                "{args:?} lacks {field}: {record}"
            );
        }
        assert!(
            record.get("solve_seconds").is_none() && record.get("claim").is_none(),
            "{args:?}"
        );
    }
    // Colourings travel in the records: scan (per family found), enumerate (every
    // class) and shards that find one (R(3,3) = 6: K_5 has one; Greenwood & Gleason 1955).
    let o = ramsift(&[
        "scan",
        "3,3",
        "--from",
        "5",
        "--to",
        "5",
        "--circulant",
        "--json",
    ]);
    let scan: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(
        scan["orders"][0]["families"][0]["colouring"]
            .as_array()
            .unwrap()
            .len(),
        5
    );
    let o = ramsift(&["enumerate", "3,4", "8", "--out", &p("e8.g6"), "--json"]);
    let enumerated: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(
        enumerated["colourings"].as_array().unwrap().len(),
        3,
        "(3,4;8): 3 graphs (McKay's data)"
    );
    let false_plan = p("false");
    ramsift(&[
        "shard",
        "plan",
        "3,3",
        "5",
        "--shards",
        "2",
        "--symmetry",
        "none",
        "--out",
        &false_plan,
    ]);
    let o = ramsift(&["shard", "local", &false_plan, "--json"]);
    let local: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(local["result"], "found");
    assert_eq!(local["colourings"][0].as_array().unwrap().len(), 5);
}

#[test]
fn a_dash_means_standard_input_or_output() {
    // 10 edge variables and 2·C(5,3) = 20 clauses for (3,3;5) (by hand).
    let o = ramsift(&["encode", "3,3", "5", "--out", "-"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert!(stdout(&o).contains("\np cnf 10 20\n"), "{}", stdout(&o));
    // (3,4;8): 3 colourings up to isomorphism (McKay's Ramsey-graph data).
    let o = ramsift(&["enumerate", "3,4", "8", "--out", "-"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert_eq!(stdout(&o).lines().count(), 3);
    let checked = run_with_input(
        &ramsift_tests_checker(),
        &["colouring", "-", "--forbid", "3,4"],
        &o.stdout,
    );
    assert_eq!(checked.status.code(), Some(0), "{}", stdout(&checked));
    // A formula on standard input, its proof from a file.
    let dir = tempfile::tempdir().unwrap();
    let bundle = dir.path().join("b");
    ramsift(&[
        "refute",
        "3,3",
        "6",
        "--symmetry",
        "none",
        "--out",
        bundle.to_str().unwrap(),
        "-q",
    ]);
    let formula = ramsift(&["encode", "3,3", "6", "--out", "-"]).stdout;
    let proof = bundle.join("proof.drat");
    let checked = run_with_input(
        &ramsift_tests_checker(),
        &["drat", "-", proof.to_str().unwrap()],
        &formula,
    );
    assert_eq!(checked.status.code(), Some(0), "{}", stdout(&checked));
    let refused = ramsift(&["enumerate", "3,4", "8", "--out", "-", "--json"]);
    assert_eq!(refused.status.code(), Some(2));
    // A figure to standard output, from a colouring on standard input.
    let colouring = ramsift(&["find", "3,3", "5", "-q"]).stdout;
    let figure = run_with_input(
        env!("CARGO_BIN_EXE_ramsift"),
        &["draw", "-", "--out", "-"],
        &colouring,
    );
    assert_eq!(figure.status.code(), Some(0), "{}", stderr(&figure));
    assert!(stdout(&figure).starts_with("<svg"), "{}", stdout(&figure));
    // A pipe named as a file is refused with the hint to use -.
    let o = Command::new("bash")
        .arg("-c")
        .arg(format!(
            "\"{}\" find 4,4 17 -q | \"{}\" colouring /dev/stdin",
            env!("CARGO_BIN_EXE_ramsift"),
            ramsift_tests_checker()
        ))
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("give - for standard input"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn local_search_keeps_its_best_near_solution() {
    // (4,6;35) colourings exist (R(4,6) >= 36, Exoo 2012; DS1), but local search
    // finds none in a second (16 cliques remained after 30 minutes, BENCHMARKS.md):
    // the run ends unknown, keeping its best.
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("local");
    let o = ramsift(&[
        "find",
        "4,6",
        "35",
        "--method",
        "local",
        "--timeout",
        "1",
        "--out",
        out.to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(o.status.code(), Some(1), "{}", stderr(&o));
    let text = std::fs::read_to_string(out.join("near-solution.colouring")).unwrap();
    assert!(
        text.starts_with("# best near-solution of local search: "),
        "{text}"
    );
    let file = parse_colouring_file("near", &text).unwrap();
    assert_eq!(file.matrix.order(), 35);
    assert!(
        !check_colouring(&file.matrix, &file.claim).is_valid(),
        "a near-solution, not a solution"
    );
}
