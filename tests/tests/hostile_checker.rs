//! The checker under hostile input, end to end through `ramsift-check`: each case
//! is one a referee could be handed by someone else (a crafted number, a link to a
//! device, a damaged or looping premise) and must end in a clear verdict with
//! bounded memory, never a crash, a hang or an unconditional pass it has not earned.

use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};
use std::time::{Duration, Instant};

use ramsift_tests::binaries::workspace_binary;
use ramsift_tests::hostile_inputs::{
    isolated_vertices_claim, long_minimality_line, many_minimality_lines, multipartite_colouring,
    unit_clause_formula, unit_lemma_trace,
};

// The worked example of the LRAT paper (Cruz-Filipe, Heule, Hunt, Kaufmann &
// Schneider-Kamp, CADE 2017): all four clauses over two variables.
const CLAUSES: &str = "1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n";

/// Runs a command under a virtual-memory limit (KiB) and a watchdog; a run past
/// `limit` is killed and fails the test as a hang.
fn run_bounded(program: &Path, args: &[&str], memory_kib: u64, limit: Duration) -> Output {
    let mut child = Command::new("bash")
        .arg("-c")
        .arg(format!("ulimit -v {memory_kib}; exec \"$0\" \"$@\""))
        .arg(program)
        .args(args)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("bash runs");
    let started = Instant::now();
    while child.try_wait().expect("wait works").is_none() {
        if started.elapsed() > limit {
            let _ = child.kill();
            panic!("{} {args:?} still ran after {limit:?}", program.display());
        }
        std::thread::sleep(Duration::from_millis(20));
    }
    child.wait_with_output().expect("output is collected")
}

/// `ramsift-check ARGS` under `memory_kib` of address space and a `seconds` watchdog:
/// its exit code and last line.
fn check_within(args: &[&str], memory_kib: u64, seconds: u64) -> (i32, String) {
    verdict(&run_bounded(
        &workspace_binary("ramsift-check"),
        args,
        memory_kib,
        Duration::from_secs(seconds),
    ))
}

fn check(args: &[&str]) -> Output {
    run_bounded(
        &workspace_binary("ramsift-check"),
        args,
        1 << 20,
        Duration::from_secs(60),
    )
}

fn ramsift(args: &[&str]) -> Output {
    let o = Command::new(workspace_binary("ramsift"))
        .args(args)
        .output()
        .expect("ramsift runs");
    assert!(
        matches!(o.status.code(), Some(0 | 10 | 20)),
        "ramsift {args:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    o
}

/// Exit code and the last stdout line.
fn verdict(o: &Output) -> (i32, String) {
    let out = String::from_utf8_lossy(&o.stdout);
    let last = out.lines().last().unwrap_or_default().to_string();
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(!err.contains("panicked"), "{err}");
    (o.status.code().unwrap_or(-1), format!("{last} | {err}"))
}

fn write(dir: &Path, name: &str, content: &[u8]) -> PathBuf {
    let path = dir.join(name);
    std::fs::write(&path, content).unwrap();
    path
}

fn s(p: &Path) -> &str {
    p.to_str().unwrap()
}

#[test]
fn huge_numbers_in_a_proof_or_header_do_not_size_memory() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let cnf = write(d, "f.cnf", format!("p cnf 2 4\n{CLAUSES}").as_bytes());
    // A lemma on a fresh variable numbered 2e9 is RAT (no clause has its negation),
    // so this is a valid refutation: it must pass within 1 GiB of address space.
    let proof = write(d, "big.drat", b"2000000000 0\n-2 0\n1 0\n0\n");
    let (code, last) = verdict(&check(&["drat", s(&cnf), s(&proof)]));
    assert_eq!(code, 0, "{last}");
    assert!(last.starts_with("PASS: "), "{last}");
    let lrat = dir.path().join("big.lrat");
    let (code, last) = verdict(&check(&[
        "drat",
        s(&cnf),
        s(&proof),
        "--emit-lrat",
        s(&lrat),
    ]));
    assert_eq!(code, 0, "{last}");
    let (code, last) = verdict(&check(&["lrat", s(&cnf), s(&lrat)]));
    assert_eq!(code, 0, "{last}");
    // The same lemma alone refutes nothing: FAIL, not an abort.
    let alone = write(d, "alone.drat", b"2000000000 0\n");
    let (code, last) = verdict(&check(&["drat", s(&cnf), s(&alone)]));
    assert_eq!(code, 1, "{last}");
    assert!(last.starts_with("FAIL: "), "{last}");
    // A header declaring 2^31-1 variables is valid DIMACS; memory follows use.
    let wide = write(
        d,
        "wide.cnf",
        format!("p cnf 2147483647 4\n{CLAUSES}").as_bytes(),
    );
    let proof = write(d, "p.drat", b"-2 0\n1 0\n0\n");
    let (code, last) = verdict(&check(&["drat", s(&wide), s(&proof)]));
    assert_eq!(code, 0, "{last}");
    let wide_lrat = write(d, "w.lrat", b"5 -2 0 4 3 0\n6 1 0 5 1 0\n7 0 5 2 6 0\n");
    let (code, last) = verdict(&check(&["lrat", s(&wide), s(&wide_lrat)]));
    assert_eq!(code, 0, "{last}");
}

#[test]
fn the_most_negative_literal_is_refused() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let cnf = write(d, "f.cnf", format!("p cnf 2 4\n{CLAUSES}").as_bytes());
    let lrat = write(d, "p.lrat", b"5 -2147483648 0 4 3 0\n");
    let (code, last) = verdict(&check(&["lrat", s(&cnf), s(&lrat)]));
    assert_eq!(code, 2, "{last}");
    assert!(last.contains("outside ±2147483647"), "{last}");
    let drat = write(d, "p.drat", b"-2147483648 0\n");
    let (code, last) = verdict(&check(&["drat", s(&cnf), s(&drat)]));
    assert_eq!(code, 2, "{last}");
    assert!(last.contains("within ±2147483647"), "{last}");
}

#[test]
fn devices_fifos_and_links_out_are_not_read() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let cnf = write(d, "f.cnf", format!("p cnf 2 4\n{CLAUSES}").as_bytes());
    let zero = d.join("zero.drat");
    std::os::unix::fs::symlink("/dev/zero", &zero).unwrap();
    let (code, last) = verdict(&check(&["drat", s(&cnf), s(&zero)]));
    assert_eq!(code, 2, "{last}");
    assert!(last.contains("only regular files"), "{last}");
    let fifo = d.join("formula.fifo");
    assert!(Command::new("mkfifo")
        .arg(&fifo)
        .status()
        .unwrap()
        .success());
    let proof = write(d, "p.drat", b"-2 0\n1 0\n0\n");
    let (code, last) = verdict(&check(&["drat", s(&fifo), s(&proof)]));
    assert_eq!(code, 2, "{last}");
    assert!(last.contains("only regular files"), "{last}");
    let (code, last) = verdict(&check(&["colouring", s(d), "--forbid", "3,3"]));
    assert_eq!(code, 2, "{last}");

    // Inside a bundle, a listed file that links out is a failure of the bundle.
    let bundle = d.join("bundle");
    ramsift(&["refute", "3,3", "6", "--out", s(&bundle), "-q"]);
    let trace = bundle.join("proof.drat");
    std::fs::remove_file(&trace).unwrap();
    std::os::unix::fs::symlink("/dev/zero", &trace).unwrap();
    let (code, last) = verdict(&check(&["bundle", s(&bundle)]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("leads outside the bundle"), "{last}");
}

/// `ramsift refute 3,4 9`: with degree bounds it rests on R(3,3) <= 6, which the
/// bundle certifies in premises/R3-3-6 (R(3,3)=6, R(3,4)=9: Greenwood & Gleason
/// 1955; Radziszowski DS1).
fn bundle_with_premise(d: &Path, name: &str, extra: &[&str]) -> PathBuf {
    let bundle = d.join(name);
    let mut args = vec!["refute", "3,4", "9", "--out", s(&bundle), "-q"];
    args.extend_from_slice(extra);
    ramsift(&args);
    bundle
}

#[test]
fn premises_pass_fail_or_stay_conditional_and_never_silently() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let full = bundle_with_premise(d, "full", &[]);
    assert!(full.join("premises/R3-3-6/manifest.json").is_file());
    let (code, last) = verdict(&check(&["bundle", s(&full)]));
    assert_eq!(code, 0, "{last}");
    assert!(
        last.starts_with("PASS: R(3,4) <= 9, with nothing assumed"),
        "{last}"
    );

    // Assumed premises: a pass of its own kind, exit 3, said on the last line.
    let assumed = bundle_with_premise(d, "assumed", &["--assume-premises"]);
    let (code, last) = verdict(&check(&["bundle", s(&assumed)]));
    assert_eq!(code, 3, "{last}");
    assert!(
        last.starts_with("CONDITIONAL: R(3,4) <= 9 holds only if R(3,3) <= 6"),
        "{last}"
    );
    let json = check(&["bundle", s(&assumed), "--json"]);
    let value: serde_json::Value = serde_json::from_slice(&json.stdout).unwrap();
    assert_eq!(value["verdict"], "CONDITIONAL");
    assert_eq!(value["exit_code"], 3);
    let premise = full.join("premises/R3-3-6");
    let (code, last) = verdict(&check(&["bundle", s(&assumed), "--premise", s(&premise)]));
    assert_eq!(code, 0, "{last}");

    // A named premise that does not exist, or is not a bundle, fails the check.
    let (code, last) = verdict(&check(&[
        "bundle",
        s(&assumed),
        "--premise",
        "/nonexistent/premise",
    ]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("/nonexistent/premise"), "{last}");
    let (code, last) = verdict(&check(&["bundle", s(&assumed), "--premise", s(d)]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("manifest.json"), "{last}");

    // A damaged premise bundle fails the whole check and is named.
    let damaged = bundle_with_premise(d, "damaged", &[]);
    let trace = damaged.join("premises/R3-3-6/proof.drat");
    let bytes = std::fs::read(&trace).unwrap();
    std::fs::write(&trace, &bytes[..bytes.len() / 2]).unwrap();
    let (code, last) = verdict(&check(&["bundle", s(&damaged)]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("premises/R3-3-6 fails"), "{last}");
}

#[test]
fn premise_links_that_loop_or_leave_end_in_a_verdict() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    for (name, target, expected) in [
        ("self", "self", "cannot be opened"),
        ("up", "..", "rests on itself"),
        ("out", "/tmp", "outside the bundle"),
    ] {
        let bundle = bundle_with_premise(d, name, &[]);
        std::os::unix::fs::symlink(target, bundle.join("premises").join(name)).unwrap();
        let (code, last) = verdict(&check(&["bundle", s(&bundle)]));
        assert_eq!(code, 1, "{name}: {last}");
        assert!(last.contains(expected), "{name}: {last}");
    }
    // Bundles nested nine deep, each in the previous one's premises/: the claim
    // R(3,4) <= 9 uses only R(3,3) <= 6, so the copies (R(3,4) <= 9 again) are
    // listed as not checked rather than checked level by level.
    let deep = bundle_with_premise(d, "deep0", &[]);
    let mut current = deep.clone();
    for level in 1..=9 {
        let next = current.join("premises").join(format!("copy{level}"));
        copy_dir(&deep, &next, &format!("copy{level}"));
        current = next;
    }
    let (code, last) = verdict(&check(&["bundle", s(&deep)]));
    assert_eq!(code, 0, "{last}");
    let text = String::from_utf8_lossy(&check(&["bundle", s(&deep)]).stdout).to_string();
    assert!(
        text.contains("premises/copy1 (R(3,4) <= 9): not checked"),
        "{text}"
    );
}

/// Copies a bundle's files (not its premises/ folder's copies named `skip`).
fn copy_dir(from: &Path, to: &Path, skip: &str) {
    std::fs::create_dir_all(to).unwrap();
    for entry in std::fs::read_dir(from).unwrap() {
        let entry = entry.unwrap();
        if entry.file_name() == skip || entry.file_name().to_string_lossy().starts_with("copy") {
            continue;
        }
        let target = to.join(entry.file_name());
        if entry.file_type().unwrap().is_dir() {
            copy_dir(&entry.path(), &target, skip);
        } else {
            std::fs::copy(entry.path(), target).unwrap();
        }
    }
}

#[test]
fn claimed_orders_are_bounded_before_any_regeneration() {
    let dir = tempfile::tempdir().unwrap();
    let bundle = dir.path().join("b");
    ramsift(&["refute", "3,3", "6", "--out", s(&bundle), "-q"]);
    let manifest_path = bundle.join("manifest.json");
    let original: serde_json::Value =
        serde_json::from_slice(&std::fs::read(&manifest_path).unwrap()).unwrap();
    for (order, code, expected) in [
        (10_000, 2, "orders up to 1000"),
        (900, 1, "clauses of the bundled formula"),
    ] {
        let mut m = original.clone();
        m["claim"]["order"] = serde_json::json!(order);
        m["claim"]["statement"] = serde_json::json!(format!("R(3,3) <= {order}"));
        std::fs::write(&manifest_path, serde_json::to_vec(&m).unwrap()).unwrap();
        let (got, last) = verdict(&check(&["bundle", s(&bundle)]));
        assert_eq!(got, code, "order {order}: {last}");
        assert!(last.contains(expected), "order {order}: {last}");
    }
}

#[test]
fn colouring_failures_name_the_forbidden_graph_and_its_edges() {
    let dir = tempfile::tempdir().unwrap();
    // The pentagon 0-1-2-3-4-0 is "Dhc" (McKay's graph6 description).
    let c5 = write(dir.path(), "c5.g6", b"Dhc\n");
    let (code, last) = verdict(&check(&["colouring", s(&c5), "--forbid", "C5,3"]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("monochromatic C5 on vertices"), "{last}");
    assert!(
        last.contains("0-1") && last.contains("3-4") && last.contains("0-4"),
        "{last}"
    );
    let (code, last) = verdict(&check(&["colouring", s(&c5), "--forbid", "C4,P3"]));
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("colour 2 has a monochromatic P3"), "{last}");
}

// Costs: each case below is small on disk and ran for minutes or needed gigabytes
// before the checker bounded its work and memory by the input's size.

/// A (3,3;6) bundle (R(3,3) = 6: Greenwood & Gleason 1955) in `d/name`.
fn small_bundle(d: &Path, name: &str) -> PathBuf {
    let bundle = d.join(name);
    ramsift(&["refute", "3,3", "6", "--out", s(&bundle), "-q"]);
    bundle
}

#[test]
fn premise_links_at_every_level_are_checked_once() {
    // Six levels, each bundle's premises/ holding the next level and eight links to
    // it: checked link by link, that is 9^6 full checks (over a minute before).
    let dir = tempfile::tempdir().unwrap();
    let pristine = bundle_with_premise(dir.path(), "pristine", &[]);
    let top = dir.path().join("top");
    copy_dir(&pristine, &top, "none");
    let mut current = top.clone();
    for _level in 1..=6 {
        let next = current.join("premises").join("next");
        copy_dir(&pristine, &next, "none");
        for link in 1..=8 {
            std::os::unix::fs::symlink(
                "next",
                current.join("premises").join(format!("link{link}")),
            )
            .unwrap();
        }
        current = next;
    }
    let (code, last) = verdict(&check(&["bundle", s(&top)]));
    assert_eq!(code, 0, "{last}");
    assert!(
        last.starts_with("PASS: R(3,4) <= 9, with nothing assumed"),
        "{last}"
    );
}

#[test]
fn a_trace_of_sixteen_million_unit_lemmas_stays_within_memory() {
    let dir = tempfile::tempdir().unwrap();
    let bundle = small_bundle(dir.path(), "b");
    let expanded = unit_lemma_trace(&bundle, 16_000_000);
    assert!(
        std::fs::metadata(bundle.join("proof.drat")).unwrap().len() < 200_000,
        "{expanded}"
    );
    let (code, last) = verdict(&check(&["bundle", s(&bundle)]));
    assert!(matches!(code, 0 | 1), "{last}");
    assert!(
        last.starts_with("PASS: ") || last.contains("neither RUP nor RAT"),
        "{last}"
    );
}

#[test]
fn a_formula_whose_header_cannot_match_the_claim_is_refused_before_it_is_read() {
    let dir = tempfile::tempdir().unwrap();
    let bundle = small_bundle(dir.path(), "b");
    unit_clause_formula(&bundle, 16_000_000);
    // 512 MiB: room for the 64 MB expanded file, not for 16 million parsed clauses.
    let (code, last) = check_within(&["bundle", s(&bundle)], 512 << 10, 60);
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("is not the formula of the claim"), "{last}");
}

#[test]
fn a_minimality_line_longer_than_the_claim_allows_is_refused_before_it_is_stored() {
    // 150 MB on one line; the 512 MiB limit leaves room for the file but not for
    // its 75 million tokens.
    let dir = tempfile::tempdir().unwrap();
    let bundle = small_bundle(dir.path(), "b");
    long_minimality_line(&bundle, 75_000_000);
    let (code, last) = check_within(&["bundle", s(&bundle)], 512 << 10, 60);
    assert_eq!(code, 1, "{last}");
    assert!(
        last.contains("minimality.txt:3") && last.contains("longer than"),
        "{last}"
    );
}

#[test]
fn regenerating_a_graph_with_isolated_vertices_does_not_walk_its_automorphisms() {
    // One edge among ten vertices ("I_???????" in graph6) in K20: 20!/10! placements,
    // but only C(20,2) = 190 copies, far more than the small formula's clauses.
    let dir = tempfile::tempdir().unwrap();
    let bundle = small_bundle(dir.path(), "b");
    isolated_vertices_claim(&bundle);
    let (code, last) = verdict(&check(&["bundle", s(&bundle)]));
    assert!(matches!(code, 1 | 2), "{last}");
    assert!(last.contains("clauses"), "{last}");
}

#[test]
fn a_complete_multipartite_colouring_of_k120_checks_at_once() {
    // Colour 1 joins different parts of eight parts of 15 (largest clique 8), colour 2
    // lies inside the parts (eight disjoint K15): no K9 in colour 1, no K16 in colour 2,
    // so R(9,16) > 120 (a bound of Turán's construction, far below the known ones).
    let dir = tempfile::tempdir().unwrap();
    let text = multipartite_colouring(8, 15);
    let file = write(dir.path(), "k120.colouring", text.as_bytes());
    let (code, last) = check_within(&["colouring", s(&file)], 1 << 20, 20);
    assert_eq!(code, 0, "{last}");
    assert!(last.starts_with("PASS: R(9,16) > 120"), "{last}");
    // One edge inside a part recoloured 1 makes a K9 in colour 1.
    let mut bad = text
        .lines()
        .map(|l| l.split(' ').map(str::to_string).collect::<Vec<_>>())
        .collect::<Vec<_>>();
    (bad[1][1], bad[2][0]) = ("1".into(), "1".into());
    let bad: Vec<String> = bad.iter().map(|row| row.join(" ")).collect();
    let file = write(
        dir.path(),
        "bad.colouring",
        (bad.join("\n") + "\n").as_bytes(),
    );
    let (code, last) = check_within(&["colouring", s(&file)], 1 << 20, 20);
    assert_eq!(code, 1, "{last}");
    assert!(last.contains("monochromatic K9"), "{last}");
}

#[test]
fn a_form_feed_in_a_text_proof_is_white_space() {
    let dir = tempfile::tempdir().unwrap();
    let cnf = write(
        dir.path(),
        "f.cnf",
        format!("p cnf 2 4\n{CLAUSES}").as_bytes(),
    );
    let proof = write(dir.path(), "p.drat", b"-2 0\x0c\n1 0\n0\n");
    let (code, last) = verdict(&check(&["drat", s(&cnf), s(&proof)]));
    assert_eq!(code, 0, "{last}");
}

#[test]
fn many_minimality_lines_at_a_large_order_cost_their_length_only() {
    // The claim R(1000,1000) <= 1000 has a two-clause formula; 30,000 minimality
    // lines each swap vertices 1 and 2 (the K_3 example of checker/src/minimality.rs).
    let dir = tempfile::tempdir().unwrap();
    let bundle = small_bundle(dir.path(), "b");
    many_minimality_lines(&bundle, 30_000);
    let o = run_bounded(
        &workspace_binary("ramsift-check"),
        &["bundle", s(&bundle)],
        1 << 20,
        Duration::from_secs(10),
    );
    let (code, last) = verdict(&o);
    assert_eq!(code, 1, "{last}");
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(text.contains("30000 minimality clauses verified"), "{text}");
}
