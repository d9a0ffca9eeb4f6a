//! `ramsift refute SPEC N --out DIR`: a certified refutation bundle.

use std::path::PathBuf;
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};

use anyhow::{Context, Result};
use clap::Args;
use ramsift_encoder::{Colouring, Instance, SymmetryChoice};

use ramsift_driver::certify::bundle::{fingerprint, Manifest};
use ramsift_driver::certify::refute::{
    certify_premises, refute, RefuteOptions, RefuteReport, RefuteResult,
};
use ramsift_driver::exit_codes;
use ramsift_driver::output::records::{
    colouring_rows, RefuteFoundRecord, RefutedRecord, UnknownRecord,
};
use ramsift_driver::output::witness::{colouring_text, write_witness_files};

use super::instance_args::{timeout_of, InstanceArgs, OutDirArgs};
use super::progress::{seconds, ProgressLine};
use super::record::print_record;

#[derive(Args, Debug)]
pub struct RefuteArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    #[command(flatten)]
    pub dir: OutDirArgs,
    /// Symmetry breaking: default (two colours: minimality during the search, with
    /// degree-bounds for cliques, as degree bounds rest on clique Ramsey numbers;
    /// three or more colours: colour-swap, lex-leader, degree-bounds; see
    /// BENCHMARKS.md for the measurements), none, or a comma list of colour-swap, lex-leader,
    /// degree-bounds, minimality (minimality runs our own solver with the
    /// lex-minimality check and does not combine with colour-swap or lex-leader).
    #[arg(long, default_value = "default", value_name = "SCHEMES")]
    pub symmetry: SymmetryChoice,
    /// With minimality: how many candidate vertices one check of a partial
    /// colouring may try before giving up (complete colourings are always checked
    /// in full). Larger budgets find more clauses and cost more per check.
    #[arg(long, value_name = "COUNT", default_value_t = ramsift_driver::minimality::hook::DEFAULT_BUDGET)]
    pub check_budget: u64,
    /// Write the DRAT trace as text instead of binary.
    #[arg(long)]
    pub text: bool,
    /// gzip-compress the DRAT trace.
    #[arg(long)]
    pub gzip: bool,
    /// Give up after this many seconds (exit code 1; no bundle is written).
    #[arg(long, value_name = "SECONDS")]
    pub timeout: Option<f64>,
    /// Do not certify the premises (the smaller Ramsey values degree bounds rest on):
    /// the bundle then claims its bound assuming them. By default each premise is
    /// refuted too, into DIR/premises/, so the bundle proves its claim unconditionally.
    #[arg(long)]
    pub assume_premises: bool,
    /// Print the outcome as JSON on stdout.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

pub fn run(args: &RefuteArgs) -> Result<u8> {
    let encoding = args.instance.refutation_encoding(&args.symmetry)?;
    args.instance
        .fits(&encoding, &encoding.instance().to_string(), 1)?;
    args.dir.prepare()?;
    let instance = encoding.instance().clone();
    let timeout = timeout_of(args.timeout)?;
    let options = RefuteOptions {
        text_proof: args.text,
        gzip_proof: args.gzip,
        timeout,
        check_budget: Some(args.check_budget),
    };
    let stop = AtomicBool::new(false);
    let bytes = AtomicU64::new(0);
    let line = ProgressLine::new(args.quiet);
    let report = line.run_while(
        || refute(&encoding, &args.dir.out, &options, &stop, &bytes),
        |elapsed| {
            format!(
                "refuting {instance} [{}]: {} elapsed, {} MiB of DRAT trace",
                encoding.symmetry(),
                seconds(elapsed),
                bytes.load(Ordering::Relaxed) >> 20
            )
        },
    )?;

    match &report.result {
        RefuteResult::Refuted {
            files,
            proof_bytes,
            manifest,
        } => {
            let mut files = files.clone();
            if !args.assume_premises {
                files.extend(certify_premises(
                    &manifest.premises,
                    encoding.symmetry(),
                    &args.dir.out,
                    &options,
                    &stop,
                )?);
                ramsift_driver::certify::referee_guide::write_guide(&args.dir.out, manifest)?;
            }
            print_refuted(args, &instance, manifest, *proof_bytes, &report, files)?;
            Ok(exit_codes::NONE_EXISTS)
        }
        RefuteResult::Found(colouring) => {
            print_found(args, &instance, colouring, report.solve_seconds)?;
            Ok(exit_codes::FOUND)
        }
        RefuteResult::Unknown => {
            if args.json {
                let record = UnknownRecord {
                    instance: instance.to_string(),
                    seconds: report.solve_seconds,
                };
                print_record(record, "unknown", exit_codes::UNKNOWN)?;
            } else {
                println!(
                    "UNKNOWN {instance}: no answer {} ({:.2}s); no bundle written",
                    ramsift_driver::search::interrupt::stopped_because(),
                    report.solve_seconds
                );
            }
            Ok(exit_codes::UNKNOWN)
        }
    }
}

/// The account of a refutation.
fn print_refuted(
    args: &RefuteArgs,
    instance: &Instance,
    manifest: &Manifest,
    proof_bytes: u64,
    report: &RefuteReport,
    files: Vec<PathBuf>,
) -> Result<()> {
    let seconds = report.solve_seconds;
    let manifest_sha256 = fingerprint(&args.dir.out)
        .with_context(|| format!("reading {}/manifest.json", args.dir.out.display()))?;
    if args.json {
        let record = RefutedRecord {
            instance: instance.to_string(),
            proves: manifest.claim.statement.clone(),
            bundle: args.dir.out.clone(),
            symmetry: manifest.encoding.symmetry.clone(),
            premises: manifest
                .premises
                .iter()
                .map(|p| p.statement.clone())
                .collect(),
            seconds,
            proof_bytes,
            files,
            manifest_sha256,
            search: report.minimality.clone(),
        };
        return print_record(record, "refuted", exit_codes::NONE_EXISTS);
    }
    let (spec, n) = (instance.spec(), instance.order());
    println!(
        "REFUTED {instance}: no colouring exists, so R({spec}) <= {n}; DRAT trace of {proof_bytes} bytes in {seconds:.2}s"
    );
    if let Some(a) = &report.minimality {
        println!(
            "search: {} conflicts; {} minimality clauses from {} checks ({} gave up), checks took {:.2}s of {seconds:.2}s",
            a.conflicts, a.minimality_clauses, a.checks, a.checks_given_up, a.check_seconds
        );
    }
    for p in &manifest.premises {
        println!("premise: {} ({})", p.statement, p.source);
    }
    println!("fingerprint (SHA-256 of manifest.json): {manifest_sha256}");
    for f in files {
        println!("wrote {}", f.display());
    }
    Ok(())
}

/// The account of a colouring found instead of a refutation (written into the
/// output directory).
fn print_found(
    args: &RefuteArgs,
    instance: &Instance,
    colouring: &Colouring,
    seconds: f64,
) -> Result<()> {
    let (spec, n) = (instance.spec(), instance.order());
    let comments = vec![format!("ramsift refute found a colouring: R({spec}) > {n}")];
    let files = write_witness_files(&args.dir.out, instance, colouring, &comments)
        .with_context(|| format!("writing the witness into {}", args.dir.out.display()))?;
    if args.json {
        let record = RefuteFoundRecord {
            instance: instance.to_string(),
            proves: format!("R({spec}) > {n}"),
            colouring: colouring_rows(colouring),
            files,
            seconds,
        };
        return print_record(record, "found", exit_codes::FOUND);
    }
    println!("FOUND {instance}: a colouring exists, so R({spec}) > {n}; nothing to refute");
    print!("{}", colouring_text(instance, colouring, &[]));
    for f in files {
        println!("wrote {}", f.display());
    }
    Ok(())
}
