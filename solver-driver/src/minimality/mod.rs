//! Symmetry breaking during the search by lex-minimality checks (the `minimality`
//! scheme; Kirchweger & Szeider, "SAT modulo symmetries for graph generation",
//! CP 2021), our own implementation.
//!
//! The colour matrix is read edge by edge in index order ({0,1}, {0,2}, {1,2},
//! {0,3}, …), colour 1 smallest. A relabelling is a vertex map `p` (position i of
//! the relabelled matrix holds vertex `p[i]`) with a permutation `s` of colours
//! that have equal forbidden graphs: `(pA)[i][j] = s(A[p[i]][p[j]])`. A colouring
//! is *minimal* when no relabelling makes it smaller; every class has exactly one
//! minimal member.
//!
//! * [`matrix`] reads the solver's partial assignment as a matrix of known colours;
//! * [`search`] looks for a relabelling that makes every completion smaller: with
//!   a budget on partial matrices, exhaustively on complete ones;
//! * [`hook`] runs the search at the solver's fixpoints and turns a relabelling
//!   into a clause; [`certificate`] writes each clause with its relabelling;
//! * [`solve`] runs the hooked solver on an encoding.

pub mod certificate;
pub mod hook;
pub mod matrix;
pub mod search;
pub mod solve;
