//! Certified refutation: solve the exact CNF of an instance with varisat writing a
//! DRAT trace, then write the certificate bundle (see [`crate::certify::bundle`]).
//!
//! The trace is written to a temporary file in the bundle directory while the solver
//! runs; only when the formula is proven unsatisfiable is it renamed into place
//! (compressed first if asked), and the formula, the manifest and the guide are
//! written. A timeout or a satisfiable formula leaves no bundle behind.
//!
//! With the `minimality` scheme the hooked solver runs instead of varisat, and
//! the clauses its minimality check added go, each with its witness, to a second
//! temporary file that becomes `minimality.txt` the same way.

use std::io::{self, BufWriter};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, AtomicU64};
use std::time::{Duration, Instant};

use thiserror::Error;

use ramsift_encoder::atomic_file::{ensure_dir, persist_finished, temporary_in, write_atomically};
use ramsift_encoder::dimacs::write_encoding_to;
use ramsift_encoder::{Colouring, RamseyEncoding, Scheme};

use crate::certify::bundle::{
    write_manifest_and_guide, FileRecord, Manifest, PremiseRecord, FORMULA_FILE,
};
use crate::certify::witness_check::verify_witness;
use crate::minimality::certificate::CERTIFICATE_FILE;
use crate::minimality::hook::DEFAULT_BUDGET;
use crate::minimality::solve::{solve_certified, CertifiedOutputs};
use crate::search::attempt::{
    run_attempt_with_proof, AttemptError, AttemptOutcome, AttemptPlan, ProofOutput,
};
use crate::search::formula::Formula;
use ramsift_cdcl::Outcome;

/// How to refute.
#[derive(Clone, Debug, Default)]
pub struct RefuteOptions {
    /// Text DRAT instead of binary.
    pub text_proof: bool,
    /// gzip the proof.
    pub gzip_proof: bool,
    pub timeout: Option<Duration>,
    /// Candidate vertices per partial minimality check (None: the default).
    pub check_budget: Option<u64>,
}

/// What the refutation found.
#[derive(Clone, Debug)]
pub enum RefuteResult {
    /// Unsatisfiable: the bundle is written.
    Refuted {
        files: Vec<PathBuf>,
        proof_bytes: u64,
        manifest: Box<Manifest>,
    },
    /// Satisfiable: a verified colouring (of the formula with its symmetry breaking).
    Found(Colouring),
    Unknown,
}

#[derive(Clone, Debug)]
pub struct RefuteReport {
    pub result: RefuteResult,
    pub solve_seconds: f64,
    /// With minimality: where the hooked search's time and clauses went.
    pub minimality: Option<SearchAccount>,
}

/// The hooked search's counters, for the account of a run.
#[derive(Clone, Debug, serde::Serialize)]
pub struct SearchAccount {
    pub conflicts: u64,
    pub decisions: u64,
    pub checks: u64,
    pub minimality_clauses: u64,
    pub checks_given_up: u64,
    pub check_seconds: f64,
}

impl SearchAccount {
    fn of(run: &crate::minimality::solve::HookedRun) -> Self {
        SearchAccount {
            conflicts: run.solver.conflicts,
            decisions: run.solver.decisions,
            checks: run.minimality.checks,
            minimality_clauses: run.minimality.partial_clauses + run.minimality.complete_clauses,
            checks_given_up: run.minimality.gave_up,
            check_seconds: run.minimality.check_seconds,
        }
    }
}

#[derive(Debug, Error)]
pub enum RefuteError {
    #[error("writing the bundle in {dir}: {source}")]
    Io {
        dir: PathBuf,
        #[source]
        source: io::Error,
    },
    #[error(transparent)]
    Attempt(#[from] AttemptError),
    #[error("internal error: the solver's colouring failed the independent check ({0}); please report this")]
    WitnessRejected(String),
    #[error("certifying the premise {0}: {1}")]
    Premise(String, String),
}

/// The proof's file name for the chosen options.
pub fn proof_file_name(options: &RefuteOptions) -> String {
    let base = if options.text_proof {
        "proof.drat.txt"
    } else {
        "proof.drat"
    };
    if options.gzip_proof {
        format!("{base}.gz")
    } else {
        base.to_string()
    }
}

/// Refutes `encoding`, writing the bundle into `dir` on success.
pub fn refute(
    encoding: &RamseyEncoding,
    dir: &Path,
    options: &RefuteOptions,
    stop: &AtomicBool,
    bytes_seen: &AtomicU64,
) -> Result<RefuteReport, RefuteError> {
    let io_error = |source: io::Error| RefuteError::Io {
        dir: dir.to_path_buf(),
        source,
    };
    ensure_dir(dir).map_err(io_error)?;
    let temporary = |prefix: &str| temporary_in(dir, prefix).map_err(io_error);
    let trace = temporary(".proof.")?;
    let started = Instant::now();
    let run = RunLimits {
        stop,
        bytes_seen,
        deadline: options.timeout.map(|t| started + t),
        started,
    };
    if encoding.symmetry().contains(Scheme::Minimality) {
        let certificate = temporary(".minimality.")?;
        refute_hooked(encoding, dir, options, trace, certificate, run)
    } else {
        refute_with_varisat(encoding, dir, options, trace, run)
    }
}

/// How a refutation may run, and since when.
struct RunLimits<'a> {
    stop: &'a AtomicBool,
    bytes_seen: &'a AtomicU64,
    deadline: Option<Instant>,
    started: Instant,
}

/// The minimality scheme: our solver with the hook, writing minimality.txt too.
fn refute_hooked(
    encoding: &RamseyEncoding,
    dir: &Path,
    options: &RefuteOptions,
    trace: tempfile::NamedTempFile,
    certificate: tempfile::NamedTempFile,
    limits: RunLimits<'_>,
) -> Result<RefuteReport, RefuteError> {
    let outputs = CertifiedOutputs {
        trace: trace.as_file(),
        certificate: certificate.as_file(),
        text_proof: options.text_proof,
        bytes_seen: Some(limits.bytes_seen),
    };
    let budget = options.check_budget.unwrap_or(DEFAULT_BUDGET);
    let run = solve_certified(encoding, &[], outputs, budget, limits.stop, limits.deadline)
        .map_err(|source| RefuteError::Io {
            dir: dir.to_path_buf(),
            source,
        })?;
    let solve_seconds = limits.started.elapsed().as_secs_f64();
    let account = SearchAccount::of(&run);
    let result = match (run.outcome, run.colouring) {
        (Outcome::Unsatisfiable, _) => {
            let parts = BundleParts {
                trace,
                certificate: Some(certificate),
                solve_seconds,
                proof_bytes: run.proof_bytes,
            };
            refuted(encoding, dir, options, parts)?
        }
        (Outcome::Satisfiable, Some(colouring)) => checked_colouring(encoding, colouring)?,
        _ => RefuteResult::Unknown,
    };
    Ok(RefuteReport {
        result,
        solve_seconds,
        minimality: Some(account),
    })
}

/// Static schemes only: varisat on the exact CNF.
fn refute_with_varisat(
    encoding: &RamseyEncoding,
    dir: &Path,
    options: &RefuteOptions,
    trace: tempfile::NamedTempFile,
    limits: RunLimits<'_>,
) -> Result<RefuteReport, RefuteError> {
    let formula = Formula::from_encoding(encoding);
    let proof = ProofOutput {
        writer: BufWriter::with_capacity(1 << 20, trace.as_file()),
        text: options.text_proof,
        bytes_seen: Some(limits.bytes_seen),
    };
    let plan = AttemptPlan::default();
    let report =
        run_attempt_with_proof(&formula, &plan, limits.stop, limits.deadline, Some(proof))?;
    let solve_seconds = limits.started.elapsed().as_secs_f64();
    let result = match report.outcome {
        AttemptOutcome::Stopped(_) => RefuteResult::Unknown,
        AttemptOutcome::Satisfiable(colouring) => checked_colouring(encoding, colouring)?,
        AttemptOutcome::Unsatisfiable => {
            let parts = BundleParts {
                trace,
                certificate: None,
                solve_seconds,
                proof_bytes: report.proof_bytes,
            };
            refuted(encoding, dir, options, parts)?
        }
    };
    Ok(RefuteReport {
        result,
        solve_seconds,
        minimality: None,
    })
}

/// Writes the bundle of a refutation and describes it.
fn refuted(
    encoding: &RamseyEncoding,
    dir: &Path,
    options: &RefuteOptions,
    parts: BundleParts,
) -> Result<RefuteResult, RefuteError> {
    let proof_bytes = parts.proof_bytes;
    let (files, manifest) = write_refutation_bundle(encoding, dir, options, parts)?;
    Ok(RefuteResult::Refuted {
        files,
        proof_bytes,
        manifest: Box::new(manifest),
    })
}

/// The solver's colouring, after the independent check.
fn checked_colouring(
    encoding: &RamseyEncoding,
    colouring: Colouring,
) -> Result<RefuteResult, RefuteError> {
    let verdict = verify_witness(encoding.instance().spec(), &colouring);
    if !verdict.is_valid() {
        return Err(RefuteError::WitnessRejected(verdict.to_string()));
    }
    Ok(RefuteResult::Found(colouring))
}

pub use crate::HOOKED_SOLVER_NAME;

/// The finished temporary files of a refutation and what it took (the solver
/// that made them follows from the symmetry schemes: `Manifest::new` names it).
struct BundleParts {
    trace: tempfile::NamedTempFile,
    certificate: Option<tempfile::NamedTempFile>,
    solve_seconds: f64,
    proof_bytes: u64,
}

/// Puts the finished trace in place (compressed if asked) and writes the formula,
/// the manifest and the guide. Returns the files written and the manifest.
fn write_refutation_bundle(
    encoding: &RamseyEncoding,
    dir: &Path,
    options: &RefuteOptions,
    parts: BundleParts,
) -> Result<(Vec<PathBuf>, Manifest), RefuteError> {
    let solve_seconds = parts.solve_seconds;
    let trace = parts.trace;
    let io_error = |source: io::Error| RefuteError::Io {
        dir: dir.to_path_buf(),
        source,
    };
    let proof_name = proof_file_name(options);
    let proof_path = dir.join(&proof_name);
    if options.gzip_proof {
        let mut source = trace.reopen().map_err(io_error)?;
        write_atomically(&proof_path, |w| io::copy(&mut source, w).map(|_| ()))
            .map_err(io_error)?;
    } else {
        persist_finished(trace, &proof_path).map_err(io_error)?;
    }
    let formula_path = dir.join(FORMULA_FILE);
    write_encoding_to(encoding, &formula_path).map_err(io_error)?;
    let proof_format = match (options.text_proof, options.gzip_proof) {
        (false, false) => "binary DRAT",
        (false, true) => "binary DRAT, gzip",
        (true, false) => "text DRAT",
        (true, true) => "text DRAT, gzip",
    };
    let mut files = vec![
        FileRecord::of(dir, FORMULA_FILE, "formula", "DIMACS CNF, gzip").map_err(io_error)?,
        FileRecord::of(dir, &proof_name, "drat-proof", proof_format).map_err(io_error)?,
    ];
    let mut written = vec![formula_path, proof_path];
    if let Some(certificate) = parts.certificate {
        let path = dir.join(CERTIFICATE_FILE);
        persist_finished(certificate, &path).map_err(io_error)?;
        files.push(
            FileRecord::of(
                dir,
                CERTIFICATE_FILE,
                "minimality-clauses",
                "ramsift minimality clauses 1",
            )
            .map_err(io_error)?,
        );
        written.push(path);
    }
    let manifest = Manifest::new(encoding, files, solve_seconds, None);
    written.extend(write_manifest_and_guide(dir, &manifest).map_err(io_error)?);
    Ok((written, manifest))
}

/// The directory a premise's bundle goes to inside a bundle: `premises/R3-4-9`.
pub fn premise_dir(dir: &Path, premise: &PremiseRecord) -> PathBuf {
    dir.join(crate::certify::bundle::premise_folder(premise))
}

/// Refutes every premise into `dir/premises/` (recursively certifying theirs), with
/// the same symmetry schemes. Returns the premise bundles written.
pub fn certify_premises(
    premises: &[PremiseRecord],
    symmetry: &ramsift_encoder::SymmetrySet,
    dir: &Path,
    options: &RefuteOptions,
    stop: &AtomicBool,
) -> Result<Vec<PathBuf>, RefuteError> {
    use ramsift_encoder::{EncodingLimits, Instance, RamseySpec};
    let mut written = Vec::new();
    for premise in premises {
        let sub_dir = premise_dir(dir, premise);
        let spec = RamseySpec::cliques(&premise.clique_sizes)
            .map_err(|e| RefuteError::Premise(premise.statement.clone(), e.to_string()))?;
        let instance = Instance::new(spec, premise.upper_bound)
            .map_err(|e| RefuteError::Premise(premise.statement.clone(), e.to_string()))?;
        let encoding =
            RamseyEncoding::with_symmetry(&instance, symmetry, &EncodingLimits::default())
                .map_err(|e| RefuteError::Premise(premise.statement.clone(), e.to_string()))?;
        let report = refute(&encoding, &sub_dir, options, stop, &AtomicU64::new(0))?;
        match report.result {
            RefuteResult::Refuted { manifest, .. } => {
                written.push(sub_dir.clone());
                written.extend(certify_premises(
                    &manifest.premises,
                    symmetry,
                    &sub_dir,
                    options,
                    stop,
                )?);
                crate::certify::referee_guide::write_guide(&sub_dir, &manifest).map_err(
                    |source| RefuteError::Io {
                        dir: sub_dir.clone(),
                        source,
                    },
                )?;
            }
            _ => {
                return Err(RefuteError::Premise(
                    premise.statement.clone(),
                    "it was not refuted (a colouring exists, or the time ran out)".into(),
                ))
            }
        }
    }
    Ok(written)
}
