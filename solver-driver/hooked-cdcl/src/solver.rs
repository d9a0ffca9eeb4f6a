//! The search loop: propagation, conflict analysis, the hook's axioms, restarts
//! and deletion of learnt clauses.

use std::time::Instant;

use crate::activity::Activity;
use crate::clauses::{ClauseArena, ClauseRef};
use crate::hook::{Assignment, SearchHook};
use crate::lit::Lit;
use crate::proof::{NoProof, ProofSink};

/// How a call to [`Solver::solve`] ended.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Outcome {
    Satisfiable,
    Unsatisfiable,
    /// The stop flag was raised or the deadline passed.
    Interrupted,
}

/// Counters of one solver's work, over all its calls.
#[derive(Clone, Debug, Default)]
pub struct SolverStats {
    pub conflicts: u64,
    pub decisions: u64,
    pub propagations: u64,
    pub restarts: u64,
    /// Clauses the hook added.
    pub axioms: u64,
    pub hook_calls: u64,
    pub deleted: u64,
}

#[derive(Clone, Copy, Debug)]
struct Watch {
    cref: ClauseRef,
    blocker: Lit,
}

const NO_REASON: ClauseRef = ClauseRef::MAX;
const FIRST_REDUCE: u64 = 2_000;
const REDUCE_GROWTH: u64 = 300;
const RESTART_UNIT: u64 = 100;
const VAR_DECAY: f64 = 0.95;

/// What adding an axiom led to.
enum AxiomEffect {
    Asserted,
    Conflict(ClauseRef),
    Unsatisfiable,
}

/// A CDCL solver; see the crate documentation.
pub struct Solver<'p> {
    arena: ClauseArena,
    /// `watches[l]`: clauses watching literal l, visited when l becomes false.
    watches: Vec<Vec<Watch>>,
    values: Vec<i8>,
    level: Vec<u32>,
    reason: Vec<ClauseRef>,
    /// Saved phases: the polarity (negated or not) of each variable's last value.
    phase: Vec<bool>,
    /// Phases set by [`Solver::anchor`], restored at every restart.
    anchor: Option<Vec<bool>>,
    trail: Vec<Lit>,
    trail_limits: Vec<usize>,
    propagated: usize,
    activity: Activity,
    seen: Vec<bool>,
    level_stamp: Vec<u64>,
    stamp: u64,
    learnts: Vec<ClauseRef>,
    unsatisfiable: bool,
    next_reduce: u64,
    reduce_step: u64,
    proof: Box<dyn ProofSink + 'p>,
    stats: SolverStats,
}

impl Default for Solver<'_> {
    fn default() -> Self {
        Solver::new()
    }
}

impl<'p> Solver<'p> {
    pub fn new() -> Self {
        Solver {
            arena: ClauseArena::default(),
            watches: Vec::new(),
            values: Vec::new(),
            level: Vec::new(),
            reason: Vec::new(),
            phase: Vec::new(),
            anchor: None,
            trail: Vec::new(),
            trail_limits: Vec::new(),
            propagated: 0,
            activity: Activity::new(),
            seen: Vec::new(),
            level_stamp: vec![0],
            stamp: 0,
            learnts: Vec::new(),
            unsatisfiable: false,
            next_reduce: FIRST_REDUCE,
            reduce_step: FIRST_REDUCE,
            proof: Box::new(NoProof),
            stats: SolverStats::default(),
        }
    }

    /// Sends every later learnt clause and deletion to `proof`.
    pub fn set_proof(&mut self, proof: Box<dyn ProofSink + 'p>) {
        self.proof = proof;
    }

    pub fn stats(&self) -> &SolverStats {
        &self.stats
    }

    pub fn variables(&self) -> usize {
        self.values.len()
    }

    /// Declares variables 1..=count (DIMACS numbering).
    pub fn reserve_variables(&mut self, count: usize) {
        while self.values.len() < count {
            self.values.push(0);
            self.level.push(0);
            self.reason.push(NO_REASON);
            self.phase.push(true);
            self.seen.push(false);
            self.watches.push(Vec::new());
            self.watches.push(Vec::new());
        }
        self.activity.grow(count);
    }

    #[inline]
    fn value(&self, lit: Lit) -> i8 {
        literal_value(&self.values, lit)
    }

    fn decision_level(&self) -> u32 {
        self.trail_limits.len() as u32
    }

    /// Anchors the search at a (partial) assignment, given as DIMACS literals:
    /// each literal's value is the one first tried for its variable, and every
    /// restart sets the saved phases back to them, so the search keeps returning
    /// to this assignment (a near-solution, say) and explores around it. The
    /// search stays complete: phases choose an order, never a clause.
    pub fn anchor(&mut self, literals: &[i32]) {
        let mut anchored = self.phase.clone();
        for &lit in literals {
            let var = lit.unsigned_abs() as usize;
            assert!(
                (1..=self.variables()).contains(&var),
                "variable {var} not reserved"
            );
            anchored[var - 1] = lit < 0;
        }
        self.phase.copy_from_slice(&anchored);
        self.anchor = Some(anchored);
    }

    fn restore_anchor(&mut self) {
        if let Some(anchor) = &self.anchor {
            self.phase[..anchor.len()].copy_from_slice(anchor);
        }
    }

    /// The value of 1-based `var` in the last model (or the current assignment).
    pub fn model_value(&self, var: usize) -> Option<bool> {
        Assignment {
            values: &self.values,
        }
        .value(var)
    }

    /// Adds an original clause (not logged in the proof). Returns false once the
    /// formula is known to be unsatisfiable.
    pub fn add_clause(&mut self, dimacs: &[i32]) -> bool {
        self.backtrack(0);
        if self.unsatisfiable {
            return false;
        }
        let max_var = dimacs
            .iter()
            .map(|l| l.unsigned_abs() as usize)
            .max()
            .unwrap_or(0);
        self.reserve_variables(max_var);
        let mut lits = sorted_literals(dimacs);
        if lits.windows(2).any(|w| w[0] == !w[1]) || lits.iter().any(|&l| self.value(l) == 1) {
            return true;
        }
        lits.sort_by_key(|&l| self.value(l) == -1);
        let open = lits.iter().take_while(|&&l| self.value(l) != -1).count();
        match (open, lits.len()) {
            (0, _) => {
                self.proof.add(&[]);
                self.unsatisfiable = true;
            }
            (1, 1) => self.enqueue(lits[0], NO_REASON),
            (open, _) => {
                let cref = self.arena.add(&lits, false, 0);
                self.attach(cref);
                if open == 1 {
                    self.enqueue(lits[0], cref);
                }
            }
        }
        !self.unsatisfiable
    }

    fn attach(&mut self, cref: ClauseRef) {
        let lits = self.arena.lits(cref);
        let (a, b) = (lits[0], lits[1]);
        self.watches[a.index()].push(Watch { cref, blocker: b });
        self.watches[b.index()].push(Watch { cref, blocker: a });
    }

    #[inline]
    fn enqueue(&mut self, lit: Lit, reason: ClauseRef) {
        let var = lit.var();
        self.values[var] = if lit.is_negated() { -1 } else { 1 };
        self.level[var] = self.decision_level();
        self.reason[var] = reason;
        self.trail.push(lit);
    }

    fn backtrack(&mut self, to: u32) {
        if self.decision_level() <= to {
            return;
        }
        let keep = self.trail_limits[to as usize];
        for i in (keep..self.trail.len()).rev() {
            let lit = self.trail[i];
            let var = lit.var();
            self.values[var] = 0;
            self.reason[var] = NO_REASON;
            self.phase[var] = lit.is_negated();
            self.activity.insert(var);
        }
        self.trail.truncate(keep);
        self.trail_limits.truncate(to as usize);
        self.propagated = keep;
    }

    /// Unit propagation to a fixpoint; returns a falsified clause on conflict.
    fn propagate(&mut self) -> Option<ClauseRef> {
        while self.propagated < self.trail.len() {
            let false_lit = !self.trail[self.propagated];
            self.propagated += 1;
            self.stats.propagations += 1;
            let mut watches = std::mem::take(&mut self.watches[false_lit.index()]);
            let (mut i, mut j) = (0, 0);
            let mut conflict = None;
            while i < watches.len() {
                let watch = watches[i];
                i += 1;
                if self.value(watch.blocker) == 1 {
                    watches[j] = watch;
                    j += 1;
                    continue;
                }
                let cref = watch.cref;
                let lits = self.arena.lits_mut(cref);
                if lits[0] == false_lit {
                    lits.swap(0, 1);
                }
                let first = lits[0];
                let first_value = literal_value(&self.values, first);
                if first != watch.blocker && first_value == 1 {
                    watches[j] = Watch {
                        cref,
                        blocker: first,
                    };
                    j += 1;
                    continue;
                }
                let mut moved = false;
                for k in 2..lits.len() {
                    let l = lits[k];
                    if literal_value(&self.values, l) != -1 {
                        lits.swap(1, k);
                        self.watches[l.index()].push(Watch {
                            cref,
                            blocker: first,
                        });
                        moved = true;
                        break;
                    }
                }
                if moved {
                    continue;
                }
                watches[j] = Watch {
                    cref,
                    blocker: first,
                };
                j += 1;
                if first_value == -1 {
                    while i < watches.len() {
                        watches[j] = watches[i];
                        i += 1;
                        j += 1;
                    }
                    conflict = Some(cref);
                } else {
                    self.enqueue(first, cref);
                }
            }
            watches.truncate(j);
            self.watches[false_lit.index()] = watches;
            if conflict.is_some() {
                self.propagated = self.trail.len();
                return conflict;
            }
        }
        None
    }

    fn abstract_level(&self, var: usize) -> u32 {
        1 << (self.level[var] & 31)
    }

    /// First-UIP analysis of a falsified clause with a literal at the current
    /// level: the learnt clause (asserting literal first, a literal of the
    /// backtrack level second), the backtrack level and the clause's LBD.
    fn analyze(&mut self, conflict: ClauseRef) -> (Vec<Lit>, u32, u32) {
        let current = self.decision_level();
        let mut learnt = vec![Lit(0)];
        let mut pending = 0usize;
        let mut index = self.trail.len();
        let mut clause = conflict;
        let mut asserting = None;
        loop {
            let skip = usize::from(asserting.is_some());
            for k in skip..self.arena.len(clause) {
                let q = self.arena.lits(clause)[k];
                let var = q.var();
                if !self.seen[var] && self.level[var] > 0 {
                    self.seen[var] = true;
                    self.activity.bump(var);
                    if self.level[var] >= current {
                        pending += 1;
                    } else {
                        learnt.push(q);
                    }
                }
            }
            loop {
                index -= 1;
                if self.seen[self.trail[index].var()] {
                    break;
                }
            }
            let p = self.trail[index];
            self.seen[p.var()] = false;
            pending -= 1;
            asserting = Some(p);
            if pending == 0 {
                break;
            }
            clause = self.reason[p.var()];
        }
        learnt[0] = !asserting.expect("the conflict has a literal at the current level");
        self.minimize(&mut learnt);
        let backtrack_level = if learnt.len() == 1 {
            0
        } else {
            let best = (1..learnt.len())
                .max_by_key(|&i| self.level[learnt[i].var()])
                .expect("non-empty");
            learnt.swap(1, best);
            self.level[learnt[1].var()]
        };
        self.stamp += 1;
        let mut lbd = 0;
        for l in &learnt {
            let lv = self.level[l.var()] as usize;
            if self.level_stamp.len() <= lv {
                self.level_stamp.resize(lv + 1, 0);
            }
            if self.level_stamp[lv] != self.stamp {
                self.level_stamp[lv] = self.stamp;
                lbd += 1;
            }
        }
        (learnt, backtrack_level, lbd)
    }

    /// Recursive minimization: drops literals implied by the others.
    fn minimize(&mut self, learnt: &mut Vec<Lit>) {
        let levels = learnt[1..]
            .iter()
            .fold(0, |a, l| a | self.abstract_level(l.var()));
        let mut to_clear: Vec<Lit> = learnt.clone();
        let mut kept = 1;
        for i in 1..learnt.len() {
            let l = learnt[i];
            if self.reason[l.var()] == NO_REASON || !self.redundant(l, levels, &mut to_clear) {
                learnt[kept] = l;
                kept += 1;
            }
        }
        learnt.truncate(kept);
        for l in to_clear {
            self.seen[l.var()] = false;
        }
    }

    fn redundant(&mut self, lit: Lit, levels: u32, to_clear: &mut Vec<Lit>) -> bool {
        let mut stack = vec![lit];
        let top = to_clear.len();
        while let Some(q) = stack.pop() {
            let reason = self.reason[q.var()];
            for k in 1..self.arena.len(reason) {
                let l = self.arena.lits(reason)[k];
                let var = l.var();
                if self.seen[var] || self.level[var] == 0 {
                    continue;
                }
                if self.reason[var] != NO_REASON && self.abstract_level(var) & levels != 0 {
                    self.seen[var] = true;
                    stack.push(l);
                    to_clear.push(l);
                } else {
                    for l in to_clear.drain(top..) {
                        self.seen[l.var()] = false;
                    }
                    return false;
                }
            }
        }
        true
    }

    /// Learns from a falsified clause and asserts the learnt clause.
    fn learn(&mut self, conflict: ClauseRef) {
        let (learnt, backtrack_level, lbd) = self.analyze(conflict);
        let dimacs: Vec<i32> = learnt.iter().map(|l| l.to_dimacs()).collect();
        self.proof.add(&dimacs);
        self.backtrack(backtrack_level);
        if learnt.len() == 1 {
            self.enqueue(learnt[0], NO_REASON);
        } else {
            let cref = self.arena.add(&learnt, true, lbd);
            self.attach(cref);
            self.learnts.push(cref);
            self.enqueue(learnt[0], cref);
        }
        self.activity.decay(VAR_DECAY);
    }

    /// Adds a clause from the hook, falsified by the current assignment.
    fn add_axiom(&mut self, dimacs: &[i32]) -> AxiomEffect {
        let mut lits = sorted_literals(dimacs);
        assert!(
            lits.iter()
                .all(|&l| l.var() < self.values.len() && self.value(l) == -1),
            "a hook clause must be falsified by the current assignment"
        );
        self.stats.axioms += 1;
        lits.sort_by_key(|&l| std::cmp::Reverse(self.level[l.var()]));
        let top = lits.first().map_or(0, |l| self.level[l.var()]);
        if top == 0 {
            self.proof.add(&[]);
            self.unsatisfiable = true;
            return AxiomEffect::Unsatisfiable;
        }
        if lits.len() == 1 {
            self.backtrack(0);
            self.enqueue(lits[0], NO_REASON);
            return AxiomEffect::Asserted;
        }
        let cref = self.arena.add(&lits, false, 0);
        self.attach(cref);
        let second = self.level[lits[1].var()];
        if second < top {
            self.backtrack(second);
            self.enqueue(lits[0], cref);
            AxiomEffect::Asserted
        } else {
            self.backtrack(top);
            AxiomEffect::Conflict(cref)
        }
    }

    /// Deletes the less useful half of the learnt clauses (LBD above 2, not a reason).
    fn reduce(&mut self) {
        let mut candidates: Vec<ClauseRef> = self
            .learnts
            .iter()
            .copied()
            .filter(|&c| {
                let first = self.arena.lits(c)[0];
                let locked = self.value(first) == 1 && self.reason[first.var()] == c;
                !locked && self.arena.lbd(c) > 2
            })
            .collect();
        candidates.sort_by_key(|&c| std::cmp::Reverse(self.arena.lbd(c)));
        for &c in &candidates[..candidates.len() / 2] {
            let dimacs: Vec<i32> = self.arena.lits(c).iter().map(|l| l.to_dimacs()).collect();
            self.proof.delete(&dimacs);
            self.arena.delete(c);
            self.stats.deleted += 1;
        }
        let arena = &self.arena;
        self.learnts.retain(|&c| !arena.is_deleted(c));
        for list in &mut self.watches {
            list.retain(|w| !arena.is_deleted(w.cref));
        }
        if self.arena.wasted * 2 > self.arena.total_words() {
            self.compact();
        }
    }

    fn compact(&mut self) {
        let mut moves: Vec<(ClauseRef, ClauseRef)> = Vec::new();
        self.arena.compact(|old, new| moves.push((old, new)));
        let relocate = |c: ClauseRef| {
            moves[moves
                .binary_search_by_key(&c, |m| m.0)
                .expect("live clause")]
            .1
        };
        for list in &mut self.watches {
            for w in list.iter_mut() {
                w.cref = relocate(w.cref);
            }
        }
        for r in &mut self.reason {
            if *r != NO_REASON {
                *r = relocate(*r);
            }
        }
        for c in &mut self.learnts {
            *c = relocate(*c);
        }
    }

    fn decide(&mut self) -> bool {
        while let Some(var) = self.activity.pop() {
            if self.values[var] == 0 {
                self.stats.decisions += 1;
                self.trail_limits.push(self.trail.len());
                self.enqueue(Lit::new(var, self.phase[var]), NO_REASON);
                return true;
            }
        }
        false
    }

    /// Searches until a model the hook accepts, a refutation, `stop()` (asked
    /// every 128 conflicts and every 128 axioms) or the `deadline`. The solver
    /// keeps its clauses, so more clauses may be added and `solve` called again
    /// (for enumeration).
    pub fn solve(
        &mut self,
        hook: &mut dyn SearchHook,
        stop: &dyn Fn() -> bool,
        deadline: Option<Instant>,
    ) -> Outcome {
        self.backtrack(0);
        self.restore_anchor();
        let mut restarts = 0u32;
        let mut restart_budget = luby(restarts) * RESTART_UNIT;
        let mut since_restart = 0u64;
        loop {
            if self.unsatisfiable {
                return Outcome::Unsatisfiable;
            }
            if let Some(conflict) = self.propagate() {
                self.stats.conflicts += 1;
                since_restart += 1;
                if self.decision_level() == 0 {
                    self.proof.add(&[]);
                    self.unsatisfiable = true;
                    return Outcome::Unsatisfiable;
                }
                self.learn(conflict);
                if self.stats.conflicts % 128 == 0
                    && (stop() || deadline.is_some_and(|d| Instant::now() >= d))
                {
                    return Outcome::Interrupted;
                }
                continue;
            }
            let complete = self.trail.len() == self.values.len();
            self.stats.hook_calls += 1;
            if let Some(clause) = hook.at_fixpoint(
                Assignment {
                    values: &self.values,
                },
                complete,
            ) {
                match self.add_axiom(&clause) {
                    AxiomEffect::Asserted => {}
                    AxiomEffect::Conflict(c) => {
                        self.stats.conflicts += 1;
                        since_restart += 1;
                        self.learn(c);
                    }
                    AxiomEffect::Unsatisfiable => return Outcome::Unsatisfiable,
                }
                if self.stats.axioms % 128 == 0
                    && (stop() || deadline.is_some_and(|d| Instant::now() >= d))
                {
                    return Outcome::Interrupted;
                }
                continue;
            }
            if complete {
                return Outcome::Satisfiable;
            }
            if since_restart >= restart_budget {
                self.backtrack(0);
                restarts += 1;
                self.stats.restarts += 1;
                restart_budget = luby(restarts) * RESTART_UNIT;
                since_restart = 0;
                self.restore_anchor();
            }
            if self.stats.conflicts >= self.next_reduce {
                self.reduce_step += REDUCE_GROWTH;
                self.next_reduce = self.stats.conflicts + self.reduce_step;
                self.reduce();
            }
            if !self.decide() {
                return Outcome::Satisfiable;
            }
        }
    }
}

/// A clause's literals, sorted, without repeats.
fn sorted_literals(dimacs: &[i32]) -> Vec<Lit> {
    let mut lits: Vec<Lit> = dimacs.iter().map(|&l| Lit::from_dimacs(l)).collect();
    lits.sort_unstable();
    lits.dedup();
    lits
}

/// 1 true, -1 false, 0 unassigned, from the per-variable values.
#[inline]
fn literal_value(values: &[i8], lit: Lit) -> i8 {
    let v = values[lit.var()];
    if lit.is_negated() {
        -v
    } else {
        v
    }
}

/// The Luby sequence 1 1 2 1 1 2 4 1 1 2 … (Luby, Sinclair & Zuckerman 1993).
fn luby(mut i: u32) -> u64 {
    let (mut size, mut seq) = (1u64, 0u32);
    while size < u64::from(i) + 1 {
        seq += 1;
        size = 2 * size + 1;
    }
    while size - 1 != u64::from(i) {
        size = (size - 1) >> 1;
        seq -= 1;
        i %= size as u32;
    }
    1 << seq
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn luby_sequence_starts_as_published() {
        // Luby, Sinclair & Zuckerman, "Optimal speedup of Las Vegas algorithms" (1993).
        let first: Vec<u64> = (0..15).map(luby).collect();
        assert_eq!(first, vec![1, 1, 2, 1, 1, 2, 4, 1, 1, 2, 1, 1, 2, 4, 8]);
    }
}
