//! Certificates: what makes an answer checkable without trusting the search.
//!
//! * [`witness_check`] runs the checker's code on every colouring before it is
//!   reported or written.
//! * [`refute`] proves unsatisfiability with a DRAT trace.
//! * [`bundle`] builds the one manifest every certificate bundle carries and writes
//!   the bundle; [`referee_guide`] writes its REFEREE.txt.
//! * [`drat_write`] writes binary DRAT steps.
//! * [`provenance`] records where and how a certificate or witness was made.

pub mod bundle;
pub mod drat_write;
pub mod provenance;
pub mod referee_guide;
pub mod refute;
pub mod witness_check;
