//! What can go wrong with a plan directory, a shard run or a merge.

use std::io;
use std::path::PathBuf;

use thiserror::Error;

use crate::certify::refute::RefuteError;
use crate::search::attempt::AttemptError;

#[derive(Debug, Error)]
pub enum ShardError {
    #[error("{path}: {source}")]
    Io {
        path: PathBuf,
        #[source]
        source: io::Error,
    },
    #[error("{path}: not a ramsift plan ({message})")]
    NotAPlan { path: PathBuf, message: String },
    #[error("{path}: plan_format is {found:?}, expected {expected:?}")]
    PlanFormat {
        path: PathBuf,
        found: String,
        expected: &'static str,
    },
    #[error("the plan's instance: {0}")]
    PlanInstance(String),
    #[error("this ramsift encodes the plan's instance differently from the one that planned it")]
    PlanEncodingChanged,
    #[error("shard index {index} is out of range: the plan has {shards} shards (0..{})", shards.saturating_sub(1))]
    IndexOutOfRange { index: usize, shards: usize },
    #[error(transparent)]
    Attempt(#[from] AttemptError),
    #[error("internal error: shard {index}'s colouring failed the independent check ({verdict})")]
    WitnessRejected { index: usize, verdict: String },
    #[error("shard {index} found a colouring of K_{order} with no monochromatic forbidden graph, so the claim R({spec}) <= {order} is FALSE; witness: {}", witness.display())]
    ClaimFalse {
        index: usize,
        order: usize,
        spec: String,
        witness: PathBuf,
    },
    #[error("{pending} of {shards} shards are not done ({damaged} damaged, {missing} missing); run them first, e.g. sbatch --array={array} {}/submit.sbatch", plan_dir.display())]
    NotDone {
        pending: usize,
        shards: usize,
        damaged: usize,
        missing: usize,
        array: String,
        plan_dir: PathBuf,
    },
    #[error("shard {index}: its trace or its minimality clauses do not match its result record (changed or damaged since it ran); run the shard again")]
    TraceChanged { index: usize },
    #[error("reading the trace of shard {index}: {message}")]
    TraceUnreadable { index: usize, message: String },
    #[error(transparent)]
    Premises(#[from] RefuteError),
}

impl ShardError {
    /// An I/O error on `path`.
    pub fn io(path: impl Into<PathBuf>) -> impl FnOnce(io::Error) -> ShardError {
        let path = path.into();
        move |source| ShardError::Io { path, source }
    }
}
