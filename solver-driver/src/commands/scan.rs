//! `ramsift scan SPEC --from A --to B`: a structured family at every order of a
//! range, each found / none / unknown, and the largest order found.

use std::path::{Path, PathBuf};
use std::time::Duration;

use anyhow::{Context, Result};
use clap::Args;

use ramsift_driver::exit_codes;
use ramsift_driver::output::json_file::write_json;
use ramsift_driver::output::records::{colouring_rows, ScanFamilyRow, ScanOrderRow, ScanSummary};
use ramsift_driver::output::witness::write_witness_files;
use ramsift_driver::structured::scan::{scan, ScanReport};
use ramsift_driver::structured::{FamilyChoice, FamilyOutcome, OrderReport, ScanVerdict};
use ramsift_encoder::atomic_file::ensure_dir;
use ramsift_encoder::{Instance, RamseySpec};

use super::progress::ProgressLine;
use super::record::print_record;

/// `--family`: a family name (see `FamilyChoice`).
fn parse_family(text: &str) -> Result<FamilyChoice, String> {
    text.parse()
}

#[derive(Args, Debug)]
pub struct ScanArgs {
    /// Forbidden clique size of each colour, comma separated (e.g. 4,4 or 3,3,3).
    #[arg(value_name = "SPEC")]
    pub spec: String,
    /// First order of the range.
    #[arg(long, value_name = "N")]
    pub from: usize,
    /// Last order of the range.
    #[arg(long, value_name = "N")]
    pub to: usize,
    /// Family: circulant (default), cayley, block-circulant, fixed-vertices
    /// (block-circulant with 1 to 4 fixed vertices), distance (the colour of {i, j}
    /// depends on |i − j| only) or structured (the first three).
    #[arg(long, default_value = "circulant", value_parser = parse_family)]
    pub family: FamilyChoice,
    /// Shorthand for --family circulant.
    #[arg(long, conflicts_with = "family")]
    pub circulant: bool,
    /// Time limit for each order, in seconds (default: none).
    #[arg(long, value_name = "SECONDS")]
    pub per_order: Option<f64>,
    /// Orders searched at once (default: all cores).
    #[arg(long, value_name = "COUNT")]
    pub threads: Option<usize>,
    /// Write each colouring found into DIR/order-N/ and the report into DIR/scan.json.
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
    /// Clear the output directory first if it holds anything (otherwise it is refused).
    #[arg(long)]
    pub force: bool,
    /// Print the report as JSON on stdout instead of a table.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

/// The report's row for one order.
fn row(report: &OrderReport) -> ScanOrderRow {
    ScanOrderRow {
        order: report.order,
        result: report.verdict(),
        seconds: report
            .families
            .iter()
            .map(|f| f.elapsed.as_secs_f64())
            .sum(),
        families: report
            .families
            .iter()
            .map(|f| {
                let (result, description, colouring) = match &f.outcome {
                    FamilyOutcome::Found {
                        description,
                        colouring,
                        ..
                    } => (
                        ScanVerdict::Found,
                        Some(description.clone()),
                        Some(colouring_rows(colouring)),
                    ),
                    FamilyOutcome::NoneInFamily => (ScanVerdict::None, None, None),
                    FamilyOutcome::Unknown => (ScanVerdict::Unknown, None, None),
                };
                ScanFamilyRow {
                    family: f.family.clone(),
                    result,
                    orbits: f.orbits,
                    clauses: f.clauses,
                    seconds: f.elapsed.as_secs_f64(),
                    description,
                    colouring,
                }
            })
            .collect(),
    }
}

/// The family, the time per order and the thread count, checked.
fn settings(args: &ScanArgs) -> Result<(FamilyChoice, Option<Duration>, usize)> {
    anyhow::ensure!(
        args.from >= 2 && args.from <= args.to,
        "--from {} --to {}: expected 2 <= FROM <= TO",
        args.from,
        args.to
    );
    anyhow::ensure!(
        args.to - args.from < 10_000,
        "--from {} --to {}: at most 10,000 orders in one scan",
        args.from,
        args.to
    );
    let choice = if args.circulant {
        FamilyChoice::Circulant
    } else {
        args.family.clone()
    };
    let per_order = match args.per_order {
        Some(t) if !(t.is_finite() && t > 0.0) => {
            anyhow::bail!("--per-order {t}: expected a positive number of seconds")
        }
        t => t.map(Duration::from_secs_f64),
    };
    let threads = match args.threads {
        Some(0) => anyhow::bail!("--threads 0: at least one worker is needed"),
        Some(t) => t,
        None => std::thread::available_parallelism().map_or(1, |n| n.get()),
    };
    Ok((choice, per_order, threads))
}

pub fn run(args: &ScanArgs) -> Result<u8> {
    let spec: RamseySpec = args
        .spec
        .parse()
        .with_context(|| format!("specification {:?}", args.spec))?;
    if let Some(dir) = &args.out {
        ramsift_driver::output::dir::prepare(dir, args.force)?;
    }
    let (choice, per_order, threads) = settings(args)?;
    let line = ProgressLine::new(args.quiet);
    let mut done = 0usize;
    let total = args.to - args.from + 1;
    let report = scan(
        &choice,
        &spec,
        args.from,
        args.to,
        per_order,
        threads,
        |order| {
            done += 1;
            line.update(|| {
                format!(
                    "{choice} scan of {spec}: order {} {} ({done}/{total})",
                    order.order,
                    order.verdict()
                )
            });
        },
    )?;
    line.finish();

    let largest = report.largest_found();
    let mut summary = ScanSummary {
        spec: spec.to_string(),
        family: choice.to_string(),
        from: args.from,
        to: args.to,
        orders: report.orders.iter().map(row).collect(),
        largest_found: largest,
        proves: largest.map(|n| format!("R({spec}) > {n}")),
        seconds: report.elapsed.as_secs_f64(),
        files: Vec::new(),
    };
    if let Some(dir) = &args.out {
        write_scan_outputs(dir, &spec, &report, &mut summary)?;
    }
    if args.json {
        print_record(&summary, "done", exit_codes::SUCCESS)?;
    } else {
        print_scan_text(&summary, &choice);
    }
    Ok(exit_codes::SUCCESS)
}

/// Every colouring found into DIR/order-N/, and the report into DIR/scan.json.
fn write_scan_outputs(
    dir: &Path,
    spec: &RamseySpec,
    report: &ScanReport,
    summary: &mut ScanSummary,
) -> Result<()> {
    ensure_dir(dir).with_context(|| format!("creating {}", dir.display()))?;
    for order in &report.orders {
        let Some(found) = order.found() else { continue };
        let instance = Instance::new(spec.clone(), order.order)?;
        let comments = vec![
            format!(
                "ramsift {} witness for {instance}: proves R({spec}) > {}",
                env!("CARGO_PKG_VERSION"),
                order.order
            ),
            format!(
                "{} ({}); checked by ramsift-checker before writing",
                found.family, found.description
            ),
        ];
        let sub = dir.join(format!("order-{}", order.order));
        summary.files.extend(
            write_witness_files(&sub, &instance, found.colouring, &comments)
                .with_context(|| format!("writing the witness into {}", sub.display()))?,
        );
    }
    let path = dir.join("scan.json");
    summary.files.push(path.clone());
    write_json(&path, &summary).with_context(|| format!("writing {}", path.display()))?;
    Ok(())
}

/// The report as a table on stdout.
fn print_scan_text(summary: &ScanSummary, choice: &FamilyChoice) {
    let spec = &summary.spec;
    println!(
        "{choice} colourings for R({spec}), orders {} to {}:",
        summary.from, summary.to
    );
    println!(
        "{:>6}  {:<8}  {:>8}  family and colouring",
        "order", "result", "seconds"
    );
    for order in &summary.orders {
        let detail = order
            .families
            .iter()
            .find(|f| f.result == ScanVerdict::Found)
            .map(|f| format!("{}: {}", f.family, f.description.as_deref().unwrap_or("")))
            .unwrap_or_else(|| {
                let each: Vec<String> = order
                    .families
                    .iter()
                    .map(|f| format!("{} {}", f.family, f.result))
                    .collect();
                each.join(", ")
            });
        println!(
            "{:>6}  {:<8}  {:>8.2}  {detail}",
            order.order,
            order.result.word(),
            order.seconds
        );
    }
    match summary.largest_found {
        Some(n) => println!("largest order with a {choice} colouring: {n}, so R({spec}) > {n}"),
        None => println!(
            "no {choice} colouring at any order from {} to {}",
            summary.from, summary.to
        ),
    }
    for file in &summary.files {
        println!("wrote {}", file.display());
    }
}
