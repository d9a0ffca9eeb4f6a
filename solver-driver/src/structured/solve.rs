//! Solving a family's orbit formula with varisat, under the same stop flag and
//! deadline as every other search, and turning a model into a verified colouring.

use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};

use varisat::{ExtendFormula, Lit};

use ramsift_encoder::{Colouring, RamseySpec};

use super::families::{EdgeOrbits, FamilyError};
use super::orbit_formula::{orbit_literal, OrbitFormula};
use crate::certify::witness_check::verify_witness;
use crate::search::interrupt::{limited_solver, SinkReport};
use crate::search::job::SearchError;

/// How a family search at one order ended.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum FamilyOutcome {
    /// A colouring of the family, verified by the checker's code.
    Found {
        colouring: Colouring,
        /// Colour of each orbit.
        orbit_colours: Vec<u8>,
        /// E.g. "colour 1: distances {1,2,4,8}; colour 2: distances {3,5,6,7}".
        description: String,
    },
    /// The orbit formula is unsatisfiable: no colouring of this family exists.
    NoneInFamily,
    /// Stopped by the deadline or the stop flag.
    Unknown,
}

/// A family search's outcome and what it cost.
#[derive(Clone, Debug)]
pub struct FamilyReport {
    pub family: String,
    pub order: usize,
    pub outcome: FamilyOutcome,
    pub orbits: usize,
    pub clauses: usize,
    pub elapsed: Duration,
}

/// Errors of a family search: the family cannot be built, or the solver failed.
#[derive(Debug, thiserror::Error)]
pub enum FamilySearchError {
    #[error(transparent)]
    Family(#[from] FamilyError),
    #[error(transparent)]
    Search(#[from] SearchError),
}

impl From<FamilySearchError> for SearchError {
    fn from(e: FamilySearchError) -> Self {
        match e {
            FamilySearchError::Family(e) => SearchError::Family(e),
            FamilySearchError::Search(e) => e,
        }
    }
}

/// Searches one family for a colouring of K_n avoiding the specification's cliques.
pub fn search_family(
    orbits: &EdgeOrbits,
    spec: &RamseySpec,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<FamilyReport, FamilySearchError> {
    let started = Instant::now();
    if !spec.is_cliques() {
        return Err(FamilyError::NeedsCliques {
            spec: spec.to_string(),
        }
        .into());
    }
    let Some(formula) = OrbitFormula::new_until(orbits, spec, deadline) else {
        return Ok(FamilyReport {
            family: orbits.kind.to_string(),
            order: orbits.order,
            outcome: FamilyOutcome::Unknown,
            orbits: orbits.orbit_count,
            clauses: 0,
            elapsed: started.elapsed(),
        });
    };
    let outcome = solve_orbit_formula(&formula, stop, deadline)?;
    let outcome = match outcome {
        Some(Some(values)) => {
            let r = formula.colours;
            let orbit_colours = decode_orbits(&values, orbits.orbit_count, r);
            let colouring = orbits.expand(&orbit_colours, r);
            let verdict = verify_witness(spec, &colouring);
            if !verdict.is_valid() {
                return Err(SearchError::WitnessRejected(verdict.to_string()).into());
            }
            FamilyOutcome::Found {
                description: orbits.describe(&orbit_colours, r),
                colouring,
                orbit_colours,
            }
        }
        Some(None) => FamilyOutcome::NoneInFamily,
        None => FamilyOutcome::Unknown,
    };
    Ok(FamilyReport {
        family: orbits.kind.to_string(),
        order: orbits.order,
        outcome,
        orbits: orbits.orbit_count,
        clauses: formula.clauses.len(),
        elapsed: started.elapsed(),
    })
}

/// The colour of each orbit in a model: the smallest colour whose literal is true
/// (as the encoder decodes edges).
fn decode_orbits(values: &[bool], orbit_count: usize, r: usize) -> Vec<u8> {
    (0..orbit_count)
        .map(|o| {
            (1..=r)
                .find(|&c| {
                    let lit = orbit_literal(o, c, r);
                    values[lit.unsigned_abs() as usize - 1] == (lit > 0)
                })
                .unwrap_or(1) as u8
        })
        .collect()
}

/// `Some(Some(model))` satisfiable, `Some(None)` unsatisfiable, `None` stopped.
fn solve_orbit_formula(
    formula: &OrbitFormula,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<Option<Vec<bool>>>, SearchError> {
    let (models, exhausted) = orbit_models(formula, 1, stop, deadline)?;
    Ok(match models.into_iter().next() {
        Some(model) => Some(Some(model)),
        None if exhausted => Some(None),
        None => None,
    })
}

/// Up to `limit` distinct models (each blocked once found), and whether the formula
/// ran out of models (false when the limit or the deadline came first).
fn orbit_models(
    formula: &OrbitFormula,
    limit: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<(Vec<Vec<bool>>, bool), SearchError> {
    let report = SinkReport::default();
    let mut solver = limited_solver(stop, deadline, &report);
    let mut buffer = Vec::new();
    for clause in &formula.clauses {
        buffer.clear();
        buffer.extend(clause.iter().map(|&l| Lit::from_dimacs(l as isize)));
        solver.add_clause(&buffer);
    }
    let mut models = Vec::new();
    while models.len() < limit {
        match solver.solve() {
            Ok(true) => {
                // Variables that occur in no clause still need a value.
                let mut values = vec![false; formula.variable_count];
                for lit in solver.model().unwrap_or_default() {
                    let var = lit.var().to_dimacs() as usize;
                    if var >= 1 && var <= values.len() {
                        values[var - 1] = lit.is_positive();
                    }
                }
                let block: Vec<Lit> = values
                    .iter()
                    .enumerate()
                    .map(|(i, &v)| {
                        Lit::from_dimacs(if v { -(i as isize + 1) } else { i as isize + 1 })
                    })
                    .collect();
                solver.add_clause(&block);
                models.push(values);
            }
            Ok(false) => return Ok((models, true)),
            Err(_) if report.reason.get().is_some() => return Ok((models, false)),
            Err(e) => return Err(SearchError::Backend(e.to_string())),
        }
    }
    Ok((models, false))
}

/// Up to `limit` distinct colourings of a family (distinct as orbit colourings),
/// each verified by the checker's code.
pub fn family_colourings(
    orbits: &EdgeOrbits,
    spec: &RamseySpec,
    limit: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Vec<Colouring>, FamilySearchError> {
    if !spec.is_cliques() {
        return Err(FamilyError::NeedsCliques {
            spec: spec.to_string(),
        }
        .into());
    }
    let Some(formula) = OrbitFormula::new_until(orbits, spec, deadline) else {
        return Ok(Vec::new());
    };
    let (models, _) = orbit_models(&formula, limit, stop, deadline)?;
    let r = formula.colours;
    let mut out = Vec::new();
    for values in models {
        let orbit_colours = decode_orbits(&values, orbits.orbit_count, r);
        let colouring = orbits.expand(&orbit_colours, r);
        let verdict = verify_witness(spec, &colouring);
        if !verdict.is_valid() {
            return Err(SearchError::WitnessRejected(verdict.to_string()).into());
        }
        out.push(colouring);
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn run(orbits: &EdgeOrbits, sizes: &[usize]) -> FamilyOutcome {
        let stop = AtomicBool::new(false);
        search_family(orbits, &RamseySpec::cliques(sizes).unwrap(), &stop, None)
            .unwrap()
            .outcome
    }

    #[test]
    fn pentagon_is_the_circulant_triangle_free_colouring_of_k5() {
        // C5 and its complement: the (3,3;5) colouring (Radziszowski DS1).
        let FamilyOutcome::Found { colouring, .. } =
            run(&EdgeOrbits::circulant(5).unwrap(), &[3, 3])
        else {
            panic!("C5 is circulant");
        };
        assert_ne!(colouring.colour(0, 1), colouring.colour(0, 2));
        // R(3,3) = 6: nothing at all at 6, so no circulant either.
        assert_eq!(
            run(&EdgeOrbits::circulant(6).unwrap(), &[3, 3]),
            FamilyOutcome::NoneInFamily
        );
    }

    proptest::proptest! {
        /// Within a prescribed automorphism's family the orbit formula (anchored
        /// at each cycle's first vertex) is exact: SAT finds a colouring exactly
        /// when trying every orbit colouring with the checker's code finds one.
        #[test]
        fn automorphism_families_agree_with_trying_every_orbit_colouring(
            lengths in proptest::collection::vec(1usize..=5, 1..=4),
            sizes in proptest::sample::select(vec![vec![3, 3], vec![3, 4], vec![4, 4], vec![3, 3, 3]]),
        ) {
            let cycles = crate::local::VertexCycles::new(lengths);
            proptest::prop_assume!(cycles.order() >= 3);
            let orbits = EdgeOrbits::invariant_under(&cycles).unwrap();
            proptest::prop_assume!(orbits.orbit_count <= 12);
            agrees_with_trying_every_orbit_colouring(&orbits, &sizes)?;
        }

        /// The same for distance colourings, where no group acts and the
        /// formula's exactness rests on translating cliques.
        #[test]
        fn distance_families_agree_with_trying_every_orbit_colouring(
            order in 3usize..=12,
            sizes in proptest::sample::select(vec![vec![3, 3], vec![3, 4], vec![4, 4], vec![3, 3, 3]]),
        ) {
            let orbits = EdgeOrbits::distance(order).unwrap();
            agrees_with_trying_every_orbit_colouring(&orbits, &sizes)?;
        }
    }

    /// SAT over the orbit formula finds a colouring of the family exactly when
    /// one of its orbit colourings passes the checker's code.
    fn agrees_with_trying_every_orbit_colouring(
        orbits: &EdgeOrbits,
        sizes: &[usize],
    ) -> Result<(), proptest::test_runner::TestCaseError> {
        let spec = RamseySpec::cliques(sizes).unwrap();
        let r = sizes.len();
        let mut exists = false;
        let mut colours = vec![1u8; orbits.orbit_count];
        'all: loop {
            if verify_witness(&spec, &orbits.expand(&colours, r)).is_valid() {
                exists = true;
                break;
            }
            for slot in colours.iter_mut() {
                if (*slot as usize) < r {
                    *slot += 1;
                    continue 'all;
                }
                *slot = 1;
            }
            break;
        }
        let outcome = run(orbits, sizes);
        proptest::prop_assert_eq!(
            matches!(outcome, FamilyOutcome::Found { .. }),
            exists,
            "{}: {:?}",
            orbits.kind,
            outcome
        );
        Ok(())
    }
}
