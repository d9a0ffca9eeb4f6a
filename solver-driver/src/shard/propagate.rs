//! Unit propagation over a [`Formula`] with occurrence lists, for the lookahead of
//! the shard planner (small and simple: it runs a few thousand times per plan).

use crate::search::formula::Formula;

/// Occurrence lists of a formula.
pub struct Propagator<'a> {
    formula: &'a Formula,
    occurs: Vec<Vec<u32>>,
}

/// The result of propagating a set of literals.
pub enum Propagation {
    Conflict,
    /// Literals assigned (including the assumptions), as DIMACS literals.
    Assigned(Vec<i32>),
}

fn slot(lit: i32) -> usize {
    lit.unsigned_abs() as usize * 2 + (lit < 0) as usize
}

impl<'a> Propagator<'a> {
    pub fn new(formula: &'a Formula) -> Self {
        let mut occurs = vec![Vec::new(); 2 * formula.variable_count() + 2];
        for (i, clause) in formula.clauses().enumerate() {
            for &l in clause {
                occurs[slot(l)].push(i as u32);
            }
        }
        Propagator { formula, occurs }
    }

    /// Propagates `assumptions` with all unit clauses of the formula.
    pub fn propagate(&self, assumptions: &[i32]) -> Propagation {
        let mut value = vec![0i8; self.formula.variable_count() + 1];
        let val = |value: &[i8], l: i32| {
            let v = value[l.unsigned_abs() as usize];
            if l > 0 {
                v
            } else {
                -v
            }
        };
        let mut trail: Vec<i32> = Vec::new();
        let assign = |value: &mut Vec<i8>, trail: &mut Vec<i32>, l: i32| -> bool {
            match val(value, l) {
                1 => true,
                -1 => false,
                _ => {
                    value[l.unsigned_abs() as usize] = if l > 0 { 1 } else { -1 };
                    trail.push(l);
                    true
                }
            }
        };
        for &l in assumptions {
            if !assign(&mut value, &mut trail, l) {
                return Propagation::Conflict;
            }
        }
        for clause in self.formula.clauses() {
            if clause.len() == 1 && !assign(&mut value, &mut trail, clause[0]) {
                return Propagation::Conflict;
            }
        }
        let mut head = 0;
        while head < trail.len() {
            let falsified = -trail[head];
            head += 1;
            for &id in &self.occurs[slot(falsified)] {
                let mut open = 0;
                let mut last = 0;
                let mut satisfied = false;
                for &l in self.formula.clause(id as usize) {
                    match val(&value, l) {
                        1 => {
                            satisfied = true;
                            break;
                        }
                        0 => {
                            open += 1;
                            last = l;
                        }
                        _ => {}
                    }
                }
                if satisfied {
                    continue;
                }
                match open {
                    0 => return Propagation::Conflict,
                    1 => {
                        assign(&mut value, &mut trail, last);
                    }
                    _ => {}
                }
            }
        }
        Propagation::Assigned(trail)
    }
}
