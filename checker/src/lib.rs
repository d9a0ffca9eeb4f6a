//! The ramsift checker: the trust anchor of the project.
//!
//! It reads a claim ("this colouring of K_n has no monochromatic forbidden graph")
//! and verifies it with its own small code, never through the encoder, the CNF or
//! the solver. It depends on neither of the other ramsift crates; where it repeats
//! their logic (the forbidden-graph list, the graph6 format) it does so on purpose.
//!
//! * [`claim`] reads the forbidden-graph list of a claim (`4,4`, `3,3,3`, `C4,K4`).
//! * [`colouring_file`] and [`graph6`] read the two witness formats.
//! * [`subgraphs`] searches a colour class for a copy of its forbidden graph
//!   (a clique or any other) by direct backtracking.
//! * [`witness`] puts these together into a verdict.
//! * [`cnf`], [`drat_parse`] and [`lrat`] read formulas and refutation proofs;
//!   [`drat_check`] checks DRAT backwards (and can emit LRAT), [`lrat`] checks LRAT
//!   forwards; [`input`] decompresses gzip transparently.
//! * [`bundle`] checks a certificate bundle: [`manifest`] reads what it claims,
//!   [`regenerate`] (the checker's own clause generator) rebuilds its formula,
//!   [`shards`] checks a sharded proof's coverage, [`premises`] the bundles that
//!   certify its premises. [`dense_vars`] keeps the proof checkers' memory tied to
//!   the variables actually used, whatever numbers a file writes.
//!
//! Every input is treated as possibly crafted: only regular files are read
//! ([`input`]), gzip expands only to a bounded multiple, literals stay within
//! ±(2^31−1), and premise bundles nest boundedly and without cycles.

#![forbid(unsafe_code)]

pub mod bundle;
pub mod claim;
mod clause_index;
pub mod cnf;
pub mod colouring_file;
pub mod dense_vars;
pub mod drat_check;
pub mod drat_parse;
pub mod graph6;
pub mod input;
pub mod input_error;
pub mod lrat;
pub mod manifest;
pub mod matrix;
pub mod minimality;
pub mod premises;
pub mod regenerate;
pub mod shards;
pub mod subgraphs;
mod watch_lists;
pub mod witness;

pub use claim::{Claim, ClaimGraph};
pub use input_error::InputError;
pub use matrix::ColourMatrix;
pub use witness::{check_colouring, Verdict};
