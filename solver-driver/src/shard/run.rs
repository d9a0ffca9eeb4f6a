//! Refuting one shard: the plan's formula with the shard's cube added as unit
//! clauses, solved by varisat writing a DRAT trace of (formula ∧ cube), or, when
//! the plan uses the minimality scheme, by our solver with the minimality check,
//! whose clauses go to the shard's `minimality.txt`.
//!
//! Results are written atomically: the trace goes to a temporary file, is flushed
//! to disk and renamed to `proof.drat`; then `result.json` (status, time, cube,
//! SHA-256 of the trace) is written the same way. A shard whose result record is
//! present and whose trace matches its hash is complete and is skipped; anything
//! else in its directory is a partial run and is redone from scratch.

use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};

use ramsift_cdcl::Outcome;
use ramsift_encoder::atomic_file::{persist_finished, temporary_in, write_atomically};
use ramsift_encoder::{Colouring, RamseyEncoding, Scheme};

use super::error::ShardError;
use super::plan::{plan_sha256, Cube, Plan};
use super::result::{complete_result, write_result, ShardResult, ShardStatus, WITNESS_FILE};
use super::{shard_dir, PLAN_FILE, SHARD_PROOF_FILE};
use crate::certify::bundle::hash_file;
use crate::certify::drat_write::write_addition;
use crate::certify::witness_check::verify_witness;
use crate::minimality::certificate::CERTIFICATE_FILE;
use crate::minimality::hook::DEFAULT_BUDGET;
use crate::minimality::solve::{solve_certified, CertifiedOutputs};
use crate::output::witness::colouring_text;
use crate::search::attempt::{run_attempt_with_proof, AttemptOutcome, AttemptPlan, ProofOutput};
use crate::search::formula::Formula;

/// What `run_shard` did.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum ShardOutcome {
    AlreadyDone,
    Refuted,
    Found,
    Unknown,
}

/// Refutes shard `index` of the plan in `plan_dir`.
pub fn run_shard(
    plan_dir: &Path,
    index: usize,
    timeout: Option<Duration>,
    stop: &AtomicBool,
) -> Result<ShardOutcome, ShardError> {
    let plan = Plan::read(plan_dir)?;
    let Some(cube) = plan.cubes.get(index) else {
        return Err(ShardError::IndexOutOfRange {
            index,
            shards: plan.cubes.len(),
        });
    };
    let plan_sha256 = plan_sha256(plan_dir).ok_or_else(|| ShardError::NotAPlan {
        path: plan_dir.join(PLAN_FILE),
        message: "it cannot be read to be hashed".into(),
    })?;
    if complete_result(plan_dir, index, &plan_sha256).is_some() {
        return Ok(ShardOutcome::AlreadyDone);
    }
    let dir = fresh_shard_dir(plan_dir, index)?;
    let encoding = plan.encoding()?;
    let trace = temporary_in(&dir, ".proof.").map_err(ShardError::io(&dir))?;
    hold_for_tests();
    let started = Instant::now();
    // The planner's lemmas open the trace, each RUP from the formula, the cube and
    // the ones before it; the solver gets the unit ones.
    let mut writer = BufWriter::with_capacity(1 << 20, trace.as_file());
    for lemma in &cube.lemmas {
        write_addition(&mut writer, lemma).map_err(ShardError::io(&dir))?;
    }
    let fixed = cube.lemmas.iter().filter(|c| c.len() == 1).map(|c| c[0]);
    let units: Vec<i32> = cube.literals.iter().copied().chain(fixed).collect();
    let deadline = timeout.map(|t| started + t);
    let Some((outcome, certificate)) =
        solve_shard(&encoding, units, writer, &trace, &dir, stop, deadline)?
    else {
        return Ok(ShardOutcome::Unknown);
    };
    let seconds = started.elapsed().as_secs_f64();
    let mut result = ShardResult {
        index,
        status: ShardStatus::Refuted,
        cube: cube.literals.clone(),
        seconds,
        proof_file: None,
        proof_sha256: None,
        proof_bytes: None,
        minimality_sha256: None,
        colouring: None,
        plan_sha256,
    };
    match outcome {
        AttemptOutcome::Stopped(_) => return Ok(ShardOutcome::Unknown),
        AttemptOutcome::Unsatisfiable => {
            if let Some(certificate) = certificate {
                result.minimality_sha256 =
                    Some(persist_file(certificate, &dir, CERTIFICATE_FILE)?.0);
            }
            let (sha, bytes) = persist_file(trace, &dir, SHARD_PROOF_FILE)?;
            result.proof_file = Some(SHARD_PROOF_FILE.into());
            result.proof_sha256 = Some(sha);
            result.proof_bytes = Some(bytes);
        }
        AttemptOutcome::Satisfiable(colouring) => {
            result.status = ShardStatus::Found;
            result.colouring = Some(write_witness(&dir, &encoding, cube, &colouring)?);
        }
    }
    write_result(plan_dir, &result)?;
    Ok(match result.status {
        ShardStatus::Found => ShardOutcome::Found,
        ShardStatus::Refuted => ShardOutcome::Refuted,
    })
}

/// Solves the formula with `units` fixed, the trace continuing after the
/// lemmas in `writer`: our solver with the minimality check when the plan uses
/// it (its clauses in a temporary file, returned), else varisat. None: stopped.
fn solve_shard(
    encoding: &RamseyEncoding,
    units: Vec<i32>,
    mut writer: BufWriter<&std::fs::File>,
    trace: &tempfile::NamedTempFile,
    dir: &Path,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<(AttemptOutcome, Option<tempfile::NamedTempFile>)>, ShardError> {
    if !encoding.symmetry().contains(Scheme::Minimality) {
        let formula = Formula::from_encoding(encoding);
        let attempt = AttemptPlan {
            units,
            ..AttemptPlan::default()
        };
        let proof = ProofOutput {
            writer,
            text: false,
            bytes_seen: None,
        };
        let report = run_attempt_with_proof(&formula, &attempt, stop, deadline, Some(proof))?;
        return Ok(match report.outcome {
            AttemptOutcome::Stopped(_) => None,
            outcome => Some((outcome, None)),
        });
    }
    writer.flush().map_err(ShardError::io(dir))?;
    drop(writer);
    let certificate = temporary_in(dir, ".minimality.").map_err(ShardError::io(dir))?;
    let outputs = CertifiedOutputs {
        trace: trace.as_file(),
        certificate: certificate.as_file(),
        text_proof: false,
        bytes_seen: None,
    };
    let run = solve_certified(encoding, &units, outputs, DEFAULT_BUDGET, stop, deadline)
        .map_err(ShardError::io(dir))?;
    Ok(match (run.outcome, run.colouring) {
        (Outcome::Unsatisfiable, _) => Some((AttemptOutcome::Unsatisfiable, Some(certificate))),
        (Outcome::Satisfiable, Some(colouring)) => {
            Some((AttemptOutcome::Satisfiable(colouring), None))
        }
        _ => None,
    })
}

/// The shard's directory, emptied of any partial run.
fn fresh_shard_dir(plan_dir: &Path, index: usize) -> Result<PathBuf, ShardError> {
    let dir = shard_dir(plan_dir, index);
    if dir.exists() {
        std::fs::remove_dir_all(&dir).map_err(ShardError::io(&dir))?;
    }
    std::fs::create_dir_all(&dir).map_err(ShardError::io(&dir))?;
    Ok(dir)
}

/// Puts a finished file in place as `name`; returns its SHA-256 and size.
fn persist_file(
    file: tempfile::NamedTempFile,
    dir: &Path,
    name: &str,
) -> Result<(String, u64), ShardError> {
    let path = dir.join(name);
    persist_finished(file, &path).map_err(ShardError::io(&path))?;
    hash_file(&path).map_err(ShardError::io(&path))
}

/// Checks a colouring found under a cube (the counterexample to the claim) and
/// writes it as a witness file of its own; returns its text.
fn write_witness(
    dir: &Path,
    encoding: &RamseyEncoding,
    cube: &Cube,
    colouring: &Colouring,
) -> Result<String, ShardError> {
    let verdict = verify_witness(encoding.instance().spec(), colouring);
    if !verdict.is_valid() {
        return Err(ShardError::WitnessRejected {
            index: cube.index,
            verdict: verdict.to_string(),
        });
    }
    let text = colouring_text(
        encoding.instance(),
        colouring,
        &[format!("found by shard {} under its cube", cube.index)],
    );
    let path = dir.join(WITNESS_FILE);
    write_atomically(&path, |w| w.write_all(text.as_bytes())).map_err(ShardError::io(&path))?;
    Ok(text)
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
