//! Extension with old vertices freed, nearest the obstruction first.
//!
//! When no colouring of K_n contains a given colouring of K_(n−1), the refutation
//! used only some of the fixed old edges: with the old edges given to the solver
//! as assumptions, varisat's failed core names them. The old vertex met most often
//! by the core's edges is where the obstruction sits, so it is freed (every edge
//! at it becomes an unknown, beside the new vertex's edges), and the solver is
//! asked again with the remaining old edges assumed. One solver serves every
//! round, keeping what it learnt. The rounds end with a colouring of K_n, with
//! `max_freed` vertices freed and still none (a statement about this colouring
//! only), or at the deadline.
//!
//! Freeing k vertices of K_(n−1) and adding one is deletion of k vertices
//! followed by an extension by k + 1, so this is also the deletion-then-extension
//! step for colourings of structured families one order below.

use std::collections::HashMap;
use std::sync::atomic::AtomicBool;
use std::time::Instant;

use rand::seq::SliceRandom;
use rand::SeedableRng;
use rand_chacha::ChaCha8Rng;
use varisat::Lit;

use ramsift_encoder::edges::{edge_endpoints, edge_index};
use ramsift_encoder::Colouring;

use crate::search::attempt::{decode_model, load, AttemptPlan};
use crate::search::first_answer::verified;
use crate::search::formula::Formula;
use crate::search::interrupt::{limited_solver, SinkReport};
use crate::search::job::{SearchError, SearchResult};
use crate::search::seeding::{edge_units, Seed, SeedKind};

/// How a loosened extension ended.
#[derive(Clone, Debug)]
pub enum Loosened {
    /// A verified colouring of K_n; `freed` old vertices were freed to reach it.
    Extended {
        result: SearchResult,
        freed: Vec<usize>,
    },
    /// No colouring of K_n agrees with the given one off these freed vertices
    /// (the last round's freed set; every earlier set is a subset of it).
    None { freed: Vec<usize> },
    /// Stopped (deadline or signal) with these vertices freed.
    Stopped { freed: Vec<usize> },
}

/// Extends `base` (a colouring of K_(n−1)) to K_n, freeing up to `max_freed` old
/// vertices, nearest the obstruction first; `formula` is the plain formula at n.
/// `seed` orders the assumptions (and so chooses among equally near vertices).
pub fn extend_loosened(
    formula: &Formula,
    base: &Colouring,
    max_freed: usize,
    seed: u64,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Loosened, SearchError> {
    let mut rng = ChaCha8Rng::seed_from_u64(seed);
    let n = formula.variables().order();
    if base.order() + 1 != n {
        return Err(SearchError::ExtensionOrder {
            given: base.order(),
            order: n,
        });
    }
    let report = SinkReport::default();
    let mut solver = limited_solver(stop, deadline, &report);
    let plain = AttemptPlan::default();
    let mut freed: Vec<usize> = Vec::new();
    if load(&mut solver, formula, &plain, stop, deadline).is_some() {
        return Ok(Loosened::Stopped { freed });
    }
    loop {
        let kept = Seed::from_colouring(SeedKind::Extension, base, |i, j| {
            !freed.contains(&i) && !freed.contains(&j)
        });
        // Each assumption literal and the old edge it pins.
        let mut edge_of: HashMap<i32, usize> = HashMap::new();
        for &(edge, colour) in &kept.fixed {
            for lit in edge_units(formula.variables(), edge, colour) {
                edge_of.insert(lit, edge);
            }
        }
        // The core depends on the order of the assumptions: in edge order it
        // leans to the first vertices, so the order is shuffled, from `seed` so
        // that a run repeats itself.
        let mut assumptions: Vec<Lit> = edge_of
            .keys()
            .map(|&l| Lit::from_dimacs(l as isize))
            .collect();
        assumptions.sort_unstable_by_key(|l| (l.var().index(), l.is_negative()));
        assumptions.shuffle(&mut rng);
        solver.assume(&assumptions);
        match solver.solve() {
            Ok(true) => {
                let colouring = decode_model(&solver, formula, &plain);
                let found_by = format!(
                    "SAT extension of a colouring of K_{} with {} old vertices freed nearest the obstruction",
                    n - 1,
                    freed.len()
                );
                return Ok(Loosened::Extended {
                    result: verified(formula.instance().spec(), colouring, found_by)?,
                    freed,
                });
            }
            Ok(false) => {
                let core: Vec<usize> = solver
                    .failed_core()
                    .unwrap_or_default()
                    .iter()
                    .filter_map(|l| edge_of.get(&(l.to_dimacs() as i32)).copied())
                    .collect();
                match nearest_vertex(&core, &freed, n - 1) {
                    Some(v) if freed.len() < max_freed => freed.push(v),
                    _ => return Ok(Loosened::None { freed }),
                }
            }
            Err(_) if report.reason.get().is_some() => return Ok(Loosened::Stopped { freed }),
            Err(e) => return Err(SearchError::Backend(e.to_string())),
        }
    }
}

/// The old vertex (not yet freed) met most often by the core's edges, the least
/// such vertex on ties; `None` when the core has no edge (the formula is
/// unsatisfiable whatever the old edges are).
fn nearest_vertex(core_edges: &[usize], freed: &[usize], old: usize) -> Option<usize> {
    let mut meets = vec![0usize; old];
    for &e in core_edges {
        let (i, j) = edge_endpoints(e);
        debug_assert_eq!(edge_index(i, j), e);
        meets[i] += 1;
        meets[j] += 1;
    }
    (0..old)
        .filter(|v| !freed.contains(v) && meets[*v] > 0)
        .max_by_key(|&v| (meets[v], std::cmp::Reverse(v)))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_vertex_met_most_by_the_core_goes_first() {
        // Edges {0,1}, {0,2}, {1,2}, {0,3}: vertex 0 is met three times.
        let core = [
            edge_index(0, 1),
            edge_index(0, 2),
            edge_index(1, 2),
            edge_index(0, 3),
        ];
        assert_eq!(nearest_vertex(&core, &[], 5), Some(0));
        assert_eq!(nearest_vertex(&core, &[0], 5), Some(1));
        assert_eq!(nearest_vertex(&[], &[], 5), None);
    }

    #[test]
    fn a_stuck_colouring_is_freed_until_it_extends() {
        // K_5 coloured with colour 1 a pentagon and colour 2 its complement is a
        // (3,3)-colouring (R(3,3) = 6, DS1); a K_4 with a monochromatic path-free
        // shape that no K_5 colouring contains: the all-colour-1 triangle-free
        // colouring of K_4 cannot exist, so take K_4 coloured 1 on a 4-cycle (no
        // triangle) and 2 on its diagonals. A fifth vertex joined to a 4-cycle
        // C4 = 0-1-2-3 must avoid colour-1 triangles (so colour 1 to at most an
        // independent pair of the cycle) and colour-2 triangles (the diagonals
        // {0,2}, {1,3}: colour 2 to at most one end of each): both ends of a
        // diagonal in colour 1 then, a colour-1 pair adjacent on the cycle. So no
        // extension, and freeing a vertex gives one (the pentagon).
        let c4 = Colouring::from_fn(4, 2, |i, j| if (j - i) % 2 == 1 { 1 } else { 2 });
        let f = Formula::of_cliques(&[3, 3], 5);
        let stop = AtomicBool::new(false);
        let Loosened::Extended { result, freed } =
            extend_loosened(&f, &c4, 2, 1, &stop, None).unwrap()
        else {
            panic!("freeing a vertex of the 4-cycle colouring gives the pentagon");
        };
        assert_eq!(freed.len(), 1);
        let SearchResult::Found { colouring, .. } = result else {
            panic!("found")
        };
        // The colouring agrees with the given one off the freed vertex.
        for j in 0..4 {
            for i in 0..j {
                if !freed.contains(&i) && !freed.contains(&j) {
                    assert_eq!(colouring.colour(i, j), c4.colour(i, j));
                }
            }
        }
        // With nothing allowed to be freed the answer is none.
        assert!(matches!(
            extend_loosened(&f, &c4, 0, 1, &stop, None).unwrap(),
            Loosened::None { .. }
        ));
    }

    #[test]
    fn at_the_ramsey_number_freeing_everything_still_gives_none() {
        // R(3,4) = 9 (DS1): no colouring of K9, whatever is freed.
        let f = Formula::of_cliques(&[3, 4], 9);
        let base = Colouring::from_fn(8, 2, |i, j| {
            if (j - i) % 8 == 1 || (j - i) % 8 == 7 {
                1
            } else {
                2
            }
        });
        let stop = AtomicBool::new(false);
        let Loosened::None { freed } = extend_loosened(&f, &base, 8, 1, &stop, None).unwrap()
        else {
            panic!("R(3,4) = 9: no (3,4)-colouring of K9");
        };
        assert!(freed.len() <= 8);
    }
}
