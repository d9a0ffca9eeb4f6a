//! The ramsift encoder: turns a Ramsey question ("is there an r-colouring of the
//! edges of K_n with no monochromatic copy of the forbidden graph of each colour?")
//! into a CNF formula whose models are exactly such colourings.
//!
//! * [`spec`] holds the problem specification ([`RamseySpec`], [`Instance`]);
//!   [`graphs`] the small forbidden graphs other than cliques.
//! * [`edges`] numbers the edges of K_n; [`variables`] maps edges and colours to
//!   CNF variables and decodes models back into a [`Colouring`].
//! * [`clauses`] generates the clauses as a stream, so that large instances never
//!   have to be held in memory.
//! * [`symmetry`] adds named, documented symmetry-breaking constraints.
//! * [`dimacs`] writes the stream as DIMACS CNF, with a self-describing header.
//! * [`published`] is the one table of published Ramsey values and ranges.

pub mod atomic_file;
pub mod clauses;
pub mod colouring;
pub mod combinations;
pub mod dimacs;
pub mod edges;
pub mod graphs;
pub mod published;
pub mod spec;
pub mod symmetry;
pub mod variables;

pub use clauses::{EncodingLimits, RamseyEncoding};
pub use colouring::Colouring;
pub use graphs::SmallGraph;
pub use spec::{Forbidden, Instance, NamedGraph, RamseySpec, SpecError};
pub use symmetry::{Scheme, SymmetryChoice, SymmetrySet};
pub use variables::VariableMap;

/// The version of this encoder, recorded in every file it writes.
pub const VERSION: &str = env!("CARGO_PKG_VERSION");
