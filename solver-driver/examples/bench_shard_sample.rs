//! Benchmark of a deep plan: runs a random sample of its open cubes, each under a
//! time cap, one after the other, and prints how many closed within the cap and
//! their times (the numbers for an estimate of the whole refutation's cost).
//!
//! `cargo run --release --example bench_shard_sample -- [--cap SECONDS] [--repeats COUNT] [--seed S] PLAN_DIR`
//!
//! `--repeats` is the sample size (default 32).

#[path = "common/bench_util.rs"]
mod bench_util;

use rand::seq::SliceRandom;
use rand::SeedableRng;
use rand_chacha::ChaCha8Rng;

fn main() {
    let args = bench_util::BenchArgs::read(20.0, 32, &[]);
    let seed: u64 = args
        .option("seed")
        .map_or(7, |s| s.parse().expect("--seed N"));
    let plan_dir = args.instances.first().expect("a plan directory");
    let plan: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string(format!("{plan_dir}/plan.json")).expect("plan.json"),
    )
    .expect("a plan");
    let mut open: Vec<u64> = plan["cubes"]
        .as_array()
        .expect("cubes")
        .iter()
        .filter(|c| c["refuted_by_propagation"] == false)
        .map(|c| c["index"].as_u64().expect("index"))
        .collect();
    open.shuffle(&mut ChaCha8Rng::seed_from_u64(seed));
    open.truncate(args.repeats);
    open.sort_unstable();
    let (mut closed, mut over) = (Vec::new(), 0);
    for index in &open {
        let mut cmd = std::process::Command::new(bench_util::release_dir().join("ramsift"));
        cmd.args([
            "shard",
            "run",
            plan_dir,
            "--index",
            &index.to_string(),
            "--timeout",
            &args.cap.to_string(),
        ]);
        let (seconds, code) = bench_util::timed(cmd, args.cap + 30.0);
        println!("cube {index}: exit {code:?}, {seconds:.2} s");
        match code {
            Some(0) => closed.push(seconds),
            _ => over += 1,
        }
    }
    let n = closed.len();
    let median = if n > 0 {
        bench_util::median(&mut closed)
    } else {
        f64::NAN
    };
    let max = closed.iter().copied().fold(0.0, f64::max);
    println!("{} sampled: {n} refuted within {} s (median {median:.2} s, max {max:.2} s), {over} over the cap", open.len(), args.cap);
}
