//! Shard results: the record a finished shard leaves in its directory
//! (`result.json`), read and written only here. A result counts only when it
//! belongs to the plan (the SHA-256 of its plan.json) and, for a refuted shard,
//! when its trace still has the recorded hash.

use std::path::{Path, PathBuf};

use serde::{Deserialize, Serialize};

use super::error::ShardError;
use super::{shard_dir, RESULT_FILE};
use crate::certify::bundle::hash_file;
use crate::minimality::certificate::CERTIFICATE_FILE;
use crate::output::json_file::write_json;

/// The witness a shard writes when it finds a colouring (the claim is then false).
pub const WITNESS_FILE: &str = "witness.colouring";

/// How a shard ended.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ShardStatus {
    /// Unsatisfiable under its cube, with a trace.
    Refuted,
    /// A colouring exists under this cube: the claim is false.
    Found,
}

/// The record a finished shard leaves behind.
#[derive(Clone, Debug, Serialize, Deserialize)]
pub struct ShardResult {
    pub index: usize,
    pub status: ShardStatus,
    pub cube: Vec<i32>,
    pub seconds: f64,
    pub proof_file: Option<String>,
    pub proof_sha256: Option<String>,
    pub proof_bytes: Option<u64>,
    /// With the minimality scheme: SHA-256 of the shard's minimality clauses.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub minimality_sha256: Option<String>,
    /// The colouring, in ramsift's text format, when one was found.
    pub colouring: Option<String>,
    /// SHA-256 of the plan.json this result belongs to: a result of another plan
    /// (a directory reused for a new plan) never counts as done.
    #[serde(default)]
    pub plan_sha256: String,
}

/// Where shard `index`'s witness is, if it found a colouring.
pub fn witness_path(plan_dir: &Path, index: usize) -> PathBuf {
    shard_dir(plan_dir, index).join(WITNESS_FILE)
}

/// Shard `index`'s result record if it is there, readable and of the plan whose
/// plan.json hashes to `plan_sha256`; its trace is not looked at.
pub fn recorded_result(plan_dir: &Path, index: usize, plan_sha256: &str) -> Option<ShardResult> {
    let text = std::fs::read_to_string(shard_dir(plan_dir, index).join(RESULT_FILE)).ok()?;
    let result: ShardResult = serde_json::from_str(&text).ok()?;
    let of_this_plan = result.index == index
        && !result.plan_sha256.is_empty()
        && result.plan_sha256 == plan_sha256;
    let complete = match result.status {
        ShardStatus::Refuted => result.proof_file.is_some() && result.proof_sha256.is_some(),
        ShardStatus::Found => result.colouring.is_some(),
    };
    (of_this_plan && complete).then_some(result)
}

/// [`recorded_result`], and for a refuted shard its trace present with the
/// recorded hash (callers hash the plan once, not once per shard).
pub fn complete_result(plan_dir: &Path, index: usize, plan_sha256: &str) -> Option<ShardResult> {
    let result = recorded_result(plan_dir, index, plan_sha256)?;
    match result.status {
        ShardStatus::Refuted => {
            let dir = shard_dir(plan_dir, index);
            let (hash, _) = hash_file(&dir.join(result.proof_file.as_deref()?)).ok()?;
            let clauses_intact = match &result.minimality_sha256 {
                Some(recorded) => hash_file(&dir.join(CERTIFICATE_FILE)).ok()?.0 == *recorded,
                None => true,
            };
            (Some(hash) == result.proof_sha256 && clauses_intact).then_some(result)
        }
        ShardStatus::Found => Some(result),
    }
}

/// Writes shard `result` into its directory, atomically.
pub fn write_result(plan_dir: &Path, result: &ShardResult) -> Result<(), ShardError> {
    let path = shard_dir(plan_dir, result.index).join(RESULT_FILE);
    write_json(&path, result).map_err(ShardError::io(&path))
}
