//! `ramsift-check`: verifies ramsift's certificates with independent code.
//!
//! Every subcommand ends with one verdict (see [`cli::verdict`]): exit code 0 PASS,
//! 1 FAIL, 2 FAIL because an input could not be read, 3 CONDITIONAL.

use std::path::PathBuf;
use std::process::ExitCode;

use clap::{Parser, Subcommand};

mod cli;

const EXIT_CODES: &str = "Exit codes: 0 PASS (the claim holds, nothing assumed), 1 FAIL (the \
    claim is not shown), 2 FAIL because an input could not be read, 3 CONDITIONAL (the proof \
    holds but rests on a premise no bundle certifies). The last line of the output (or the \
    `verdict` field with --json) says the same.";

#[derive(Parser)]
#[command(
    name = "ramsift-check",
    version,
    about = "Independent checker for ramsift witnesses and proofs",
    long_about = "Independent checker for ramsift witnesses and proofs.\n\n\
        It re-derives every claim from its statement with its own code and trusts \
        nothing the search produced. It reads only regular files, bounds the memory \
        it uses by the size of its inputs, and follows no link out of a bundle.",
    after_help = EXIT_CODES
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Check that a colouring has no monochromatic forbidden graph.
    ///
    /// FILE is a ramsift colouring file (or a stream of them, as `ramsift enumerate`
    /// writes), or a graph6 file (one graph per line; edges are colour 1, non-edges
    /// colour 2), which needs --forbid; - reads standard input.
    #[command(after_help = EXIT_CODES)]
    Colouring {
        /// The colouring file (ramsift format or graph6).
        file: PathBuf,
        /// The forbidden graph of each colour (e.g. 4,4 or C4,K4). Defaults to the file's header.
        #[arg(long, value_name = "SPEC")]
        forbid: Option<String>,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check a DRAT refutation (text or binary, gzip allowed) of a DIMACS CNF.
    #[command(after_help = EXIT_CODES)]
    Drat {
        /// The formula (DIMACS CNF, gzip allowed).
        cnf: PathBuf,
        /// The proof (DRAT text or binary, detected from the content; gzip allowed).
        proof: PathBuf,
        /// Literals added to the formula as unit clauses before checking, as in a
        /// shard's trace, which refutes the formula under its cube (e.g. "5,-12").
        #[arg(long, value_name = "LITERALS", allow_hyphen_values = true)]
        cube: Option<String>,
        /// Also write an LRAT proof of the same refutation to this file.
        #[arg(long, value_name = "FILE")]
        emit_lrat: Option<PathBuf>,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check a certificate bundle written by `ramsift refute` or `ramsift shard merge`:
    /// hashes, the formula (regenerated from the claim), the proof, and the premises.
    #[command(after_help = EXIT_CODES)]
    Bundle {
        /// The bundle directory.
        dir: PathBuf,
        /// A bundle that certifies a premise (may be repeated); it must pass itself.
        #[arg(long, value_name = "DIR")]
        premise: Vec<PathBuf>,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
    /// Check an LRAT refutation (text, gzip allowed) of a DIMACS CNF.
    #[command(after_help = EXIT_CODES)]
    Lrat {
        /// The formula (DIMACS CNF, gzip allowed).
        cnf: PathBuf,
        /// The proof (LRAT text; gzip allowed).
        proof: PathBuf,
        /// Print the verdict as JSON on stdout.
        #[arg(long)]
        json: bool,
    },
}

fn main() -> ExitCode {
    let (report, json) = match Cli::parse().command {
        Command::Colouring { file, forbid, json } => (cli::colouring::run(&file, forbid.as_deref()), json),
        Command::Drat { cnf, proof, cube, emit_lrat, json } => {
            (cli::proofs::run_drat(&cnf, &proof, cube.as_deref(), emit_lrat.as_deref()), json)
        }
        Command::Lrat { cnf, proof, json } => (cli::proofs::run_lrat(&cnf, &proof), json),
        Command::Bundle { dir, premise, json } => (cli::bundle::run(&dir, &premise), json),
    };
    report.emit(json)
}
