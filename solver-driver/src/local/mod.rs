//! Local search for lower-bound colourings: tabu search and simulated annealing on
//! full colourings, minimising the number of monochromatic forbidden copies (of
//! cliques or of any other small graph, counted by [`pattern`]), with delta
//! evaluation ([`state`]), restarts, and one independent run per core.
//!
//! With a prescribed automorphism ([`automorphism`]) the moves recolour whole edge
//! orbits, so only colourings with that symmetry are visited.
//!
//! Local search cannot prove that no colouring exists; it finds colourings, and its
//! best near-solutions seed the SAT driver (see [`crate::search::hybrid`]).

pub mod automorphism;
pub mod moves;
pub mod pattern;
pub mod schedule;
pub mod search;
pub mod state;
pub mod weighting;

pub use automorphism::{EdgeOrbitMoves, VertexCycles};
pub use pattern::Pattern;
pub use search::{local_search, LocalMethod, LocalOptions, LocalReport};
pub use state::{LocalState, MAX_LOCAL_ORDER};
