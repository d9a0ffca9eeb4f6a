//! Benchmark of `ramsift find` against plain single-threaded varisat on the same CNF.
//!
//! For each instance and each repeat, runs `ramsift find` (all cores, seed = repeat
//! number) and a plain varisat solve of the same clauses (one thread, no seeds, no
//! proof output) as separate processes, alternating, each killed at the time cap.
//! Prints a Markdown table of medians and their ratio.
//!
//! `cargo run --release --example bench_find -- [--repeats R] [--cap SECONDS] [--method M] [SPEC:N ...]`
//!
//! `--method` is passed to `ramsift find` (default `sat`, the SAT portfolio this
//! benchmark was written for; `bench_lower` compares the methods).

#[path = "common/bench_util.rs"]
mod bench_util;

use std::process::Command;

use ramsift_driver::search::formula::Formula;
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec};
use varisat::{ExtendFormula, Lit, Solver};

const DEFAULT_INSTANCES: &[&str] = &["4,4:17", "3,5:13", "3,6:17", "3,7:22", "3,3,3:16", "4,5:24"];

fn main() {
    let raw: Vec<String> = std::env::args().skip(1).collect();
    if raw.first().map(String::as_str) == Some("plain") {
        plain(&raw[1], raw[2].parse().unwrap());
        return;
    }
    let args = bench_util::BenchArgs::read(60.0, 5, DEFAULT_INSTANCES);
    let (cap, repeats, method) = (
        args.cap,
        args.repeats,
        args.option("method").unwrap_or("sat").to_string(),
    );
    let instances = args.instances;
    let ramsift = bench_util::release_dir().join("ramsift");
    println!("| instance | find median (s) | find runs answered | plain varisat median (s) | plain answered | plain / find |");
    println!("|---|---|---|---|---|---|");
    for inst in &instances {
        let (spec, n) = inst.split_once(':').expect("SPEC:N");
        let mut find_times = Vec::new();
        let mut plain_times = Vec::new();
        let (mut find_ok, mut plain_ok) = (0, 0);
        for r in 0..repeats {
            let mut find = Command::new(&ramsift);
            find.args([
                "find",
                spec,
                n,
                "-q",
                "--method",
                &method,
                "--seed",
                &(r + 1).to_string(),
                "--timeout",
                &cap.to_string(),
            ]);
            let (t, code) = bench_util::timed(find, cap + 5.0);
            if code == Some(10) || code == Some(20) {
                find_ok += 1;
            }
            find_times.push(t);
            let mut plain_cmd = Command::new(std::env::current_exe().unwrap());
            plain_cmd.args(["plain", spec, n]);
            let (t, code) = bench_util::timed(plain_cmd, cap);
            if code == Some(10) || code == Some(20) {
                plain_ok += 1;
            }
            plain_times.push(t);
        }
        let (f, p) = (
            bench_util::median(&mut find_times),
            bench_util::median(&mut plain_times),
        );
        println!(
            "| ({spec};{n}) | {} | {find_ok}/{repeats} | {} | {plain_ok}/{repeats} | {} |",
            fmt(f, cap),
            fmt(p, cap),
            if f >= cap || p >= cap {
                "n/a".to_string()
            } else {
                format!("{:.1}×", p / f)
            }
        );
    }
}

fn fmt(t: f64, cap: f64) -> String {
    if t >= cap {
        format!("> {cap:.0} (cap)")
    } else {
        format!("{t:.3}")
    }
}

/// Plain varisat: the formula's clauses in order, one thread, exit 10/20.
fn plain(spec: &str, n: usize) {
    let instance = Instance::new(spec.parse::<RamseySpec>().unwrap(), n).unwrap();
    let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
    let formula = Formula::from_encoding(&encoding);
    let mut solver = Solver::new();
    let mut lits = Vec::new();
    for clause in formula.clauses() {
        lits.clear();
        lits.extend(clause.iter().map(|&l| Lit::from_dimacs(l as isize)));
        solver.add_clause(&lits);
    }
    let sat = solver.solve().unwrap();
    std::process::exit(if sat { 10 } else { 20 });
}
