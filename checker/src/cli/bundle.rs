//! `ramsift-check bundle`: a certificate bundle, with its premises.

use std::path::{Path, PathBuf};
use std::time::Instant;

use serde_json::json;

use ramsift_checker::bundle::check_bundle;

use super::verdict::{Outcome, Report};

pub fn run(dir: &Path, premise_dirs: &[PathBuf]) -> Report {
    let started = Instant::now();
    let verdict = match super::progress::while_checking(None, || check_bundle(dir, premise_dirs)) {
        Ok(v) => v,
        Err(e) => return Report::unreadable(e),
    };
    let seconds = started.elapsed().as_secs_f64();
    let manifest_sha256 = ramsift_checker::bundle::manifest_sha256(dir).unwrap_or_default();
    let mut lines = vec![
        format!("bundle {}", dir.display()),
        format!("fingerprint (SHA-256 of manifest.json): {manifest_sha256}"),
        format!("claim: {}", verdict.claim),
        format!(
            "symmetry breaking: {}",
            if verdict.symmetry.is_empty() { "none".to_string() } else { verdict.symmetry.join(", ") }
        ),
    ];
    lines.extend(verdict.passed.iter().map(|step| format!("  ok: {step}")));
    let assumed: Vec<&str> =
        verdict.premises.iter().filter(|p| p.certified_by.is_none()).map(|p| p.statement.as_str()).collect();
    for p in &verdict.premises {
        lines.push(match &p.certified_by {
            Some(by) => format!("  premise {}: certified by bundle {}", p.statement, by.display()),
            None => format!("  premise {}: ASSUMED, not certified by any bundle ({})", p.statement, p.source),
        });
    }
    lines.extend(verdict.unchecked_premises.iter().map(|why| format!("  {why}")));
    let mut report = match &verdict.failure {
        Some(why) => Report::new(Outcome::Fail, why.clone()),
        None if assumed.is_empty() => {
            Report::new(Outcome::Pass, format!("{}, with nothing assumed ({seconds:.2}s)", verdict.claim))
        }
        None => Report::new(
            Outcome::Conditional,
            format!(
                "{} holds only if {} (assumed, not certified; give a bundle with --premise) ({seconds:.2}s)",
                verdict.claim,
                assumed.join(" and ")
            ),
        ),
    };
    report.lines = lines;
    let premises: Vec<_> = verdict
        .premises
        .iter()
        .map(|p| json!({"statement": p.statement, "source": p.source, "certified_by": p.certified_by}))
        .collect();
    report
        .field("claim", verdict.claim.clone())
        .field("manifest_sha256", manifest_sha256)
        .field("symmetry", verdict.symmetry.clone())
        .field("premises", premises)
        .field("unchecked_premise_bundles", verdict.unchecked_premises.clone())
        .field("checks", verdict.passed.clone())
        .field("seconds", seconds)
}
