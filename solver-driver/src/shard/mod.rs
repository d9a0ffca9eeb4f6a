//! Sharded refutation: a refutation too hard for one machine is split into cubes
//! (partial assignments whose disjunction is a tautology), each refuted on its own
//! (as a Slurm array task or on a local core), and merged into one certificate.
//!
//! * [`plan`] chooses the cubes with a lookahead decision tree, and reads and
//!   writes the plan.
//! * [`propagate`] is the unit propagation the lookahead uses.
//! * [`run`] refutes one shard, resumably; [`result`] reads and writes the
//!   atomic result record it leaves.
//! * [`status`] tells which shards are done, failed or missing.
//! * [`slurm`] writes the batch script for a job array.
//! * [`merge`] checks every shard result and writes the sharded bundle, optionally
//!   with one composed DRAT trace of the whole formula, reading each trace once.
//! * [`error`] is what can go wrong with any of them.

pub mod error;
pub mod merge;
pub mod plan;
pub mod propagate;
pub mod result;
pub mod run;
pub mod slurm;
pub mod status;

pub use error::ShardError;
pub use plan::{Plan, PlanTree};

/// Layout of a plan directory.
pub const PLAN_FILE: &str = "plan.json";
pub const SHARDS_DIR: &str = "shards";
pub const RESULT_FILE: &str = "result.json";
pub const SHARD_PROOF_FILE: &str = "proof.drat";

/// The directory of shard `index` inside a plan directory.
pub fn shard_dir(plan_dir: &std::path::Path, index: usize) -> std::path::PathBuf {
    plan_dir.join(SHARDS_DIR).join(format!("{index:05}"))
}
