//! The bounds report: where a Ramsey number R(k_1, …, k_r) stands between the
//! theoretical bounds, the published range, and what bundles on disk certify.
//!
//! * [`probabilistic`]: Erdős 1947, the deletion (alteration) method, and Spencer's
//!   1975 local-lemma bound, decided exactly with big integers.
//! * [`recursion`]: upper bounds from R(s,t) ≤ R(s−1,t) + R(s,t−1) (one less when
//!   both are even) and its multicolour form, and Erdős–Szekeres.
//! * the published values and ranges come from the encoder's one table
//!   (`ramsift_encoder::published`), which degree bounds also use.
//! * [`certified`]: bundles and witnesses found on disk, checked by the checker.

pub mod certified;
pub mod probabilistic;
pub mod recursion;
