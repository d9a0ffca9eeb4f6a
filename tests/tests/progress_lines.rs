//! Long work says how far it got, on stderr and only on a terminal: the checker
//! (what it reads, lemmas checked), shard planning and local search. A terminal is
//! given with `script` (util-linux), which runs a command under a pseudo-terminal;
//! without one, stderr stays empty.

use std::process::Command;

use ramsift_tests::binaries::workspace_binary;

/// Output of `program args` run under a pseudo-terminal.
fn on_a_terminal(program: &std::path::Path, args: &[&str]) -> String {
    let line = std::iter::once(program.to_str().unwrap())
        .chain(args.iter().copied())
        .collect::<Vec<_>>()
        .join(" ");
    let o = Command::new("script")
        .args(["-qec", &line, "/dev/null"])
        .output()
        .expect("script (util-linux) runs");
    String::from_utf8_lossy(&o.stdout).replace('\r', "\n")
}

#[test]
fn long_work_shows_progress_on_a_terminal_only() {
    let dir = tempfile::tempdir().unwrap();
    let bundle = dir.path().join("b");
    let (ramsift, checker) = (
        workspace_binary("ramsift"),
        workspace_binary("ramsift-check"),
    );
    // R(4,4) = 18 (Greenwood & Gleason 1955; Radziszowski DS1).
    let o = Command::new(&ramsift)
        .args([
            "refute",
            "4,4",
            "18",
            "--symmetry",
            "lex-leader",
            "-q",
            "--out",
            bundle.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(20));
    let (formula, proof) = (bundle.join("formula.cnf.gz"), bundle.join("proof.drat"));
    let (formula, proof) = (formula.to_str().unwrap(), proof.to_str().unwrap());
    let shown = on_a_terminal(&checker, &["drat", formula, proof]);
    assert!(
        shown.contains("reading ") && shown.contains("lemmas checked"),
        "{shown}"
    );
    assert!(shown.contains("PASS: "), "{shown}");
    let quiet = Command::new(&checker)
        .args(["drat", formula, proof])
        .output()
        .unwrap();
    assert!(
        quiet.stderr.is_empty(),
        "{}",
        String::from_utf8_lossy(&quiet.stderr)
    );

    let plan = dir.path().join("plan");
    let shown = on_a_terminal(
        &ramsift,
        &[
            "shard",
            "plan",
            "4,4",
            "18",
            "--shards",
            "8",
            "--symmetry",
            "lex-leader",
            "--out",
            plan.to_str().unwrap(),
        ],
    );
    assert!(shown.contains("planned (4,4;18) as 8 shards"), "{shown}");
    // (4,6;35): local search runs its full second, showing its best so far.
    let shown = on_a_terminal(
        &ramsift,
        &["find", "4,6", "35", "--method", "local", "--timeout", "1"],
    );
    assert!(shown.contains("fewest monochromatic copies"), "{shown}");
}
