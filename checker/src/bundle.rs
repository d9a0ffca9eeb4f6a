//! Checking a certificate bundle written by `ramsift refute`, trusting nothing in it:
//!
//! 1. `manifest.json` is read; every file it lists must exist with the recorded
//!    SHA-256; the formula and the DRAT proof must both be listed.
//! 2. The formula is regenerated from the claim (clique sizes, order, symmetry
//!    schemes, premises) with the checker's own generator ([`crate::regenerate`])
//!    and compared with the bundled CNF as a multiset of clauses.
//! 3. The proof is checked against the formula ([`crate::drat_check`]).
//! 4. Premises (smaller Ramsey values used by degree bounds) are reported as
//!    assumptions unless a bundle given with `--premise`, or one in the bundle's
//!    own `premises/` folder, certifies them (and passes itself).

use std::path::{Path, PathBuf};

use serde_json::Value;
use sha2::{Digest, Sha256};

use crate::claim::Claim;
use crate::cnf::parse_cnf;
use crate::drat_check::check_drat;
use crate::drat_parse::parse_drat;
use crate::input::read_input;
use crate::input_error::InputError;
use crate::regenerate::{normalized, regenerate, PremiseBound, Statement};

/// The bundle layout this checker understands.
pub const BUNDLE_FORMAT: &str = "ramsift-bundle 1";

/// A premise and how it stands.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PremiseStatus {
    pub statement: String,
    /// The bundle that certifies it, if any.
    pub certified_by: Option<PathBuf>,
    pub source: String,
}

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
    /// Steps that passed, in words.
    pub passed: Vec<String>,
    /// The first failure; None means PASS.
    pub failure: Option<String>,
}

impl BundleVerdict {
    pub fn passed(&self) -> bool {
        self.failure.is_none()
    }

    /// Whether the claim holds with no premise left unproven.
    pub fn unconditional(&self) -> bool {
        self.passed() && self.premises.iter().all(|p| p.certified_by.is_some())
    }
}

fn sha256_hex(bytes: &[u8]) -> String {
    Sha256::digest(bytes)
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

fn field<'a>(value: &'a Value, path: &[&str], name: &str) -> Result<&'a Value, InputError> {
    let mut v = value;
    for key in path {
        v = v.get(key).ok_or_else(|| {
            InputError::whole(name, format!("manifest has no field {}", path.join(".")))
        })?;
    }
    Ok(v)
}

fn usize_list(v: &Value, what: &str, name: &str) -> Result<Vec<usize>, InputError> {
    v.as_array()
        .and_then(|a| {
            a.iter()
                .map(|x| x.as_u64().map(|n| n as usize))
                .collect::<Option<Vec<_>>>()
        })
        .ok_or_else(|| {
            InputError::whole(
                name,
                format!("manifest field {what} must be a list of whole numbers"),
            )
        })
}

/// Checks the bundle in `dir`; `premise_dirs` may certify its premises.
/// Returns Err only when the manifest itself cannot be read.
pub fn check_bundle(dir: &Path, premise_dirs: &[PathBuf]) -> Result<BundleVerdict, InputError> {
    let manifest_path = dir.join("manifest.json");
    let name = manifest_path.display().to_string();
    let text = std::fs::read(&manifest_path)
        .map_err(|e| InputError::whole(&name, format!("cannot read: {e}")))?;
    let manifest: Value = serde_json::from_slice(&text)
        .map_err(|e| InputError::at_line(&name, e.line(), format!("not valid JSON: {e}")))?;
    let format = field(&manifest, &["bundle_format"], &name)?
        .as_str()
        .unwrap_or_default();
    if format != BUNDLE_FORMAT {
        return Err(InputError::whole(
            &name,
            format!("bundle_format is {format:?}, expected {BUNDLE_FORMAT:?}"),
        ));
    }
    let order = field(&manifest, &["claim", "order"], &name)?
        .as_u64()
        .ok_or_else(|| InputError::whole(&name, "claim.order must be a whole number"))?
        as usize;
    // Forbidden graphs other than cliques are named in claim.forbidden (the
    // specification's entries, read with the checker's own parser); clique claims
    // may give claim.clique_sizes alone.
    let claim_graphs = match manifest.get("claim").and_then(|c| c.get("forbidden")) {
        Some(list) => {
            let entries: Vec<String> = list
                .as_array()
                .map(|a| {
                    a.iter()
                        .filter_map(|s| s.as_str().map(String::from))
                        .collect()
                })
                .filter(|e: &Vec<String>| e.len() == list.as_array().map_or(0, Vec::len))
                .ok_or_else(|| {
                    InputError::whole(&name, "claim.forbidden must be a list of graph names")
                })?;
            let parsed = Claim::parse(&entries.join(","))
                .map_err(|e| InputError::whole(&name, format!("claim.forbidden: {e}")))?;
            if let Some(sizes) = manifest.get("claim").and_then(|c| c.get("clique_sizes")) {
                let sizes = usize_list(sizes, "claim.clique_sizes", &name)?;
                if parsed.clique_sizes() != Some(sizes) {
                    return Err(InputError::whole(
                        &name,
                        "claim.forbidden and claim.clique_sizes disagree",
                    ));
                }
            }
            parsed
        }
        None => Claim::cliques(&usize_list(
            field(&manifest, &["claim", "clique_sizes"], &name)?,
            "claim.clique_sizes",
            &name,
        )?),
    };
    let clique_sizes = claim_graphs.clique_sizes().unwrap_or_default();
    if claim_graphs.forbidden.len() < 2
        || claim_graphs
            .forbidden
            .iter()
            .any(|g| g.vertices() < 2 || g.vertices() > order)
        || order > 10_000
    {
        return Err(InputError::whole(&name, format!("claim {claim_graphs} at order {order} is not a Ramsey question this checker accepts")));
    }
    let symmetry: Vec<String> = field(&manifest, &["encoding", "symmetry"], &name)?
        .as_array()
        .map(|a| {
            a.iter()
                .filter_map(|s| s.as_str().map(String::from))
                .collect()
        })
        .ok_or_else(|| InputError::whole(&name, "encoding.symmetry must be a list of names"))?;
    let mut premises = Vec::new();
    let mut premise_sources = Vec::new();
    for p in field(&manifest, &["premises"], &name)?
        .as_array()
        .cloned()
        .unwrap_or_default()
    {
        let cliques = usize_list(
            field(&p, &["clique_sizes"], &name)?,
            "premises[].clique_sizes",
            &name,
        )?;
        let bound = field(&p, &["upper_bound"], &name)?
            .as_u64()
            .ok_or_else(|| {
                InputError::whole(&name, "premises[].upper_bound must be a whole number")
            })? as usize;
        premise_sources.push(
            p.get("source")
                .and_then(Value::as_str)
                .unwrap_or("")
                .to_string(),
        );
        premises.push(PremiseBound { cliques, bound });
    }
    let claim = format!("R({claim_graphs}) <= {order}");

    let mut verdict = BundleVerdict {
        claim: claim.clone(),
        clique_sizes: clique_sizes.clone(),
        order,
        symmetry: symmetry.clone(),
        premises: Vec::new(),
        passed: Vec::new(),
        failure: None,
    };
    let fail = |mut v: BundleVerdict, why: String| {
        v.failure = Some(why);
        Ok(v)
    };
    let stated = field(&manifest, &["claim", "statement"], &name)?
        .as_str()
        .unwrap_or_default();
    if stated != claim {
        return fail(
            verdict,
            format!("the manifest states {stated:?}, but its clique sizes and order say {claim:?}"),
        );
    }

    // 1. Files and hashes.
    let files = field(&manifest, &["files"], &name)?
        .as_array()
        .cloned()
        .unwrap_or_default();
    let mut formula_file = None;
    let mut proof_file = None;
    for f in &files {
        let (Some(file), Some(role), Some(hash)) = (
            f.get("name").and_then(Value::as_str),
            f.get("role").and_then(Value::as_str),
            f.get("sha256").and_then(Value::as_str),
        ) else {
            return fail(verdict, "a files[] entry lacks name, role or sha256".into());
        };
        if file.starts_with('/')
            || file.split('/').any(|part| part == ".." || part.is_empty())
            || file.contains('\\')
        {
            return fail(
                verdict,
                format!("file name {file:?} points outside the bundle"),
            );
        }
        let path = dir.join(file);
        let Ok(bytes) = std::fs::read(&path) else {
            return fail(
                verdict,
                format!("{file} is listed in the manifest but missing"),
            );
        };
        let actual = sha256_hex(&bytes);
        if actual != hash {
            return fail(
                verdict,
                format!("{file}: SHA-256 is {actual}, the manifest says {hash}"),
            );
        }
        match role {
            "formula" => formula_file = Some(path),
            "drat-proof" => proof_file = Some(path),
            _ => {}
        }
    }
    let sharding = manifest.get("sharding").filter(|v| !v.is_null());
    let Some(formula_path) = formula_file else {
        return fail(verdict, "the manifest lists no formula file".into());
    };
    if proof_file.is_none() && sharding.is_none() {
        return fail(
            verdict,
            "the manifest lists no drat-proof file and no shards".into(),
        );
    }
    verdict
        .passed
        .push(format!("{} files match their SHA-256", files.len()));

    // 2. The formula says exactly what the claim says.
    let statement = Statement {
        forbidden: claim_graphs.forbidden.clone(),
        order,
        symmetry,
        premises,
    };
    let regenerated = match regenerate(&statement) {
        Ok(r) => r,
        Err(e) => return fail(verdict, e),
    };
    let formula_name = formula_path.display().to_string();
    let cnf = match read_input(&formula_path).and_then(|b| parse_cnf(&formula_name, &b)) {
        Ok(c) => c,
        Err(e) => return fail(verdict, format!("the formula cannot be read: {e}")),
    };
    if cnf.variables != regenerated.variables
        || normalized(&cnf.clauses) != normalized(&regenerated.clauses)
    {
        return fail(
            verdict,
            format!(
                "the bundled formula ({} variables, {} clauses) is not the formula of the claim with symmetry [{}] ({} variables, {} clauses)",
                cnf.variables,
                cnf.clauses.len(),
                statement.symmetry.join(","),
                regenerated.variables,
                regenerated.clauses.len()
            ),
        );
    }
    verdict.passed.push(format!(
        "formula regenerated independently: {} variables, {} clauses, identical as a set",
        cnf.variables,
        cnf.clauses.len()
    ));

    // 3. The proof refutes it: one trace, or every shard under its cube.
    if let Some(sharding) = sharding {
        match check_shards(dir, &cnf, sharding, &files) {
            Ok(summary) => verdict.passed.push(summary),
            Err(why) => return fail(verdict, why),
        }
    }
    if let Some(proof_path) = proof_file {
        let proof_name = proof_path.display().to_string();
        let steps = match read_input(&proof_path).and_then(|b| parse_drat(&proof_name, &b)) {
            Ok(s) => s,
            Err(e) => return fail(verdict, format!("the proof cannot be read: {e}")),
        };
        match check_drat(&cnf, &steps, false) {
            Ok((report, _)) => verdict.passed.push(format!(
                "DRAT proof verified: {} lemmas, {} checked, core of {} original clauses",
                report.lemmas, report.checked_lemmas, report.core_original_clauses
            )),
            Err(e) => return fail(verdict, format!("the proof is rejected: {e}")),
        }
    }

    // 4. Premises.
    let mut candidates: Vec<PathBuf> = premise_dirs.to_vec();
    if let Ok(entries) = std::fs::read_dir(dir.join("premises")) {
        let mut nested: Vec<PathBuf> = entries
            .filter_map(|e| e.ok().map(|e| e.path()))
            .filter(|p| p.is_dir())
            .collect();
        nested.sort();
        candidates.extend(nested);
    }
    for used in &regenerated.used_premises {
        let index = statement
            .premises
            .iter()
            .position(|p| p == used)
            .unwrap_or(0);
        let text = format!(
            "R({}) <= {}",
            used.cliques
                .iter()
                .map(|k| k.to_string())
                .collect::<Vec<_>>()
                .join(","),
            used.bound
        );
        let mut certified_by = None;
        for candidate in &candidates {
            if let Ok(sub) = check_bundle(candidate, &[]) {
                let mut theirs = sub.clique_sizes.clone();
                theirs.sort_unstable();
                let mut ours = used.cliques.clone();
                ours.sort_unstable();
                if sub.unconditional() && theirs == ours && sub.order <= used.bound {
                    certified_by = Some(candidate.clone());
                    break;
                }
            }
        }
        verdict.premises.push(PremiseStatus {
            statement: text,
            certified_by,
            source: premise_sources.get(index).cloned().unwrap_or_default(),
        });
    }
    Ok(verdict)
}

/// The leaves of a coverage tree with their paths; checks its shape.
fn tree_leaves(
    tree: &Value,
    variables: usize,
    path: &mut Vec<i32>,
    out: &mut Vec<(usize, Vec<i32>)>,
) -> Result<(), String> {
    if let Some(leaf) = tree.get("leaf") {
        let leaf = leaf.as_u64().ok_or("a tree leaf must be a shard index")? as usize;
        out.push((leaf, path.clone()));
        return Ok(());
    }
    let var = tree
        .get("split")
        .and_then(Value::as_i64)
        .filter(|&v| v >= 1 && v as usize <= variables)
        .ok_or("a tree node must split on a variable of the formula")? as i32;
    if path.iter().any(|l| l.abs() == var) {
        return Err(format!(
            "the tree splits twice on variable {var} along one path"
        ));
    }
    let (Some(positive), Some(negative)) = (tree.get("positive"), tree.get("negative")) else {
        return Err(format!(
            "the split on variable {var} lacks a positive or negative branch"
        ));
    };
    path.push(var);
    tree_leaves(positive, variables, path, out)?;
    path.pop();
    path.push(-var);
    tree_leaves(negative, variables, path, out)?;
    path.pop();
    Ok(())
}

/// Checks a sharded refutation: the tree covers every assignment (each split has both
/// branches, so the leaves' cubes form a tautology), each leaf has exactly one shard
/// trace whose cube is the leaf's path, and each trace refutes formula ∧ cube.
fn check_shards(
    dir: &Path,
    cnf: &crate::cnf::Cnf,
    sharding: &Value,
    files: &[Value],
) -> Result<String, String> {
    let tree = sharding.get("tree").ok_or("sharding has no tree")?;
    let mut leaves = Vec::new();
    tree_leaves(tree, cnf.variables, &mut Vec::new(), &mut leaves)?;
    let count = leaves.len();
    let mut seen = vec![false; count];
    for (leaf, _) in &leaves {
        if *leaf >= count || std::mem::replace(&mut seen[*leaf], true) {
            return Err(format!(
                "the tree's leaves are not the shard indices 0..{count} each once"
            ));
        }
    }
    if sharding.get("shards").and_then(Value::as_u64) != Some(count as u64) {
        return Err(format!(
            "sharding.shards does not match the {count} leaves of the tree"
        ));
    }
    let mut lemmas = 0;
    for (leaf, path) in &leaves {
        let shard_files: Vec<&Value> = files
            .iter()
            .filter(|f| f.get("role").and_then(Value::as_str) == Some("shard-proof"))
            .filter(|f| f.get("shard").and_then(Value::as_u64) == Some(*leaf as u64))
            .collect();
        let [file] = shard_files.as_slice() else {
            return Err(format!(
                "shard {leaf} has {} traces listed, expected exactly one",
                shard_files.len()
            ));
        };
        let mut cube: Vec<i32> = file
            .get("cube")
            .and_then(Value::as_array)
            .and_then(|a| {
                a.iter()
                    .map(|x| x.as_i64().map(|v| v as i32))
                    .collect::<Option<Vec<_>>>()
            })
            .ok_or(format!("shard {leaf} has no cube"))?;
        let mut expected = path.clone();
        cube.sort_unstable();
        expected.sort_unstable();
        if cube != expected {
            return Err(format!(
                "shard {leaf}'s cube {cube:?} is not its tree path {expected:?}"
            ));
        }
        let name = file.get("name").and_then(Value::as_str).unwrap_or_default();
        let path_on_disk = dir.join(name);
        let steps = read_input(&path_on_disk)
            .and_then(|b| parse_drat(&path_on_disk.display().to_string(), &b))
            .map_err(|e| format!("shard {leaf}: {e}"))?;
        let mut with_cube = cnf.clone();
        with_cube.clauses.extend(cube.iter().map(|&l| vec![l]));
        let (report, _) = check_drat(&with_cube, &steps, false)
            .map_err(|e| format!("shard {leaf}'s trace is rejected: {e}"))?;
        lemmas += report.lemmas;
    }
    Ok(format!("coverage tree complete ({count} cubes); every shard trace verified under its cube ({lemmas} lemmas)"))
}
