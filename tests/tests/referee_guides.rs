//! Every command a bundle's REFEREE.txt suggests (the lines starting with `$ `)
//! must succeed when run as written in the bundle's directory: for a single-trace
//! bundle, a sharded one, and a sharded one with a composed single trace.

use std::path::Path;
use std::process::Command;

use ramsift_tests::binaries::workspace_binary;

fn ramsift(args: &[&str]) {
    let o = Command::new(workspace_binary("ramsift"))
        .args(args)
        .output()
        .expect("ramsift runs");
    assert!(
        matches!(o.status.code(), Some(0 | 20)),
        "ramsift {args:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
}

/// Runs every `$ ` line of the guide in `bundle`; returns how many ran.
fn run_guide(bundle: &Path) -> usize {
    workspace_binary("ramsift-check");
    let bin_dir = workspace_binary("ramsift").parent().unwrap().to_path_buf();
    let path = format!(
        "{}:{}",
        bin_dir.display(),
        std::env::var("PATH").unwrap_or_default()
    );
    let guide = std::fs::read_to_string(bundle.join("REFEREE.txt")).unwrap();
    let commands: Vec<&str> = guide
        .lines()
        .filter_map(|l| l.trim_start().strip_prefix("$ "))
        .collect();
    for command in &commands {
        let o = Command::new("bash")
            .arg("-c")
            .arg(command)
            .current_dir(bundle)
            .env("PATH", &path)
            .output()
            .unwrap();
        assert_eq!(
            o.status.code(),
            Some(0),
            "`{command}` in {}:\n{}\n{}",
            bundle.display(),
            String::from_utf8_lossy(&o.stdout),
            String::from_utf8_lossy(&o.stderr)
        );
    }
    commands.len()
}

#[test]
fn single_trace_guide_commands_succeed_and_premises_are_stated_exactly() {
    let dir = tempfile::tempdir().unwrap();
    // R(4,4) = 18 (Greenwood & Gleason 1955; Radziszowski DS1), resting on R(3,4) <= 9.
    let bundle = dir.path().join("r44");
    ramsift(&[
        "refute",
        "4,4",
        "18",
        "--out",
        bundle.to_str().unwrap(),
        "-q",
    ]);
    let guide = std::fs::read_to_string(bundle.join("REFEREE.txt")).unwrap();
    assert!(
        guide.contains("R(3,4) <= 9") && guide.contains("CERTIFIED by the bundle premises/R3-4-9/"),
        "{guide}"
    );
    assert!(!guide.contains("ASSUMED"), "{guide}");
    // The default (minimality): check, build the formula with the minimality
    // clauses, check the trace against it.
    assert!(guide.contains("minimality.txt lists"), "{guide}");
    assert_eq!(run_guide(&bundle), 3);

    // Static symmetry breaking only: check, the trace alone, gunzip, LRAT (2).
    let static_only = dir.path().join("static");
    ramsift(&[
        "refute",
        "4,4",
        "18",
        "--symmetry",
        "colour-swap,lex-leader,degree-bounds",
        "--out",
        static_only.to_str().unwrap(),
        "-q",
    ]);
    assert_eq!(run_guide(&static_only), 5);

    let assumed = dir.path().join("assumed");
    ramsift(&[
        "refute",
        "4,4",
        "18",
        "--out",
        assumed.to_str().unwrap(),
        "--assume-premises",
        "-q",
    ]);
    let guide = std::fs::read_to_string(assumed.join("REFEREE.txt")).unwrap();
    assert!(
        guide.contains("R(3,4) <= 9")
            && guide.contains("ASSUMED")
            && guide.contains("CONDITIONAL (exit code 3)"),
        "{guide}"
    );
}

#[test]
fn sharded_guide_commands_succeed_with_and_without_a_single_trace() {
    // Static schemes (varisat) and the default (minimality: one more command, which
    // builds the formula with the minimality clauses).
    for (symmetry, extra_commands) in [("colour-swap,lex-leader", 0), ("default", 1)] {
        sharded_guide(symmetry, extra_commands);
    }
}

fn sharded_guide(symmetry: &str, extra_commands: usize) {
    let dir = tempfile::tempdir().unwrap();
    let plan = dir.path().join("plan");
    let p = plan.to_str().unwrap();
    // R(4,4) = 18 (Greenwood & Gleason 1955; Radziszowski DS1).
    ramsift(&[
        "shard",
        "plan",
        "4,4",
        "18",
        "--shards",
        "4",
        "--symmetry",
        symmetry,
        "--out",
        p,
    ]);
    ramsift(&["shard", "local", p]);
    for (name, extra) in [("sharded", None), ("composed", Some("--single-trace"))] {
        let bundle = dir.path().join(format!("{name}-{symmetry}"));
        let mut args = vec!["shard", "merge", p, "--out", bundle.to_str().unwrap()];
        args.extend(extra);
        ramsift(&args);
        let ran = run_guide(&bundle);
        let shard_lines = std::fs::read_to_string(bundle.join("REFEREE.txt"))
            .unwrap()
            .matches("--cube=")
            .count();
        if extra.is_some() && extra_commands == 0 {
            assert_eq!((ran, shard_lines), (5, 0), "{name}");
        } else if extra.is_some() {
            // check, build the formula with the minimality clauses, check the trace
            assert_eq!((ran, shard_lines), (3, 0), "{name} [{symmetry}]");
        } else {
            assert!(
                shard_lines >= 4 && ran == shard_lines + 1 + extra_commands,
                "{name} [{symmetry}]: {ran} commands, {shard_lines} shards"
            );
        }
    }
}
