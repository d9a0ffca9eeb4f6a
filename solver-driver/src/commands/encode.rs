//! `ramsift encode SPEC N --out FILE`: writes the DIMACS CNF of an instance.

use std::path::PathBuf;
use std::time::Instant;

use anyhow::{Context, Result};
use clap::Args;
use ramsift_encoder::SymmetryChoice;

use ramsift_driver::output::records::EncodeRecord;

use ramsift_driver::exit_codes;
use ramsift_encoder::dimacs::write_encoding_to;

use super::instance_args::InstanceArgs;
use super::record::print_record;

#[derive(Args, Debug)]
pub struct EncodeArgs {
    #[command(flatten)]
    pub instance: InstanceArgs,
    /// Output file (DIMACS CNF; gzip-compressed if the name ends in .gz; - for standard output).
    #[arg(long, value_name = "FILE")]
    pub out: PathBuf,
    /// Symmetry breaking: none, or a comma list of colour-swap, lex-leader, degree-bounds.
    #[arg(long, default_value = "none", value_name = "SCHEMES")]
    pub symmetry: SymmetryChoice,
    /// Print what was written as JSON on stdout.
    #[arg(long)]
    pub json: bool,
}

pub fn run(args: &EncodeArgs) -> Result<u8> {
    let encoding = args.instance.encoding(&args.symmetry)?;
    let started = Instant::now();
    let to_stdout = args.out.as_os_str() == "-";
    let bytes = if to_stdout {
        // The formula on standard output, uncompressed; the account goes to stderr.
        let stdout = std::io::stdout();
        let mut out = std::io::BufWriter::new(stdout.lock());
        let bytes = ramsift_encoder::dimacs::write_encoding(&encoding, &mut out)?;
        std::io::Write::flush(&mut out)?;
        bytes
    } else {
        write_encoding_to(&encoding, &args.out)
            .with_context(|| format!("writing {}", args.out.display()))?
    };
    let summary = EncodeRecord {
        instance: encoding.instance().to_string(),
        file: args.out.clone(),
        variables: encoding.variable_count(),
        clauses: encoding.clause_count(),
        bytes_uncompressed: bytes,
        seconds: started.elapsed().as_secs_f64(),
    };
    if to_stdout {
        eprintln!(
            "{} as DIMACS CNF on standard output: {} variables, {} clauses",
            summary.instance, summary.variables, summary.clauses
        );
    } else if args.json {
        print_record(&summary, "written", exit_codes::SUCCESS)?;
    } else {
        println!(
            "wrote {}: {} as DIMACS CNF, {} variables, {} clauses, {} bytes, {:.2}s",
            summary.file.display(),
            summary.instance,
            summary.variables,
            summary.clauses,
            summary.bytes_uncompressed,
            summary.seconds
        );
    }
    Ok(exit_codes::SUCCESS)
}
