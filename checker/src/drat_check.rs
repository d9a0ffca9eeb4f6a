//! Backward DRAT checking with core-first unit propagation.
//!
//! 1. Forward pass: replay the proof on the clause database, up to the first empty
//!    lemma (or, if there is none, with the empty clause as an implicit last lemma).
//!    Deletions of unit clauses are ignored, as is common practice (keeping a clause
//!    only makes later checks stricter or equal: every kept clause is implied).
//! 2. Backward pass: undo the steps from the last to the first. A lemma is checked
//!    only if it is in the *core*, that is, used by a later check (the final empty
//!    clause is core from the start). A lemma must be RUP (unit propagation on its
//!    negation reaches a conflict) or RAT on its first literal p: for every clause D
//!    containing ¬p, the resolvent C ∪ (D \ {¬p}) is RUP. Every clause used in a
//!    conflict becomes core.
//! 3. Propagation prefers core clauses: it runs core clauses to a fixpoint before
//!    letting any other clause propagate, which keeps the core small.
//!
//! The check of each lemma records the clauses it used, in propagation order; from
//! those, an LRAT proof of the same refutation is written on request.
//!
//! Memory follows the proof's size, whatever its shape: every clause's literals
//! live in one arena behind a 24-byte header, watch lists are linked through two
//! nodes per clause ([`crate::watch_lists`]), clauses are found for deletion by a
//! keyed hash of their content ([`crate::clause_index`]), and a lemma
//! identical to a clause still present is not stored again: it only raises that
//! clause's count of copies (a deletion lowers it first). Such a copy is implied by
//! the clause it repeats, so it needs no check of its own.

use crate::clause_index::ClauseIndex;
use crate::cnf::Cnf;
use crate::dense_vars::DenseVars;
use crate::drat_parse::{DratProof, StepKind};
use crate::lrat::{lrat_steps, CheckedStep, Justification, LratStep};
use crate::watch_lists::WatchLists;

/// What a successful check found.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct DratReport {
    pub original_clauses: usize,
    pub lemmas: usize,
    pub deletions: usize,
    /// Lemmas in the core (checked).
    pub checked_lemmas: usize,
    /// Checked lemmas that needed the RAT rule.
    pub rat_lemmas: usize,
    /// Original clauses used by the refutation.
    pub core_original_clauses: usize,
    pub ignored_unit_deletions: usize,
    pub deletions_of_absent_clauses: usize,
    /// The proof had no empty lemma; the empty clause followed by propagation at the end.
    pub implicit_empty_clause: bool,
    /// The formula itself contains the empty clause.
    pub formula_has_empty_clause: bool,
}

/// Why a proof was rejected.
#[derive(Clone, Debug, PartialEq, Eq, thiserror::Error)]
pub enum DratFailure {
    /// A core lemma (`step` counts from 1) is neither RUP nor RAT on its first literal.
    #[error("proof step {step} (byte {offset}): lemma {lemma:?} is neither RUP nor RAT on its first literal")]
    LemmaFailed { step: usize, offset: u64, lemma: Vec<i32> },
    /// No empty lemma, and propagation on the final clause set finds no conflict.
    #[error(
        "the proof never derives the empty clause, and unit propagation on its final clause set finds no conflict"
    )]
    NoRefutation,
}

/// Lemmas checked so far by every check in this process: read by the CLI's progress line only.
pub static CHECKED_LEMMAS: std::sync::atomic::AtomicUsize = std::sync::atomic::AtomicUsize::new(0);

const NO_REASON: u32 = u32::MAX;
const CORE: u8 = 0;
const OTHER: u8 = 1;

type Lit = u32;

/// Literal codes: 2v for v, 2v + 1 for ¬v (so negation is `^ 1`).
fn code(lit: i32) -> Lit {
    (lit.unsigned_abs() << 1) | (lit < 0) as u32
}

fn dimacs(lit: Lit) -> i32 {
    (lit >> 1) as i32 * if lit & 1 == 1 { -1 } else { 1 }
}

/// A clause's header; its literals are `arena[start..start + len]`.
struct Clause {
    start: usize,
    len: u32,
    /// The lemma's first literal as written (the RAT pivot), or NO_PIVOT.
    pivot: Lit,
    /// Copies beyond the first that the proof added and has not yet deleted.
    copies: u32,
    /// ACTIVE, IN_CORE, WATCHED << p (node 2c + p is in a list), CORE_LIST.
    flags: u8,
}

const ACTIVE: u8 = 1;
const IN_CORE: u8 = 2;
const WATCHED: u8 = 4;
const CORE_LIST: u8 = 16;

impl Clause {
    fn has(&self, flag: u8) -> bool {
        self.flags & flag != 0
    }

    fn set(&mut self, flag: u8, on: bool) {
        self.flags = if on { self.flags | flag } else { self.flags & !flag };
    }

    /// CORE (0) or OTHER (1): the kind of list that holds its watch nodes.
    fn list(&self) -> u8 {
        (!self.has(CORE_LIST)) as u8
    }
}

const NO_PIVOT: Lit = u32::MAX;

/// A step of the forward pass, to be undone backwards: the clause and the step's index.
#[derive(Clone, Copy)]
enum Record {
    Add(u32, u32),
    /// A lemma identical to the active clause: one more copy of it.
    AddCopy(u32),
    Delete(u32),
    DeleteCopy(u32),
}

/// Step index of the implicit empty clause at the end.
const IMPLICIT: u32 = u32::MAX;

/// Checked lemmas with their justifications, or why the proof fails.
type Justified = Result<Vec<(u32, Justification)>, DratFailure>;

/// Outcome of propagating the negation of a clause.
enum Rup {
    /// The clause is a tautology.
    Trivial,
    /// Conflict; the clauses used, in propagation order, conflict clause last.
    Conflict(Vec<u32>),
    NoConflict,
}

struct Checker {
    clauses: Vec<Clause>,
    arena: Vec<Lit>,
    watches: WatchLists,
    units: Vec<u32>,
    is_true: Vec<bool>,
    reason: Vec<u32>,
    trail_position: Vec<u32>,
    seen: Vec<bool>,
    trail: Vec<Lit>,
    pending_core: Vec<u32>,
}

impl Checker {
    fn new(max_var: usize) -> Self {
        let (lits, vars) = (2 * (max_var + 1), max_var + 1);
        let (reason, trail_position, seen) = (vec![NO_REASON; vars], vec![0; vars], vec![false; vars]);
        let (clauses, units, trail, pending_core) = (Vec::new(), Vec::new(), Vec::new(), Vec::new());
        let (watches, is_true) = (WatchLists::new(lits), vec![false; lits]);
        let arena = Vec::new();
        Checker { clauses, arena, watches, units, is_true, reason, trail_position, seen, trail, pending_core }
    }

    fn lits(&self, id: u32) -> &[Lit] {
        let c = &self.clauses[id as usize];
        &self.arena[c.start..c.start + c.len as usize]
    }

    fn lit_at(&self, id: u32, k: usize) -> Lit {
        self.arena[self.clauses[id as usize].start + k]
    }

    /// Whether clause `id` holds exactly the literals of `key` (sorted, each once);
    /// None when it is deleted.
    fn same_active(&self, id: u32, key: &[Lit]) -> Option<bool> {
        let lits = self.lits(id);
        self.clauses[id as usize]
            .has(ACTIVE)
            .then(|| lits.len() == key.len() && lits.iter().all(|l| key.binary_search(l).is_ok()))
    }

    /// Adds a clause of sorted literal codes without repeats (`key`); `pivot` is kept first.
    fn add_clause(&mut self, key: &[Lit], pivot: Option<Lit>) -> u32 {
        let start = self.arena.len();
        self.arena.extend_from_slice(key);
        // Keep the pivot first: it is the literal RAT is checked on.
        if let Some(p) = pivot {
            let at = key.iter().position(|&l| l == p).expect("pivot is in the clause");
            self.arena.swap(start, start + at);
        }
        let id = self.clauses.len() as u32;
        let (len, pivot) = (key.len() as u32, pivot.unwrap_or(NO_PIVOT));
        self.clauses.push(Clause { start, len, pivot, copies: 0, flags: 0 });
        self.watches.add_clause(id);
        self.activate(id);
        id
    }

    fn activate(&mut self, id: u32) {
        let clause = &mut self.clauses[id as usize];
        clause.set(ACTIVE, true);
        match clause.len {
            0 => {}
            1 => self.units.push(id),
            _ => {
                for p in 0..2 {
                    if !clause.has(WATCHED << p) {
                        clause.set(WATCHED << p, true);
                        self.watches.link(clause.list(), self.arena[clause.start + p], 2 * id + p as u32);
                    }
                }
            }
        }
    }

    fn mark_core(&mut self, id: u32) {
        let clause = &mut self.clauses[id as usize];
        if !clause.has(IN_CORE) {
            clause.set(IN_CORE, true);
            if clause.len >= 2 {
                self.pending_core.push(id);
            }
        }
    }

    /// Moves the watch entries of newly core clauses into the core lists (only
    /// between checks, when nothing is assigned).
    fn migrate_core_watches(&mut self) {
        for id in std::mem::take(&mut self.pending_core) {
            let clause = &mut self.clauses[id as usize];
            if clause.has(CORE_LIST) {
                continue;
            }
            for p in 0..2 {
                if clause.has(WATCHED << p) {
                    let (lit, node) = (self.arena[clause.start + p], 2 * id + p as u32);
                    self.watches.unlink(OTHER, lit, node);
                    self.watches.link(CORE, lit, node);
                }
            }
            clause.set(CORE_LIST, true);
        }
    }

    fn reset(&mut self) {
        for &lit in &self.trail {
            self.is_true[lit as usize] = false;
            self.reason[(lit >> 1) as usize] = NO_REASON;
        }
        self.trail.clear();
        self.migrate_core_watches();
    }

    fn assign(&mut self, lit: Lit, reason: u32) {
        self.is_true[lit as usize] = true;
        let var = (lit >> 1) as usize;
        self.reason[var] = reason;
        self.trail_position[var] = self.trail.len() as u32;
        self.trail.push(lit);
    }

    /// Unit propagation from the current trail; returns a conflict clause.
    fn propagate(&mut self) -> Option<u32> {
        let (mut core_head, mut other_head) = (0, 0);
        loop {
            while core_head < self.trail.len() {
                let lit = self.trail[core_head];
                core_head += 1;
                if let Some(conflict) = self.visit(CORE, lit ^ 1) {
                    return Some(conflict);
                }
            }
            if other_head < self.trail.len() {
                let lit = self.trail[other_head];
                other_head += 1;
                if let Some(conflict) = self.visit(OTHER, lit ^ 1) {
                    return Some(conflict);
                }
                continue;
            }
            return None;
        }
    }

    /// Visits the clauses of one kind watching `falsified`.
    fn visit(&mut self, kind: u8, falsified: Lit) -> Option<u32> {
        let mut next = self.watches.first(kind, falsified);
        while let Some(node) = next {
            next = self.watches.after(node);
            let (id, p) = (node / 2, (node % 2) as usize);
            let clause = &mut self.clauses[id as usize];
            if !clause.has(ACTIVE) {
                clause.set(WATCHED << p, false);
                self.watches.unlink(kind, falsified, node);
                continue;
            }
            let lits = &mut self.arena[clause.start..clause.start + clause.len as usize];
            let other = lits[1 - p];
            if self.is_true[other as usize] {
                continue;
            }
            if let Some(k) = lits[2..].iter().position(|&l| !self.is_true[(l ^ 1) as usize]) {
                lits.swap(p, k + 2);
                let watched = lits[p];
                self.watches.unlink(kind, falsified, node);
                self.watches.link(kind, watched, node);
                continue;
            }
            if self.is_true[(other ^ 1) as usize] {
                return Some(id);
            }
            self.assign(other, id);
        }
        None
    }

    /// Collects the clauses that led to `conflict`, marking them core; returns them
    /// in propagation order with the conflict clause last.
    fn analyze(&mut self, conflict: u32) -> Vec<u32> {
        let mut used: Vec<u32> = Vec::new();
        let mut seen_vars: Vec<usize> = Vec::new();
        let mut stack: Vec<u32> = vec![conflict];
        while let Some(id) = stack.pop() {
            self.mark_core(id);
            for k in 0..self.clauses[id as usize].len as usize {
                let var = (self.lit_at(id, k) >> 1) as usize;
                if self.seen[var] {
                    continue;
                }
                self.seen[var] = true;
                seen_vars.push(var);
                let reason = self.reason[var];
                if reason != NO_REASON && reason != id {
                    used.push(reason);
                    stack.push(reason);
                }
            }
        }
        for var in seen_vars {
            self.seen[var] = false;
        }
        used.sort_by_key(|&r| {
            let lit = self
                .lits(r)
                .iter()
                .copied()
                .find(|&l| self.reason[(l >> 1) as usize] == r && self.is_true[l as usize])
                .expect("a reason clause has its implied literal");
            self.trail_position[(lit >> 1) as usize]
        });
        used.dedup();
        used.push(conflict);
        used
    }

    /// Propagates the negation of `lits` (plus the active units).
    fn rup(&mut self, lits: &[Lit]) -> Rup {
        self.reset();
        for &lit in lits {
            if self.is_true[lit as usize] {
                return Rup::Trivial;
            }
            if !self.is_true[(lit ^ 1) as usize] {
                self.assign(lit ^ 1, NO_REASON);
            }
        }
        let mut k = 0;
        while k < self.units.len() {
            let id = self.units[k];
            if !self.clauses[id as usize].has(ACTIVE) {
                self.units.swap_remove(k);
                continue;
            }
            k += 1;
            let lit = self.lit_at(id, 0);
            if self.is_true[lit as usize] {
                continue;
            }
            if self.is_true[(lit ^ 1) as usize] {
                return Rup::Conflict(self.analyze(id));
            }
            self.assign(lit, id);
        }
        match self.propagate() {
            Some(conflict) => Rup::Conflict(self.analyze(conflict)),
            None => Rup::NoConflict,
        }
    }

    /// RAT on the lemma's pivot; returns (candidate, hints) pairs on success.
    fn rat(&mut self, lemma: u32) -> Option<Vec<(u32, Vec<u32>)>> {
        let pivot = Some(self.clauses[lemma as usize].pivot).filter(|&p| p != NO_PIVOT)?;
        let lemma_lits = self.lits(lemma).to_vec();
        let candidates: Vec<u32> = (0..self.clauses.len() as u32)
            .filter(|&id| self.clauses[id as usize].has(ACTIVE) && self.lits(id).contains(&(pivot ^ 1)))
            .collect();
        let mut proofs = Vec::new();
        for candidate in candidates {
            let mut resolvent = lemma_lits.clone();
            resolvent.extend(self.lits(candidate).iter().copied().filter(|&l| l != pivot ^ 1));
            self.mark_core(candidate);
            match self.rup(&resolvent) {
                Rup::Trivial => proofs.push((candidate, Vec::new())),
                Rup::Conflict(hints) => proofs.push((candidate, hints)),
                Rup::NoConflict => return None,
            }
        }
        Some(proofs)
    }

    /// Adds the lemmas and applies the deletions in proof order, up to the first empty
    /// lemma (or an implicit one at the end); returns the steps to undo backwards.
    fn forward_pass(&mut self, cnf: &Cnf, proof: &DratProof, vars: &DenseVars, report: &mut DratReport) -> Vec<Record> {
        let mut index = ClauseIndex::new(cnf.len() + proof.len());
        let mut key = Vec::new();
        for clause in cnf.clauses() {
            fill_key(&mut key, clause.iter().copied());
            let id = self.add_clause(&key, None);
            index.insert(id, index.hash(&key));
        }
        let mut records = Vec::new();
        let mut empty_lemma: Option<u32> = None;
        for (step, (kind, literals, _)) in proof.iter().enumerate() {
            fill_key(&mut key, literals.iter().map(|&l| vars.dense(l)));
            let hash = index.hash(&key);
            let found = index.find(hash, |id| self.same_active(id, &key));
            match (kind, found) {
                (StepKind::Add, Some(id)) => {
                    report.lemmas += 1;
                    self.clauses[id as usize].copies += 1;
                    records.push(Record::AddCopy(id));
                }
                (StepKind::Add, None) => {
                    report.lemmas += 1;
                    let id = self.add_clause(&key, literals.first().map(|&l| code(vars.dense(l))));
                    index.insert(id, hash);
                    records.push(Record::Add(id, step as u32));
                    if literals.is_empty() {
                        empty_lemma = Some(id);
                        break;
                    }
                }
                (StepKind::Delete, None) => {
                    (report.deletions, report.deletions_of_absent_clauses) =
                        (report.deletions + 1, report.deletions_of_absent_clauses + 1)
                }
                (StepKind::Delete, Some(id)) => {
                    report.deletions += 1;
                    let clause = &mut self.clauses[id as usize];
                    if clause.copies > 0 {
                        clause.copies -= 1;
                        records.push(Record::DeleteCopy(id));
                    } else if clause.len == 1 {
                        report.ignored_unit_deletions += 1;
                    } else {
                        clause.set(ACTIVE, false);
                        records.push(Record::Delete(id));
                    }
                }
            }
        }
        let final_id = empty_lemma.unwrap_or_else(|| {
            report.implicit_empty_clause = true;
            records.push(Record::Add(self.clauses.len() as u32, IMPLICIT));
            self.add_clause(&[], None)
        });
        self.mark_core(final_id);
        records
    }

    /// Checks the core lemmas from the last back (RUP, else RAT), undoing deletions;
    /// returns each checked lemma's justification when LRAT is wanted.
    fn backward_pass(
        &mut self,
        records: &[Record],
        proof: &DratProof,
        lrat: bool,
        report: &mut DratReport,
    ) -> Justified {
        let mut justified: Vec<(u32, Justification)> = Vec::new();
        for record in records.iter().rev() {
            let (id, step) = match *record {
                Record::Delete(id) => {
                    self.activate(id);
                    continue;
                }
                Record::AddCopy(id) => {
                    self.clauses[id as usize].copies -= 1;
                    continue;
                }
                Record::DeleteCopy(id) => {
                    self.clauses[id as usize].copies += 1;
                    continue;
                }
                Record::Add(id, step) => (id, step),
            };
            self.clauses[id as usize].set(ACTIVE, false);
            if !self.clauses[id as usize].has(IN_CORE) {
                continue;
            }
            report.checked_lemmas += 1;
            CHECKED_LEMMAS.fetch_add(1, std::sync::atomic::Ordering::Relaxed);
            let lits = self.lits(id).to_vec();
            let justification = match self.rup(&lits) {
                Rup::Trivial => continue,
                Rup::Conflict(hints) => Justification::Rup(hints),
                Rup::NoConflict => match self.rat(id) {
                    Some(proofs) => {
                        report.rat_lemmas += 1;
                        Justification::Rat(proofs)
                    }
                    None if step == IMPLICIT => return Err(DratFailure::NoRefutation),
                    None => {
                        let failed = proof.step(step as usize);
                        let (step, offset, lemma) = (step as usize + 1, failed.offset, failed.literals);
                        return Err(DratFailure::LemmaFailed { step, offset, lemma });
                    }
                },
            };
            if lrat {
                justified.push((id, justification));
            }
        }
        Ok(justified)
    }
}

/// A clause's literal codes, sorted and without repeats, into `key`.
fn fill_key(key: &mut Vec<Lit>, lits: impl Iterator<Item = i32>) {
    key.clear();
    key.extend(lits.map(code));
    key.sort_unstable();
    key.dedup();
}

/// Checks a DRAT refutation of `cnf`. With `emit_lrat`, also returns an LRAT proof.
pub fn check_drat(
    cnf: &Cnf,
    proof: &DratProof,
    emit_lrat: bool,
) -> Result<(DratReport, Option<Vec<LratStep>>), DratFailure> {
    let mut vars = DenseVars::new(cnf.all_literals());
    proof.all_literals().iter().for_each(|&l| vars.add(l));
    let vars = vars.sealed();
    let mut report = DratReport { original_clauses: cnf.len(), ..DratReport::default() };
    if cnf.clauses().any(|c| c.is_empty()) {
        report.formula_has_empty_clause = true;
        return Ok((report, emit_lrat.then(Vec::new)));
    }
    let mut checker = Checker::new(vars.max_var());
    let records = checker.forward_pass(cnf, proof, &vars, &mut report);
    let justified = checker.backward_pass(&records, proof, emit_lrat, &mut report)?;
    report.core_original_clauses = checker.clauses[..cnf.len()].iter().filter(|c| c.has(IN_CORE)).count();
    report.checked_lemmas -= report.implicit_empty_clause as usize;

    let lrat = emit_lrat.then(|| {
        // Checked lemmas (literals as written, pivot first) and deletions, in proof order.
        let mut justified: std::collections::HashMap<u32, Justification> = justified.into_iter().collect();
        let steps = records.iter().filter_map(|record| match *record {
            Record::Delete(id) => Some(CheckedStep::Delete(id)),
            Record::Add(id, _) => justified.remove(&id).map(|justification| {
                let pivot = Some(checker.clauses[id as usize].pivot).filter(|&p| p != NO_PIVOT);
                let literals = pivot
                    .into_iter()
                    .chain(checker.lits(id).iter().copied().filter(|&l| Some(l) != pivot))
                    .map(|l| vars.original(dimacs(l)))
                    .collect();
                CheckedStep::Lemma(id, literals, justification)
            }),
            Record::AddCopy(_) | Record::DeleteCopy(_) => None,
        });
        lrat_steps(cnf.len(), steps)
    });
    Ok((report, lrat))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::drat_parse::DratStep;
    use crate::lrat::{check_lrat, parse_lrat, write_lrat};
    use proptest::prelude::*;

    /// Every clause over variables 1..3 (unsatisfiable), and a clause with 5 that a
    /// decoration may delete before the RAT lemma below sees it.
    fn formula() -> Vec<Vec<i32>> {
        let mut clauses: Vec<Vec<i32>> =
            (0..8).map(|m| (1..=3).map(|v| if m >> (v - 1) & 1 == 1 { -v } else { v }).collect()).collect();
        clauses.push(vec![5, 1, 2]);
        clauses
    }

    /// A refutation that defines 5 as 1 by two RAT lemmas and uses both:
    /// [5,-1] (RAT on 5), [-5,1] (RAT on -5; candidates [5,-1] and [5,1,2]),
    /// then [5,2], [5], [2], [] each by unit propagation.
    fn base() -> Vec<(bool, Vec<i32>)> {
        [vec![5, -1], vec![-5, 1], vec![5, 2], vec![5], vec![2], vec![]].into_iter().map(|l| (true, l)).collect()
    }

    proptest! {
        /// Decorations: tautologies and superset lemmas (both RUP), lemmas on 5 deleted
        /// before the RAT lemma, the formula's [5,1,2] deleted, unit deletions; the
        /// variables renamed with signs. The DRAT check must accept, and the LRAT it
        /// writes must pass the LRAT check.
        #[test]
        fn emitted_lrat_always_checks(
            decorations in proptest::collection::vec((0usize..5, 0usize..9, any::<bool>()), 0..8),
            flips in any::<[bool; 6]>(),
        ) {
            let mut steps = base();
            for &(kind, at, flag) in &decorations {
                let clause = formula()[at % 8].clone();
                let (position, inserted): (usize, Vec<(bool, Vec<i32>)>) = match kind {
                    0 => (1, vec![(true, vec![5, clause[0], -clause[0]])]),       // a tautology candidate
                    1 => (at % 5, vec![(true, [clause.clone(), vec![4]].concat())]), // a superset lemma
                    2 => (1, vec![(true, vec![5, 3]), (false, vec![5, 3])]),       // a candidate added, deleted
                    3 => (1, vec![(false, vec![5, 1, 2])]),                       // the formula's candidate deleted
                    _ => (if flag { 4 } else { 5 }, vec![(false, vec![5])]),        // a unit deletion
                };
                let position = position.min(steps.len() - 1);
                steps.splice(position..position, inserted);
            }
            let flip = |l: &i32| if flips[l.unsigned_abs() as usize - 1] { -l } else { *l };
            let cnf = Cnf::new(5, formula().iter().map(|c| c.iter().map(flip).collect()).collect());
            let owned: Vec<DratStep> = steps
                .iter()
                .map(|(add, l)| DratStep {
                    kind: if *add { StepKind::Add } else { StepKind::Delete },
                    literals: l.iter().map(flip).collect(),
                    offset: 0,
                })
                .collect();
            let (_, lrat) = check_drat(&cnf, &DratProof::from_steps(&owned), true).expect("the proof is valid");
            let text = write_lrat(&lrat.expect("LRAT was asked for"));
            let lines = parse_lrat("lrat", text.as_bytes()).expect("the LRAT parses");
            prop_assert!(check_lrat(&cnf, &lines).is_ok(), "{:?}\n{text}", check_lrat(&cnf, &lines));
        }
    }
}
