//! Cross-crate tests of ramsift and the published values they check against.
//!
//! [`published`] holds the values with their sources; [`constructions`] builds the
//! classical extremal colourings from their definitions; [`binaries`] finds the
//! command-line programs for end-to-end tests; [`hostile_inputs`] crafts costly
//! checker inputs for the hostile-checker tests and the benchmarks. The tests themselves live
//! in `tests/tests/`.

pub mod binaries;
pub mod bundle_files;
pub mod constructions;
pub mod hostile_inputs;
pub mod published;
pub mod reference_drat;
