//! The subcommands of `ramsift-check`: each reads its inputs with the library,
//! and returns a [`verdict::Report`] that `main` prints.

pub mod bundle;
pub mod colouring;
pub mod progress;
pub mod proofs;
pub mod verdict;
