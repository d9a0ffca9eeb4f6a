//! Checking a sharded refutation: the coverage tree covers every assignment (each
//! split has both branches, so the leaves' cubes form a tautology), each leaf has
//! exactly one shard trace whose cube is the leaf's path, and each trace refutes
//! formula ∧ cube. Together these refute the formula.

use std::path::Path;

use crate::bundle::{bundle_file, check_trace};
use crate::cnf::Cnf;
use crate::manifest::{CoverTree, FileRecord, Sharding};

/// The leaves of a coverage tree with their paths; checks its shape.
fn tree_leaves(
    tree: &CoverTree,
    variables: usize,
    path: &mut Vec<i32>,
    out: &mut Vec<(usize, Vec<i32>)>,
) -> Result<(), String> {
    let (var, positive, negative) = match tree {
        CoverTree::Leaf { leaf } => {
            out.push((*leaf, path.clone()));
            return Ok(());
        }
        CoverTree::Split { split, positive, negative } => (*split, positive, negative),
    };
    if var < 1 || var as usize > variables {
        return Err(format!("the tree splits on {var}, which is not a variable of the formula"));
    }
    if path.iter().any(|l| l.abs() == var) {
        return Err(format!("the tree splits twice on variable {var} along one path"));
    }
    for (branch, literal) in [(positive, var), (negative, -var)] {
        path.push(literal);
        tree_leaves(branch, variables, path, out)?;
        path.pop();
    }
    Ok(())
}

/// Checks every shard under its cube; returns a summary.
pub fn check_shards(root: &Path, cnf: &Cnf, sharding: &Sharding, files: &[FileRecord]) -> Result<String, String> {
    let mut leaves = Vec::new();
    tree_leaves(&sharding.tree, cnf.variables, &mut Vec::new(), &mut leaves)?;
    let count = leaves.len();
    let mut seen = vec![false; count];
    for (leaf, _) in &leaves {
        if *leaf >= count || std::mem::replace(&mut seen[*leaf], true) {
            return Err(format!("the tree's leaves are not the shard indices 0..{count} each once"));
        }
    }
    if sharding.shards != count {
        return Err(format!("sharding.shards does not match the {count} leaves of the tree"));
    }
    for (leaf, path) in &leaves {
        let traces: Vec<&FileRecord> =
            files.iter().filter(|f| f.role == "shard-proof" && f.shard == Some(*leaf)).collect();
        let [file] = traces.as_slice() else {
            return Err(format!("shard {leaf} has {} traces listed, expected exactly one", traces.len()));
        };
        let sorted = |mut v: Vec<i32>| {
            v.sort_unstable();
            v
        };
        let (cube, expected) =
            (sorted(file.cube.clone().ok_or(format!("shard {leaf} has no cube"))?), sorted(path.clone()));
        if cube != expected {
            return Err(format!("shard {leaf}'s cube {cube:?} is not its tree path {expected:?}"));
        }
        check_trace(cnf, &bundle_file(root, &file.name)?, &cube).map_err(|e| format!("shard {leaf}: {e}"))?;
    }
    Ok(format!("coverage tree complete ({count} cubes); all {count} shard traces verified under their cubes"))
}
