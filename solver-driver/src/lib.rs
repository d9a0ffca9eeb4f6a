//! The ramsift driver: searches for Ramsey colourings with varisat on all cores and
//! writes what it finds in forms a referee can check.
//!
//! * [`formula`] holds an encoding's clauses in memory, shared by all workers.
//! * [`attempt`] runs one solver on a renamed, reordered copy of the formula with a
//!   partial colouring fixed, under a budget; [`interrupt`] is how budgets and the
//!   global stop reach a solver that has no interrupt of its own.
//! * [`seeding`] draws the random partial colourings.
//! * [`portfolio`] runs the workers in parallel and collects the first answer.
//! * [`structured`] searches circulant, Cayley and block-circulant colourings
//!   exactly within each family; [`local`] is tabu search and simulated annealing
//!   on full colourings; [`hybrid`] combines them with the SAT driver (the default
//!   of `ramsift find`).
//! * [`witness`] writes colourings (our text format, graph6) and the JSON summary.
//! * [`refute`] proves unsatisfiability with a DRAT trace and writes the
//!   certificate [`bundle`].
//! * [`bounds`] computes the bounds report (probabilistic, recursive, published,
//!   certified on disk).
//! * [`draw`] writes figures of colourings (SVG, TikZ).
//! * [`enumerate`] lists all colourings up to isomorphism (blocking clauses and
//!   canonical forms).
//! * [`exit_codes`] are the SAT-competition-style exit codes of the binary.

pub mod attempt;
pub mod bounds;
pub mod bundle;
#[cfg(feature = "cadical")]
pub mod cadical_backend;
pub mod draw;
pub mod enumerate;
pub mod exit_codes;
pub mod extension;
pub mod formula;
pub mod graph6;
pub mod hybrid;
pub mod interrupt;
pub mod local;
pub mod memory;
pub mod output_dir;
pub mod portfolio;
pub mod refute;
pub mod repair;
pub mod seeding;
pub mod shard;
pub mod structured;
pub mod verify;
pub mod witness;

/// The solver backend name and version recorded in outputs.
pub const SOLVER_NAME: &str = "varisat 0.2.2";
