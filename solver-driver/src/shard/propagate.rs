//! Unit propagation for the shard planner's lookahead, with two watched literals
//! and a trail, so that a probe (assume a literal, propagate, undo) costs only
//! the implications it adds. Backtracking leaves the watches as they are (the
//! usual invariant of watched literals: a clause's watches are valid under every
//! prefix of the trail). Each watch entry keeps a *blocker*, another literal of
//! its clause: when the blocker is true the clause is skipped without being read,
//! which spares most memory traffic on formulas of millions of long clauses.

use crate::search::formula::Formula;

/// A unit propagation engine over a formula's clauses.
pub struct Propagator {
    /// Clauses of two or more literals, back to back; `starts[i]..starts[i+1]` is
    /// clause i, its first two literals watched.
    literals: Vec<i32>,
    starts: Vec<usize>,
    /// For each literal slot, the clauses watching that literal, each with its blocker.
    watches: Vec<Vec<(u32, i32)>>,
    /// The formula's unit clauses, and whether it has an empty clause.
    units: Vec<i32>,
    has_empty: bool,
    /// 1 true, -1 false, 0 open, by variable.
    value: Vec<i8>,
    trail: Vec<i32>,
    /// Trail entries already propagated.
    head: usize,
    /// Variables up to this number are counted by [`Propagator::assigned_counted`].
    counted_variables: usize,
    assigned_counted: usize,
}

fn slot(lit: i32) -> usize {
    lit.unsigned_abs() as usize * 2 + (lit < 0) as usize
}

/// A propagation reached a conflict.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Conflict;

impl Propagator {
    /// Watches every clause of `formula`; assignments to variables 1..=`counted`
    /// are counted (the colour variables, for the planner's measure).
    pub fn new(formula: &Formula, counted: usize) -> Self {
        let variables = formula.variable_count();
        let mut propagator = Propagator {
            literals: Vec::new(),
            starts: vec![0],
            watches: vec![Vec::new(); 2 * variables + 2],
            units: Vec::new(),
            has_empty: false,
            value: vec![0; variables + 1],
            trail: Vec::new(),
            head: 0,
            counted_variables: counted,
            assigned_counted: 0,
        };
        for clause in formula.clauses() {
            match clause {
                [] => propagator.has_empty = true,
                [unit] => propagator.units.push(*unit),
                _ => {
                    let id = propagator.starts.len() as u32 - 1;
                    propagator.watches[slot(clause[0])].push((id, clause[1]));
                    propagator.watches[slot(clause[1])].push((id, clause[0]));
                    propagator.literals.extend_from_slice(clause);
                    propagator.starts.push(propagator.literals.len());
                }
            }
        }
        propagator
    }

    fn value_of(&self, lit: i32) -> i8 {
        let v = self.value[lit.unsigned_abs() as usize];
        if lit > 0 {
            v
        } else {
            -v
        }
    }

    /// The trail's length, to undo to later.
    pub fn mark(&self) -> usize {
        self.trail.len()
    }

    /// How many counted variables are assigned.
    pub fn assigned_counted(&self) -> usize {
        self.assigned_counted
    }

    /// Whether `lit`'s variable is assigned.
    pub fn is_assigned(&self, lit: i32) -> bool {
        self.value_of(lit) != 0
    }

    /// Undoes every assignment after `mark`.
    pub fn undo_to(&mut self, mark: usize) {
        while self.trail.len() > mark {
            let lit = self.trail.pop().expect("longer than mark");
            let var = lit.unsigned_abs() as usize;
            self.value[var] = 0;
            if var <= self.counted_variables {
                self.assigned_counted -= 1;
            }
        }
        self.head = self.head.min(mark);
    }

    /// Clears the trail and assigns the formula's unit clauses.
    pub fn reset(&mut self) -> Result<(), Conflict> {
        self.undo_to(0);
        if self.has_empty {
            return Err(Conflict);
        }
        for unit in self.units.clone() {
            self.enqueue(unit)?;
        }
        self.propagate()
    }

    fn enqueue(&mut self, lit: i32) -> Result<(), Conflict> {
        match self.value_of(lit) {
            1 => Ok(()),
            -1 => Err(Conflict),
            _ => {
                let var = lit.unsigned_abs() as usize;
                self.value[var] = if lit > 0 { 1 } else { -1 };
                if var <= self.counted_variables {
                    self.assigned_counted += 1;
                }
                self.trail.push(lit);
                Ok(())
            }
        }
    }

    /// Assumes `lit` and propagates. On a conflict the assignments stay until the
    /// caller undoes them.
    pub fn assume(&mut self, lit: i32) -> Result<(), Conflict> {
        self.enqueue(lit)?;
        self.propagate()
    }

    /// Assumes every literal in turn (stopping at a conflict).
    pub fn assume_all(&mut self, lits: &[i32]) -> Result<(), Conflict> {
        lits.iter().try_for_each(|&l| self.assume(l))
    }

    fn propagate(&mut self) -> Result<(), Conflict> {
        while self.head < self.trail.len() {
            let falsified = -self.trail[self.head];
            self.head += 1;
            let mut list = std::mem::take(&mut self.watches[slot(falsified)]);
            // A clause leaving this list moves to a literal that is not false,
            // never back to `falsified`, so the list is put back as it is.
            let result = self.visit(falsified, &mut list);
            self.watches[slot(falsified)] = list;
            result?;
        }
        Ok(())
    }

    /// Visits the clauses watching `falsified` (their list taken out as `list`):
    /// each is skipped (its blocker or other watch is true), finds another watch,
    /// becomes unit, or is a conflict.
    fn visit(&mut self, falsified: i32, list: &mut Vec<(u32, i32)>) -> Result<(), Conflict> {
        let mut i = 0;
        while i < list.len() {
            let (id, blocker) = list[i];
            if self.value_of(blocker) == 1 {
                i += 1;
                continue;
            }
            let (start, end) = (self.starts[id as usize], self.starts[id as usize + 1]);
            if self.literals[start] == falsified {
                self.literals.swap(start, start + 1);
            }
            let other = self.literals[start];
            if self.value_of(other) == 1 {
                list[i].1 = other;
                i += 1;
                continue;
            }
            let replacement = (start + 2..end).find(|&k| self.value_of(self.literals[k]) != -1);
            if let Some(k) = replacement {
                self.literals.swap(start + 1, k);
                self.watches[slot(self.literals[start + 1])].push((id, other));
                list.swap_remove(i);
                continue;
            }
            i += 1;
            self.enqueue(other)?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;
    use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec};

    /// Plain propagation to a fixpoint by scanning every clause: the reference.
    fn reference(clauses: &[Vec<i32>], variables: usize, assumptions: &[i32]) -> Option<Vec<i8>> {
        let mut value = vec![0i8; variables + 1];
        let val = |value: &[i8], l: i32| value[l.unsigned_abs() as usize] * l.signum() as i8;
        for &l in assumptions {
            match val(&value, l) {
                -1 => return None,
                _ => value[l.unsigned_abs() as usize] = l.signum() as i8,
            }
        }
        loop {
            let mut changed = false;
            for c in clauses {
                if c.iter().any(|&l| val(&value, l) == 1) {
                    continue;
                }
                let open: Vec<i32> = c.iter().copied().filter(|&l| val(&value, l) == 0).collect();
                match open.as_slice() {
                    [] => return None,
                    [l] => {
                        value[l.unsigned_abs() as usize] = l.signum() as i8;
                        changed = true;
                    }
                    _ => {}
                }
            }
            if !changed {
                return Some(value);
            }
        }
    }

    fn formula() -> Formula {
        let instance = Instance::new(RamseySpec::cliques(&[3, 4]).unwrap(), 7).unwrap();
        Formula::from_encoding(&RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap())
    }

    proptest! {
        /// After any sequence of probes and undos, propagating a set of literals
        /// gives what the plain fixpoint gives (conflict, or the same values).
        #[test]
        fn agrees_with_the_plain_fixpoint(
            probes in proptest::collection::vec(proptest::collection::vec((1i32..=21, any::<bool>()), 1..6), 1..8)
        ) {
            let f = formula();
            let clauses: Vec<Vec<i32>> = f.clauses().map(<[i32]>::to_vec).collect();
            let mut p = Propagator::new(&f, f.variable_count());
            p.reset().unwrap();
            for probe in probes {
                let lits: Vec<i32> = probe.iter().map(|&(v, s)| if s { v } else { -v }).collect();
                let mark = p.mark();
                let ours = p.assume_all(&lits);
                let expected = reference(&clauses, f.variable_count(), &lits);
                match (ours, expected) {
                    (Err(Conflict), None) => {}
                    (Ok(()), Some(values)) => {
                        prop_assert_eq!(&p.value[1..], &values[1..]);
                        prop_assert_eq!(p.assigned_counted(), values[1..].iter().filter(|&&x| x != 0).count());
                    }
                    (ours, expected) => prop_assert!(false, "ours {:?}, reference conflict {}", ours, expected.is_none()),
                }
                p.undo_to(mark);
            }
        }
    }
}
