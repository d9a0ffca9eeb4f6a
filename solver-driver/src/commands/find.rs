//! `ramsift find SPEC N`: the witness search, by the method chosen with `--method`.

use std::path::PathBuf;
use std::sync::atomic::{AtomicBool, Ordering};
use std::time::Instant;

use anyhow::{Context, Result};
use clap::Args;

use ramsift_driver::local::search::LocalProgress;
use ramsift_driver::local::{local_search, LocalMethod, LocalOptions};
use ramsift_driver::output::witness::{
    colouring_text, write_summary, write_witness_files, FindSummary,
};
use ramsift_driver::search::extension::{extend, Extension};
use ramsift_driver::search::formula::Formula;
use ramsift_driver::search::hybrid::auto_search;
use ramsift_driver::search::portfolio::{
    search, SearchOptions, SearchProgress, SearchReport, SearchResult,
};
use ramsift_driver::search::repair::{repair, Repair};
use ramsift_driver::structured::{search_order, AbelianGroup, FamilyChoice};
use ramsift_encoder::atomic_file::write_atomically;

use super::instance_args::{timeout_of, InstanceArgs};
use super::progress::{seconds, ProgressLine};
use super::record::print_record;

#[derive(Args, Debug)]
pub struct FindArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Search method. auto: structured families, then local search feeding SAT, with
    /// a complete SAT worker throughout; sat: the SAT portfolio alone; circulant,
    /// cayley, block-circulant, structured: exhaustive within those families; local:
    /// local search alone (tabu search, or annealing with --rule anneal).
    #[arg(long, default_value = "auto", value_parser = ["auto", "sat", "circulant", "cayley", "block-circulant", "structured", "local"])]
    pub method: String,
    /// Shorthand for --method circulant.
    #[arg(long, conflicts_with = "method")]
    pub circulant: bool,
    /// With --method cayley: only this group, e.g. Z3xZ5 or Z2^4 (its order must be N).
    #[arg(long, value_name = "GROUP")]
    pub group: Option<String>,
    /// With --method block-circulant: only this many blocks (default: 2 and 3).
    #[arg(long, value_name = "COUNT")]
    pub blocks: Option<usize>,
    /// With --method local: tabu (default) or anneal.
    #[arg(long, default_value = "tabu", value_parser = ["tabu", "anneal"])]
    pub rule: String,
    /// Extend this colouring of a smaller K_m to K_N with SAT, one vertex at a time
    /// (a ramsift colouring file, or graph6 for two colours; - reads standard
    /// input). "None extends" concerns this colouring only.
    #[arg(long, value_name = "FILE", conflicts_with = "repair")]
    pub from: Option<PathBuf>,
    /// Repair this near-solution of K_N by SAT: free the edges of its remaining
    /// monochromatic cliques, then every edge at their vertices, then all edges,
    /// until a colouring is found (cliques only; e.g. local search's near-solution).
    #[arg(long, value_name = "FILE")]
    pub repair: Option<PathBuf>,
    /// Worker threads (default: all cores).
    #[arg(long, value_name = "COUNT")]
    pub threads: Option<usize>,
    /// Seed of every random choice; the same seed and thread count repeat a run.
    #[arg(long, default_value_t = 1)]
    pub seed: u64,
    /// Give up after this many seconds (exit code 1).
    #[arg(long, value_name = "SECONDS")]
    pub timeout: Option<f64>,
    /// Write the witness (colouring file, graph6) and summary.json into this directory.
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
    /// Clear the output directory first if it holds anything (otherwise it is refused).
    #[arg(long)]
    pub force: bool,
    /// Symmetry breaking for the SAT workers: none, or a comma list of colour-swap,
    /// lex-leader, degree-bounds. None is the default for searches (it slows
    /// satisfiable searches down).
    #[arg(long, default_value = "none", value_name = "SCHEMES")]
    pub symmetry: String,
    /// Solver backend: varisat (pure Rust, default) or cadical (needs a build with
    /// `--features ramsift-driver/cadical`; implies --method sat).
    #[arg(long, default_value = "varisat", value_parser = ["varisat", "cadical"])]
    pub solver: String,
    /// Print the summary as JSON on stdout instead of text.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

impl FindArgs {
    fn method(&self) -> &str {
        if self.circulant {
            "circulant"
        } else if self.solver == "cadical" {
            "sat"
        } else {
            &self.method
        }
    }

    fn family_choice(&self) -> Result<Option<FamilyChoice>> {
        anyhow::ensure!(
            self.group.is_none() || self.method() == "cayley",
            "--group goes with --method cayley"
        );
        anyhow::ensure!(
            self.blocks.is_none() || self.method() == "block-circulant",
            "--blocks goes with --method block-circulant"
        );
        Ok(match self.method() {
            "circulant" => Some(FamilyChoice::Circulant),
            "cayley" => Some(FamilyChoice::Cayley(
                self.group
                    .as_deref()
                    .map(|g| g.parse::<AbelianGroup>())
                    .transpose()
                    .context("--group")?,
            )),
            "block-circulant" => Some(FamilyChoice::BlockCirculant(self.blocks)),
            "structured" => Some(FamilyChoice::All),
            _ => None,
        })
    }
}

/// A colouring named on the command line (a colouring file, or graph6 for two
/// colours; - reads standard input), in the instance's colours.
fn read_colouring_arg(
    from: &std::path::Path,
    instance: &ramsift_encoder::Instance,
) -> Result<ramsift_encoder::Colouring> {
    let read = super::input::read_first_colouring(from)?;
    anyhow::ensure!(
        read.in_file == 1,
        "{}: holds {} colourings; give a file with one",
        from.display(),
        read.in_file
    );
    anyhow::ensure!(
        read.claim.is_some() || instance.colours() == 2,
        "{}: graph6 describes two colours; the specification has {}",
        from.display(),
        instance.colours()
    );
    let matrix = read.matrix;
    Ok(ramsift_encoder::Colouring::from_fn(
        matrix.order(),
        instance.colours(),
        |i, j| matrix.colour(i, j),
    ))
}

/// `find --repair FILE`: repairs a near-solution of K_N by SAT around its
/// remaining monochromatic cliques (see `ramsift_driver::search::repair`).
fn find_by_repair(
    args: &FindArgs,
    from: &std::path::Path,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
) -> Result<SearchReport> {
    anyhow::ensure!(
        args.symmetry == "none",
        "--repair keeps most edges of a colouring: --symmetry must be none"
    );
    anyhow::ensure!(
        instance.spec().is_cliques(),
        "--repair is for clique specifications"
    );
    let near = read_colouring_arg(from, instance)?;
    anyhow::ensure!(
        near.order() == instance.order(),
        "{} colours K_{}: --repair takes a (near-)colouring of K_{}",
        from.display(),
        near.order(),
        instance.order()
    );
    let encoding = args.instance.encoding("none")?;
    args.instance.fits(&encoding, &instance.to_string(), 1)?;
    let formula = Formula::from_encoding(&encoding);
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let result = match repair(
        &formula,
        instance.spec(),
        &near,
        &AtomicBool::new(false),
        deadline,
    )? {
        Repair::Repaired(result, _) => result,
        // The last radius is the whole plain formula: none exists at all.
        Repair::None => SearchResult::NoneExists,
        Repair::Stopped => SearchResult::Unknown,
    };
    Ok(SearchReport {
        result,
        attempts: 1,
        elapsed: started.elapsed(),
        threads: 1,
    })
}

/// `find --from FILE`: extends the given colouring of K_(N-1) by one vertex.
fn find_by_extension(
    args: &FindArgs,
    from: &std::path::Path,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
) -> Result<(SearchReport, Option<String>)> {
    anyhow::ensure!(
        args.symmetry == "none",
        "--from extends a given colouring: symmetry breaking could exclude its extensions, so --symmetry must be none"
    );
    let name = from.display().to_string();
    let base = read_colouring_arg(from, instance)?;
    anyhow::ensure!(
        base.order() < instance.order(),
        "{name} colours K_{}: --from extends a colouring of a smaller K_m to K_{}",
        base.order(),
        instance.order()
    );
    let verdict = ramsift_driver::certify::witness_check::verify_witness(instance.spec(), &base);
    anyhow::ensure!(
        verdict.is_valid(),
        "{name} is not a good colouring of K_{} for {}: {verdict}",
        base.order(),
        instance.spec()
    );
    // One vertex at a time: K_m -> K_(m+1) -> ... -> K_N (a chain of extensions).
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let mut current = base.clone();
    let mut outcome = Extension::Stopped;
    for order in base.order() + 1..=instance.order() {
        let step = ramsift_encoder::Instance::new(instance.spec().clone(), order)?;
        let encoding = ramsift_encoder::CliqueEncoding::new(
            &step,
            &ramsift_encoder::EncodingLimits::default(),
        )?;
        args.instance.fits(&encoding, &step.to_string(), 1)?;
        let formula = Formula::from_encoding(&encoding);
        outcome = extend(
            &formula,
            instance.spec(),
            &current,
            &AtomicBool::new(false),
            deadline,
        )?;
        match &outcome {
            Extension::Extended(SearchResult::Found { colouring, .. }) => {
                current = colouring.clone()
            }
            _ => break,
        }
    }
    let (result, note) = match outcome {
        Extension::Extended(SearchResult::Found { colouring, found_by }) if colouring.order() == instance.order() => {
            let steps = instance.order() - base.order();
            (SearchResult::Found { colouring, found_by: format!("{found_by}; {steps} extension step(s) from K_{}", base.order()) }, None)
        }
        Extension::Extended(_) | Extension::Stopped => (SearchResult::Unknown, None),
        Extension::None => (
            SearchResult::Unknown,
            Some(format!(
                "the chain of extensions from the colouring of K_{} in {name} stops at K_{}: no colouring of K_{} extends it",
                base.order(),
                current.order(),
                current.order() + 1
            )),
        ),
    };
    Ok((
        SearchReport {
            result,
            attempts: 1,
            elapsed: started.elapsed(),
            threads: 1,
        },
        note,
    ))
}

/// Where `find --method local --out DIR` keeps its best near-solution.
const NEAR_SOLUTION_FILE: &str = "near-solution.colouring";

/// "1 attempt", "2 attempts".
fn count(n: u64, noun: &str) -> String {
    format!("{n} {noun}{}", if n == 1 { "" } else { "s" })
}

pub fn run(args: &FindArgs) -> Result<u8> {
    let instance = args.instance.instance()?;
    if let Some(dir) = &args.out {
        ramsift_driver::output::dir::prepare(dir, args.force)?;
    }
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
    let line = ProgressLine::new(args.quiet);
    let method = args.method().to_string();

    let mut family_note = None;
    let report = if let Some(near) = &args.repair {
        find_by_repair(args, near, &instance, &options)?
    } else if let Some(from) = &args.from {
        let (report, note) = find_by_extension(args, from, &instance, &options)?;
        family_note = note;
        report
    } else if let Some(choice) = args.family_choice()? {
        let (report, note) = find_in_family(&choice, &instance, &options, &line)?;
        family_note = note;
        report
    } else if method == "local" {
        find_by_local_search(args, &instance, &options, &line)?
    } else {
        // The encoding only counts its clauses here (refusing instances over the
        // limits); the formula itself is built when a method needs it.
        let encoding = args.instance.encoding(&args.symmetry)?;
        let progress = SearchProgress::default();
        let tick = |elapsed| {
            line.update(|| {
                format!(
                    "{instance}: {method}, {}, {} elapsed, {} MiB of proof steps",
                    count(progress.attempts.load(Ordering::Relaxed), "attempt"),
                    seconds(elapsed),
                    progress.proof_bytes.load(Ordering::Relaxed) >> 20
                )
            })
        };
        let solvers = options.threads.max(1);
        if args.solver == "cadical" {
            args.instance.fits(&encoding, &format!("{instance}"), 1)?;
            search_with_cadical(&Formula::from_encoding(&encoding), &instance, &options)?
        } else if method == "sat" {
            args.instance
                .fits(&encoding, &format!("{instance}"), solvers)?;
            let formula = Formula::from_encoding(&encoding);
            search(&formula, instance.spec(), &options, &progress, tick)?
        } else {
            auto_search(
                instance.spec(),
                instance.order(),
                &options,
                &progress,
                tick,
                || {
                    // Too large for memory: the structured and local searches still run.
                    let fits = args
                        .instance
                        .fits(&encoding, &format!("{instance}"), solvers);
                    Ok(fits.is_ok().then(|| Formula::from_encoding(&encoding)))
                },
            )?
        }
    };
    line.finish();

    let mut summary = FindSummary::of_search(&instance, &report, args.seed);
    summary.method = method.clone();
    if args.solver == "cadical" {
        summary.solver = "CaDiCaL (rustsat-cadical 0.7.5)".to_string();
    }
    if let Some(note) = &family_note {
        summary.result = "none-in-family".to_string();
        summary.proves = Some(note.clone());
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
                    "found by {found_by}; method {method}; seed {}; checked by ramsift-checker before writing",
                    args.seed
                ),
            ];
            summary.files = write_witness_files(dir, &instance, colouring, &comments)
                .with_context(|| format!("writing the witness into {}", dir.display()))?;
        }
        let path = dir.join(ramsift_driver::output::witness::SUMMARY_FILE);
        summary.files.push(path);
        write_summary(dir, &summary)
            .with_context(|| format!("writing the summary into {}", dir.display()))?;
    }

    if args.json {
        print_record(&summary, &summary.result, summary.exit_code)?;
    } else {
        match &report.result {
            SearchResult::Found { colouring, found_by } => {
                let found = format!(
                    "FOUND {instance}: a colouring with no monochromatic forbidden graph, so R({}) > {} ({:.2}s, {}, {found_by})",
                    instance.spec(),
                    instance.order(),
                    report.elapsed.as_secs_f64(),
                    count(report.attempts, "attempt")
                );
                if args.out.is_some() {
                    println!("{found}");
                } else {
                    // The account as a comment line: the output is a colouring file
                    // that `ramsift-check colouring -` reads as it is.
                    print!("{}", colouring_text(&instance, colouring, &[found]));
                }
            }
            SearchResult::NoneExists => println!(
                "NONE {instance}: no such colouring exists, so R({}) <= {} ({:.2}s; uncertified: `ramsift refute` gives a checkable proof)",
                instance.spec(),
                instance.order(),
                report.elapsed.as_secs_f64()
            ),
            SearchResult::Unknown => match &family_note {
                Some(note) => println!(
                    "NONE-IN-FAMILY {instance}: {note} ({:.2}s); this says nothing about other colourings",
                    report.elapsed.as_secs_f64()
                ),
                None => println!(
                    "UNKNOWN {instance}: no answer {} ({:.2}s, {})",
                    ramsift_driver::search::interrupt::stopped_because(),
                    report.elapsed.as_secs_f64(),
                    count(report.attempts, "attempt")
                ),
            },
        }
        for file in &summary.files {
            println!("wrote {}", file.display());
        }
    }
    Ok(summary.exit_code)
}

/// An exhaustive search within families. A proof that the family is empty is
/// returned as `Unknown` with a note saying so (exit code 1: nothing was found, and
/// other colourings may still exist).
fn find_in_family(
    choice: &FamilyChoice,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
    line: &ProgressLine,
) -> Result<(SearchReport, Option<String>)> {
    let started = Instant::now();
    let stop = AtomicBool::new(false);
    let deadline = options.timeout.map(|t| started + t);
    line.update(|| format!("{instance}: {choice} search"));
    let order_report = search_order(choice, instance.spec(), instance.order(), &stop, deadline)?;
    let attempts = order_report.families.len() as u64;
    let (result, note) = match order_report.found() {
        Some(found) => (
            SearchResult::Found {
                colouring: found.colouring.clone(),
                found_by: format!("{} ({})", found.family, found.description),
            },
            None,
        ),
        None if order_report.verdict() == "none" => {
            let families: Vec<&str> = order_report
                .families
                .iter()
                .map(|f| f.family.as_str())
                .collect();
            (
                SearchResult::Unknown,
                Some(format!(
                    "no colouring of these families exists at this order: {}",
                    families.join(", ")
                )),
            )
        }
        None => (SearchResult::Unknown, None),
    };
    Ok((
        SearchReport {
            result,
            attempts,
            elapsed: started.elapsed(),
            threads: 1,
        },
        note,
    ))
}

fn find_by_local_search(
    args: &FindArgs,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
    line: &ProgressLine,
) -> Result<SearchReport> {
    let local_options = LocalOptions {
        method: if args.rule == "anneal" {
            LocalMethod::Anneal
        } else {
            LocalMethod::Tabu
        },
        threads: options.threads,
        seed: options.seed,
        timeout: options.timeout,
        ..LocalOptions::default()
    };
    let stop = AtomicBool::new(false);
    let progress = LocalProgress::default();
    let report = line.run_while(
        || local_search(instance.spec(), instance.order(), &local_options, &stop, &progress),
        |elapsed| {
            let best = progress.best_cost.load(Ordering::Relaxed);
            format!(
                "{instance}: {}, {} steps, {} restarts, fewest monochromatic cliques {}, {} elapsed",
                local_options.method,
                progress.steps.load(Ordering::Relaxed),
                progress.restarts.load(Ordering::Relaxed),
                if best == u64::MAX { "-".to_string() } else { best.to_string() },
                seconds(elapsed)
            )
        },
    )?;
    if report.found.is_none() && !args.quiet && !args.json {
        eprintln!(
            "{instance}: best colouring seen has {} monochromatic forbidden cliques",
            report.best_cost
        );
    }
    // The best near-solution is kept: a start for later runs (and for repair).
    if let (None, Some(dir), Some((cost, near))) = (&report.found, &args.out, report.near.first()) {
        let note = format!(
            "best near-solution of local search: {cost} monochromatic forbidden cliques remain"
        );
        let text = colouring_text(instance, near, &[note]);
        let path = dir.join(NEAR_SOLUTION_FILE);
        write_atomically(&path, |w| w.write_all(text.as_bytes()))
            .with_context(|| format!("writing {}", path.display()))?;
        if !args.json {
            eprintln!(
                "{instance}: wrote the best near-solution to {}",
                path.display()
            );
        }
    }
    Ok(SearchReport {
        result: match report.found {
            Some((colouring, found_by)) => SearchResult::Found {
                colouring,
                found_by,
            },
            None => SearchResult::Unknown,
        },
        attempts: report.restarts,
        elapsed: report.elapsed,
        threads: options.threads,
    })
}

#[cfg(feature = "cadical")]
fn search_with_cadical(
    formula: &Formula,
    instance: &ramsift_encoder::Instance,
    options: &SearchOptions,
) -> Result<SearchReport> {
    Ok(ramsift_driver::search::backends::cadical::search_cadical(
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
) -> Result<SearchReport> {
    anyhow::bail!("--solver cadical: this ramsift was built without CaDiCaL; rebuild with `cargo build --release --features ramsift-driver/cadical` (needs a C++ compiler and libclang)")
}
