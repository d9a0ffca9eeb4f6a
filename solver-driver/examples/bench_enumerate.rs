//! Benchmark of `ramsift enumerate`: the default (minimality check, our solver)
//! against `--lex-leader` (varisat with lex-leader, blocking clauses and
//! canonical forms), side by side in one run; medians of `--repeats` runs, one
//! run when over 5 s. Instances as `SPEC:N`, with `:swap` for `--swap-colours`.
//!
//! `cargo run --release --example bench_enumerate -- [--cap S] [--repeats R] [SPEC:N[:swap] …]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;

const DEFAULT_INSTANCES: &[&str] = &[
    "3,5:12",
    "3,5:13",
    "4,4:16",
    "4,4:17",
    "3,6:17",
    "3,3,3:16:swap",
];

/// Median seconds of the enumeration (None: over the cap).
fn measure(
    parts: &[&str],
    lex_leader: bool,
    cap: f64,
    repeats: usize,
    out: &std::path::Path,
) -> Option<f64> {
    let mut times = Vec::new();
    for _ in 0..repeats {
        let mut cmd = Command::new(bench_util::release_dir().join("ramsift"));
        cmd.args([
            "enumerate",
            parts[0],
            parts[1],
            "-q",
            "--timeout",
            &cap.to_string(),
            "--out",
        ])
        .arg(out);
        if parts.get(2) == Some(&"swap") {
            cmd.arg("--swap-colours");
        }
        if lex_leader {
            cmd.arg("--lex-leader");
        }
        let (t, code) = bench_util::timed(cmd, cap + 10.0);
        let _ = std::fs::remove_file(out);
        if code != Some(0) {
            return None;
        }
        times.push(t);
        if t > 5.0 {
            break;
        }
    }
    Some(bench_util::median(&mut times))
}

fn main() {
    let args = bench_util::BenchArgs::read(600.0, 5, DEFAULT_INSTANCES);
    let scratch = tempfile::tempdir().unwrap();
    let out = scratch.path().join("classes");
    let cell = |m: Option<f64>| m.map_or(format!("> {:.0}", args.cap), |t| format!("{t:.3}"));
    println!("| enumeration | minimality, default (s) | --lex-leader (s) | ratio |");
    println!("|---|---|---|---|");
    for inst in &args.instances {
        let parts: Vec<&str> = inst.split(':').collect();
        let new = measure(&parts, false, args.cap, args.repeats, &out);
        let old = measure(&parts, true, args.cap, args.repeats, &out);
        let ratio = match (new, old) {
            (Some(a), Some(b)) => format!("{:.1}×", b / a),
            _ => "-".into(),
        };
        println!(
            "| ({};{}){} | {} | {} | {ratio} |",
            parts[0],
            parts[1],
            if parts.len() > 2 {
                " up to colour permutation"
            } else {
                ""
            },
            cell(new),
            cell(old)
        );
    }
}
