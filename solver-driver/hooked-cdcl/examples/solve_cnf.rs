//! Solves a DIMACS CNF file with no hook and prints the outcome, the time and the
//! solver's counters: `cargo run --release -p ramsift-cdcl --example solve_cnf FILE`.

use std::time::Instant;

use ramsift_cdcl::{NoHook, Solver};

fn main() {
    let path = std::env::args().nth(1).expect("usage: solve_cnf FILE");
    let text = std::fs::read_to_string(&path).expect("readable file");
    let mut solver = Solver::new();
    let mut clause = Vec::new();
    for token in text
        .lines()
        .filter(|l| !l.starts_with('c') && !l.starts_with('p'))
        .flat_map(str::split_whitespace)
    {
        let l: i32 = token.parse().expect("a DIMACS literal");
        if l == 0 {
            solver.add_clause(&clause);
            clause.clear();
        } else {
            clause.push(l);
        }
    }
    let started = Instant::now();
    let outcome = solver.solve(&mut NoHook, &|| false, None);
    println!(
        "{outcome:?} in {:.3}s: {:?}",
        started.elapsed().as_secs_f64(),
        solver.stats()
    );
}
