//! The ramsift checker: the trust anchor of the project.
//!
//! It reads a claim ("this colouring of K_n has no monochromatic forbidden clique")
//! and verifies it with its own small code, never through the encoder, the CNF or
//! the solver. It depends on neither of the other ramsift crates; where it repeats
//! their logic (the forbidden-graph list, the graph6 format) it does so on purpose.
//!
//! * [`claim`] reads the forbidden-graph list of a claim (`4,4`, `3,3,3`).
//! * [`colouring_file`] and [`graph6`] read the two witness formats.
//! * [`cliques`] searches a colour class for a clique by direct enumeration.
//! * [`witness`] puts these together into a verdict.

pub mod claim;
pub mod cliques;
pub mod colouring_file;
pub mod graph6;
pub mod input_error;
pub mod matrix;
pub mod witness;

pub use claim::Claim;
pub use input_error::InputError;
pub use matrix::ColourMatrix;
pub use witness::{check_colouring, Verdict};
