//! The SAT search for colourings: one [`job::SearchJob`] carries the instance, its
//! formula, the options and the progress counters, and every search takes it.
//!
//! * [`job`] is the search job; [`formula`] holds its clauses in memory, shared by
//!   all workers; [`memory`] estimates whether a formula fits before it is built.
//! * [`attempt`] runs one solver on a renamed, reordered copy of the formula with a
//!   partial colouring fixed, under a budget; [`interrupt`] is how budgets and the
//!   global stop reach a solver that has no interrupt of its own.
//! * [`seeding`] makes every seed (random partial colourings, near-solutions,
//!   circulant neighbours, given colourings) and runs seeded attempts.
//! * [`first_answer`] collects the first answer of parallel workers, whatever the
//!   backend; [`portfolio`] is the parallel SAT search; [`hybrid`] combines
//!   structured families, local search and SAT (the default of `ramsift find`).
//! * [`extension`] and [`repair`] solve for part of a given colouring;
//!   [`anchored`] searches the whole formula starting from a given colouring.
//! * [`backends`] holds the optional second solver.

pub mod anchored;
pub mod attempt;
pub mod backends;
pub mod extension;
pub mod first_answer;
pub mod formula;
pub mod hybrid;
pub mod interrupt;
pub mod job;
pub mod loosening;
pub mod memory;
pub mod portfolio;
pub mod repair;
pub mod seeding;
