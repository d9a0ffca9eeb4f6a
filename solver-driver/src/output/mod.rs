//! What runs write: colouring files ([`witness`]), graph6 ([`graph6`]), the JSON
//! summary of a `find` run ([`summary`]), the `--json` records of every command
//! ([`records`]), and output directories that are never left half-written ([`dir`]).

pub mod dir;
pub mod graph6;
pub mod records;
pub mod summary;
pub mod witness;
