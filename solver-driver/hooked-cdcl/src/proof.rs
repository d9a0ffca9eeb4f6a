//! Where the solver reports the clauses it learns and deletes, in DIMACS
//! numbering, in the order a DRAT trace lists them.

/// Receives the solver's proof steps.
pub trait ProofSink {
    fn add(&mut self, clause: &[i32]);
    fn delete(&mut self, clause: &[i32]);
}

/// Discards every step.
pub struct NoProof;

impl ProofSink for NoProof {
    fn add(&mut self, _: &[i32]) {}
    fn delete(&mut self, _: &[i32]) {}
}

impl<S: ProofSink + ?Sized> ProofSink for &mut S {
    fn add(&mut self, clause: &[i32]) {
        (**self).add(clause)
    }
    fn delete(&mut self, clause: &[i32]) {
        (**self).delete(clause)
    }
}
