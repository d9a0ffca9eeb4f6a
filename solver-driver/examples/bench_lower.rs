//! Benchmark of the lower-bound engine: time to a verified witness with
//! `ramsift find` (default method auto), with the foundation SAT portfolio
//! (`--method sat`) and with plain single-threaded varisat on the same CNF, side by
//! side in one run (the three alternate within each repeat), each killed at the cap.
//!
//! `cargo run --release --example bench_lower -- [--repeats R] [--cap SECONDS] [SPEC:N ...]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;

const DEFAULT_INSTANCES: &[&str] = &["4,5:24", "3,8:27", "3,9:35", "4,6:34", "5,5:41", "3,3,3:16"];

fn main() {
    let bench_util::BenchArgs {
        cap,
        repeats,
        instances,
        ..
    } = bench_util::BenchArgs::read(60.0, 3, DEFAULT_INSTANCES);
    let release = bench_util::release_dir();
    let ramsift = release.join("ramsift");
    let bench_find = release.join("examples").join("bench_find");
    println!("| instance | auto median (s) | found | sat portfolio median (s) | found | plain varisat median (s) | found | sat / auto | plain / auto |");
    println!("|---|---|---|---|---|---|---|---|---|");
    for inst in &instances {
        let (spec, n) = inst.split_once(':').expect("SPEC:N");
        let mut times = [Vec::new(), Vec::new(), Vec::new()];
        let mut found = [0; 3];
        for r in 0..repeats {
            for (column, method) in ["auto", "sat", "plain"].iter().enumerate() {
                let cmd = if *method == "plain" {
                    let mut c = Command::new(&bench_find);
                    c.args(["plain", spec, n]);
                    c
                } else {
                    let mut c = Command::new(&ramsift);
                    c.args(["find", spec, n, "-q", "--method", method, "--seed"])
                        .arg((r + 1).to_string())
                        .args(["--timeout", &cap.to_string()]);
                    c
                };
                let (t, code) = bench_util::timed(cmd, cap + 5.0);
                if code == Some(10) {
                    found[column] += 1;
                    times[column].push(t);
                } else {
                    times[column].push(f64::INFINITY);
                }
            }
        }
        let medians: Vec<f64> = times.iter_mut().map(|t| bench_util::median(t)).collect();
        let show = |t: f64| {
            if t.is_finite() {
                format!("{t:.3}")
            } else {
                format!("> {cap:.0} (cap)")
            }
        };
        let ratio = |t: f64| {
            if t.is_finite() && medians[0].is_finite() {
                format!("{:.0}×", t / medians[0])
            } else if medians[0].is_finite() {
                format!("> {:.0}×", cap / medians[0])
            } else {
                "n/a".to_string()
            }
        };
        println!(
            "| ({spec};{n}) | {} | {}/{repeats} | {} | {}/{repeats} | {} | {}/{repeats} | {} | {} |",
            show(medians[0]),
            found[0],
            show(medians[1]),
            found[1],
            show(medians[2]),
            found[2],
            ratio(medians[1]),
            ratio(medians[2]),
        );
    }
}
