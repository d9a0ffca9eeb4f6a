//! The search hook: what it sees (the partial assignment) and what it may answer.

/// A view of the solver's current partial assignment.
#[derive(Clone, Copy)]
pub struct Assignment<'a> {
    /// Per 0-based variable: 1 true, -1 false, 0 unassigned.
    pub(crate) values: &'a [i8],
}

impl<'a> Assignment<'a> {
    /// Builds a view from per-variable values (1 true, -1 false, 0 unassigned);
    /// for hooks' own tests.
    pub fn from_values(values: &'a [i8]) -> Self {
        Assignment { values }
    }

    /// The value of 1-based variable `var`, None while unassigned.
    #[inline]
    pub fn value(&self, var: usize) -> Option<bool> {
        match self.values[var - 1] {
            1 => Some(true),
            -1 => Some(false),
            _ => None,
        }
    }

    /// The value of a DIMACS literal, None while unassigned.
    #[inline]
    pub fn literal(&self, lit: i32) -> Option<bool> {
        self.value(lit.unsigned_abs() as usize)
            .map(|v| v == (lit > 0))
    }

    pub fn variables(&self) -> usize {
        self.values.len()
    }
}

/// Called by the solver at every propagation fixpoint without conflict.
pub trait SearchHook {
    /// `complete` says every variable is assigned. Return a clause (DIMACS
    /// literals, every one false under `assignment`) to add it as an axiom and
    /// learn from it; None lets the search go on (and, when complete, makes the
    /// assignment the model).
    fn at_fixpoint(&mut self, assignment: Assignment<'_>, complete: bool) -> Option<Vec<i32>>;
}

/// A hook that never answers: plain CDCL.
pub struct NoHook;

impl SearchHook for NoHook {
    fn at_fixpoint(&mut self, _: Assignment<'_>, _: bool) -> Option<Vec<i32>> {
        None
    }
}
