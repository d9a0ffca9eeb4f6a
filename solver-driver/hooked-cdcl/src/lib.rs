//! A conflict-driven clause-learning SAT solver whose search can be steered from
//! outside: at every propagation fixpoint it shows the current partial assignment
//! to a [`SearchHook`], which may answer with a clause the assignment falsifies.
//! The solver adds that clause (an *axiom*: justified by the hook's own argument,
//! not by resolution) and learns from it as from a conflict.
//!
//! The rest is the standard design (Marques-Silva & Sakallah 1999; Moskewicz et
//! al., DAC 2001; Eén & Sörensson, SAT 2003): two watched literals with blockers,
//! VSIDS with phase saving, first-UIP learning with recursive minimization, Luby
//! restarts and LBD-ranked deletion of learnt clauses (Audemard & Simon, IJCAI
//! 2009). Every learnt clause and deletion goes to a [`ProofSink`], so a DRAT
//! trace of the run can be checked against the formula plus the hook's axioms.
//!
//! * [`lit`]: variables and literals; [`clauses`]: the clause arena;
//! * [`activity`]: the VSIDS order; [`proof`]: the proof sink;
//! * [`hook`]: what the hook sees and returns; [`solver`]: the search.

pub mod activity;
pub mod clauses;
pub mod hook;
pub mod lit;
pub mod proof;
pub mod solver;

pub use hook::{Assignment, NoHook, SearchHook};
pub use lit::Lit;
pub use proof::{NoProof, ProofSink};
pub use solver::{Outcome, Solver, SolverStats};
