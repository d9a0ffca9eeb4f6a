//! Cross-crate tests of ramsift and the published values they check against.
//!
//! [`published`] holds the values with their sources; [`constructions`] builds the
//! classical extremal colourings from their definitions; [`binaries`] finds the
//! command-line programs for end-to-end tests. The tests themselves live
//! in `tests/tests/`.

pub mod binaries;
pub mod bundle_files;
pub mod constructions;
pub mod published;
pub mod reference_drat;
