//! Certifying a bundle's premises (smaller Ramsey values its degree bounds use)
//! by other bundles: those named with `--premise` and every entry of the bundle's
//! own `premises/` folder. Each such bundle is checked in full; one that fails, or
//! that cannot be read, fails the whole check, naming it. Nesting is limited to
//! [`MAX_PREMISE_DEPTH`] and a bundle met again along its own chain is a cycle.
//! A premise is certified by a bundle that holds unconditionally and proves
//! R(same sizes) <= an order no larger than the premise's bound.

use std::path::{Path, PathBuf};

use crate::bundle::{check_nested, BundleVerdict, MAX_PREMISE_DEPTH};
use crate::manifest::Manifest;
use crate::regenerate::PremiseBound;

/// A premise and how it stands.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PremiseStatus {
    pub statement: String,
    /// The bundle that certifies it; None means it is assumed.
    pub certified_by: Option<PathBuf>,
    pub source: String,
}

fn candidates(root: &Path, premise_dirs: &[PathBuf]) -> Result<Vec<(PathBuf, String)>, String> {
    let mut found: Vec<(PathBuf, String)> =
        premise_dirs.iter().map(|d| (d.clone(), format!("premise bundle {}", d.display()))).collect();
    let folder = root.join("premises");
    if !folder.exists() {
        return Ok(found);
    }
    let entries = std::fs::read_dir(&folder).map_err(|e| format!("premises/ cannot be read: {e}"))?;
    let mut nested = Vec::new();
    for entry in entries {
        let entry = entry.map_err(|e| format!("premises/ cannot be read: {e}"))?;
        let label = format!("premise bundle premises/{}", entry.file_name().to_string_lossy());
        let path = entry.path().canonicalize().map_err(|e| format!("{label} cannot be opened: {e}"))?;
        if !path.starts_with(root) {
            return Err(format!("{label} is a link that leads outside the bundle"));
        }
        if !path.is_dir() {
            return Err(format!("{label} is not a bundle directory"));
        }
        nested.push((path, label));
    }
    nested.sort();
    found.extend(nested);
    Ok(found)
}

fn sorted(sizes: &[usize]) -> Vec<usize> {
    let mut sizes = sizes.to_vec();
    sizes.sort_unstable();
    sizes
}

/// The status of each used premise, or why a premise bundle fails.
pub fn certify_premises(
    root: &Path,
    premise_dirs: &[PathBuf],
    manifest: &Manifest,
    used: &[PremiseBound],
    chain: &mut Vec<PathBuf>,
) -> Result<Vec<PremiseStatus>, String> {
    let mut passing: Vec<(PathBuf, BundleVerdict)> = Vec::new();
    for (path, label) in candidates(root, premise_dirs)? {
        if chain.len() >= MAX_PREMISE_DEPTH {
            return Err(format!("{label}: premises nest deeper than {MAX_PREMISE_DEPTH} bundles"));
        }
        let canonical = path.canonicalize().map_err(|e| format!("{label} cannot be opened: {e}"))?;
        if chain.contains(&canonical) {
            return Err(format!("{label} is a bundle that rests on itself (a cycle of premises)"));
        }
        let verdict = check_nested(&path, &[], chain).map_err(|e| format!("{label} cannot be read: {e}"))?;
        if let Some(why) = &verdict.failure {
            return Err(format!("{label} fails: {why}"));
        }
        passing.push((path, verdict));
    }
    let status = |premise: &PremiseBound| {
        let sizes: Vec<String> = premise.cliques.iter().map(|k| k.to_string()).collect();
        let certifies = |v: &BundleVerdict| {
            v.unconditional() && sorted(&v.clique_sizes) == sorted(&premise.cliques) && v.order <= premise.bound
        };
        let recorded =
            manifest.premises.iter().find(|p| p.clique_sizes == premise.cliques && p.upper_bound == premise.bound);
        PremiseStatus {
            statement: format!("R({}) <= {}", sizes.join(","), premise.bound),
            certified_by: passing.iter().find(|(_, v)| certifies(v)).map(|(path, _)| path.clone()),
            source: recorded.map(|p| p.source.clone()).unwrap_or_default(),
        }
    };
    Ok(used.iter().map(status).collect())
}
