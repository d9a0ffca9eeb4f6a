//! `ramsift find SPEC N`: the witness search, by the method chosen with `--method`.

use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, Ordering};
use std::time::Instant;

use anyhow::{Context, Result};
use clap::{Args, ValueEnum};

use ramsift_driver::certify::witness_check::verify_witness;
use ramsift_driver::local::search::LocalProgress;
use ramsift_driver::local::{local_search, LocalMethod, LocalOptions, VertexCycles};
use ramsift_driver::output::records::{FindResult, FindSummary};
use ramsift_driver::output::summary::{write_summary, SUMMARY_FILE};
use ramsift_driver::output::witness::{colouring_text, write_witness_files};
use ramsift_driver::search::extension::{extend_chain, Chain};
use ramsift_driver::search::formula::Formula;
use ramsift_driver::search::hybrid::auto_search;
use ramsift_driver::search::job::{SearchJob, SearchOptions, SearchReport, SearchResult};
use ramsift_driver::search::portfolio::search;
use ramsift_driver::search::repair::{repair, Repair};
use ramsift_driver::structured::{search_order, AbelianGroup, FamilyChoice, ScanVerdict};
use ramsift_encoder::atomic_file::write_atomically;
use ramsift_encoder::{Colouring, Instance, RamseyEncoding, SymmetryChoice, SymmetrySet};

use super::instance_args::{timeout_of, InstanceArgs};
use super::progress::{seconds, ProgressLine};
use super::record::print_record;

#[derive(Args, Debug)]
pub struct FindArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Search method. auto: structured families, then local search feeding SAT, with
    /// a complete SAT worker throughout; sat: the SAT portfolio alone; circulant,
    /// cayley, block-circulant, structured: exhaustive within those families;
    /// automorphism: exhaustive among the colourings invariant under
    /// --automorphism; distance: exhaustive among the colourings where the colour
    /// of {i, j} depends on |i − j| only; local: local search alone (focused tabu
    /// search; see --rule).
    #[arg(long, value_enum, default_value_t = Method::Auto)]
    pub method: Method,
    /// Shorthand for --method circulant.
    #[arg(long, conflicts_with = "method")]
    pub circulant: bool,
    /// With --method cayley: only this group, e.g. Z3xZ5 or Z2^4 (its order must be N).
    #[arg(long, value_name = "GROUP")]
    pub group: Option<String>,
    /// With --method block-circulant: only this many blocks (default: 2 and 3).
    #[arg(long, value_name = "COUNT")]
    pub blocks: Option<usize>,
    /// With --method block-circulant: this many fixed vertices after the blocks,
    /// joined to each block by one colour (default: 0).
    #[arg(long, value_name = "COUNT")]
    pub fixed: Option<usize>,
    /// With --method local: focused (default; tabu over the edges of the remaining
    /// monochromatic copies), weighted (focused, with clique weights that grow
    /// while a copy persists), tabu (over every edge's recolourings) or anneal.
    #[arg(long, value_enum, default_value_t = Rule::Focused)]
    pub rule: Rule,
    /// With --method local or automorphism: only colourings invariant under a
    /// vertex permutation with these cycle lengths, e.g. 4x8,2 (eight 4-cycles on
    /// vertices 0..31, then a 2-cycle; a length of 1 is a fixed vertex; the lengths
    /// add up to N). Local search moves recolour whole edge orbits (rules focused
    /// and tabu); --method automorphism searches the family exhaustively. Give it
    /// again for more permutations: each local search restart takes one (each in
    /// turn at first, then every second restart the one whose restarts ended with
    /// the fewest copies on average); the exhaustive search tries them one after
    /// the other.
    #[arg(long, value_name = "CYCLES")]
    pub automorphism: Vec<VertexCycles>,
    /// With --method local: add every involution shape of K_N to the permutations
    /// (p 2-cycles on vertices 0..2p, the other N − 2p vertices fixed, for p from
    /// N/2 down to 1); the restarts share them out as with several --automorphism.
    #[arg(long)]
    pub involutions: bool,
    /// Extend this colouring of a smaller K_m to K_N with SAT, one vertex at a time
    /// (a ramsift colouring file, or graph6 for two colours; - reads standard
    /// input). "None extends" concerns this colouring only.
    #[arg(long, value_name = "FILE", conflicts_with = "repair")]
    pub from: Option<PathBuf>,
    /// With --from: when a step finds no extension, free up to this many old
    /// vertices (all their edges become unknowns), the one most involved in the
    /// solver's refutation first, one more per round.
    #[arg(long, value_name = "COUNT", default_value_t = 0, requires = "from")]
    pub free: usize,
    /// Repair this near-solution of K_N by SAT: free the edges of its remaining
    /// monochromatic forbidden copies; failing that, search the whole formula with
    /// CDCL anchored at the near-solution (every descent starts from it), until a
    /// colouring is found or none exists (e.g. local search's near-solution).
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
    pub symmetry: SymmetryChoice,
    /// Solver backend: varisat (pure Rust, default) or cadical (needs a build with
    /// `--features ramsift-driver/cadical`; implies --method sat).
    #[arg(long, value_enum, default_value_t = SolverChoice::Varisat)]
    pub solver: SolverChoice,
    /// Print the summary as JSON on stdout instead of text.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

/// The search methods of `find`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Method {
    Auto,
    Sat,
    Circulant,
    Cayley,
    BlockCirculant,
    Structured,
    Automorphism,
    Distance,
    Local,
}

impl Method {
    /// The name on the command line and in summaries.
    fn name(self) -> String {
        self.to_possible_value()
            .map_or_else(String::new, |v| v.get_name().to_string())
    }
}

/// The move rules of `--method local`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Rule {
    Tabu,
    /// Tabu search over the edges of the remaining monochromatic copies only.
    Focused,
    /// Focused search whose monochromatic cliques gain weight while they persist
    /// (breakout clique weighting).
    Weighted,
    Anneal,
}

/// The solver backends.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum SolverChoice {
    Varisat,
    Cadical,
}

impl FindArgs {
    fn method(&self) -> Method {
        if self.circulant {
            Method::Circulant
        } else if self.solver == SolverChoice::Cadical {
            Method::Sat
        } else {
            self.method
        }
    }

    fn family_choice(&self) -> Result<Option<FamilyChoice>> {
        anyhow::ensure!(
            self.group.is_none() || self.method() == Method::Cayley,
            "--group goes with --method cayley"
        );
        anyhow::ensure!(
            (self.blocks.is_none() && self.fixed.is_none())
                || self.method() == Method::BlockCirculant,
            "--blocks and --fixed go with --method block-circulant"
        );
        Ok(match self.method() {
            Method::Circulant => Some(FamilyChoice::Circulant),
            Method::Cayley => Some(FamilyChoice::Cayley(
                self.group
                    .as_deref()
                    .map(|g| g.parse::<AbelianGroup>())
                    .transpose()
                    .context("--group")?,
            )),
            Method::BlockCirculant => Some(FamilyChoice::BlockCirculant(
                self.blocks,
                self.fixed.unwrap_or(0),
            )),
            Method::Structured => Some(FamilyChoice::All),
            Method::Distance => Some(FamilyChoice::Distance),
            Method::Automorphism => {
                anyhow::ensure!(
                    !self.automorphism.is_empty(),
                    "--method automorphism needs --automorphism CYCLES"
                );
                Some(FamilyChoice::Automorphism(self.automorphism.clone()))
            }
            _ => None,
        })
    }

    /// The symmetry breaking of the SAT workers.
    fn symmetry(&self, instance: &Instance) -> SymmetrySet {
        self.symmetry
            .resolve(|| SymmetrySet::for_refutation(instance.spec()))
    }
}

/// A colouring named on the command line (a colouring file, or graph6 for two
/// colours; - reads standard input), in the instance's colours.
fn read_colouring_arg(from: &Path, instance: &Instance) -> Result<Colouring> {
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
    Ok(Colouring::from_fn(
        matrix.order(),
        instance.colours(),
        |i, j| matrix.colour(i, j),
    ))
}

/// What a method returns: the report, and a note when it proved something
/// narrower than the question (a family is empty; a given colouring does not extend).
type Found = (SearchReport, Option<String>);

/// `find --repair FILE`: repairs a near-solution of K_N by SAT around its
/// remaining monochromatic cliques (see `ramsift_driver::search::repair`).
fn find_by_repair(args: &FindArgs, near_file: &Path, job: &SearchJob) -> Result<Found> {
    anyhow::ensure!(
        job.symmetry.is_empty(),
        "--repair keeps most edges of a colouring: --symmetry must be none"
    );
    let instance = &job.instance;
    let near = read_colouring_arg(near_file, instance)?;
    anyhow::ensure!(
        near.order() == instance.order(),
        "{} colours K_{}: --repair takes a (near-)colouring of K_{}",
        near_file.display(),
        near.order(),
        instance.order()
    );
    let encoding = args
        .instance
        .encoding(&SymmetryChoice::Schemes(SymmetrySet::none()))?;
    args.instance.fits(&encoding, &instance.to_string(), 1)?;
    let formula = Formula::from_encoding(&encoding);
    let started = Instant::now();
    let result = match repair(
        &formula,
        &near,
        &AtomicBool::new(false),
        job.deadline_from(started),
    )? {
        Repair::Repaired(result, _) => result,
        // The anchored stage searches the whole plain formula: none exists at all.
        Repair::None => SearchResult::NoneExists,
        Repair::Stopped => SearchResult::Unknown,
    };
    job.count_attempt(0);
    Ok((job.report(result, started), None))
}

/// `find --from FILE`: extends the given colouring of a smaller K_m to K_N, one
/// vertex at a time.
fn find_by_extension(args: &FindArgs, from: &Path, job: &SearchJob) -> Result<Found> {
    anyhow::ensure!(
        job.symmetry.is_empty(),
        "--from extends a given colouring: symmetry breaking could exclude its extensions, so --symmetry must be none"
    );
    let (instance, name) = (&job.instance, from.display().to_string());
    let base = read_colouring_arg(from, instance)?;
    anyhow::ensure!(
        base.order() < instance.order(),
        "{name} colours K_{}: --from extends a colouring of a smaller K_m to K_{}",
        base.order(),
        instance.order()
    );
    let verdict = verify_witness(instance.spec(), &base);
    anyhow::ensure!(
        verdict.is_valid(),
        "{name} is not a good colouring of K_{} for {}: {verdict}",
        base.order(),
        instance.spec()
    );
    let started = Instant::now();
    let admit = |encoding: &RamseyEncoding| -> Result<()> {
        Ok(args
            .instance
            .fits(encoding, &encoding.instance().to_string(), 1)?)
    };
    let chain = extend_chain(
        instance,
        &base,
        args.free,
        args.seed,
        &AtomicBool::new(false),
        job.deadline_from(started),
        admit,
    )?;
    job.count_attempt(0);
    let (result, note) = match chain {
        Chain::Reached { colouring, found_by } => (SearchResult::Found { colouring, found_by }, None),
        Chain::Stopped => (SearchResult::Unknown, None),
        Chain::StuckAt(last) => (
            SearchResult::Unknown,
            Some(format!(
                "the chain of extensions from the colouring of K_{} in {name} stops at K_{}: no colouring of K_{} extends it{}",
                base.order(),
                last.order(),
                last.order() + 1,
                if args.free > 0 {
                    format!(" with up to {} of its vertices freed", args.free)
                } else {
                    String::new()
                }
            )),
        ),
    };
    Ok((job.report(result, started), note))
}

/// Where `find --method local --out DIR` keeps its best near-solution.
const NEAR_SOLUTION_FILE: &str = "near-solution.colouring";

/// "1 attempt", "2 attempts".
fn count(n: u64, noun: &str) -> String {
    format!("{n} {noun}{}", if n == 1 { "" } else { "s" })
}

/// The search job of a `find` run: the instance, the SAT workers' symmetry
/// breaking, and the options from the flags.
fn job_of(args: &FindArgs) -> Result<SearchJob> {
    let instance = args.instance.instance()?;
    let mut options = SearchOptions {
        seed: args.seed,
        timeout: timeout_of(args.timeout)?,
        ..SearchOptions::default()
    };
    if let Some(threads) = args.threads {
        anyhow::ensure!(threads >= 1, "--threads 0: at least one worker is needed");
        options.threads = threads;
    }
    let symmetry = args.symmetry(&instance);
    Ok(SearchJob::new(instance, symmetry, options))
}

pub fn run(args: &FindArgs) -> Result<u8> {
    anyhow::ensure!(
        args.automorphism.is_empty()
            || (matches!(args.method(), Method::Local | Method::Automorphism)
                && args.from.is_none()
                && args.repair.is_none()),
        "--automorphism goes with --method local or automorphism"
    );
    anyhow::ensure!(
        !args.involutions || args.method() == Method::Local,
        "--involutions goes with --method local"
    );
    let job = job_of(args)?;
    if let Some(dir) = &args.out {
        ramsift_driver::output::dir::prepare(dir, args.force)?;
    }
    let line = ProgressLine::new(args.quiet);
    let (report, note) = if let Some(near) = &args.repair {
        find_by_repair(args, near, &job)?
    } else if let Some(from) = &args.from {
        find_by_extension(args, from, &job)?
    } else if let Some(choice) = args.family_choice()? {
        find_in_family(&choice, &job, &line)?
    } else if args.method() == Method::Local {
        (find_by_local_search(args, &job, &line)?, None)
    } else {
        (find_by_sat(args, &job, &line)?, None)
    };
    line.finish();

    let mut summary = FindSummary::of_search(&job.instance, &report, args.seed);
    summary.method = args.method().name();
    if args.solver == SolverChoice::Cadical {
        summary.solver = "CaDiCaL (rustsat-cadical 0.7.5)".to_string();
    }
    if let Some(note) = &note {
        summary.result = FindResult::NoneInFamily;
        summary.proves = Some(note.clone());
    }
    if let Some(dir) = &args.out {
        write_find_outputs(args, dir, &job.instance, &report, &mut summary)?;
    }
    if args.json {
        print_record(&summary, summary.result.word(), summary.exit_code)?;
    } else {
        print_find_text(args, &job.instance, &report, note.as_deref());
        for file in &summary.files {
            println!("wrote {}", file.display());
        }
    }
    Ok(summary.exit_code)
}

/// The SAT methods: `sat` (the portfolio, or CaDiCaL) and `auto` (the hybrid).
fn find_by_sat(args: &FindArgs, job: &SearchJob, line: &ProgressLine) -> Result<SearchReport> {
    // The encoding only counts its clauses here (refusing instances over the
    // limits); the formula itself is built when a method needs it.
    let encoding = args.instance.encoding(&args.symmetry)?;
    let instance = &job.instance;
    let method = args.method().name();
    let tick = |elapsed| {
        line.update(|| {
            format!(
                "{instance}: {method}, {}, {} elapsed, {} MiB of proof steps",
                count(job.progress.attempts.load(Ordering::Relaxed), "attempt"),
                seconds(elapsed),
                job.progress.proof_bytes.load(Ordering::Relaxed) >> 20
            )
        })
    };
    let what = instance.to_string();
    if args.solver == SolverChoice::Cadical {
        args.instance.fits(&encoding, &what, 1)?;
        search_with_cadical(job, &Formula::from_encoding(&encoding))
    } else if args.method() == Method::Sat {
        args.instance.fits(&encoding, &what, job.threads())?;
        Ok(search(job, &Formula::from_encoding(&encoding), tick)?)
    } else {
        Ok(auto_search(job, tick, || {
            // Too large for memory: the structured and local searches still run.
            let fits = args.instance.fits(&encoding, &what, job.threads());
            Ok(fits.is_ok().then(|| Formula::from_encoding(&encoding)))
        })?)
    }
}

/// Writes the witness files (when found) and summary.json into `dir`, and lists
/// them in the summary.
fn write_find_outputs(
    args: &FindArgs,
    dir: &Path,
    instance: &Instance,
    report: &SearchReport,
    summary: &mut FindSummary,
) -> Result<()> {
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
                "found by {found_by}; method {}; seed {}; checked by ramsift-checker before writing",
                args.method().name(),
                args.seed
            ),
        ];
        summary.files = write_witness_files(dir, instance, colouring, &comments)
            .with_context(|| format!("writing the witness into {}", dir.display()))?;
    }
    summary.files.push(dir.join(SUMMARY_FILE));
    write_summary(dir, summary)
        .with_context(|| format!("writing the summary into {}", dir.display()))?;
    Ok(())
}

/// The text account of a `find` run on stdout.
fn print_find_text(
    args: &FindArgs,
    instance: &Instance,
    report: &SearchReport,
    note: Option<&str>,
) {
    let (spec, n, secs) = (
        instance.spec(),
        instance.order(),
        report.elapsed.as_secs_f64(),
    );
    match &report.result {
        SearchResult::Found { colouring, found_by } => {
            let found = format!(
                "FOUND {instance}: a colouring with no monochromatic forbidden graph, so R({spec}) > {n} ({secs:.2}s, {}, {found_by})",
                count(report.attempts, "attempt")
            );
            if args.out.is_some() {
                println!("{found}");
            } else {
                // The account as a comment line: the output is a colouring file
                // that `ramsift-check colouring -` reads as it is.
                print!("{}", colouring_text(instance, colouring, &[found]));
            }
        }
        SearchResult::NoneExists => println!(
            "NONE {instance}: no such colouring exists, so R({spec}) <= {n} ({secs:.2}s; uncertified: `ramsift refute` gives a checkable proof)"
        ),
        SearchResult::Unknown => match note {
            Some(note) => {
                println!("NONE-IN-FAMILY {instance}: {note} ({secs:.2}s); this says nothing about other colourings")
            }
            None => println!(
                "UNKNOWN {instance}: no answer {} ({secs:.2}s, {})",
                ramsift_driver::search::interrupt::stopped_because(),
                count(report.attempts, "attempt")
            ),
        },
    }
}

/// An exhaustive search within families. A proof that the family is empty is
/// returned as `Unknown` with a note saying so (exit code 1: nothing was found, and
/// other colourings may still exist).
fn find_in_family(choice: &FamilyChoice, job: &SearchJob, line: &ProgressLine) -> Result<Found> {
    let started = Instant::now();
    let instance = &job.instance;
    line.update(|| format!("{instance}: {choice} search"));
    let order_report = search_order(
        choice,
        instance.spec(),
        instance.order(),
        &AtomicBool::new(false),
        job.deadline_from(started),
    )?;
    job.progress
        .attempts
        .fetch_add(order_report.families.len() as u64, Ordering::Relaxed);
    let (result, note) = match order_report.found() {
        Some(found) => (
            SearchResult::Found {
                colouring: found.colouring.clone(),
                found_by: format!("{} ({})", found.family, found.description),
            },
            None,
        ),
        None if order_report.verdict() == ScanVerdict::None => {
            let families: Vec<&str> = order_report
                .families
                .iter()
                .map(|f| f.family.as_str())
                .collect();
            let note = format!(
                "no colouring of these families exists at this order: {}",
                families.join(", ")
            );
            (SearchResult::Unknown, Some(note))
        }
        None => (SearchResult::Unknown, None),
    };
    let mut report = job.report(result, started);
    report.threads = 1;
    Ok((report, note))
}

fn find_by_local_search(
    args: &FindArgs,
    job: &SearchJob,
    line: &ProgressLine,
) -> Result<SearchReport> {
    let local_options = LocalOptions {
        method: match args.rule {
            Rule::Anneal => LocalMethod::Anneal,
            Rule::Focused => LocalMethod::Focused,
            Rule::Weighted => LocalMethod::Weighted,
            Rule::Tabu => LocalMethod::Tabu,
        },
        threads: job.threads(),
        seed: job.options.seed,
        timeout: job.options.timeout,
        automorphisms: local_automorphisms(args, job.order()),
        ..LocalOptions::default()
    };
    let (instance, stop, progress) = (
        &job.instance,
        AtomicBool::new(false),
        LocalProgress::default(),
    );
    let symmetry = match (args.automorphism.as_slice(), args.involutions) {
        ([], false) => String::new(),
        ([], true) => " over the edge orbits of every involution".to_string(),
        (given, involutions) => format!(
            " over the edge orbits of cycles {}{}",
            VertexCycles::list(given),
            if involutions {
                " and every involution"
            } else {
                ""
            }
        ),
    };
    let report =
        line.run_while(
            || local_search(instance, &local_options, &stop, &progress),
            |elapsed| {
                let best = progress.best_cost.load(Ordering::Relaxed);
                format!(
                "{instance}: {}{symmetry}, {} steps, {} restarts, fewest monochromatic copies {}, {} elapsed",
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
            "{instance}: best colouring seen has {} monochromatic forbidden copies",
            report.best_cost
        );
    }
    // The best near-solution is kept: a start for later runs (and for repair).
    if let (None, Some(dir), Some((cost, near))) = (&report.found, &args.out, report.near.first()) {
        let note = format!(
            "best near-solution of local search: {cost} monochromatic forbidden copies remain"
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
    job.progress
        .attempts
        .fetch_add(report.restarts, Ordering::Relaxed);
    let result = match report.found {
        Some((colouring, found_by)) => SearchResult::Found {
            colouring,
            found_by,
        },
        None => SearchResult::Unknown,
    };
    Ok(SearchReport {
        result,
        attempts: report.restarts,
        elapsed: report.elapsed,
        threads: job.threads(),
    })
}

/// The permutations local search shares its restarts among: --automorphism,
/// then with --involutions every involution shape of K_order.
fn local_automorphisms(args: &FindArgs, order: usize) -> Vec<VertexCycles> {
    let mut all = args.automorphism.clone();
    if args.involutions {
        all.extend(VertexCycles::involutions(order));
    }
    all
}

#[cfg(feature = "cadical")]
fn search_with_cadical(job: &SearchJob, formula: &Formula) -> Result<SearchReport> {
    Ok(ramsift_driver::search::backends::cadical::search_cadical(
        job, formula,
    )?)
}

#[cfg(not(feature = "cadical"))]
fn search_with_cadical(_: &SearchJob, _: &Formula) -> Result<SearchReport> {
    anyhow::bail!("--solver cadical: this ramsift was built without CaDiCaL; rebuild with `cargo build --release --features ramsift-driver/cadical` (needs a C++ compiler and libclang)")
}
