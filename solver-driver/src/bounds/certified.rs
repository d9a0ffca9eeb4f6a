//! What is certified on disk: every refutation bundle (a directory with
//! `manifest.json`) and every witness (`*.colouring`) below a directory, each
//! checked with the checker's code before it counts.

use std::path::{Path, PathBuf};

use ramsift_checker::bundle::check_bundle;
use ramsift_checker::colouring_file::parse_colouring_file;
use ramsift_checker::{check_colouring, Claim};

/// One certificate that bears on a specification.
#[derive(Clone, Debug, serde::Serialize)]
pub struct Certificate {
    pub path: PathBuf,
    /// "lower" (R > order, from a valid colouring) or "upper" (R <= order, from a
    /// bundle that passes with every premise certified).
    pub kind: &'static str,
    pub order: usize,
}

/// The certificates below `dir` for the claim `claim` (same forbidden graphs in the
/// same colour order, or permuted for cliques).
pub fn certificates(dir: &Path, claim: &Claim) -> std::io::Result<Vec<Certificate>> {
    let mut found = Vec::new();
    let mut stack = vec![dir.to_path_buf()];
    let same = |other: &Claim| {
        let mut a: Vec<String> = other.forbidden.iter().map(|g| g.to_string()).collect();
        let mut b: Vec<String> = claim.forbidden.iter().map(|g| g.to_string()).collect();
        a.sort();
        b.sort();
        a == b
    };
    while let Some(current) = stack.pop() {
        if current.join("manifest.json").is_file() {
            if let Ok(verdict) = check_bundle(&current, &[]) {
                let parsed = verdict
                    .claim
                    .strip_prefix("R(")
                    .and_then(|rest| rest.split_once(") <= "))
                    .and_then(|(spec, _)| Claim::parse(spec).ok());
                if verdict.unconditional() && parsed.is_some_and(|c| same(&c)) {
                    found.push(Certificate {
                        path: current.clone(),
                        kind: "upper",
                        order: verdict.order,
                    });
                }
            }
            continue; // premises inside a bundle are not separate results
        }
        let mut entries: Vec<PathBuf> = std::fs::read_dir(&current)?
            .filter_map(|e| e.ok().map(|e| e.path()))
            .collect();
        entries.sort();
        for path in entries {
            if path.is_dir() {
                stack.push(path);
            } else if path.extension().is_some_and(|e| e == "colouring") {
                let Ok(text) = std::fs::read_to_string(&path) else {
                    continue;
                };
                let Ok(file) = parse_colouring_file(&path.display().to_string(), &text) else {
                    continue;
                };
                if same(&file.claim) && check_colouring(&file.matrix, &file.claim).is_valid() {
                    found.push(Certificate {
                        path,
                        kind: "lower",
                        order: file.matrix.order(),
                    });
                }
            }
        }
    }
    found.sort_by(|a, b| (a.kind, a.order).cmp(&(b.kind, b.order)));
    Ok(found)
}
