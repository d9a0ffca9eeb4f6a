//! What runs write: colouring files ([`witness`]), graph6 ([`graph6`]), the JSON
//! summary of a `find` run ([`summary`]), the `--json` records of every command
//! ([`records`]), output directories that are never left half-written ([`dir`]), and every
//! JSON file ([`json_file`]).

pub mod dir;
pub mod graph6;
pub mod json_file;
pub mod records;
pub mod summary;
pub mod witness;
