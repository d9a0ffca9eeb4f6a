//! The ramsift driver: searches for Ramsey colourings with varisat on all cores and
//! writes what it finds in forms a referee can check.
//!
//! * [`search`] is the SAT search: the search job, one solver attempt, seeds, the
//!   parallel portfolio and the hybrid default of `ramsift find`, extension and
//!   repair of given colourings.
//! * [`structured`] searches circulant, Cayley and block-circulant colourings
//!   exactly within each family; [`local`] is tabu search and simulated annealing
//!   on full colourings.
//! * [`certify`] checks witnesses with the checker's code, refutes with a DRAT
//!   trace and writes certificate bundles.
//! * [`shard`] splits a refutation into cubes, runs them (locally or on Slurm) and
//!   merges them into one certificate.
//! * [`output`] writes colourings (our text format, graph6), summaries and the
//!   `--json` records.
//! * [`bounds`] computes the bounds report (probabilistic, recursive, published,
//!   certified on disk).
//! * [`draw`] writes figures of colourings (SVG, TikZ).
//! * [`enumerate`] lists all colourings up to isomorphism (blocking clauses and
//!   canonical forms).
//! * [`exit_codes`] are the SAT-competition-style exit codes of the binary.

pub mod bounds;
pub mod certify;
pub mod draw;
pub mod enumerate;
pub mod exit_codes;
pub mod local;
pub mod minimality;
pub mod output;
pub mod search;
pub mod shard;
pub mod structured;

/// The solver backend name and version recorded in outputs.
pub const SOLVER_NAME: &str = "varisat 0.2.2";

/// The name of the hooked solver (which every refutation with the minimality
/// scheme runs, single or per shard) in manifests.
pub const HOOKED_SOLVER_NAME: &str = "ramsift-cdcl (our CDCL with a minimality hook)";
