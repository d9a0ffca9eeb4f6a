//! `ramsift`: finds and certifies small Ramsey numbers with a SAT solver.
//!
//! Exit codes: 10 a colouring was found, 20 none exists, 0 success of other
//! commands, 1 timeout or unknown, 2 bad input or an error.

mod commands;

use std::process::ExitCode;

use clap::{Parser, Subcommand};

use ramsift_driver::exit_codes;

#[derive(Parser)]
#[command(
    name = "ramsift",
    version,
    about = "Find and certify small Ramsey numbers with a SAT solver",
    long_about = "Find and certify small Ramsey numbers with a SAT solver.\n\n\
        A specification lists the forbidden graph of each colour: `4,4` asks for \
        2-colourings of the edges of K_n with no monochromatic K4, `3,3,3` for \
        3-colourings with no monochromatic triangle, `C4,K4` for no colour-1 4-cycle \
        and no colour-2 K4 (entries: Kk, Kk-e, Ck, Pk, Ka:b (K1:k a star), W_n (n vertices), Bk, G6:..., \
        E:0-1/1-2/...).\n\n\
        Exit codes: 10 a colouring was found, 20 none exists, 0 success of other \
        commands, 1 timeout or unknown, 2 bad input or an error."
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Search for a colouring of K_N with no monochromatic forbidden graph
    /// (structured families, local search and SAT; see --method).
    Find(commands::find::FindArgs),
    /// Search a structured family (circulant by default) at every order of a range.
    Scan(commands::scan::ScanArgs),
    /// Prove that no colouring exists and write a certificate bundle (CNF, DRAT, manifest).
    Refute(commands::refute::RefuteArgs),
    /// Sharded refutation: plan cubes, run them (locally or on Slurm), merge.
    #[command(subcommand)]
    Shard(commands::shard::ShardCommand),
    /// Theoretical bounds, the published range, and what bundles on disk certify.
    Bounds(commands::bounds::BoundsArgs),
    /// Draw a colouring as SVG or TikZ (circle layout or adjacency matrix).
    Draw(commands::draw::DrawArgs),
    /// List every colouring of K_N up to isomorphism (graph6 lines for two colours).
    Enumerate(commands::enumerate::EnumerateArgs),
    /// Write the CNF encoding of an instance as DIMACS (gzip if the name ends in .gz).
    Encode(commands::encode::EncodeArgs),
    /// A short built-in session: find and check witnesses for classical bounds.
    Demo(commands::demo::DemoArgs),
}

/// Restores the default action for SIGPIPE, so that `ramsift … | head` ends quietly
/// when the reader goes away instead of failing on its next write to stdout.
fn quiet_on_closed_pipe() {
    #[cfg(unix)]
    // SAFETY: called first thing in main, before any other thread exists; setting the
    // disposition of SIGPIPE to SIG_DFL has no other effect on this process.
    unsafe {
        libc::signal(libc::SIGPIPE, libc::SIG_DFL);
    }
}

fn main() -> ExitCode {
    quiet_on_closed_pipe();
    let cli = Cli::parse();
    if let Err(e) = ramsift_driver::search::interrupt::install_signal_handler() {
        eprintln!("ramsift: warning: Ctrl-C will not stop cleanly: {e}");
    }
    let result = match cli.command {
        Command::Find(args) => commands::find::run(&args),
        Command::Encode(args) => commands::encode::run(&args),
        Command::Refute(args) => commands::refute::run(&args),
        Command::Scan(args) => commands::scan::run(&args),
        Command::Shard(command) => commands::shard::run(&command),
        Command::Demo(args) => commands::demo::run(&args),
        Command::Bounds(args) => commands::bounds::run(&args),
        Command::Draw(args) => commands::draw::run(&args),
        Command::Enumerate(args) => commands::enumerate::run(&args),
    };
    match result {
        Ok(code) => ExitCode::from(code),
        Err(error) => {
            eprintln!("ramsift: error: {error:#}");
            // Under --json the error is JSON on stdout too, so scripts always get a record.
            if std::env::args().any(|a| a == "--json") {
                let record = ramsift_driver::output::records::ErrorRecord {
                    error: format!("{error:#}"),
                };
                let _ = commands::record::print_record(record, "error", exit_codes::BAD_INPUT);
            }
            ExitCode::from(exit_codes::BAD_INPUT)
        }
    }
}
