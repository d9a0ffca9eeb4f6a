//! A deliberately plain reference for judging proof mutants: a forward checker that
//! ignores all deletions and keeps every lemma that is RUP, or RAT on its first
//! literal, with respect to the formula and the lemmas kept so far. Ignoring
//! deletions and keeping every valid lemma can only make more lemmas RUP, so when
//! this reference finds no refutation, no DRAT-style checker may accept the proof.
//! (RAT is not monotone in the clause set; varisat's traces contain no RAT lemmas.)

/// A proof step for the reference: (is an addition, literals).
pub type Step = (bool, Vec<i32>);

struct Db {
    clauses: Vec<Vec<i32>>,
    /// Clause indices containing each literal (index by `slot`).
    occurs: Vec<Vec<usize>>,
}

fn slot(lit: i32) -> usize {
    (lit.unsigned_abs() as usize) * 2 + (lit < 0) as usize
}

impl Db {
    fn new(vars: usize) -> Self {
        Db {
            clauses: Vec::new(),
            occurs: vec![Vec::new(); 2 * vars + 2],
        }
    }

    fn add(&mut self, clause: Vec<i32>) {
        let id = self.clauses.len();
        for &l in &clause {
            self.occurs[slot(l)].push(id);
        }
        self.clauses.push(clause);
    }

    /// Unit propagation from `assumed` (all set true); true if a conflict is reached.
    fn conflict_from(&self, assumed: &[i32]) -> bool {
        let mut value: Vec<i8> = vec![0; self.occurs.len() / 2 + 1];
        let val = |value: &Vec<i8>, l: i32| {
            let v = value[l.unsigned_abs() as usize];
            if l > 0 {
                v
            } else {
                -v
            }
        };
        let mut queue: Vec<i32> = Vec::new();
        for &l in assumed {
            match val(&value, l) {
                -1 => return true,
                0 => {
                    value[l.unsigned_abs() as usize] = if l > 0 { 1 } else { -1 };
                    queue.push(l);
                }
                _ => {}
            }
        }
        // Clauses with no literal at all are conflicts; units start the propagation.
        for clause in &self.clauses {
            match clause.len() {
                0 => return true,
                1 => match val(&value, clause[0]) {
                    -1 => return true,
                    0 => {
                        value[clause[0].unsigned_abs() as usize] =
                            if clause[0] > 0 { 1 } else { -1 };
                        queue.push(clause[0]);
                    }
                    _ => {}
                },
                _ => {}
            }
        }
        let mut head = 0;
        while head < queue.len() {
            let falsified = -queue[head];
            head += 1;
            for &id in &self.occurs[slot(falsified)] {
                let clause = &self.clauses[id];
                let mut open = Vec::new();
                let mut satisfied = false;
                for &l in clause {
                    match val(&value, l) {
                        1 => satisfied = true,
                        0 => open.push(l),
                        _ => {}
                    }
                }
                if satisfied {
                    continue;
                }
                open.dedup();
                match open.len() {
                    0 => return true,
                    1 => {
                        value[open[0].unsigned_abs() as usize] = if open[0] > 0 { 1 } else { -1 };
                        queue.push(open[0]);
                    }
                    _ => {}
                }
            }
        }
        false
    }

    fn rup(&self, lemma: &[i32]) -> bool {
        let negated: Vec<i32> = lemma.iter().map(|&l| -l).collect();
        if lemma.iter().any(|&l| lemma.contains(&-l)) {
            return true;
        }
        self.conflict_from(&negated)
    }

    fn rat(&self, lemma: &[i32]) -> bool {
        let Some(&pivot) = lemma.first() else {
            return false;
        };
        self.clauses
            .iter()
            .filter(|d| d.contains(&-pivot))
            .all(|d| {
                let mut resolvent = lemma.to_vec();
                resolvent.extend(d.iter().copied().filter(|&l| l != -pivot));
                self.rup(&resolvent)
            })
    }
}

/// Whether the proof refutes the formula under the reference's permissive reading.
pub fn reference_refutes(variables: usize, formula: &[Vec<i32>], steps: &[Step]) -> bool {
    let max_var = steps
        .iter()
        .flat_map(|(_, c)| c.iter())
        .map(|l| l.unsigned_abs() as usize)
        .max()
        .unwrap_or(0)
        .max(variables);
    let mut db = Db::new(max_var);
    for clause in formula {
        db.add(clause.clone());
    }
    if db.conflict_from(&[]) {
        return true;
    }
    for (is_add, lemma) in steps {
        if !is_add {
            continue;
        }
        if db.rup(lemma) || db.rat(lemma) {
            if lemma.is_empty() {
                return true;
            }
            db.add(lemma.clone());
            if db.conflict_from(&[]) {
                return true;
            }
        }
    }
    false
}
