//! Benchmark of sharded refutation on this machine: for each instance, plan M shards,
//! run them with `ramsift shard local` (all cores), and compare with one unsharded
//! `ramsift refute` of the same formula, measured in the same run. Prints the
//! distribution of shard times, the speed-up and the total trace size.
//!
//! `cargo run --release --example bench_shards -- [--symmetry S] [SPEC:N:SHARDS ...]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;
use std::time::Instant;

const DEFAULT: &[&str] = &["4,4:18:16", "3,6:18:64", "3,7:23:64"];

fn main() {
    let args = bench_util::BenchArgs::read(0.0, 1, DEFAULT);
    let symmetry = args
        .option("symmetry")
        .unwrap_or("colour-swap,lex-leader")
        .to_string();
    let cases = args.instances;
    let bin = bench_util::release_dir().join("ramsift");
    let scratch = tempfile::tempdir().unwrap();
    println!("symmetry: {symmetry}\n");
    println!("| instance | shards | plan (s) | shard local wall (s) | shard times min / median / p90 / max (s) | sum of shard times (s) | unsharded refute (s) | speed-up (unsharded / local) | shard traces (bytes) | unsharded trace (bytes) |");
    println!("|---|---|---|---|---|---|---|---|---|---|");
    for case in &cases {
        let parts: Vec<&str> = case.split(':').collect();
        let (spec, n, shards) = (parts[0], parts[1], parts[2]);
        let plan = scratch.path().join(format!("plan-{spec}-{n}"));
        let t = Instant::now();
        let o = Command::new(&bin)
            .args([
                "shard",
                "plan",
                spec,
                n,
                "--shards",
                shards,
                "--symmetry",
                &symmetry,
                "--out",
            ])
            .arg(&plan)
            .output()
            .unwrap();
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        let plan_seconds = t.elapsed().as_secs_f64();
        let t = Instant::now();
        let o = Command::new(&bin)
            .args(["shard", "local"])
            .arg(&plan)
            .output()
            .unwrap();
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        let local = t.elapsed().as_secs_f64();
        let mut times = Vec::new();
        let mut bytes = 0u64;
        for entry in std::fs::read_dir(plan.join("shards")).unwrap() {
            let dir = entry.unwrap().path();
            let result: serde_json::Value =
                serde_json::from_str(&std::fs::read_to_string(dir.join("result.json")).unwrap())
                    .unwrap();
            times.push(result["seconds"].as_f64().unwrap());
            bytes += result["proof_bytes"].as_u64().unwrap_or(0);
        }
        times.sort_by(|a, b| a.partial_cmp(b).unwrap());
        let q = |f: f64| times[((times.len() - 1) as f64 * f).round() as usize];
        let single = scratch.path().join(format!("single-{spec}-{n}"));
        let t = Instant::now();
        let o = bench_util::refute_command(spec, n, &symmetry, &single)
            .output()
            .unwrap();
        assert_eq!(
            o.status.code(),
            Some(20),
            "{}",
            String::from_utf8_lossy(&o.stderr)
        );
        let unsharded = t.elapsed().as_secs_f64();
        let single_bytes = std::fs::metadata(single.join("proof.drat")).unwrap().len();
        println!(
            "| ({spec};{n}) | {} | {plan_seconds:.2} | {local:.2} | {:.3} / {:.3} / {:.3} / {:.3} | {:.2} | {unsharded:.2} | {:.2}× | {bytes} | {single_bytes} |",
            times.len(),
            q(0.0),
            q(0.5),
            q(0.9),
            q(1.0),
            times.iter().sum::<f64>(),
            unsharded / local
        );
    }
}
