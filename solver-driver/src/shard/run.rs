//! Refuting one shard: the plan's formula with the shard's cube added as unit
//! clauses, solved by varisat writing a DRAT trace of (formula ∧ cube).
//!
//! Results are written atomically: the trace goes to a temporary file, is flushed
//! to disk and renamed to `proof.drat`; then `result.json` (status, time, cube,
//! SHA-256 of the trace) is written the same way. A shard whose result record is
//! present and whose trace matches its hash is complete and is skipped; anything
//! else in its directory is a partial run and is redone from scratch.

use std::io::BufWriter;
use std::path::{Path, PathBuf};
use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};

use anyhow::{bail, Context, Result};
use serde::{Deserialize, Serialize};

use ramsift_encoder::atomic_file::write_atomically;
use ramsift_encoder::{CliqueEncoding, EncodingLimits, Instance, RamseySpec, SymmetrySet};

use super::plan::Plan;
use super::{shard_dir, PLAN_FILE, RESULT_FILE, SHARD_PROOF_FILE};
use crate::certify::bundle::hash_file;
use crate::certify::witness_check::verify_witness;
use crate::output::witness::colouring_text;
use crate::search::attempt::{run_attempt, AttemptOutcome, AttemptPlan};
use crate::search::formula::Formula;

/// The record a finished shard leaves behind.
#[derive(Clone, Debug, Serialize, Deserialize)]
pub struct ShardResult {
    pub index: usize,
    /// "refuted" or "found" (a colouring exists under this cube: the claim is false).
    pub status: String,
    pub cube: Vec<i32>,
    pub seconds: f64,
    pub proof_file: Option<String>,
    pub proof_sha256: Option<String>,
    pub proof_bytes: Option<u64>,
    /// The colouring, in ramsift's text format, when one was found.
    pub colouring: Option<String>,
    /// SHA-256 of the plan.json this result belongs to: a result of another plan
    /// (a directory reused for a new plan) never counts as done.
    #[serde(default)]
    pub plan_sha256: String,
}

/// What `run_shard` did.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum ShardOutcome {
    AlreadyDone,
    Refuted,
    Found,
    Unknown,
}

/// Reads a plan directory's plan.
pub fn read_plan(plan_dir: &Path) -> Result<Plan> {
    let path = plan_dir.join(PLAN_FILE);
    let text =
        std::fs::read_to_string(&path).with_context(|| format!("reading {}", path.display()))?;
    let plan: Plan = serde_json::from_str(&text)
        .with_context(|| format!("{}: not a ramsift plan", path.display()))?;
    if plan.plan_format != super::plan::PLAN_FORMAT {
        bail!(
            "{}: plan_format is {:?}, expected {:?}",
            path.display(),
            plan.plan_format,
            super::plan::PLAN_FORMAT
        );
    }
    Ok(plan)
}

/// Rebuilds the plan's encoding and checks it matches what the plan recorded.
pub fn plan_encoding(plan: &Plan) -> Result<CliqueEncoding> {
    let spec: RamseySpec = plan.spec.parse().context("the plan's spec")?;
    let instance = Instance::new(spec, plan.order)?;
    let symmetry: SymmetrySet = plan.symmetry.join(",").parse()?;
    let encoding = CliqueEncoding::with_symmetry(&instance, &symmetry, &EncodingLimits::default())?;
    if encoding.variable_count() != plan.variables || encoding.clause_count() != plan.clauses {
        bail!("this ramsift encodes the plan's instance differently from the one that planned it");
    }
    Ok(encoding)
}

/// The witness a shard writes when it finds a colouring (the claim is then false).
pub const WITNESS_FILE: &str = "witness.colouring";

/// Where shard `index`'s witness is, if it found a colouring.
pub fn witness_path(plan_dir: &Path, index: usize) -> PathBuf {
    shard_dir(plan_dir, index).join(WITNESS_FILE)
}

/// SHA-256 of the plan directory's plan.json.
pub fn plan_sha256(plan_dir: &Path) -> Option<String> {
    hash_file(&plan_dir.join(PLAN_FILE))
        .ok()
        .map(|(sha, _)| sha)
}

/// Reads a shard's result record if it is complete (trace present with the recorded
/// hash) and belongs to the plan whose plan.json hashes to `plan_sha256` (callers
/// hash the plan once, not once per shard).
pub fn complete_result(plan_dir: &Path, index: usize, plan_sha256: &str) -> Option<ShardResult> {
    let dir = shard_dir(plan_dir, index);
    let result: ShardResult =
        serde_json::from_str(&std::fs::read_to_string(dir.join(RESULT_FILE)).ok()?).ok()?;
    if result.index != index || result.plan_sha256.is_empty() || result.plan_sha256 != plan_sha256 {
        return None;
    }
    match result.status.as_str() {
        "refuted" => {
            let (hash, _) = hash_file(&dir.join(result.proof_file.as_deref()?)).ok()?;
            (Some(hash) == result.proof_sha256).then_some(result)
        }
        "found" => result.colouring.is_some().then_some(result),
        _ => None,
    }
}

/// Refutes shard `index` of the plan in `plan_dir`.
pub fn run_shard(
    plan_dir: &Path,
    index: usize,
    timeout: Option<Duration>,
    stop: &AtomicBool,
) -> Result<ShardOutcome> {
    let plan = read_plan(plan_dir)?;
    let Some(cube) = plan.cubes.get(index) else {
        bail!(
            "shard index {index} is out of range: the plan has {} shards (0..{})",
            plan.cubes.len(),
            plan.cubes.len().saturating_sub(1)
        );
    };
    let plan_sha256 = plan_sha256(plan_dir).context("hashing the plan")?;
    if complete_result(plan_dir, index, &plan_sha256).is_some() {
        return Ok(ShardOutcome::AlreadyDone);
    }
    let dir: PathBuf = shard_dir(plan_dir, index);
    if dir.exists() {
        std::fs::remove_dir_all(&dir)
            .with_context(|| format!("clearing the partial run in {}", dir.display()))?;
    }
    std::fs::create_dir_all(&dir).with_context(|| format!("creating {}", dir.display()))?;
    let encoding = plan_encoding(&plan)?;
    let formula = Formula::from_encoding(&encoding);
    let trace = tempfile::Builder::new()
        .prefix(".proof.")
        .suffix(".tmp")
        .tempfile_in(&dir)?;
    hold_for_tests();
    let started = Instant::now();
    let attempt = AttemptPlan {
        units: cube.literals.clone(),
        ..AttemptPlan::default()
    };
    let report = run_attempt(
        &formula,
        &attempt,
        stop,
        timeout.map(|t| started + t),
        Some(BufWriter::with_capacity(1 << 20, trace.as_file())),
        false,
    )?;
    let seconds = started.elapsed().as_secs_f64();
    let result = match report.outcome {
        AttemptOutcome::Stopped(_) => return Ok(ShardOutcome::Unknown),
        AttemptOutcome::Unsatisfiable => {
            trace.as_file().sync_all()?;
            let proof_path = dir.join(SHARD_PROOF_FILE);
            trace.persist(&proof_path).map_err(|e| e.error)?;
            let (sha, bytes) = hash_file(&proof_path)?;
            ShardResult {
                index,
                status: "refuted".into(),
                cube: cube.literals.clone(),
                seconds,
                proof_file: Some(SHARD_PROOF_FILE.into()),
                proof_sha256: Some(sha),
                proof_bytes: Some(bytes),
                colouring: None,
                plan_sha256: plan_sha256.clone(),
            }
        }
        AttemptOutcome::Satisfiable(colouring) => {
            let verdict = verify_witness(encoding.instance().spec(), &colouring);
            if !verdict.is_valid() {
                bail!("internal error: shard {index}'s colouring failed the independent check ({verdict})");
            }
            // The counterexample to the claim, as a witness file of its own.
            let text = colouring_text(
                encoding.instance(),
                &colouring,
                &[format!("found by shard {index} under its cube")],
            );
            write_atomically(&dir.join(WITNESS_FILE), |w| w.write_all(text.as_bytes()))?;
            ShardResult {
                index,
                status: "found".into(),
                cube: cube.literals.clone(),
                seconds,
                proof_file: None,
                proof_sha256: None,
                proof_bytes: None,
                colouring: Some(text),
                plan_sha256,
            }
        }
    };
    let json = serde_json::to_string_pretty(&result)?;
    write_atomically(&dir.join(RESULT_FILE), |w| w.write_all(json.as_bytes()))?;
    Ok(if result.status == "found" {
        ShardOutcome::Found
    } else {
        ShardOutcome::Refuted
    })
}

/// Test aid: `RAMSIFT_SHARD_HOLD_SECONDS` makes a shard wait after it has started
/// (its partial files exist), so that tests can interrupt a running shard.
fn hold_for_tests() {
    if let Some(seconds) = std::env::var("RAMSIFT_SHARD_HOLD_SECONDS")
        .ok()
        .and_then(|s| s.parse::<f64>().ok())
    {
        std::thread::sleep(Duration::from_secs_f64(seconds));
    }
}
