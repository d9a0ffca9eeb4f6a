//! Checking a certificate bundle written by `ramsift refute` or `ramsift shard
//! merge`, trusting nothing in it. The steps, cheapest first:
//!
//! 1. `manifest.json` is read ([`crate::manifest`]): format, claim, order bound.
//! 2. Every listed file must lie inside the bundle (no `..`, no symlink leading
//!    out), be a regular file, and have the recorded SHA-256.
//! 3. The formula is regenerated from the claim with the checker's own generator
//!    ([`crate::regenerate`]), never past the bundled formula's clause count, and
//!    compared with the bundled CNF as a multiset of clauses.
//! 4. With the `minimality` scheme, each clause of `minimality.txt` is verified
//!    on its own by its relabelling ([`crate::minimality`]) and joins the formula.
//!    The proof is checked against it: one DRAT trace ([`crate::drat_check`]), or
//!    every shard under its cube with a complete coverage tree ([`crate::shards`]).
//! 5. Premises (smaller Ramsey values used by degree bounds) are certified by the
//!    bundles given with `--premise` and those in `premises/` ([`crate::premises`]);
//!    any of these that fails makes the whole check fail. A premise no bundle
//!    certifies stays an assumption, and the verdict is then only conditional.

use std::path::{Path, PathBuf};

use sha2::{Digest, Sha256};

use crate::cnf::{parse_cnf, parse_header, Cnf};
use crate::drat_check::check_drat;
use crate::drat_parse::parse_drat;
use crate::input::{read_input, require_regular_file};
use crate::input_error::InputError;
use crate::manifest::{read_manifest, Manifest};
use crate::premises::{certify_premises, PremiseRun, PremiseStatus};
use crate::regenerate::{normalize, regenerate, PremiseBound, Statement};

/// The verdict on a bundle.
#[derive(Clone, Debug)]
pub struct BundleVerdict {
    /// The claim exactly as proven (`R(4,4) <= 18`, `R(C4,4) <= 10`).
    pub claim: String,
    /// The clique sizes (empty when a colour forbids another graph).
    pub clique_sizes: Vec<usize>,
    pub order: usize,
    pub symmetry: Vec<String>,
    pub premises: Vec<PremiseStatus>,
    /// Premise bundles present but not checked, each with why.
    pub unchecked_premises: Vec<String>,
    /// Steps that passed, in words.
    pub passed: Vec<String>,
    /// The first failure; None means the bundle's own proof holds.
    pub failure: Option<String>,
}

impl BundleVerdict {
    /// The bundle's proof holds (premises may still be assumed).
    pub fn passed(&self) -> bool {
        self.failure.is_none()
    }

    /// The claim holds with nothing assumed.
    pub fn unconditional(&self) -> bool {
        self.passed() && self.premises.iter().all(|p| p.certified_by.is_some())
    }
}

/// How deep premise bundles may nest (a bundle, its premise, that one's premise…).
pub const MAX_PREMISE_DEPTH: usize = 8;

/// Checks the bundle in `dir`; `premise_dirs` may certify its premises.
/// Returns Err only when the bundle's own manifest cannot be read or accepted.
pub fn check_bundle(dir: &Path, premise_dirs: &[PathBuf]) -> Result<BundleVerdict, InputError> {
    check_nested(dir, premise_dirs, &mut PremiseRun::default())
}

/// Checks a bundle below the ones in `run.chain` (canonical paths, outermost first).
pub(crate) fn check_nested(
    dir: &Path,
    premise_dirs: &[PathBuf],
    run: &mut PremiseRun,
) -> Result<BundleVerdict, InputError> {
    let name = dir.display().to_string();
    let root = dir.canonicalize().map_err(|e| InputError::whole(&name, format!("cannot open the bundle: {e}")))?;
    let manifest = read_manifest(&root)?;
    let manifest_name = dir.join("manifest.json").display().to_string();
    let claim = manifest.claim(&manifest_name)?;
    let order = manifest.claim.order;
    let statement = Statement {
        forbidden: claim.forbidden.clone(),
        order,
        symmetry: manifest.encoding.symmetry.clone(),
        premises: manifest
            .premises
            .iter()
            .map(|p| PremiseBound { cliques: p.clique_sizes.clone(), bound: p.upper_bound })
            .collect(),
    };
    let mut verdict = BundleVerdict {
        claim: format!("R({claim}) <= {order}"),
        clique_sizes: claim.clique_sizes().unwrap_or_default(),
        order,
        symmetry: statement.symmetry.clone(),
        premises: Vec::new(),
        unchecked_premises: Vec::new(),
        passed: Vec::new(),
        failure: None,
    };
    let premises = check_own_proof(&root, &manifest, &statement, &mut verdict).and_then(|used| {
        run.chain.push(root.clone());
        let premises = certify_premises(&root, premise_dirs, &manifest, &used, run);
        run.chain.pop();
        premises
    });
    match premises {
        Ok((statuses, unchecked)) => (verdict.premises, verdict.unchecked_premises) = (statuses, unchecked),
        Err(why) => verdict.failure = Some(why),
    }
    Ok(verdict)
}

/// Resolves a file named in the manifest: inside the bundle, a regular file.
pub(crate) fn bundle_file(root: &Path, name: &str) -> Result<PathBuf, String> {
    if name.starts_with('/') || name.contains('\\') || name.split('/').any(|p| p == ".." || p.is_empty()) {
        return Err(format!("file name {name:?} points outside the bundle"));
    }
    let path = root
        .join(name)
        .canonicalize()
        .map_err(|e| format!("{name} is listed in the manifest but cannot be opened: {e}"))?;
    if !path.starts_with(root) {
        return Err(format!("{name} is a link that leads outside the bundle"));
    }
    require_regular_file(&path).map_err(|e| e.to_string())?;
    Ok(path)
}

/// The bundle's fingerprint, the SHA-256 of its manifest.json.
pub fn manifest_sha256(dir: &Path) -> Result<String, String> {
    sha256_of(&dir.join("manifest.json"))
}

pub(crate) fn sha256_of(path: &Path) -> Result<String, String> {
    let mut hasher = Sha256::new();
    std::io::copy(&mut std::fs::File::open(path).map_err(|e| e.to_string())?, &mut hasher)
        .map_err(|e| e.to_string())?;
    Ok(hasher.finalize().iter().map(|b| format!("{b:02x}")).collect())
}

/// Steps 2 to 4; returns the premises the formula actually uses.
fn check_own_proof(
    root: &Path,
    manifest: &Manifest,
    statement: &Statement,
    verdict: &mut BundleVerdict,
) -> Result<Vec<PremiseBound>, String> {
    if manifest.claim.statement != verdict.claim {
        return Err(format!(
            "the manifest states {:?}, but its forbidden graphs and order say {:?}",
            manifest.claim.statement, verdict.claim
        ));
    }
    let (mut formula, mut proof, mut minimality) = (None, None, None);
    for file in &manifest.files {
        let path = bundle_file(root, &file.name)?;
        let actual = sha256_of(&path)?;
        if actual != file.sha256 {
            return Err(format!("{}: SHA-256 is {actual}, the manifest says {}", file.name, file.sha256));
        }
        match file.role.as_str() {
            "formula" if formula.is_none() => formula = Some(path),
            "drat-proof" if proof.is_none() => proof = Some(path),
            "minimality-clauses" if minimality.is_none() => minimality = Some(path),
            "formula" | "drat-proof" | "minimality-clauses" => {
                return Err(format!("the manifest lists a second {} file", file.role))
            }
            _ => {}
        }
    }
    let formula = formula.ok_or("the manifest lists no formula file")?;
    if proof.is_none() && manifest.sharding.is_none() {
        return Err("the manifest lists no drat-proof file and no shards".into());
    }
    verdict.passed.push(format!("{} files match their SHA-256", manifest.files.len()));

    let formula_name = formula.display().to_string();
    let bytes = read_input(&formula).map_err(|e| format!("the formula cannot be read: {e}"))?;
    let header = parse_header(&formula_name, &bytes).map_err(|e| format!("the formula cannot be read: {e}"))?;
    // The claim's formula is regenerated first, never past the header's clause count,
    // and compared by size before a single bundled clause is stored.
    let mut regenerated = regenerate(statement, header.1)?;
    let mismatch = |ours: (usize, usize), theirs: (usize, usize)| {
        let schemes = statement.symmetry.join(",");
        format!("the bundled formula ({} variables, {} clauses) is not the formula of the claim with symmetry [{schemes}] ({} variables, {} clauses)", ours.0, ours.1, theirs.0, theirs.1)
    };
    let theirs = (regenerated.variables, regenerated.clauses.len());
    if header != theirs {
        return Err(mismatch(header, theirs));
    }
    let mut cnf = parse_cnf(&formula_name, &bytes).map_err(|e| format!("the formula cannot be read: {e}"))?;
    drop(bytes);
    cnf.normalize();
    normalize(&mut regenerated.clauses);
    if !cnf.clauses().eq(regenerated.clauses.iter().map(Vec::as_slice)) {
        return Err(mismatch(header, theirs));
    }
    drop(regenerated.clauses);
    verdict.passed.push(format!(
        "formula regenerated independently: {} variables, {} clauses, identical as a set",
        header.0, header.1
    ));

    let cnf = with_minimality_clauses(cnf, minimality.as_deref(), manifest, statement, verdict)?;
    if let Some(sharding) = &manifest.sharding {
        let summary = crate::shards::check_shards(root, &cnf, sharding, &manifest.files)?;
        verdict.passed.push(summary);
    }
    if let Some(path) = proof {
        let summary = check_trace(&cnf, &path, &[])?;
        verdict.passed.push(format!("DRAT proof verified: {summary}"));
    }
    Ok(regenerated.used_premises)
}

/// Verifies the minimality clauses (if the scheme is used) and adds them to the formula.
fn with_minimality_clauses(
    mut cnf: Cnf,
    file: Option<&Path>,
    manifest: &Manifest,
    statement: &Statement,
    verdict: &mut BundleVerdict,
) -> Result<Cnf, String> {
    let scheme = statement.symmetry.iter().any(|s| s == "minimality");
    let order = manifest.encoding.minimality_order.as_deref();
    match (scheme, file) {
        (false, Some(_)) => {
            return Err("the bundle has minimality clauses but its symmetry does not list minimality".into())
        }
        (false, None) if order.is_some() => return Err("minimality_order is set but minimality is not used".into()),
        (false, None) => return Ok(cnf),
        (true, _) if order != Some(crate::minimality::MATRIX_ORDER) => {
            return Err(format!(
                "the manifest's minimality order is {order:?}; this checker verifies only {:?}",
                crate::minimality::MATRIX_ORDER
            ))
        }
        (true, None) => return Ok(cnf),
        (true, Some(_)) => {}
    }
    let path = file.expect("present");
    let name = path.display().to_string();
    let bytes = read_input(path).map_err(|e| format!("the minimality clauses cannot be read: {e}"))?;
    let clauses = crate::minimality::verified_clauses(&name, &bytes, &statement.forbidden, statement.order)
        .map_err(|e| format!("a minimality clause is rejected: {e}"))?;
    verdict.passed.push(format!("{} minimality clauses verified, each by its relabelling", clauses.len()));
    clauses.iter().for_each(|c| cnf.push(c));
    Ok(cnf)
}

/// Checks one DRAT trace against the formula with `cube` added as unit clauses.
pub(crate) fn check_trace(cnf: &Cnf, path: &Path, cube: &[i32]) -> Result<String, String> {
    let name = path.display().to_string();
    let steps =
        read_input(path).and_then(|b| parse_drat(&name, &b)).map_err(|e| format!("the proof cannot be read: {e}"))?;
    let with_cube = (!cube.is_empty()).then(|| {
        let mut with_cube = cnf.clone();
        cube.iter().for_each(|&l| with_cube.push(&[l]));
        with_cube
    });
    let formula = with_cube.as_ref().unwrap_or(cnf);
    let (r, _) = check_drat(formula, &steps, false).map_err(|e| format!("{name} is rejected: {e}"))?;
    Ok(format!(
        "{} lemmas, {} checked, core of {} original clauses",
        r.lemmas, r.checked_lemmas, r.core_original_clauses
    ))
}
