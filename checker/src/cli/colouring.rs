//! `ramsift-check colouring`: a witness colouring (ramsift colouring file, or
//! graph6 with --forbid) must contain no monochromatic forbidden graph.

use std::io::Read;
use std::path::Path;

use serde_json::json;

use ramsift_checker::colouring_file::{parse_colouring_file, MAGIC};
use ramsift_checker::graph6::decode_graph6_file;
use ramsift_checker::input::read_input;
use ramsift_checker::{check_colouring, Claim, ColourMatrix};

use super::verdict::{Outcome, Report};

pub fn run(path: &Path, forbid: Option<&str>) -> Report {
    let name = path.display().to_string();
    let forbid = match forbid.map(Claim::parse).transpose() {
        Ok(f) => f,
        Err(e) => return Report::unreadable(format!("--forbid: {e}")),
    };
    let (claim, matrices) = match read(&name, path, forbid) {
        Ok(read) => read,
        Err(e) => return Report::unreadable(e),
    };
    let mut lines = Vec::new();
    let mut items = Vec::new();
    let mut failures = Vec::new();
    for (index, matrix) in matrices.iter().enumerate() {
        let label = if matrices.len() > 1 { format!("{name} graph {}", index + 1) } else { name.clone() };
        let verdict = check_colouring(matrix, &claim);
        let pass = verdict.is_valid();
        let detail = if pass {
            format!("a colouring of K_{} with no monochromatic forbidden graph", matrix.order())
        } else {
            verdict.to_string()
        };
        lines.push(format!("{}: {label}: {detail}", if pass { "ok" } else { "bad" }));
        if !pass {
            failures.push(format!("{label}: {detail}"));
        }
        items.push(json!({"order": matrix.order(), "pass": pass, "detail": detail}));
    }
    let mut report = if failures.is_empty() {
        let orders: Vec<String> = matrices.iter().map(|m| m.order().to_string()).collect();
        Report::new(
            Outcome::Pass,
            format!(
                "R({claim}) > {} ({}; {} colouring(s) checked)",
                matrices.iter().map(ColourMatrix::order).max().unwrap_or(0),
                describe(&claim),
                orders.len()
            ),
        )
    } else {
        Report::new(Outcome::Fail, failures.join("; "))
    };
    report.lines = if matrices.len() > 1 { lines } else { Vec::new() };
    report.field("claim", claim.to_string()).field("colourings", items)
}

fn read(name: &str, path: &Path, forbid: Option<Claim>) -> Result<(Claim, Vec<ColourMatrix>), String> {
    let content = if name == "-" {
        let mut bytes = Vec::new();
        std::io::stdin().read_to_end(&mut bytes).map_err(|e| format!("standard input: {e}"))?;
        bytes
    } else {
        read_input(path).map_err(|e| e.to_string())?
    };
    if looks_like_colouring_file(&content) {
        let text =
            std::str::from_utf8(&content).map_err(|e| format!("{name}: byte {}: not UTF-8 text", e.valid_up_to()))?;
        // One colouring file, or a stream of them (each from its header line on).
        let mut claim = forbid.clone();
        let mut matrices = Vec::new();
        for part in split_stream(text) {
            let file = parse_colouring_file(name, &part).map_err(|e| e.to_string())?;
            match (&claim, &forbid) {
                (Some(c), None) if *c != file.claim => {
                    return Err(format!(
                        "{name}: the colourings name different specifications ({c} and {})",
                        file.claim
                    ))
                }
                _ => claim = Some(claim.unwrap_or(file.claim)),
            }
            matrices.push(file.matrix);
        }
        return Ok((claim.expect("a colouring file has a header"), matrices));
    }
    let claim = forbid.ok_or_else(|| {
        format!("{name}: not a ramsift colouring file (no {MAGIC} header); a graph6 file needs --forbid S,T")
    })?;
    if claim.colours() != 2 {
        return Err("--forbid: a graph6 file describes two colours; give exactly two forbidden graphs".into());
    }
    let matrices = decode_graph6_file(name, &content).map_err(|e| e.to_string())?;
    Ok((claim, matrices))
}

/// Splits a stream of colouring files at their header lines; the line numbers of
/// each part stay those of the whole text (earlier lines become blank). A
/// deliberate copy of the driver's `witness::split_colouring_stream`: the checker
/// depends on no other ramsift crate.
fn split_stream(text: &str) -> Vec<String> {
    let lines: Vec<&str> = text.lines().collect();
    let starts: Vec<usize> = (0..lines.len()).filter(|&i| lines[i].trim_start().starts_with(MAGIC)).collect();
    let mut parts = Vec::new();
    for (k, &start) in starts.iter().enumerate() {
        let end = starts.get(k + 1).copied().unwrap_or(lines.len());
        let mut part = "\n".repeat(start);
        for line in &lines[start..end] {
            part.push_str(line);
            part.push('\n');
        }
        parts.push(part);
    }
    parts
}

fn describe(claim: &Claim) -> String {
    claim
        .forbidden
        .iter()
        .enumerate()
        .map(|(i, g)| match g {
            ramsift_checker::ClaimGraph::Clique(k) => format!("colour {} avoids K{k}", i + 1),
            ramsift_checker::ClaimGraph::Graph { token, .. } => {
                format!("colour {} avoids {token}", i + 1)
            }
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// A ramsift colouring file starts (after comments and blank lines) with its magic word.
fn looks_like_colouring_file(content: &[u8]) -> bool {
    content
        .split(|&b| b == b'\n')
        .map(|l| l.trim_ascii())
        .find(|l| !l.is_empty() && !l.starts_with(b"#"))
        .is_some_and(|l| l.starts_with(MAGIC.as_bytes()))
}
