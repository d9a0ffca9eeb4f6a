//! Solver backends besides varisat (which [`super::attempt`] drives). The default
//! build is pure Rust; a C++ backend is compiled only with its feature.

#[cfg(feature = "cadical")]
pub mod cadical;
