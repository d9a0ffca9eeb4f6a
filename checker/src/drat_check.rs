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

use std::collections::HashMap;

use crate::cnf::Cnf;
use crate::dense_vars::DenseVars;
use crate::drat_parse::{DratStep, StepKind};
use crate::lrat::{number_lemmas, Justification, LratLemma};

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
const CORE: usize = 0;
const OTHER: usize = 1;

type Lit = u32;

/// Literal codes: 2v for v, 2v + 1 for ¬v (so negation is `^ 1`).
fn code(lit: i32) -> Lit {
    (lit.unsigned_abs() << 1) | (lit < 0) as u32
}

fn dimacs(lit: Lit) -> i32 {
    (lit >> 1) as i32 * if lit & 1 == 1 { -1 } else { 1 }
}

struct Clause {
    lits: Vec<Lit>,
    active: bool,
    core: bool,
    /// Whether the watch entry of position 0 / 1 is present in a list.
    watched: [bool; 2],
    /// Which kind of list (CORE or OTHER) holds its entries.
    list: usize,
    /// The lemma's first literal as written (the RAT pivot).
    pivot: Option<Lit>,
}

enum Record {
    Add(u32),
    Delete(u32),
}

/// The forward pass's steps, each with its index in the proof.
type Records = Vec<(Record, usize)>;
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
    watches: [Vec<Vec<u32>>; 2],
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
        let (watches, is_true) = ([vec![Vec::new(); lits], vec![Vec::new(); lits]], vec![false; lits]);
        Checker { clauses, watches, units, is_true, reason, trail_position, seen, trail, pending_core }
    }

    fn add_clause(&mut self, literals: &[i32], pivot: Option<i32>) -> u32 {
        let mut lits: Vec<Lit> = literals.iter().map(|&l| code(l)).collect();
        lits.sort_unstable();
        lits.dedup();
        // Keep the pivot first: it is the literal RAT is checked on.
        if let Some(p) = pivot.map(code) {
            let at = lits.iter().position(|&l| l == p).expect("pivot is in the clause");
            lits.swap(0, at);
        }
        let id = self.clauses.len() as u32;
        self.clauses.push(Clause {
            lits,
            active: false,
            core: false,
            watched: [false, false],
            list: OTHER,
            pivot: pivot.map(code),
        });
        self.activate(id);
        id
    }

    fn activate(&mut self, id: u32) {
        let clause = &mut self.clauses[id as usize];
        clause.active = true;
        match clause.lits.len() {
            0 => {}
            1 => self.units.push(id),
            _ => {
                for p in 0..2 {
                    if !clause.watched[p] {
                        clause.watched[p] = true;
                        self.watches[clause.list][clause.lits[p] as usize].push(id);
                    }
                }
            }
        }
    }

    fn mark_core(&mut self, id: u32) {
        let clause = &mut self.clauses[id as usize];
        if !clause.core {
            clause.core = true;
            if clause.lits.len() >= 2 {
                self.pending_core.push(id);
            }
        }
    }

    /// Moves the watch entries of newly core clauses into the core lists (only
    /// between checks, when nothing is assigned).
    fn migrate_core_watches(&mut self) {
        for id in std::mem::take(&mut self.pending_core) {
            let clause = &mut self.clauses[id as usize];
            if clause.list == CORE {
                continue;
            }
            for p in 0..2 {
                if clause.watched[p] {
                    let list = &mut self.watches[OTHER][clause.lits[p] as usize];
                    if let Some(at) = list.iter().position(|&c| c == id) {
                        list.swap_remove(at);
                    }
                    self.watches[CORE][clause.lits[p] as usize].push(id);
                }
            }
            clause.list = CORE;
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
    fn visit(&mut self, kind: usize, falsified: Lit) -> Option<u32> {
        let mut list = std::mem::take(&mut self.watches[kind][falsified as usize]);
        let mut i = 0;
        let mut conflict = None;
        while i < list.len() {
            let id = list[i];
            let clause = &mut self.clauses[id as usize];
            if !clause.active {
                let p = if clause.lits[0] == falsified { 0 } else { 1 };
                clause.watched[p] = false;
                list.swap_remove(i);
                continue;
            }
            if clause.lits[0] == falsified {
                clause.lits.swap(0, 1);
                clause.watched.swap(0, 1);
            }
            let first = clause.lits[0];
            if self.is_true[first as usize] {
                i += 1;
                continue;
            }
            let replacement = clause.lits[2..].iter().position(|&l| !self.is_true[(l ^ 1) as usize]).map(|k| k + 2);
            if let Some(k) = replacement {
                clause.lits.swap(1, k);
                let new_watch = clause.lits[1] as usize;
                self.watches[kind][new_watch].push(id);
                list.swap_remove(i);
                continue;
            }
            if self.is_true[(first ^ 1) as usize] {
                conflict = Some(id);
                break;
            }
            self.assign(first, id);
            i += 1;
        }
        self.watches[kind][falsified as usize] = list;
        conflict
    }

    /// Collects the clauses that led to `conflict`, marking them core; returns them
    /// in propagation order with the conflict clause last.
    fn analyze(&mut self, conflict: u32) -> Vec<u32> {
        let mut used: Vec<u32> = Vec::new();
        let mut seen_vars: Vec<usize> = Vec::new();
        let mut stack: Vec<u32> = vec![conflict];
        while let Some(id) = stack.pop() {
            self.mark_core(id);
            for k in 0..self.clauses[id as usize].lits.len() {
                let var = (self.clauses[id as usize].lits[k] >> 1) as usize;
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
            let lit = self.clauses[r as usize]
                .lits
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
            if !self.clauses[id as usize].active {
                self.units.swap_remove(k);
                continue;
            }
            k += 1;
            let lit = self.clauses[id as usize].lits[0];
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
        let pivot = self.clauses[lemma as usize].pivot?;
        let lemma_lits = self.clauses[lemma as usize].lits.clone();
        let candidates: Vec<u32> = (0..self.clauses.len() as u32)
            .filter(|&id| {
                let c = &self.clauses[id as usize];
                c.active && c.lits.contains(&(pivot ^ 1))
            })
            .collect();
        let mut proofs = Vec::new();
        for candidate in candidates {
            let mut resolvent = lemma_lits.clone();
            resolvent.extend(self.clauses[candidate as usize].lits.iter().copied().filter(|&l| l != pivot ^ 1));
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
    fn forward_pass(&mut self, cnf: &Cnf, steps: &[DratStep], vars: &DenseVars, report: &mut DratReport) -> Records {
        let mut by_content: HashMap<Vec<Lit>, Vec<u32>> = HashMap::new();
        for clause in &cnf.clauses {
            let id = self.add_clause(clause, None);
            by_content.entry(key(clause)).or_default().push(id);
        }
        let mut records: Records = Vec::new();
        let mut empty_lemma: Option<u32> = None;
        for (index, step) in steps.iter().enumerate() {
            let literals: Vec<i32> = step.literals.iter().map(|&l| vars.dense(l)).collect();
            match step.kind {
                StepKind::Add => {
                    report.lemmas += 1;
                    let id = self.add_clause(&literals, literals.first().copied());
                    by_content.entry(key(&literals)).or_default().push(id);
                    records.push((Record::Add(id), index));
                    if literals.is_empty() {
                        empty_lemma = Some(id);
                        break;
                    }
                }
                StepKind::Delete => {
                    report.deletions += 1;
                    let k = key(&literals);
                    let found = by_content.get_mut(&k).and_then(|ids| {
                        let at = ids.iter().rposition(|&id| self.clauses[id as usize].active)?;
                        Some(ids.remove(at))
                    });
                    match found {
                        None => report.deletions_of_absent_clauses += 1,
                        Some(id) if self.clauses[id as usize].lits.len() == 1 => {
                            report.ignored_unit_deletions += 1;
                            by_content.entry(k).or_default().push(id);
                        }
                        Some(id) => {
                            self.clauses[id as usize].active = false;
                            records.push((Record::Delete(id), index));
                        }
                    }
                }
            }
        }

        let final_id = empty_lemma.unwrap_or_else(|| {
            report.implicit_empty_clause = true;
            records.push((Record::Add(self.clauses.len() as u32), usize::MAX));
            self.add_clause(&[], None)
        });
        self.mark_core(final_id);
        records
    }

    /// Checks the core lemmas from the last back (RUP, else RAT), undoing deletions;
    /// returns each checked lemma's justification when LRAT is wanted.
    fn backward_pass(
        &mut self,
        records: &Records,
        steps: &[DratStep],
        lrat: bool,
        report: &mut DratReport,
    ) -> Justified {
        let mut justified: Vec<(u32, Justification)> = Vec::new();
        for (record, index) in records.iter().rev() {
            match *record {
                Record::Delete(id) => self.activate(id),
                Record::Add(id) => {
                    self.clauses[id as usize].active = false;
                    if !self.clauses[id as usize].core {
                        continue;
                    }
                    report.checked_lemmas += 1;
                    CHECKED_LEMMAS.fetch_add(1, std::sync::atomic::Ordering::Relaxed);
                    let lits = self.clauses[id as usize].lits.clone();
                    let justification = match self.rup(&lits) {
                        Rup::Trivial => continue,
                        Rup::Conflict(hints) => Justification::Rup(hints),
                        Rup::NoConflict => match self.rat(id) {
                            Some(proofs) => {
                                report.rat_lemmas += 1;
                                Justification::Rat(proofs)
                            }
                            None if *index == usize::MAX => return Err(DratFailure::NoRefutation),
                            None => {
                                return Err(DratFailure::LemmaFailed {
                                    step: index + 1,
                                    offset: steps[*index].offset,
                                    lemma: steps[*index].literals.clone(),
                                })
                            }
                        },
                    };
                    if lrat {
                        justified.push((id, justification));
                    }
                }
            }
        }
        Ok(justified)
    }
}

/// A clause's literals as a lookup key (sorted, without repeats).
fn key(lits: &[i32]) -> Vec<Lit> {
    let mut k: Vec<Lit> = lits.iter().map(|&l| code(l)).collect();
    k.sort_unstable();
    k.dedup();
    k
}

/// Checks a DRAT refutation of `cnf`. With `emit_lrat`, also returns an LRAT proof.
pub fn check_drat(
    cnf: &Cnf,
    steps: &[DratStep],
    emit_lrat: bool,
) -> Result<(DratReport, Option<Vec<LratLemma>>), DratFailure> {
    let mut vars = DenseVars::new(&cnf.clauses);
    steps.iter().flat_map(|s| s.literals.iter()).for_each(|&l| vars.add(l));
    let mut report = DratReport { original_clauses: cnf.clauses.len(), ..DratReport::default() };
    if cnf.clauses.iter().any(|c| c.is_empty()) {
        report.formula_has_empty_clause = true;
        return Ok((report, emit_lrat.then(Vec::new)));
    }
    let mut checker = Checker::new(vars.max_var());
    let records = checker.forward_pass(cnf, steps, &vars, &mut report);
    let mut justified = checker.backward_pass(&records, steps, emit_lrat, &mut report)?;
    report.core_original_clauses = checker.clauses[..cnf.clauses.len()].iter().filter(|c| c.core).count();
    report.checked_lemmas -= report.implicit_empty_clause as usize;

    let lrat = emit_lrat.then(|| {
        // Lemmas in proof order, each with its literals as written, pivot first.
        justified.reverse();
        let lemmas = justified.into_iter().map(|(id, justification)| {
            let clause = &checker.clauses[id as usize];
            let literals = clause
                .pivot
                .into_iter()
                .chain(clause.lits.iter().copied().filter(|&l| Some(l) != clause.pivot))
                .map(|l| vars.original(dimacs(l)))
                .collect();
            (id, literals, justification)
        });
        number_lemmas(cnf.clauses.len(), lemmas)
    });
    Ok((report, lrat))
}
