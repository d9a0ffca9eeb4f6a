//! The ramsift checker: the trust anchor of the project.
//!
//! It reads a claim ("this colouring of K_n has no monochromatic forbidden graph")
//! and verifies it with its own small code, never through the encoder, the CNF or
//! the solver. It depends on neither of the other ramsift crates; where it repeats
//! their logic (the forbidden-graph list, the graph6 format) it does so on purpose.
//!
//! * [`claim`] reads the forbidden-graph list of a claim (`4,4`, `3,3,3`, `C4,K4`).
//! * [`colouring_file`] and [`graph6`] read the two witness formats.
//! * [`cliques`] searches a colour class for a clique by direct enumeration;
//!   [`subgraphs`] searches it for a copy of any other forbidden graph.
//! * [`witness`] puts these together into a verdict.
//! * [`cnf`], [`drat_parse`] and [`lrat`] read formulas and refutation proofs;
//!   [`drat_check`] checks DRAT backwards (and can emit LRAT), [`lrat`] checks LRAT
//!   forwards; [`input`] decompresses gzip transparently.
//! * [`bundle`] checks a certificate bundle, regenerating its formula with
//!   [`regenerate`], the checker's own clause generator.

pub mod bundle;
pub mod claim;
pub mod cliques;
pub mod cnf;
pub mod colouring_file;
pub mod drat_check;
pub mod drat_parse;
pub mod graph6;
pub mod input;
pub mod input_error;
pub mod lrat;
pub mod matrix;
pub mod regenerate;
pub mod subgraphs;
pub mod witness;

pub use claim::{Claim, ClaimGraph};
pub use input_error::InputError;
pub use matrix::ColourMatrix;
pub use witness::{check_colouring, Verdict};
