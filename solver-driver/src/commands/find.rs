//! `ramsift find SPEC N`: the parallel witness search.

use std::path::PathBuf;
use std::sync::atomic::Ordering;

use anyhow::{Context, Result};
use clap::Args;

use ramsift_driver::formula::Formula;
use ramsift_driver::portfolio::{search, SearchOptions, SearchProgress, SearchResult};
use ramsift_driver::witness::{colouring_text, write_summary, write_witness_files, FindSummary};

use super::instance_args::{timeout_of, InstanceArgs};
use super::progress::{seconds, ProgressLine};

#[derive(Args, Debug)]
pub struct FindArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Worker threads (default: all cores). Worker 0 is complete; the others are seeded.
    #[arg(long, value_name = "COUNT")]
    pub threads: Option<usize>,
    /// Seed of the random partial colourings; the same seed and thread count repeat a run.
    #[arg(long, default_value_t = 1)]
    pub seed: u64,
    /// Give up after this many seconds (exit code 1).
    #[arg(long, value_name = "SECONDS")]
    pub timeout: Option<f64>,
    /// Write the witness (colouring file, graph6) and summary.json into this directory.
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
    /// Symmetry breaking: none, or a comma list of colour-swap, lex-leader, degree-bounds.
    /// None is the default for searches (it slows satisfiable searches down).
    #[arg(long, default_value = "none", value_name = "SCHEMES")]
    pub symmetry: String,
    /// Solver backend: varisat (pure Rust, default) or cadical (needs a build with
    /// `--features ramsift-driver/cadical`).
    #[arg(long, default_value = "varisat", value_parser = ["varisat", "cadical"])]
    pub solver: String,
    /// Print the summary as JSON on stdout instead of text.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

pub fn run(args: &FindArgs) -> Result<u8> {
    let encoding = args.instance.encoding(&args.symmetry)?;
    let instance = encoding.instance().clone();
    let timeout = timeout_of(args.timeout)?;
    let mut options = SearchOptions {
        seed: args.seed,
        timeout,
        ..SearchOptions::default()
    };
    if let Some(threads) = args.threads {
        anyhow::ensure!(threads >= 1, "--threads 0: at least one worker is needed");
        options.threads = threads;
    }

    let formula = Formula::from_encoding(&encoding);
    let progress = SearchProgress::default();
    let line = ProgressLine::new(args.quiet);
    let report = if args.solver == "cadical" {
        search_with_cadical(&formula, &instance, &options)?
    } else {
        search(&formula, instance.spec(), &options, &progress, |elapsed| {
            line.update(|| {
                format!(
                    "{instance}: {} attempts, {} elapsed, {} MiB of proof steps",
                    progress.attempts.load(Ordering::Relaxed),
                    seconds(elapsed),
                    progress.proof_bytes.load(Ordering::Relaxed) >> 20
                )
            })
        })?
    };
    line.finish();

    let mut summary = FindSummary::of_search(&instance, &report, args.seed);
    if args.solver == "cadical" {
        summary.solver = "CaDiCaL (rustsat-cadical 0.7.5)".to_string();
    }
    if let Some(dir) = &args.out {
        if let SearchResult::Found {
            colouring,
            found_by,
        } = &report.result
        {
            let comments = vec![
                format!(
                    "ramsift {} witness for {}: proves R({}) > {}",
                    env!("CARGO_PKG_VERSION"),
                    instance,
                    instance.spec(),
                    instance.order()
                ),
                format!(
                    "found by {found_by}; seed {}; checked by ramsift-checker before writing",
                    args.seed
                ),
            ];
            summary.files = write_witness_files(dir, &instance, colouring, &comments)
                .with_context(|| format!("writing the witness into {}", dir.display()))?;
        }
        let path = dir.join(ramsift_driver::witness::SUMMARY_FILE);
        summary.files.push(path);
        write_summary(dir, &summary)
            .with_context(|| format!("writing the summary into {}", dir.display()))?;
    }

    if args.json {
        println!("{}", serde_json::to_string_pretty(&summary)?);
    } else {
        match &report.result {
            SearchResult::Found { colouring, found_by } => {
                println!(
                    "FOUND {instance}: a colouring with no monochromatic forbidden clique, so R({}) > {} ({:.2}s, {} attempts, {found_by})",
                    instance.spec(),
                    instance.order(),
                    report.elapsed.as_secs_f64(),
                    report.attempts
                );
                if args.out.is_none() {
                    print!("{}", colouring_text(&instance, colouring, &[]));
                }
            }
            SearchResult::NoneExists => println!(
                "NONE {instance}: no such colouring exists, so R({}) <= {} ({:.2}s; uncertified: `ramsift refute` gives a checkable proof)",
                instance.spec(),
                instance.order(),
                report.elapsed.as_secs_f64()
            ),
            SearchResult::Unknown => println!(
                "UNKNOWN {instance}: no answer within the time limit ({:.2}s, {} attempts)",
                report.elapsed.as_secs_f64(),
                report.attempts
            ),
        }
        for file in &summary.files {
            println!("wrote {}", file.display());
        }
    }
    Ok(summary.exit_code)
}

#[cfg(feature = "cadical")]
fn search_with_cadical(
    formula: &Formula,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
) -> Result<ramsift_driver::portfolio::SearchReport> {
    Ok(ramsift_driver::cadical_backend::search_cadical(
        formula,
        instance.spec(),
        options,
    )?)
}

#[cfg(not(feature = "cadical"))]
fn search_with_cadical(
    _: &Formula,
    _: &ramsift_encoder::Instance,
    _: &SearchOptions,
) -> Result<ramsift_driver::portfolio::SearchReport> {
    anyhow::bail!("--solver cadical: this ramsift was built without CaDiCaL; rebuild with `cargo build --release --features ramsift-driver/cadical` (needs a C++ compiler and libclang)")
}
