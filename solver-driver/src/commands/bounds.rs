//! `ramsift bounds SPEC`: the theoretical bounds, the published range, and what is
//! certified on disk, as a plain table or JSON.

use std::path::PathBuf;

use anyhow::{Context, Result};
use clap::Args;

use super::record::print_record;
use ramsift_checker::Claim;
use ramsift_driver::bounds::certified::certificates;
use ramsift_driver::bounds::probabilistic::{deletion_lower, erdos_lower, spencer_lower};
use ramsift_driver::bounds::recursion::{erdos_szekeres, recursive_upper};
use ramsift_driver::exit_codes;
use ramsift_driver::output::records::{BoundsRecord, BoundsRow};
use ramsift_encoder::published::{exact, published};
use ramsift_encoder::RamseySpec;

/// Orders searched by the probabilistic bounds.
const SEARCH_LIMIT: u64 = 1 << 40;

#[derive(Args, Debug)]
pub struct BoundsArgs {
    /// Forbidden clique size of each colour, comma separated (e.g. 5,5 or 3,3,4).
    #[arg(value_name = "SPEC")]
    pub spec: String,
    /// Also list the bundles and witnesses below this directory that certify a
    /// bound for SPEC (each is checked first).
    #[arg(long, value_name = "DIR")]
    pub bundles: Option<PathBuf>,
    /// Print the report as JSON.
    #[arg(long)]
    pub json: bool,
}

/// A big integer as a JSON number, or as a decimal string beyond 2^64.
fn number(value: &num_bigint::BigUint) -> serde_json::Value {
    u64::try_from(value).map_or_else(|_| value.to_string().into(), Into::into)
}

pub fn run(args: &BoundsArgs) -> Result<u8> {
    let spec: RamseySpec = args
        .spec
        .parse()
        .with_context(|| format!("specification {:?}", args.spec))?;
    let sizes = spec.clique_sizes().ok_or_else(|| {
        anyhow::anyhow!("bounds: the probabilistic and recursive bounds are for cliques; {spec} forbids other graphs")
    })?;
    let certified = match &args.bundles {
        Some(dir) => {
            let claim = Claim::parse(&spec.to_string()).map_err(|e| anyhow::anyhow!(e))?;
            certificates(dir, &claim).with_context(|| format!("reading {}", dir.display()))?
        }
        None => Vec::new(),
    };
    let report = BoundsRecord {
        spec: spec.to_string(),
        rows: bound_rows(&sizes),
        certified,
    };
    if args.json {
        print_record(&report, "done", exit_codes::SUCCESS)?;
    } else {
        print_report(&report, args.bundles.as_deref());
    }
    Ok(exit_codes::SUCCESS)
}

/// The theoretical and published bounds for the clique sizes.
fn bound_rows(sizes: &[usize]) -> Vec<BoundsRow> {
    let r = sizes.len();
    let mut rows = vec![
        BoundsRow {
            bound: "first moment",
            kind: "R >",
            value: Some(erdos_lower(sizes, SEARCH_LIMIT).into()),
            source: format!("Erdős 1947: largest n with Σ C(n,k_c)·{r}^(−C(k_c,2)) < 1"),
        },
        BoundsRow {
            bound: "deletion",
            kind: "R >",
            value: Some(deletion_lower(sizes, SEARCH_LIMIT).into()),
            source: "alteration: max over n of n − ⌊E(n)⌋ (Alon & Spencer ch. 3)".into(),
        },
        BoundsRow {
            bound: "local lemma",
            kind: "R >",
            value: spencer_lower(sizes, SEARCH_LIMIT).map(Into::into),
            source:
                "Spencer 1975: e·(C(k,2)·C(n−2,k−2)+1)·2^(1−C(k,2)) < 1 (two equal colours only)"
                    .into(),
        },
        BoundsRow {
            bound: "recursion",
            kind: "R <=",
            value: Some(number(&recursive_upper(sizes, &|_| None))),
            source: "R(s,t) ≤ R(s−1,t)+R(s,t−1), one less if both even; from R(s,2) = s".into(),
        },
        BoundsRow {
            bound: "recursion on published values",
            kind: "R <=",
            value: Some(number(&recursive_upper(sizes, &exact))),
            source: "the same recursion, starting from the exact values of the table".into(),
        },
        BoundsRow {
            bound: "Erdős–Szekeres",
            kind: "R <=",
            value: erdos_szekeres(sizes).map(|v| number(&v)),
            source: "C(s+t−2, s−1) (two colours only)".into(),
        },
    ];
    match published(sizes) {
        Some(p) if p.lower == p.upper => rows.push(BoundsRow {
            bound: "published value",
            kind: "R =",
            value: Some(p.lower.into()),
            source: format!("{}; Radziszowski DS1", p.source),
        }),
        Some(p) => rows.push(BoundsRow {
            bound: "published range",
            kind: "R in",
            value: Some(serde_json::json!([p.lower, p.upper])),
            source: format!("{}; Radziszowski DS1", p.source),
        }),
        None => rows.push(BoundsRow {
            bound: "published range",
            kind: "R in",
            value: None,
            source: "not in the embedded table (Radziszowski DS1 revision 17)".into(),
        }),
    }
    rows
}

/// The report as text on stdout.
fn print_report(report: &BoundsRecord, bundles: Option<&std::path::Path>) {
    let spec = &report.spec;
    println!("Bounds for R({spec}):");
    let width = report
        .rows
        .iter()
        .map(|r| r.bound.chars().count())
        .max()
        .unwrap_or(0);
    for row in &report.rows {
        let value = match &row.value {
            Some(v) => format!("{} {v}", row.kind),
            None => "n/a".to_string(),
        };
        println!(
            "  {:<width$}  {:<16}  {}",
            row.bound,
            value,
            row.source,
            width = width
        );
    }
    if let Some(dir) = bundles {
        if report.certified.is_empty() {
            println!("certified below {}: nothing for R({spec})", dir.display());
        } else {
            println!("certified below {} (each checked now):", dir.display());
            for c in &report.certified {
                let what = if c.kind == "lower" { ">" } else { "<=" };
                println!("  R({spec}) {what} {}  {}", c.order, c.path.display());
            }
        }
    }
}
