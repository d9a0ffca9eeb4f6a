//! Which shards of a plan are done, failed (a colouring was found, or a damaged
//! result), or missing (never run, or interrupted), and the `--array=` list that
//! resubmits the ones still needed.

use std::path::Path;

use super::plan::plan_sha256;
use super::result::{complete_result, ShardResult, ShardStatus};
use super::{shard_dir, RESULT_FILE};

/// The state of every shard.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct PlanStatus {
    pub done: Vec<usize>,
    /// A colouring was found under the cube: the claim itself is false.
    pub found: Vec<usize>,
    /// A result record exists but does not match its trace.
    pub damaged: Vec<usize>,
    /// No result record (never run, running, or interrupted).
    pub missing: Vec<usize>,
    /// The missing shards that left partial files (running now, or interrupted).
    pub partial: Vec<usize>,
}

impl PlanStatus {
    /// Shards to (re)submit: damaged and missing ones.
    pub fn to_resubmit(&self) -> Vec<usize> {
        let mut all: Vec<usize> = self.damaged.iter().chain(&self.missing).copied().collect();
        all.sort_unstable();
        all
    }
}

/// The state of every shard, its traces checked against their records.
pub fn plan_status(plan_dir: &Path, shards: usize) -> PlanStatus {
    // Without a readable plan no result can belong to it.
    let plan_sha256 = plan_sha256(plan_dir);
    let read = |index| complete_result(plan_dir, index, plan_sha256.as_deref()?);
    classify_shards(plan_dir, shards, read).0
}

/// The state of every shard as `read` gives its result (None: no usable
/// record), and the refuted shards' results in index order.
pub fn classify_shards(
    plan_dir: &Path,
    shards: usize,
    read: impl Fn(usize) -> Option<ShardResult>,
) -> (PlanStatus, Vec<ShardResult>) {
    let (mut status, mut refuted) = (PlanStatus::default(), Vec::new());
    for index in 0..shards {
        match read(index) {
            Some(r) if r.status == ShardStatus::Refuted => {
                status.done.push(index);
                refuted.push(r);
            }
            Some(_) => status.found.push(index),
            None if shard_dir(plan_dir, index).join(RESULT_FILE).exists() => {
                status.damaged.push(index)
            }
            None => {
                if shard_dir(plan_dir, index).exists() {
                    status.partial.push(index);
                }
                status.missing.push(index);
            }
        }
    }
    (status, refuted)
}

/// Slurm's array syntax for a list of indices: `0,3-5,9`.
pub fn array_list(indices: &[usize]) -> String {
    let mut parts = Vec::new();
    let mut i = 0;
    while i < indices.len() {
        let start = indices[i];
        let mut end = start;
        while i + 1 < indices.len() && indices[i + 1] == end + 1 {
            i += 1;
            end = indices[i];
        }
        parts.push(if start == end {
            start.to_string()
        } else {
            format!("{start}-{end}")
        });
        i += 1;
    }
    parts.join(",")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn array_lists_compress_runs() {
        assert_eq!(array_list(&[0, 1, 2, 5, 7, 8]), "0-2,5,7-8");
        assert_eq!(array_list(&[3]), "3");
        assert_eq!(array_list(&[]), "");
    }
}
