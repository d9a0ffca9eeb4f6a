//! Benchmark of certified refutation: every symmetry-breaking combination × a list of
//! instances, time to refute (`ramsift refute`, premises assumed so that only the
//! instance itself is timed), time to check the trace (`ramsift-check drat`), trace
//! size, and plain single-threaded varisat on the plain CNF, side by side in one run.
//! Runs that finish under 5 s are repeated and the median is reported.
//!
//! `cargo run --release --example bench_refute -- [--cap SECONDS] [--repeats R] [SPEC:N ...]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;

use ramsift_encoder::SymmetrySet;

const DEFAULT_INSTANCES: &[&str] = &[
    "3,5:14", "4,4:18", "3,6:18", "3,7:23", "3,3,3:17", "4,5:25", "3,8:28",
];

fn main() {
    let bench_util::BenchArgs {
        cap,
        repeats,
        instances,
        ..
    } = bench_util::BenchArgs::read(30.0, 3, DEFAULT_INSTANCES);
    let bin = bench_util::release_dir();
    let scratch = tempfile::tempdir().unwrap();
    println!("| instance | symmetry | refute median (s) | check median (s) | check / refute | trace (bytes) | plain varisat (s) |");
    println!("|---|---|---|---|---|---|---|");
    for inst in &instances {
        let (spec, n) = inst.split_once(':').expect("SPEC:N");
        let plain = {
            let mut cmd = Command::new(bin.join("examples").join("bench_find"));
            cmd.args(["plain", spec, n]);
            bench_util::timed(cmd, cap).0
        };
        for set in SymmetrySet::all_combinations() {
            let symmetry = set.to_string();
            let mut refute_times = Vec::new();
            let mut check_times = Vec::new();
            let mut trace_bytes = 0;
            for r in 0..repeats {
                let out = scratch.path().join(format!("{spec}-{n}-{symmetry}-{r}"));
                let mut cmd = bench_util::refute_command(spec, n, &symmetry, &out);
                cmd.args(["--timeout", &cap.to_string()]);
                let (t, code) = bench_util::timed(cmd, cap + 10.0);
                if code != Some(20) {
                    refute_times.clear();
                    break;
                }
                refute_times.push(t);
                let mut check = Command::new(bin.join("ramsift-check"));
                check
                    .arg("drat")
                    .arg(out.join("formula.cnf.gz"))
                    .arg(out.join("proof.drat"));
                let (c, code) = bench_util::timed(check, 10.0 * cap);
                assert_eq!(code, Some(0), "the trace of {inst} [{symmetry}] must check");
                check_times.push(c);
                trace_bytes = std::fs::metadata(out.join("proof.drat")).unwrap().len();
                let _ = std::fs::remove_dir_all(&out);
                if t > 5.0 {
                    break;
                }
            }
            let plain_text = if plain >= cap {
                format!("> {cap:.0}")
            } else {
                format!("{plain:.3}")
            };
            if refute_times.is_empty() {
                println!(
                    "| ({spec};{n}) | {symmetry} | > {cap:.0} (cap) | - | - | - | {plain_text} |"
                );
            } else {
                let (rt, ct) = (
                    bench_util::median(&mut refute_times),
                    bench_util::median(&mut check_times),
                );
                println!(
                    "| ({spec};{n}) | {symmetry} | {rt:.3} | {ct:.3} | {:.2} | {trace_bytes} | {plain_text} |",
                    ct / rt
                );
            }
        }
    }
}
