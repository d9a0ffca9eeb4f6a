//! Local search for lower-bound colourings: tabu search and simulated annealing on
//! full colourings, minimising the number of monochromatic forbidden cliques, with
//! delta evaluation ([`state`]), restarts, and one independent run per core.
//!
//! Local search cannot prove that no colouring exists; it finds colourings, and its
//! best near-solutions seed the SAT driver (see [`crate::search::hybrid`]).

pub mod moves;
pub mod search;
pub mod state;

pub use search::{local_search, LocalMethod, LocalOptions, LocalReport};
pub use state::{LocalState, MAX_LOCAL_ORDER};
