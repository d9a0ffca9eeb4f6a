//! Benchmark of local search over the edge orbits of each involution shape of K_n
//! (p 2-cycles, n − 2p fixed vertices): per shape, on one thread for the same
//! time and seed, whether a colouring was found, how many restarts ran, and how
//! the restarts ended (their mean fewest copies and the lowest few, `cost:count`).
//! This is what the restart schedule of `--involutions` (and of `find`'s default)
//! reads to share the restarts out. Two shapes run at a time, one per core.
//!
//! `cargo run --release --example bench_involutions -- SPEC N [SECONDS] [SEED]`

use std::collections::BTreeMap;
use std::sync::atomic::AtomicBool;
use std::time::Duration;

use ramsift_driver::local::search::LocalProgress;
use ramsift_driver::local::{local_search, LocalOptions, VertexCycles};
use ramsift_encoder::{Instance, RamseySpec};

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let usage = "usage: bench_involutions SPEC N [SECONDS] [SEED]";
    let spec: RamseySpec = args.first().expect(usage).parse().expect("SPEC");
    let order: usize = args.get(1).expect(usage).parse().expect("N");
    let seconds: f64 = args.get(2).map_or(20.0, |s| s.parse().expect("SECONDS"));
    let seed: u64 = args.get(3).map_or(1, |s| s.parse().expect("SEED"));
    let instance = Instance::new(spec, order).expect("instance");
    println!("| shape | found | restarts | mean ending | lowest endings (copies:restarts) |");
    println!("|---|---|---|---|---|");
    let shapes = VertexCycles::involutions(order);
    for pair in shapes.chunks(2) {
        let rows: Vec<String> = std::thread::scope(|scope| {
            let runs: Vec<_> = pair
                .iter()
                .map(|shape| scope.spawn(|| row(&instance, shape, seconds, seed)))
                .collect();
            runs.into_iter().map(|r| r.join().expect("run")).collect()
        });
        for row in rows {
            println!("{row}");
        }
    }
}

/// One shape's table row.
fn row(instance: &Instance, shape: &VertexCycles, seconds: f64, seed: u64) -> String {
    let options = LocalOptions {
        threads: 1,
        seed,
        timeout: Some(Duration::from_secs_f64(seconds)),
        keep_near: usize::MAX,
        automorphisms: vec![shape.clone()],
        ..LocalOptions::default()
    };
    let report = local_search(
        instance,
        &options,
        &AtomicBool::new(false),
        &LocalProgress::default(),
    )
    .expect("local search");
    let endings = report.automorphism_endings[0];
    let mean = endings.sum as f64 / endings.restarts.max(1) as f64;
    let mut counts: BTreeMap<u64, usize> = BTreeMap::new();
    for (cost, _) in &report.near {
        *counts.entry(*cost).or_default() += 1;
    }
    let lowest: Vec<String> = counts
        .iter()
        .take(4)
        .map(|(cost, n)| format!("{cost}:{n}"))
        .collect();
    format!(
        "| {shape} | {} | {} | {mean:.1} | {} |",
        match &report.found {
            Some(_) => format!("yes, {:.1} s", report.elapsed.as_secs_f64()),
            None => "no".to_string(),
        },
        report.restarts,
        lowest.join(" ")
    )
}
