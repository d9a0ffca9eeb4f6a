//! Benchmark of the local-search rules: each rule runs on one thread with the same
//! seeds, the rules of one seed at the same time (one per core), so that they are
//! measured side by side; for each instance and rule, the seconds to a checked
//! colouring (">cap" when none) and the fewest monochromatic copies reached.
//!
//! `cargo run --release --example bench_local -- [--cap SECONDS] [--repeats R]
//!  [--rules focused,weighted] [SPEC:N ...]`
//!
//! A rule may run over the edge orbits of an automorphism: `focused@4x8+2` is the
//! focused rule over colourings invariant under eight 4-cycles and a 2-cycle
//! (`+` stands for the `,` of `--automorphism`).

#[path = "common/bench_util.rs"]
mod bench_util;

use std::sync::atomic::AtomicBool;
use std::time::Duration;

use ramsift_driver::local::search::LocalProgress;
use ramsift_driver::local::{local_search, LocalMethod, LocalOptions, VertexCycles};
use ramsift_encoder::{Instance, RamseySpec};

const DEFAULT_INSTANCES: &[&str] = &["3,8:27", "4,5:24", "3,9:35", "5,5:41", "4,6:34"];

/// A rule, optionally over the edge orbits of an automorphism: `focused` or
/// `focused@4x8+2` (cycle lengths with `+` for `,`).
fn rule(text: &str) -> (LocalMethod, Option<VertexCycles>) {
    let (name, cycles) = match text.split_once('@') {
        Some((name, cycles)) => (
            name,
            Some(
                cycles
                    .replace('+', ",")
                    .parse::<VertexCycles>()
                    .expect("cycle lengths after @"),
            ),
        ),
        None => (text, None),
    };
    (method(name), cycles)
}

fn method(name: &str) -> LocalMethod {
    match name {
        "tabu" => LocalMethod::Tabu,
        "focused" => LocalMethod::Focused,
        "weighted" => LocalMethod::Weighted,
        "anneal" => LocalMethod::Anneal,
        other => panic!("unknown rule {other}"),
    }
}

/// One single-threaded run: (seconds to a colouring or None, fewest copies).
fn run(
    instance: &Instance,
    (method, automorphism): (LocalMethod, Option<VertexCycles>),
    seed: u64,
    cap: f64,
    stall: Option<u64>,
) -> (Option<f64>, u64) {
    let options = LocalOptions {
        method,
        stall_steps: stall,
        threads: 1,
        seed,
        timeout: Some(Duration::from_secs_f64(cap)),
        automorphisms: automorphism.into_iter().collect(),
        ..LocalOptions::default()
    };
    let report = local_search(
        instance,
        &options,
        &AtomicBool::new(false),
        &LocalProgress::default(),
    )
    .expect("local search runs");
    let seconds = report
        .found
        .is_some()
        .then_some(report.elapsed.as_secs_f64());
    (seconds, report.best_cost)
}

fn main() {
    let args = bench_util::BenchArgs::read(60.0, 3, DEFAULT_INSTANCES);
    let stall: Option<u64> = args
        .options
        .iter()
        .find(|(k, _)| k == "stall")
        .map(|(_, v)| v.parse().expect("--stall STEPS"));
    let rules: Vec<String> = args
        .options
        .iter()
        .find(|(k, _)| k == "rules")
        .map_or("focused,weighted", |(_, v)| v.as_str())
        .split(',')
        .map(str::to_string)
        .collect();
    print!("| instance |");
    for r in &rules {
        print!(" {r}: seconds per seed | {r}: median | {r}: fewest copies |");
    }
    println!();
    println!("|---|{}", "---|---|---|".repeat(rules.len()));
    for inst in &args.instances {
        let (spec, n) = inst.split_once(':').expect("SPEC:N");
        let spec: RamseySpec = spec.parse().expect("a specification");
        let instance = Instance::new(spec, n.parse().expect("an order")).expect("an instance");
        let mut results = vec![Vec::new(); rules.len()];
        for seed in 1..=args.repeats as u64 {
            let outcomes: Vec<(Option<f64>, u64)> = std::thread::scope(|scope| {
                let handles: Vec<_> = rules
                    .iter()
                    .map(|r| {
                        let instance = &instance;
                        scope.spawn(move || run(instance, rule(r), seed, args.cap, stall))
                    })
                    .collect();
                handles
                    .into_iter()
                    .map(|h| h.join().expect("run"))
                    .collect()
            });
            for (column, outcome) in outcomes.into_iter().enumerate() {
                results[column].push(outcome);
            }
        }
        print!("| ({}) |", inst.replace(':', ";"));
        for column in &results {
            let shown: Vec<String> = column
                .iter()
                .map(|(t, _)| t.map_or(format!(">{}", args.cap), |t| format!("{t:.3}")))
                .collect();
            let mut times: Vec<f64> = column
                .iter()
                .map(|(t, _)| t.unwrap_or(f64::INFINITY))
                .collect();
            let median = bench_util::median(&mut times);
            let fewest = column.iter().map(|(_, c)| *c).min().unwrap_or(u64::MAX);
            let median = if median.is_finite() {
                format!("{median:.3}")
            } else {
                format!(">{}", args.cap)
            };
            print!(" {} | {median} | {fewest} |", shown.join(", "));
        }
        println!();
    }
}
