//! The solver against varisat (a general-purpose CDCL solver from crates.io) on
//! random 3-SAT formulas near the satisfiability threshold (clause/variable ratio
//! about 4.26, common practice), and every refutation's DRAT trace against the
//! checker's DRAT code; models are checked clause by clause.

use ramsift_cdcl::{Assignment, NoHook, Outcome, ProofSink, SearchHook, Solver};
use ramsift_checker::cnf::Cnf;
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::parse_drat;
use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;
use varisat::ExtendFormula;

fn random_formula(rng: &mut ChaCha8Rng, vars: i32, clauses: usize) -> Vec<Vec<i32>> {
    (0..clauses)
        .map(|_| {
            (0..3)
                .map(|_| {
                    let v = rng.gen_range(1..=vars);
                    if rng.gen_bool(0.5) {
                        v
                    } else {
                        -v
                    }
                })
                .collect()
        })
        .collect()
}

fn varisat_says_sat(formula: &[Vec<i32>]) -> bool {
    let mut solver = varisat::Solver::new();
    for c in formula {
        let lits: Vec<varisat::Lit> = c
            .iter()
            .map(|&l| varisat::Lit::from_dimacs(l as isize))
            .collect();
        solver.add_clause(&lits);
    }
    solver.solve().unwrap()
}

/// Collects a text DRAT trace.
struct TextDrat(Vec<u8>);

impl ProofSink for TextDrat {
    fn add(&mut self, clause: &[i32]) {
        for l in clause {
            self.0.extend_from_slice(format!("{l} ").as_bytes());
        }
        self.0.extend_from_slice(b"0\n");
    }
    fn delete(&mut self, clause: &[i32]) {
        self.0.extend_from_slice(b"d ");
        self.add(clause);
    }
}

fn check_refutation(formula: &[Vec<i32>], vars: usize, trace: &[u8]) {
    let steps = parse_drat("trace", trace).expect("the trace parses");
    let cnf = Cnf::new(vars, formula.to_vec());
    check_drat(&cnf, &steps, false).expect("the DRAT trace is accepted");
}

fn satisfies(solver: &Solver<'_>, formula: &[Vec<i32>]) -> bool {
    formula.iter().all(|c| {
        c.iter()
            .any(|&l| solver.model_value(l.unsigned_abs() as usize) == Some(l > 0))
    })
}

#[test]
fn agrees_with_varisat_and_proofs_check() {
    let mut rng = ChaCha8Rng::seed_from_u64(11);
    let (mut sat, mut unsat) = (0, 0);
    for round in 0..400 {
        let vars = 20 + (round % 5) * 10;
        let formula = random_formula(&mut rng, vars, (vars as f64 * 4.26) as usize);
        let mut trace = TextDrat(Vec::new());
        let outcome = {
            let mut solver = Solver::new();
            solver.set_proof(Box::new(&mut trace));
            solver.reserve_variables(vars as usize);
            for c in &formula {
                solver.add_clause(c);
            }
            let outcome = solver.solve(&mut NoHook, &|| false, None);
            if outcome == Outcome::Satisfiable {
                assert!(
                    satisfies(&solver, &formula),
                    "round {round}: the model falsifies a clause"
                );
            }
            outcome
        };
        let expected = varisat_says_sat(&formula);
        assert_eq!(outcome == Outcome::Satisfiable, expected, "round {round}");
        if expected {
            sat += 1;
        } else {
            unsat += 1;
            check_refutation(&formula, vars as usize, &trace.0);
        }
    }
    assert!(
        sat > 50 && unsat > 50,
        "{sat} satisfiable, {unsat} unsatisfiable"
    );
}

/// A hook that forbids each complete assignment it sees, so the solver must
/// enumerate every model: the count is compared with brute force.
struct BlockEveryModel {
    seen: usize,
}

impl SearchHook for BlockEveryModel {
    fn at_fixpoint(&mut self, assignment: Assignment<'_>, complete: bool) -> Option<Vec<i32>> {
        if !complete {
            return None;
        }
        self.seen += 1;
        Some(
            (1..=assignment.variables())
                .map(|v| {
                    if assignment.value(v) == Some(true) {
                        -(v as i32)
                    } else {
                        v as i32
                    }
                })
                .collect(),
        )
    }
}

#[test]
fn hook_axioms_enumerate_every_model() {
    let mut rng = ChaCha8Rng::seed_from_u64(5);
    for round in 0..60 {
        let vars = 8 + round % 5;
        let formula = random_formula(&mut rng, vars, (vars as usize) * 3);
        let brute = (0u32..1 << vars)
            .filter(|bits| {
                formula.iter().all(|c| {
                    c.iter()
                        .any(|&l| (bits >> (l.abs() - 1) & 1 == 1) == (l > 0))
                })
            })
            .count();
        let mut solver = Solver::new();
        solver.reserve_variables(vars as usize);
        for c in &formula {
            solver.add_clause(c);
        }
        let mut hook = BlockEveryModel { seen: 0 };
        let outcome = solver.solve(&mut hook, &|| false, None);
        assert_eq!(outcome, Outcome::Unsatisfiable, "round {round}");
        assert_eq!(hook.seen, brute, "round {round}");
    }
}

/// The last model as DIMACS literals of variables 1..=vars.
fn model_literals(solver: &Solver<'_>, vars: i32) -> Vec<i32> {
    (1..=vars)
        .map(|v| match solver.model_value(v as usize) {
            Some(true) => v,
            _ => -v,
        })
        .collect()
}

/// Anchoring changes only the order of the search: on the same formulas the
/// anchored solver agrees with varisat (every refutation's trace checks), and
/// anchored at one of its own models it returns that model without a conflict.
#[test]
fn anchored_search_stays_complete_and_starts_at_its_anchor() {
    let mut rng = ChaCha8Rng::seed_from_u64(23);
    let mut returned_to_anchor = 0;
    for round in 0..200 {
        let vars = 20 + (round % 4) * 10;
        let formula = random_formula(&mut rng, vars, (vars as f64 * 4.26) as usize);
        let anchor: Vec<i32> = (1..=vars)
            .map(|v| if rng.gen_bool(0.5) { v } else { -v })
            .collect();
        let mut trace = TextDrat(Vec::new());
        let (outcome, model) = {
            let mut solver = Solver::new();
            solver.set_proof(Box::new(&mut trace));
            solver.reserve_variables(vars as usize);
            for c in &formula {
                solver.add_clause(c);
            }
            solver.anchor(&anchor);
            let outcome = solver.solve(&mut NoHook, &|| false, None);
            let model = model_literals(&solver, vars);
            if outcome == Outcome::Satisfiable {
                assert!(satisfies(&solver, &formula), "round {round}");
            }
            (outcome, model)
        };
        let expected = varisat_says_sat(&formula);
        assert_eq!(outcome == Outcome::Satisfiable, expected, "round {round}");
        if !expected {
            check_refutation(&formula, vars as usize, &trace.0);
            continue;
        }
        let mut solver = Solver::new();
        solver.reserve_variables(vars as usize);
        for c in &formula {
            solver.add_clause(c);
        }
        solver.anchor(&model);
        assert_eq!(
            solver.solve(&mut NoHook, &|| false, None),
            Outcome::Satisfiable
        );
        let again = model_literals(&solver, vars);
        assert_eq!(solver.stats().conflicts, 0, "round {round}");
        assert_eq!(again, model, "round {round}");
        returned_to_anchor += 1;
    }
    assert!(
        returned_to_anchor > 30,
        "{returned_to_anchor} satisfiable rounds"
    );
}
