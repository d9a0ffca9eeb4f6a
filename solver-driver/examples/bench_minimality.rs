//! Benchmark of the minimality scheme, side by side in one run: `ramsift refute`
//! with the new default (minimality, with degree-bounds for cliques), minimality
//! alone, the previous default (colour-swap, lex-leader, degree-bounds; varisat),
//! and plain single-threaded varisat on the plain CNF. Premises are assumed so
//! that only the instance is timed; every bundle is checked in full with
//! `ramsift-check bundle`. Medians of `--repeats` runs (one run when it takes
//! over 5 s). With `--budgets 2000,20000,…`, the default is also run with each
//! `--check-budget`.
//!
//! `cargo run --release --example bench_minimality -- [--cap S] [--repeats R] [--budgets B,…] [SPEC:N …]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::path::Path;
use std::process::Command;

const DEFAULT_INSTANCES: &[&str] = &["4,4:18", "3,6:18", "3,3,3:17", "3,5:14", "3,7:23"];

/// Median refute and check times (None: over the cap) and the trace size.
fn measure(
    spec: &str,
    n: &str,
    symmetry: &str,
    budget: Option<&str>,
    cap: f64,
    repeats: usize,
    scratch: &Path,
) -> Option<(f64, f64, u64)> {
    let (mut refute_times, mut check_times, mut bytes) = (Vec::new(), Vec::new(), 0);
    for r in 0..repeats {
        let out = scratch.join(format!("{spec}-{n}-{symmetry}-{budget:?}-{r}"));
        let mut cmd = bench_util::refute_command(spec, n, symmetry, &out);
        cmd.args(["--timeout", &cap.to_string()]);
        if let Some(b) = budget {
            cmd.args(["--check-budget", b]);
        }
        let (t, code) = bench_util::timed(cmd, cap + 10.0);
        if code != Some(20) {
            return None;
        }
        refute_times.push(t);
        let mut check = Command::new(bench_util::release_dir().join("ramsift-check"));
        check.arg("bundle").arg(&out);
        let (c, code) = bench_util::timed(check, 20.0 * cap);
        // 3: CONDITIONAL, the premises being assumed here.
        assert!(
            matches!(code, Some(0) | Some(3)),
            "the bundle of ({spec};{n}) [{symmetry}] must check"
        );
        check_times.push(c);
        bytes = std::fs::metadata(out.join("proof.drat"))
            .map(|m| m.len())
            .unwrap_or(0);
        let _ = std::fs::remove_dir_all(&out);
        if t > 5.0 {
            break;
        }
    }
    Some((
        bench_util::median(&mut refute_times),
        bench_util::median(&mut check_times),
        bytes,
    ))
}

fn cell(m: Option<(f64, f64, u64)>, cap: f64) -> String {
    match m {
        Some((r, c, b)) => format!("{r:.3} / {c:.3} ({:.2}×), {:.1} MB", c / r, b as f64 / 1e6),
        None => format!("> {cap:.0}"),
    }
}

fn main() {
    let args = bench_util::BenchArgs::read(120.0, 5, DEFAULT_INSTANCES);
    let (cap, repeats) = (args.cap, args.repeats);
    let scratch = tempfile::tempdir().unwrap();
    println!(
        "Each cell: refute median / check median (check ÷ refute), DRAT trace size; seconds.\n"
    );
    println!("| instance | new default | minimality alone | previous default | plain varisat |");
    println!("|---|---|---|---|---|");
    for inst in &args.instances {
        let (spec, n) = inst.split_once(':').expect("SPEC:N");
        let new = measure(spec, n, "default", None, cap, repeats, scratch.path());
        let alone = measure(spec, n, "minimality", None, cap, repeats, scratch.path());
        let old = measure(
            spec,
            n,
            "colour-swap,lex-leader,degree-bounds",
            None,
            cap,
            repeats,
            scratch.path(),
        );
        let plain = {
            let mut cmd = Command::new(
                bench_util::release_dir()
                    .join("examples")
                    .join("bench_find"),
            );
            cmd.args(["plain", spec, n]);
            bench_util::timed(cmd, cap).0
        };
        let plain = if plain >= cap {
            format!("> {cap:.0}")
        } else {
            format!("{plain:.3}")
        };
        println!(
            "| ({spec};{n}) | {} | {} | {} | {plain} |",
            cell(new, cap),
            cell(alone, cap),
            cell(old, cap)
        );
    }
    if let Some(budgets) = args.option("budgets") {
        println!("\n| instance | check budget | refute / check (s) |");
        println!("|---|---|---|");
        for inst in &args.instances {
            let (spec, n) = inst.split_once(':').expect("SPEC:N");
            for b in budgets.split(',') {
                let m = measure(spec, n, "default", Some(b), cap, repeats, scratch.path());
                println!("| ({spec};{n}) | {b} | {} |", cell(m, cap));
            }
        }
    }
}
