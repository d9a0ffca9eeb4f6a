//! Certifying a bundle's premises (smaller Ramsey values its degree bounds use)
//! by other bundles: those named with `--premise` and every entry of the bundle's
//! own `premises/` folder. Links in `premises/` are resolved once, to canonical
//! paths inside the bundle. Each candidate's manifest is read (a cheap step); a
//! candidate is checked in full only when it could certify a premise the claim
//! uses and no earlier candidate has; the others are listed as not checked. A
//! checked bundle that fails, or a candidate that cannot be read, fails the whole
//! check, naming it. Each bundle is checked at most once per run (remembered by
//! its canonical path and its manifest's SHA-256), so the work is linear in the
//! number of distinct bundles however many links lead to them. Nesting is limited
//! to [`MAX_PREMISE_DEPTH`] and a bundle met again along its own chain is a cycle.
//! A premise is certified by a bundle that holds unconditionally and proves
//! R(same sizes) <= an order no larger than the premise's bound.

use std::collections::HashMap;
use std::path::{Path, PathBuf};

use crate::bundle::{check_nested, sha256_of, BundleVerdict, MAX_PREMISE_DEPTH};
use crate::manifest::{read_manifest, Manifest};
use crate::regenerate::PremiseBound;

/// A premise and how it stands.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PremiseStatus {
    pub statement: String,
    /// The bundle that certifies it; None means it is assumed.
    pub certified_by: Option<PathBuf>,
    pub source: String,
}

/// What one run of the bundle check shares across nesting levels.
#[derive(Default)]
pub(crate) struct PremiseRun {
    /// Canonical paths of the bundles being checked, outermost first.
    pub chain: Vec<PathBuf>,
    /// Verdicts of bundles already checked, by canonical path and manifest SHA-256.
    checked: HashMap<(PathBuf, String), BundleVerdict>,
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

/// The claim a candidate's manifest states, read without checking anything else.
fn stated_claim(path: &Path, label: &str) -> Result<(Vec<usize>, usize, String), String> {
    let manifest = read_manifest(path).map_err(|e| format!("{label} cannot be read: {e}"))?;
    let claim = manifest.claim(&path.join("manifest.json").display().to_string());
    let sizes = claim.map_err(|e| format!("{label} cannot be read: {e}"))?.clique_sizes().unwrap_or_default();
    Ok((sizes, manifest.claim.order, manifest.claim.statement))
}

/// Checks the bundle at `canonical` in full, or returns the verdict of this run's earlier check.
fn check_once(canonical: &Path, run: &mut PremiseRun) -> Result<BundleVerdict, String> {
    let key = (canonical.to_path_buf(), sha256_of(&canonical.join("manifest.json"))?);
    if let Some(verdict) = run.checked.get(&key) {
        return Ok(verdict.clone());
    }
    let verdict = check_nested(canonical, &[], run).map_err(|e| e.to_string())?;
    run.checked.insert(key, verdict.clone());
    Ok(verdict)
}

/// The status of each used premise and the candidates left unchecked (with why),
/// or why a premise bundle fails.
pub(crate) fn certify_premises(
    root: &Path,
    premise_dirs: &[PathBuf],
    manifest: &Manifest,
    used: &[PremiseBound],
    run: &mut PremiseRun,
) -> Result<(Vec<PremiseStatus>, Vec<String>), String> {
    let mut statuses: Vec<PremiseStatus> = used
        .iter()
        .map(|premise| {
            let sizes: Vec<String> = premise.cliques.iter().map(|k| k.to_string()).collect();
            let recorded =
                manifest.premises.iter().find(|p| p.clique_sizes == premise.cliques && p.upper_bound == premise.bound);
            PremiseStatus {
                statement: format!("R({}) <= {}", sizes.join(","), premise.bound),
                certified_by: None,
                source: recorded.map(|p| p.source.clone()).unwrap_or_default(),
            }
        })
        .collect();
    let mut unchecked = Vec::new();
    for (path, label) in candidates(root, premise_dirs)? {
        if run.chain.len() >= MAX_PREMISE_DEPTH {
            return Err(format!("{label}: premises nest deeper than {MAX_PREMISE_DEPTH} bundles"));
        }
        let canonical = path.canonicalize().map_err(|e| format!("{label} cannot be opened: {e}"))?;
        if run.chain.contains(&canonical) {
            return Err(format!("{label} is a bundle that rests on itself (a cycle of premises)"));
        }
        let (sizes, order, statement) = stated_claim(&canonical, &label)?;
        let wanted: Vec<usize> = (0..used.len())
            .filter(|&i| statuses[i].certified_by.is_none())
            .filter(|&i| sorted(&sizes) == sorted(&used[i].cliques) && order <= used[i].bound)
            .collect();
        if wanted.is_empty() {
            unchecked.push(format!("{label} ({statement}): not checked, no premise left for it to certify"));
            continue;
        }
        let verdict = check_once(&canonical, run).map_err(|e| format!("{label} cannot be read: {e}"))?;
        if let Some(why) = &verdict.failure {
            return Err(format!("{label} fails: {why}"));
        }
        // What the full check proved (not the manifest read above) decides.
        if verdict.unconditional() && sorted(&verdict.clique_sizes) == sorted(&sizes) && verdict.order == order {
            wanted.iter().for_each(|&i| statuses[i].certified_by = Some(path.clone()));
        }
    }
    Ok((statuses, unchecked))
}
