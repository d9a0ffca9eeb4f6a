//! Cross-check against a general-purpose reference library: varisat's own proof
//! checker (the varisat-checker crate) accepts varisat's native proof of a random
//! formula exactly when our checker accepts varisat's DRAT trace of the same
//! formula; and a satisfiable formula never yields an accepted refutation.

use proptest::prelude::*;
use varisat::checker::{CheckedProofStep, Checker, CheckerData, ProofProcessor};
use varisat::{CnfFormula, ExtendFormula, Lit, ProofFormat, Solver};

use ramsift_checker::cnf::Cnf;
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::parse_drat;
use ramsift_checker::lrat::{check_lrat, parse_lrat, write_lrat};

/// Records whether the reference checker derived the empty clause.
#[derive(Default)]
struct SawEmptyClause(bool);

impl ProofProcessor for SawEmptyClause {
    fn process_step(
        &mut self,
        step: &CheckedProofStep,
        _: CheckerData,
    ) -> Result<(), anyhow::Error> {
        if let CheckedProofStep::AtClause { clause, .. } = step {
            if clause.is_empty() {
                self.0 = true;
            }
        }
        Ok(())
    }
}

fn solve_with_proof(clauses: &[Vec<i32>], format: ProofFormat) -> (bool, Vec<u8>) {
    let mut proof = Vec::new();
    let sat;
    {
        let mut solver = Solver::new();
        solver.write_proof(&mut proof, format);
        for c in clauses {
            let lits: Vec<Lit> = c.iter().map(|&l| Lit::from_dimacs(l as isize)).collect();
            solver.add_clause(&lits);
        }
        sat = solver.solve().unwrap();
        solver.close_proof().unwrap();
    }
    (sat, proof)
}

/// The reference verdict: varisat-checker accepts the native proof of the formula
/// and derives the empty clause.
fn reference_accepts(clauses: &[Vec<i32>], native_proof: &[u8]) -> bool {
    let mut formula = CnfFormula::new();
    for c in clauses {
        let lits: Vec<Lit> = c.iter().map(|&l| Lit::from_dimacs(l as isize)).collect();
        formula.add_clause(&lits);
    }
    let mut saw = SawEmptyClause::default();
    let ok = {
        let mut checker = Checker::new();
        checker.add_processor(&mut saw);
        checker.add_formula(&formula).unwrap();
        checker.check_proof(native_proof).is_ok()
    };
    ok && saw.0
}

fn clauses_strategy() -> impl Strategy<Value = (usize, Vec<Vec<i32>>)> {
    (3usize..=9).prop_flat_map(|vars| {
        let lit = (1..=vars as i32, any::<bool>()).prop_map(|(v, neg)| if neg { -v } else { v });
        (
            Just(vars),
            proptest::collection::vec(proptest::collection::vec(lit, 1..=3), 4..=45),
        )
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn our_drat_verdict_matches_the_reference_checker((vars, clauses) in clauses_strategy()) {
        let (sat_native, native) = solve_with_proof(&clauses, ProofFormat::Varisat);
        let (sat_drat, drat) = solve_with_proof(&clauses, ProofFormat::BinaryDrat);
        prop_assert_eq!(sat_native, sat_drat);
        let cnf = Cnf::new(vars, clauses.clone());
        let steps = parse_drat("trace", &drat).unwrap();
        let ours = check_drat(&cnf, &steps, true);
        let reference = reference_accepts(&clauses, &native);
        prop_assert_eq!(ours.is_ok(), reference, "sat = {}", sat_drat);
        if sat_drat {
            prop_assert!(ours.is_err(), "a satisfiable formula's trace was accepted as a refutation");
        }
        // The LRAT we emit is accepted by the forward LRAT checker.
        if let Ok((_, Some(lrat))) = ours {
            let text = write_lrat(&lrat);
            let lines = parse_lrat("emitted", text.as_bytes()).unwrap();
            prop_assert!(check_lrat(&cnf, &lines).is_ok());
        }
    }
}
