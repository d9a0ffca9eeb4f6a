//! Writes the crafted checker inputs of the hostile-checker tests into DIR, one
//! folder or file per case, for measuring the checker's time and peak memory on
//! them, and the Paley colouring of K101 (BENCHMARKS.md, "The checker under
//! hostile input"):
//!
//! ```sh
//! cargo run --release -p ramsift-tests --example hostile_inputs -- /tmp/hostile
//! /usr/bin/time -v target/release/ramsift-check bundle /tmp/hostile/unit-lemmas
//! ```

use std::path::{Path, PathBuf};
use std::process::Command;

use anyhow::{bail, Context, Result};
use ramsift_driver::output::witness::colouring_text;
use ramsift_encoder::{Instance, RamseySpec};
use ramsift_tests::binaries::workspace_binary;
use ramsift_tests::hostile_inputs::{
    distinct_variable_trace, isolated_vertices_claim, long_minimality_line, many_minimality_lines,
    multipartite_colouring, unit_clause_formula, unit_lemma_trace, FOUR_CLAUSES,
};

/// A fresh (3,3;6) bundle at `dir/name` from `ramsift refute`.
fn bundle(dir: &Path, name: &str) -> Result<PathBuf> {
    let path = dir.join(name);
    let status = Command::new(workspace_binary("ramsift"))
        .args(["refute", "3,3", "6", "-q", "--out"])
        .arg(&path)
        .stdout(std::process::Stdio::null())
        .status()
        .context("running ramsift refute")?;
    if status.code() != Some(20) {
        bail!("ramsift refute 3,3 6 ended with {status}");
    }
    Ok(path)
}

fn main() -> Result<()> {
    let dir = PathBuf::from(
        std::env::args()
            .nth(1)
            .context("usage: hostile_inputs DIR (a new folder)")?,
    );
    std::fs::create_dir(&dir)
        .with_context(|| format!("creating {} (it must not exist yet)", dir.display()))?;
    let size = unit_lemma_trace(&bundle(&dir, "unit-lemmas")?, 16_000_000);
    println!("unit-lemmas: trace of 16,000,000 one-literal lemmas, {size} bytes expanded");
    let size = unit_clause_formula(&bundle(&dir, "unit-clauses")?, 16_000_000);
    println!("unit-clauses: formula of 16,000,000 unit clauses, {size} bytes expanded");
    let size = long_minimality_line(&bundle(&dir, "long-line")?, 30_000_000);
    println!("long-line: one minimality line of {size} bytes");
    many_minimality_lines(&bundle(&dir, "many-lines")?, 10_000);
    println!("many-lines: 10,000 minimality lines at n = 1000");
    isolated_vertices_claim(&bundle(&dir, "isolated")?);
    println!("isolated: one edge among ten vertices, in K20");
    std::fs::write(dir.join("k120.colouring"), multipartite_colouring(8, 15))?;
    println!("k120.colouring: complete 8-partite colouring of K120 against K9 and K16");
    std::fs::write(dir.join("four.cnf"), FOUR_CLAUSES)?;
    let trace = distinct_variable_trace(8_000_000);
    std::fs::write(dir.join("distinct.drat"), &trace)?;
    println!(
        "four.cnf, distinct.drat: 8,000,000 lemmas on new variables, {} bytes",
        trace.len()
    );
    // Paley(101) as (6,6;101) (R(6,6) >= 102, Radziszowski DS1), Paley(149) and
    // Paley(241) against K8 (R(8,8) >= 282, DS1 from memory): record-size witnesses.
    for (p, k) in [(101, 6), (149, 8), (241, 8)] {
        let instance = Instance::new(RamseySpec::cliques(&[k, k])?, p)?;
        let text = colouring_text(&instance, &ramsift_tests::constructions::paley(p), &[]);
        std::fs::write(dir.join(format!("paley{p}.colouring")), text)?;
        println!("paley{p}.colouring: the Paley colouring of K{p} (quadratic residues mod {p}) against K{k}");
    }
    Ok(())
}
