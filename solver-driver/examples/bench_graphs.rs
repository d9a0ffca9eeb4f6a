//! Benchmark of the graph encodings and of enumeration: clauses per second when
//! streaming the encoding of a cycle or wheel at order 40 (median of the repeats,
//! clauses counted, nothing written), and the time and count of enumerations
//! (each a separate `ramsift enumerate` process).
//!
//! `cargo run --release --example bench_graphs -- [--repeats R]`

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;
use std::time::Instant;

use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec};

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let repeats: usize = args
        .iter()
        .position(|a| a == "--repeats")
        .and_then(|i| args.get(i + 1))
        .map_or(3, |r| r.parse().unwrap());

    println!("| forbidden graph (colour 1; colour 2 forbids K2) | n | clauses | median seconds | clauses/s |");
    println!("|---|---|---|---|---|");
    // C7 (6.7e9 clauses) and W_7 (7.8e9) at n = 40 are far beyond any solver; stop at
    // the sizes a run can hold.
    for graph in ["C4", "C5", "C6", "W_5", "W_6"] {
        let n = 40;
        let spec: RamseySpec = format!("{graph},2").parse().unwrap();
        let instance = Instance::new(spec, n).unwrap();
        let limits = EncodingLimits {
            max_clauses: u64::MAX,
        };
        let mut times = Vec::new();
        let mut count = 0u64;
        for _ in 0..repeats {
            let started = Instant::now();
            let encoding = RamseyEncoding::new(&instance, &limits).unwrap();
            let mut seen = 0u64;
            let mut literals = 0u64;
            encoding
                .for_each_clause::<()>(|c| {
                    seen += 1;
                    literals += c.len() as u64;
                    Ok(())
                })
                .unwrap();
            std::hint::black_box(literals);
            times.push(started.elapsed().as_secs_f64());
            count = seen;
        }
        let t = bench_util::median(&mut times);
        println!(
            "| {graph} | {n} | {count} | {t:.3} | {:.1} M |",
            count as f64 / t / 1e6
        );
    }

    let ramsift = bench_util::release_dir().join("ramsift");
    println!();
    println!("| enumeration | classes | labelled colourings enumerated | median seconds |");
    println!("|---|---|---|---|");
    for (spec, n, swap) in [
        ("3,5", "12", false),
        ("4,4", "16", false),
        ("3,5", "13", false),
        ("4,4", "17", false),
        ("3,3,3", "16", true),
    ] {
        let mut times = Vec::new();
        let mut line = String::new();
        for _ in 0..repeats {
            let out = std::env::temp_dir().join(format!("bench-enum-{spec}-{n}"));
            let mut cmd = Command::new(&ramsift);
            cmd.args(["enumerate", spec, n, "--json", "-q", "--out"])
                .arg(&out);
            if swap {
                cmd.arg("--swap-colours");
            }
            let started = Instant::now();
            let output = cmd.output().unwrap();
            times.push(started.elapsed().as_secs_f64());
            let summary: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
            line = format!(
                "{} | {}",
                summary["classes"], summary["labelled_models_enumerated"]
            );
            let _ = std::fs::remove_file(out);
        }
        let t = bench_util::median(&mut times);
        let up_to = if swap { " (colours permuted too)" } else { "" };
        println!("| ({spec};{n}){up_to} | {line} | {t:.2} |");
    }
}
