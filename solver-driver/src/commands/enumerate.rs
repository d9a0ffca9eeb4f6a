//! `ramsift enumerate SPEC N --out FILE`: every colouring up to isomorphism.
//!
//! The file holds one colouring per line: for two colours the colour-1 graph in
//! graph6 (nothing else, so any graph6 reader takes it); for more colours the upper
//! triangle of the colour matrix, row by row, as digits (colour of {0,1}, {0,2}, …,
//! {0,n−1}, {1,2}, …), after comment lines starting with `#` that state the
//! specification and the count.

use std::path::{Path, PathBuf};
use std::sync::atomic::AtomicBool;

use anyhow::{Context, Result};
use clap::Args;
use ramsift_encoder::{Colouring, Instance, SymmetryChoice, SymmetrySet};

use ramsift_driver::enumerate::{enumerate, EnumerateOptions};
use ramsift_driver::exit_codes;
use ramsift_driver::output::graph6::colour_one_graph6;
use ramsift_driver::output::records::{colouring_rows, EnumerateRecord};
use ramsift_driver::output::witness::colouring_text;
use ramsift_encoder::atomic_file::write_atomically;

use super::instance_args::{timeout_of, InstanceArgs};
use super::progress::{seconds, ProgressLine};
use super::record::print_record;

#[derive(Args, Debug)]
pub struct EnumerateArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Where to write the colourings (graph6 lines for two colours, a stream of
    /// colouring files for more); - for standard output.
    #[arg(long, value_name = "FILE")]
    pub out: PathBuf,
    /// Count colourings that differ by permuting colours with equal forbidden
    /// graphs as one.
    #[arg(long)]
    pub swap_colours: bool,
    /// Enumerate with lex-leader constraints, blocking clauses and canonical forms
    /// (varisat) instead of the default minimality check (our solver), which
    /// meets each class exactly once.
    #[arg(long)]
    pub lex_leader: bool,
    /// Give up after this many seconds (exit code 1; nothing is written).
    #[arg(long, value_name = "SECONDS")]
    pub timeout: Option<f64>,
    /// Print the summary as JSON.
    #[arg(long)]
    pub json: bool,
    /// No progress line on stderr.
    #[arg(long, short)]
    pub quiet: bool,
}

pub fn run(args: &EnumerateArgs) -> Result<u8> {
    let instance = args.instance.instance()?;
    let to_stdout = args.out.as_os_str() == "-";
    anyhow::ensure!(
        !(to_stdout && args.json),
        "--out - and --json both want standard output; give --out a file"
    );
    // The search holds the whole formula (with lex-leader, a small addition).
    let plain = args
        .instance
        .encoding(&SymmetryChoice::Schemes(SymmetrySet::none()))?;
    args.instance.fits(&plain, &instance.to_string(), 1)?;
    let timeout = timeout_of(args.timeout)?;
    let line = ProgressLine::new(args.quiet);
    let stop = AtomicBool::new(false);
    let started = std::time::Instant::now();
    let result = enumerate(
        &instance,
        &EnumerateOptions {
            swap_colours: args.swap_colours,
            lex_leader: args.lex_leader,
            timeout,
        },
        &stop,
        |models, classes| {
            line.update(|| {
                format!(
                    "{instance}: {models} colourings enumerated, {classes} classes, {}",
                    seconds(started.elapsed())
                )
            })
        },
    )?;
    line.finish();
    let up_to = match args.swap_colours {
        true => "vertex relabelling and permutation of equal colours",
        false => "vertex relabelling",
    };
    let mut summary = EnumerateRecord {
        instance: instance.to_string(),
        classes: result.classes.len(),
        labelled_models_enumerated: result.models,
        up_to,
        symmetry: result.symmetry.to_string(),
        seconds: result.elapsed.as_secs_f64(),
        complete: result.complete,
        file: None,
        colourings: result.classes.iter().map(colouring_rows).collect(),
    };
    if result.complete {
        let text = classes_text(&instance, &result.classes, up_to);
        if to_stdout {
            print!("{text}");
        } else {
            write_atomically(&args.out, |w| w.write_all(text.as_bytes()))
                .with_context(|| format!("writing {}", args.out.display()))?;
            summary.file = Some(args.out.clone());
        }
    }
    let code = if result.complete {
        exit_codes::SUCCESS
    } else {
        exit_codes::UNKNOWN
    };
    if args.json {
        print_record(
            &summary,
            if result.complete {
                "complete"
            } else {
                "unknown"
            },
            code,
        )?;
    } else {
        print_enumeration_text(&summary, &args.out, to_stdout);
    }
    Ok(code)
}

/// The classes as written: for two colours graph6, one graph a line (it has no
/// comment lines); for more, a stream of colouring files, which ramsift-check and
/// draw read.
fn classes_text(instance: &Instance, classes: &[Colouring], up_to: &str) -> String {
    let mut text = String::new();
    for (k, colouring) in classes.iter().enumerate() {
        if instance.colours() == 2 {
            text.push_str(&colour_one_graph6(colouring));
            text.push('\n');
        } else {
            let note = format!(
                "class {} of {} colourings of {instance} up to {up_to}",
                k + 1,
                classes.len()
            );
            text.push_str(&colouring_text(instance, colouring, &[note]));
        }
    }
    text
}

/// The account on stdout (or stderr, when the classes went to stdout).
fn print_enumeration_text(summary: &EnumerateRecord, out: &Path, to_stdout: bool) {
    let (instance, up_to) = (&summary.instance, summary.up_to);
    if summary.complete && to_stdout {
        eprintln!(
            "{} colouring(s) of {instance} up to {up_to} written to standard output ({:.2}s)",
            summary.classes, summary.seconds
        );
    } else if summary.complete {
        println!(
            "{} colouring(s) of {instance} up to {up_to} ({} labelled colourings enumerated under {}, {:.2}s)",
            summary.classes, summary.labelled_models_enumerated, summary.symmetry, summary.seconds
        );
        println!("wrote {}", out.display());
    } else {
        println!(
            "UNKNOWN {instance}: the time ran out after {} classes ({} colourings enumerated); nothing written",
            summary.classes, summary.labelled_models_enumerated
        );
    }
}
