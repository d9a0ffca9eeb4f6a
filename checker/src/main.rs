//! `ramsift-check`: verifies ramsift's certificates with independent code.
//!
//! Exit codes: 0 the claim holds, 1 it does not, 2 the input could not be read.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Parser, Subcommand};

mod proofs;

use ramsift_checker::colouring_file::{parse_colouring_file, MAGIC};
use ramsift_checker::graph6::decode_graph6_file;
use ramsift_checker::{check_colouring, Claim, ColourMatrix, Verdict};

#[derive(Parser)]
#[command(
    name = "ramsift-check",
    version,
    about = "Independent checker for ramsift witnesses and proofs",
    long_about = "Independent checker for ramsift witnesses and proofs.\n\n\
        It re-derives every claim from its statement with its own code and trusts \
        nothing the search produced.\n\nExit codes: 0 the claim holds, 1 it does not, \
        2 the input could not be read."
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Check that a colouring has no monochromatic forbidden graph.
    ///
    /// FILE is a ramsift colouring file, or a graph6 file (one graph per line; edges
    /// are colour 1, non-edges colour 2), which needs --forbid.
    Colouring {
        /// The colouring file (ramsift format or graph6).
        file: PathBuf,
        /// Forbidden clique sizes, one per colour (e.g. 4,4). Defaults to the file's header.
        #[arg(long, value_name = "SIZES")]
        forbid: Option<String>,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check a DRAT refutation (text or binary, gzip allowed) of a DIMACS CNF.
    Drat {
        /// The formula (DIMACS CNF, gzip allowed).
        cnf: PathBuf,
        /// The proof (DRAT text or binary, detected from the content; gzip allowed).
        proof: PathBuf,
        /// Also write an LRAT proof of the same refutation to this file.
        #[arg(long, value_name = "FILE")]
        emit_lrat: Option<PathBuf>,
        /// Print the result as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check a certificate bundle written by `ramsift refute`: hashes, the formula
    /// (regenerated from the claim), the proof, and the premises.
    Bundle {
        /// The bundle directory.
        dir: PathBuf,
        /// A bundle that certifies a premise (may be repeated).
        #[arg(long, value_name = "DIR")]
        premise: Vec<PathBuf>,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check an LRAT refutation (text, gzip allowed) of a DIMACS CNF.
    Lrat {
        /// The formula (DIMACS CNF, gzip allowed).
        cnf: PathBuf,
        /// The proof (LRAT text; gzip allowed).
        proof: PathBuf,
        /// Print the result as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Colouring { file, forbid, json } => run_colouring(&file, forbid.as_deref(), json),
        Command::Drat {
            cnf,
            proof,
            emit_lrat,
            json,
        } => proofs::run_drat(&cnf, &proof, emit_lrat.as_deref(), json),
        Command::Lrat { cnf, proof, json } => proofs::run_lrat(&cnf, &proof, json),
        Command::Bundle { dir, premise, json } => proofs::run_bundle(&dir, &premise, json),
    }
}

/// Prints an input error and returns exit code 2.
pub(crate) fn unreadable(message: impl std::fmt::Display) -> ExitCode {
    eprintln!("ramsift-check: error: {message}");
    ExitCode::from(2)
}

fn run_colouring(path: &Path, forbid: Option<&str>, json: bool) -> ExitCode {
    let name = path.display().to_string();
    let content = match std::fs::read(path) {
        Ok(c) => c,
        Err(e) => return unreadable(format!("{name}: cannot read: {e}")),
    };
    let forbid = match forbid.map(Claim::parse).transpose() {
        Ok(f) => f,
        Err(e) => return unreadable(format!("--forbid: {e}")),
    };
    let (claim, matrices): (Claim, Vec<ColourMatrix>) = if looks_like_colouring_file(&content) {
        let text = match std::str::from_utf8(&content) {
            Ok(t) => t,
            Err(e) => {
                return unreadable(format!("{name}: byte {}: not UTF-8 text", e.valid_up_to()))
            }
        };
        let file = match parse_colouring_file(&name, text) {
            Ok(f) => f,
            Err(e) => return unreadable(e),
        };
        (forbid.unwrap_or(file.claim), vec![file.matrix])
    } else {
        let Some(claim) = forbid else {
            return unreadable(format!(
                "{name}: not a ramsift colouring file (no {MAGIC} header); a graph6 file needs --forbid S,T"
            ));
        };
        if claim.colours() != 2 {
            return unreadable(
                "--forbid: a graph6 file describes two colours; give exactly two sizes",
            );
        }
        match decode_graph6_file(&name, &content) {
            Ok(m) => (claim, m),
            Err(e) => return unreadable(e),
        }
    };

    let verdicts: Vec<Verdict> = matrices
        .iter()
        .map(|m| check_colouring(m, &claim))
        .collect();
    let all_valid = verdicts.iter().all(Verdict::is_valid);
    if json {
        let items: Vec<String> = verdicts
            .iter()
            .zip(&matrices)
            .map(|(v, m)| {
                format!(
                    "{{\"order\":{},\"valid\":{},\"detail\":\"{}\"}}",
                    m.order(),
                    v.is_valid(),
                    v
                )
            })
            .collect();
        println!(
            "{{\"claim\":\"{claim}\",\"valid\":{all_valid},\"colourings\":[{}]}}",
            items.join(",")
        );
    } else {
        for (index, (verdict, matrix)) in verdicts.iter().zip(&matrices).enumerate() {
            let label = if matrices.len() > 1 {
                format!("{name} graph {}", index + 1)
            } else {
                name.clone()
            };
            match verdict {
                Verdict::Valid => println!(
                    "VALID: {label}: a colouring of K_{} with no monochromatic forbidden graph ({}), so R({}) > {}",
                    matrix.order(),
                    describe(&claim),
                    claim,
                    matrix.order()
                ),
                other => println!("INVALID: {label}: {other}"),
            }
        }
    }
    if all_valid {
        ExitCode::SUCCESS
    } else {
        ExitCode::from(1)
    }
}

fn describe(claim: &Claim) -> String {
    claim
        .forbidden
        .iter()
        .enumerate()
        .map(|(i, g)| match g {
            ramsift_checker::ClaimGraph::Clique(k) => format!("colour {} forbids K{k}", i + 1),
            ramsift_checker::ClaimGraph::Graph { token, .. } => {
                format!("colour {} forbids {token}", i + 1)
            }
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// A ramsift colouring file starts (after comments and blank lines) with its magic word.
fn looks_like_colouring_file(content: &[u8]) -> bool {
    content
        .split(|&b| b == b'\n')
        .map(|l| l.trim_ascii())
        .find(|l| !l.is_empty() && !l.starts_with(b"#"))
        .is_some_and(|l| l.starts_with(MAGIC.as_bytes()))
}
