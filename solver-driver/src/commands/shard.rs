//! `ramsift shard …`: plan a sharded refutation, run shards (one, all locally, or as
//! a Slurm job array), report their status, and merge them into one bundle.

use std::path::PathBuf;
use std::sync::atomic::{AtomicBool, Ordering};

use anyhow::{bail, Context, Result};
use clap::{Args, Subcommand};
use ramsift_encoder::SymmetryChoice;
use rayon::prelude::*;

use ramsift_driver::exit_codes;
use ramsift_driver::output::records::{
    ShardLocalRecord, ShardMergeRecord, ShardPlanRecord, ShardRunRecord, ShardStatusRecord,
};
use ramsift_driver::shard::merge::merge_counted;
use ramsift_driver::shard::plan::plan_cubes_counted;
use ramsift_driver::shard::result::witness_path;
use ramsift_driver::shard::run::{run_shard, ShardOutcome};
use ramsift_driver::shard::slurm::{batch_scripts, SlurmOptions};
use ramsift_driver::shard::status::{array_list, plan_status};
use ramsift_driver::shard::{Plan, ShardError};
use ramsift_encoder::atomic_file::{ensure_dir, write_atomically};
use ramsift_encoder::dimacs::write_encoding_to;

use super::instance_args::{timeout_of, InstanceArgs, OutDirArgs};
use super::progress::{seconds, ProgressLine};
use super::record::print_record;

#[derive(Subcommand, Debug)]
pub enum ShardCommand {
    /// Split a refutation into cubes whose disjunction is a tautology.
    Plan(PlanArgs),
    /// Refute one shard (index from --index or SLURM_ARRAY_TASK_ID); skips finished shards.
    Run(RunArgs),
    /// Run every unfinished shard on local cores.
    Local(LocalArgs),
    /// Write a Slurm batch script (job array over the shards).
    Slurm(SlurmArgs),
    /// Count done / failed / missing shards and print the --array list to resubmit.
    Status(StatusArgs),
    /// Check every shard result and write one certificate bundle.
    Merge(MergeArgs),
}

#[derive(Args, Debug)]
pub struct PlanArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Number of open cubes to plan (cubes that propagation does not refute; the
    /// planner stops earlier when nothing is left to split).
    #[arg(long, default_value_t = 64)]
    pub shards: usize,
    #[command(flatten)]
    pub dir: OutDirArgs,
    /// Symmetry breaking, as for refute (default: minimality, with degree-bounds for
    /// cliques; each shard then runs our solver with the minimality check).
    #[arg(long, default_value = "default", value_name = "SCHEMES")]
    pub symmetry: SymmetryChoice,
    /// Print the result as one JSON record on stdout.
    #[arg(long)]
    pub json: bool,
}

#[derive(Args, Debug)]
pub struct RunArgs {
    /// The plan directory.
    pub plan: PathBuf,
    /// The shard to run (default: $SLURM_ARRAY_TASK_ID).
    #[arg(long)]
    pub index: Option<usize>,
    /// Give up on the shard after this many seconds (exit 1; nothing is kept).
    #[arg(long, value_name = "SECONDS")]
    pub timeout: Option<f64>,
    /// Print the result as one JSON record on stdout.
    #[arg(long)]
    pub json: bool,
}

#[derive(Args, Debug)]
pub struct LocalArgs {
    /// The plan directory.
    pub plan: PathBuf,
    /// Shards run at once (default: all cores).
    #[arg(long)]
    pub threads: Option<usize>,
    /// Print the result as one JSON record on stdout.
    #[arg(long)]
    pub json: bool,
}

#[derive(Args, Debug)]
pub struct SlurmArgs {
    /// The plan directory.
    pub plan: PathBuf,
    #[arg(long)]
    pub partition: Option<String>,
    /// Time limit per shard, in Slurm's syntax (e.g. 1:00:00).
    #[arg(long)]
    pub time: Option<String>,
    /// Memory per shard, in Slurm's syntax (e.g. 4G).
    #[arg(long)]
    pub mem: Option<String>,
    /// CPUs per shard (a shard runs one solver).
    #[arg(long, default_value_t = 1)]
    pub cpus: usize,
    /// At most this many shards running at once.
    #[arg(long)]
    pub throttle: Option<usize>,
    /// The cluster's MaxArraySize (larger plans get one script per chunk).
    #[arg(long, default_value_t = 1001)]
    pub max_array_size: usize,
}

#[derive(Args, Debug)]
pub struct StatusArgs {
    /// The plan directory.
    pub plan: PathBuf,
    /// Print the status as JSON.
    #[arg(long)]
    pub json: bool,
}

#[derive(Args, Debug)]
pub struct MergeArgs {
    /// The plan directory.
    pub plan: PathBuf,
    #[command(flatten)]
    pub dir: OutDirArgs,
    /// Also compose one DRAT trace of the whole formula from the shard traces.
    #[arg(long)]
    pub single_trace: bool,
    /// Do not certify the premises of degree bounds (see `refute --assume-premises`).
    #[arg(long)]
    pub assume_premises: bool,
    /// Print the result as one JSON record on stdout.
    #[arg(long)]
    pub json: bool,
}

pub fn run(command: &ShardCommand) -> Result<u8> {
    match command {
        ShardCommand::Plan(args) => plan(args),
        ShardCommand::Run(args) => run_one(args),
        ShardCommand::Local(args) => local(args),
        ShardCommand::Slurm(args) => slurm(args),
        ShardCommand::Status(args) => status(args),
        ShardCommand::Merge(args) => {
            args.dir.prepare()?;
            let copied = std::sync::atomic::AtomicUsize::new(0);
            let line = ProgressLine::new(args.json);
            let shards = Plan::read(&args.plan)?.cubes.len();
            let report = line.run_while(
                || {
                    merge_counted(
                        &args.plan,
                        &args.dir.out,
                        args.single_trace,
                        !args.assume_premises,
                        &copied,
                    )
                },
                |elapsed| {
                    let done = copied.load(Ordering::Relaxed);
                    format!(
                        "merging: {done} of {shards} shard traces taken in, {} elapsed",
                        seconds(elapsed)
                    )
                },
            )?;
            let manifest_sha256 = ramsift_driver::certify::bundle::fingerprint(&args.dir.out)
                .with_context(|| format!("reading {}/manifest.json", args.dir.out.display()))?;
            if args.json {
                let plan = Plan::read(&args.plan)?;
                let record = ShardMergeRecord {
                    proves: format!("R({}) <= {}", plan.spec, plan.order),
                    bundle: args.dir.out.clone(),
                    seconds: report.shard_seconds,
                    trace_bytes: report.trace_bytes,
                    composed_trace: report.composed_trace,
                    files: report.files,
                    manifest_sha256,
                };
                print_record(record, "refuted", exit_codes::NONE_EXISTS)?;
                return Ok(exit_codes::NONE_EXISTS);
            }
            println!(
                "merged {} into {}: shard time {:.2}s in all, {} bytes of shard traces",
                args.plan.display(),
                args.dir.out.display(),
                report.shard_seconds,
                report.trace_bytes
            );
            if let Some(t) = report.composed_trace {
                println!("composed single trace {}", t.display());
            }
            println!("fingerprint (SHA-256 of manifest.json): {manifest_sha256}");
            println!(
                "check with: ramsift-check bundle {}",
                args.dir.out.display()
            );
            Ok(exit_codes::NONE_EXISTS)
        }
    }
}

fn plan(args: &PlanArgs) -> Result<u8> {
    anyhow::ensure!(args.shards >= 1, "--shards 0: at least one shard is needed");
    let encoding = args.instance.refutation_encoding(&args.symmetry)?;
    args.instance
        .fits(&encoding, &encoding.instance().to_string(), 1)?;
    args.dir.prepare()?;
    let formula_path = args.dir.out.join("formula.cnf.gz");
    write_encoding_to(&encoding, &formula_path)?;
    let (sha, _) = ramsift_driver::certify::bundle::hash_file(&formula_path)?;
    let leaves = std::sync::atomic::AtomicUsize::new(0);
    let line = ProgressLine::new(args.json);
    let plan = line.run_while(
        || plan_cubes_counted(&encoding, args.shards, sha, &leaves),
        |elapsed| {
            let so_far = leaves.load(Ordering::Relaxed);
            format!(
                "planning {}: {so_far} of {} open cubes, {} elapsed",
                encoding.instance(),
                args.shards,
                seconds(elapsed)
            )
        },
    );
    plan.write(&args.dir.out)?;
    if args.json {
        let record = ShardPlanRecord {
            instance: encoding.instance().to_string(),
            plan: args.dir.out.clone(),
            shards: plan.cubes.len(),
            symmetry: encoding.symmetry().to_string(),
            cubes: plan.cubes,
        };
        print_record(record, "planned", exit_codes::SUCCESS)?;
        return Ok(exit_codes::SUCCESS);
    }
    println!(
        "planned {} as {} shards in {} [{}]",
        encoding.instance(),
        plan.cubes.len(),
        args.dir.out.display(),
        encoding.symmetry()
    );
    let open = plan
        .cubes
        .iter()
        .filter(|c| !c.refuted_by_propagation)
        .count();
    let fixed: usize = plan.cubes.iter().map(|c| c.lemmas.len()).sum();
    println!("{open} open cubes; {fixed} lemmas from failed literals and settled branches");
    println!(
        "{:>6} {:>6} {:>6} {:>8} {:>10}  cube",
        "shard", "size", "lemmas", "free", "est. share"
    );
    for c in &plan.cubes {
        println!(
            "{:>6} {:>6} {:>6} {:>8} {:>9.1}%  {:?}{}",
            c.index,
            c.literals.len(),
            c.lemmas.len(),
            c.free_variables,
            c.estimated_share_percent,
            c.literals,
            if c.refuted_by_propagation {
                " (refuted by propagation)"
            } else {
                ""
            }
        );
    }
    Ok(exit_codes::SUCCESS)
}

fn run_one(args: &RunArgs) -> Result<u8> {
    let index = match args.index {
        Some(i) => i,
        None => std::env::var("SLURM_ARRAY_TASK_ID")
            .ok()
            .and_then(|v| v.parse().ok())
            .context("no --index given and SLURM_ARRAY_TASK_ID is not set")?,
    };
    let outcome = run_shard(
        &args.plan,
        index,
        timeout_of(args.timeout)?,
        &AtomicBool::new(false),
    )?;
    let plan = Plan::read(&args.plan)?;
    let code = match outcome {
        // 0, not 20: a Slurm array task that exits non-zero counts as failed.
        ShardOutcome::AlreadyDone | ShardOutcome::Refuted => exit_codes::SUCCESS,
        ShardOutcome::Found => exit_codes::FOUND,
        ShardOutcome::Unknown => exit_codes::UNKNOWN,
    };
    if args.json {
        let (word, witness) = match outcome {
            ShardOutcome::AlreadyDone => ("already-done", None),
            ShardOutcome::Refuted => ("refuted", None),
            ShardOutcome::Found => ("found", Some(witness_path(&args.plan, index))),
            ShardOutcome::Unknown => ("unknown", None),
        };
        let record = ShardRunRecord {
            shard: index,
            colouring: witness
                .as_ref()
                .and_then(|_| witness_rows(&args.plan, index)),
            witness,
        };
        print_record(record, word, code)?;
        return Ok(code);
    }
    match outcome {
        ShardOutcome::AlreadyDone => {
            println!("shard {index}: already done (its result is complete)")
        }
        ShardOutcome::Refuted => println!("shard {index}: refuted under its cube; trace written"),
        ShardOutcome::Unknown => println!("shard {index}: no answer within the time limit"),
        ShardOutcome::Found => println!("{}", claim_false(&args.plan, &plan, index)),
    }
    Ok(code)
}

/// A shard's witness as matrix rows (0 on the diagonal), read back with the
/// checker's own parser.
fn witness_rows(plan_dir: &std::path::Path, index: usize) -> Option<Vec<Vec<u8>>> {
    let path = witness_path(plan_dir, index);
    let text = std::fs::read_to_string(&path).ok()?;
    let file =
        ramsift_checker::colouring_file::parse_colouring_file(&path.display().to_string(), &text)
            .ok()?;
    let n = file.matrix.order();
    Some(
        (0..n)
            .map(|i| (0..n).map(|j| file.matrix.colour(i, j)).collect())
            .collect(),
    )
}

/// The words for a shard that found a colouring: the claim is false, and where
/// the witness is.
fn claim_false(
    plan_dir: &std::path::Path,
    plan: &ramsift_driver::shard::Plan,
    index: usize,
) -> String {
    format!(
        "FOUND: shard {index} found a colouring of K_{} with no monochromatic forbidden graph, so the claim R({}) <= {} is FALSE; witness: {}",
        plan.order,
        plan.spec,
        plan.order,
        witness_path(plan_dir, index).display()
    )
}

fn local(args: &LocalArgs) -> Result<u8> {
    let plan = Plan::read(&args.plan)?;
    let pending = plan_status(&args.plan, plan.cubes.len()).to_resubmit();
    let threads = args
        .threads
        .unwrap_or_else(|| std::thread::available_parallelism().map_or(1, |n| n.get()));
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(threads.max(1))
        .build()?;
    let stop = AtomicBool::new(false);
    let finished = std::sync::atomic::AtomicUsize::new(0);
    let line = ProgressLine::new(args.json);
    let run_all = || {
        pool.install(|| {
            let run = |&i: &usize| {
                let outcome = run_shard(&args.plan, i, None, &stop);
                finished.fetch_add(1, Ordering::Relaxed);
                outcome
            };
            pending
                .par_iter()
                .map(run)
                .collect::<Vec<Result<ShardOutcome, ShardError>>>()
        })
    };
    let outcomes = line.run_while(run_all, |elapsed| {
        let done = finished.load(Ordering::Relaxed);
        format!(
            "{done} of {} shards run on {threads} threads, {} elapsed",
            pending.len(),
            seconds(elapsed)
        )
    });
    let mut found = Vec::new();
    for (i, outcome) in pending.iter().zip(outcomes) {
        match outcome.with_context(|| format!("shard {i}"))? {
            ShardOutcome::Found => {
                found.push(*i);
                if !args.json {
                    println!("{}", claim_false(&args.plan, &plan, *i));
                }
            }
            ShardOutcome::Unknown => bail!("shard {i} ended without an answer"),
            _ => {}
        }
    }
    let code = if found.is_empty() {
        exit_codes::SUCCESS
    } else {
        exit_codes::FOUND
    };
    if args.json {
        let witnesses: Vec<_> = found.iter().map(|&i| witness_path(&args.plan, i)).collect();
        let record = ShardLocalRecord {
            ran: pending.len(),
            already_done: plan.cubes.len() - pending.len(),
            threads,
            colourings: found
                .iter()
                .filter_map(|&i| witness_rows(&args.plan, i))
                .collect(),
            found: found.clone(),
            witnesses,
        };
        print_record(
            record,
            if found.is_empty() { "refuted" } else { "found" },
            code,
        )?;
        return Ok(code);
    }
    println!(
        "ran {} shards on {threads} threads ({} were already done)",
        pending.len(),
        plan.cubes.len() - pending.len()
    );
    Ok(code)
}

fn slurm(args: &SlurmArgs) -> Result<u8> {
    let plan = Plan::read(&args.plan)?;
    let plan_dir = std::fs::canonicalize(&args.plan)?;
    let ramsift = std::env::current_exe().context("locating the ramsift binary")?;
    let options = SlurmOptions {
        partition: args.partition.clone(),
        time: args.time.clone(),
        mem: args.mem.clone(),
        cpus: args.cpus,
        throttle: args.throttle,
        max_array_size: args.max_array_size,
    };
    let job = format!("ramsift-{}-{}", plan.spec.replace(',', "-"), plan.order);
    ensure_dir(&plan_dir.join("shards"))?;
    for (name, script) in batch_scripts(&ramsift, &plan_dir, &job, plan.cubes.len(), &options) {
        let path = plan_dir.join(&name);
        write_atomically(&path, |w| w.write_all(script.as_bytes()))?;
        println!(
            "wrote {} (submit with: sbatch {})",
            path.display(),
            path.display()
        );
    }
    Ok(exit_codes::SUCCESS)
}

fn status(args: &StatusArgs) -> Result<u8> {
    let plan = Plan::read(&args.plan)?;
    let s = plan_status(&args.plan, plan.cubes.len());
    let resubmit = s.to_resubmit();
    let code = if resubmit.is_empty() && s.found.is_empty() {
        exit_codes::SUCCESS
    } else {
        exit_codes::UNKNOWN
    };
    if args.json {
        let record = ShardStatusRecord {
            shards: plan.cubes.len(),
            done: s.done.len(),
            found: s.found.clone(),
            damaged: s.damaged.clone(),
            missing: s.missing.clone(),
            partial: s.partial.clone(),
            resubmit_array: array_list(&resubmit),
        };
        let word = if !s.found.is_empty() {
            "found"
        } else if resubmit.is_empty() {
            "done"
        } else {
            "pending"
        };
        print_record(record, word, code)?;
    } else {
        println!(
            "{}: {} shards: {} done, {} failed ({} found a colouring, {} damaged), {} missing ({} with partial files: running or interrupted)",
            args.plan.display(),
            plan.cubes.len(),
            s.done.len(),
            s.found.len() + s.damaged.len(),
            s.found.len(),
            s.damaged.len(),
            s.missing.len(),
            s.partial.len()
        );
        if !resubmit.is_empty() {
            println!(
                "resubmit with: sbatch --array={} {}/submit.sbatch",
                array_list(&resubmit),
                args.plan.display()
            );
        }
    }
    Ok(code)
}
