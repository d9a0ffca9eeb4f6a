//! Random partial colourings that seed the non-complete workers.
//!
//! Three kinds, drawn at random for each attempt:
//! * **star**: vertex 0's edges coloured in blocks (colour 1 to vertices 1..=d1,
//!   colour 2 to the next d2, …) with random block sizes. Up to relabelling every
//!   colouring has this form for its own vertex 0, so this guesses only the degrees;
//! * **random subset**: a few percent of the edges fixed from a uniformly random
//!   colouring;
//! * **circulant subset**: some edges fixed from a random circulant colouring (the
//!   colour of {i, j} depends only on the distance |i - j| mod n), the shape of many
//!   classical extremal colourings.
//!
//! Seeds only steer the search: an attempt that is unsatisfiable under its seed
//! says nothing, and the one unseeded worker keeps the search complete.
//! [`seeded_attempt`] is the one budgeted attempt under a seed (the portfolio's
//! workers and the hybrid's stages use it). Seeds taken from whole colourings
//! ([`Seed::from_colouring`]): the circulant neighbours of the hybrid search,
//! near-solutions of local search ([`near_solution_seeds`]), and the fixed parts
//! of extension ([`extension_seed`]) and repair ([`repair_seed`]), which solve
//! with them completely ([`Seed::solve`]).

use std::collections::HashSet;
use std::fmt;
use std::sync::atomic::AtomicBool;
use std::time::Instant;

use rand::seq::index::sample;
use rand::seq::SliceRandom;
use rand::Rng;
use rand_chacha::ChaCha8Rng;

use ramsift_encoder::edges::{edge_count, edge_index};
use ramsift_encoder::{Colouring, VariableMap};

use super::attempt::{run_attempt, AttemptError, AttemptOutcome, AttemptPlan};
use super::first_answer::verified;
use super::formula::Formula;
use super::job::{SearchError, SearchJob, SearchResult};
use super::portfolio::luby;
use crate::local::{LocalState, Pattern};

/// Which construction a seed came from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SeedKind {
    Star,
    RandomSubset,
    CirculantSubset,
    /// The edges of a circulant colouring of K_{n-1} (see [`crate::search::hybrid`]).
    CirculantNeighbour,
    /// The edges of a local-search near-solution in no monochromatic clique.
    NearSolution,
    /// Every edge of a given colouring of K_{n-1} (see [`crate::search::extension`]).
    Extension,
}

impl fmt::Display for SeedKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            SeedKind::Star => "star seed",
            SeedKind::RandomSubset => "random-subset seed",
            SeedKind::CirculantSubset => "circulant-subset seed",
            SeedKind::CirculantNeighbour => "circulant colouring of K_(n-1)",
            SeedKind::NearSolution => "local-search near-solution",
            SeedKind::Extension => "given colouring of K_(n-1)",
        })
    }
}

/// A partial colouring as unit literals.
#[derive(Clone, Debug)]
pub struct Seed {
    pub kind: SeedKind,
    /// (edge index, colour) pairs.
    pub fixed: Vec<(usize, usize)>,
}

impl Seed {
    /// The edges {i,j} of `colouring` for which `keep(i, j)` holds, fixed to their colours.
    pub fn from_colouring(
        kind: SeedKind,
        colouring: &Colouring,
        keep: impl Fn(usize, usize) -> bool,
    ) -> Seed {
        let n = colouring.order();
        let fixed = (0..n)
            .flat_map(|j| (0..j).map(move |i| (i, j)))
            .filter(|&(i, j)| keep(i, j))
            .map(|(i, j)| (edge_index(i, j), colouring.colour(i, j) as usize))
            .collect();
        Seed { kind, fixed }
    }

    /// One complete attempt on `formula` with this seed's edges fixed (no
    /// renaming, no budget): how extension and repair solve.
    pub fn solve(
        &self,
        formula: &Formula,
        stop: &AtomicBool,
        deadline: Option<Instant>,
    ) -> Result<AttemptOutcome, AttemptError> {
        let plan = AttemptPlan {
            units: self.units(formula.variables()),
            ..AttemptPlan::default()
        };
        Ok(run_attempt(formula, &plan, stop, deadline)?.outcome)
    }

    /// Unit clauses pinning each fixed edge to its colour.
    pub fn units(&self, vars: &VariableMap) -> Vec<i32> {
        let mut units = Vec::new();
        for &(edge, colour) in &self.fixed {
            units.extend(edge_units(vars, edge, colour));
        }
        units
    }
}

/// The literals that pin edge `edge` to `colour`: one with two colours, one per
/// colour otherwise.
pub fn edge_units(
    vars: &VariableMap,
    edge: usize,
    colour: usize,
) -> impl Iterator<Item = i32> + '_ {
    let r = vars.colours();
    let colours = if r == 2 { colour..=colour } else { 1..=r };
    colours.map(move |c| {
        let lit = vars.colour_literal(edge, c);
        if c == colour {
            lit
        } else {
            -lit
        }
    })
}

/// One budgeted attempt under `seed`: a random renaming and clause order from
/// `rng`, the seed's edges fixed, and a proof-byte budget of the job's base budget
/// times the Luby sequence at `attempt`. `Some` with a verified colouring when it
/// found one; `who` names the worker in the colouring's account.
#[allow(clippy::too_many_arguments)]
pub fn seeded_attempt(
    job: &SearchJob,
    formula: &Formula,
    seed: &Seed,
    rng: &mut ChaCha8Rng,
    attempt: u64,
    who: &str,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<SearchResult>, SearchError> {
    let mut plan = AttemptPlan::shuffled(formula, rng);
    plan.units = seed.units(formula.variables());
    plan.budget_bytes = Some(job.options.base_budget_bytes.saturating_mul(luby(attempt)));
    let report = run_attempt(formula, &plan, stop, deadline)?;
    job.count_attempt(report.proof_bytes);
    match report.outcome {
        AttemptOutcome::Satisfiable(c) => {
            let by = format!(
                "{who} seeded by a {} ({} edges fixed)",
                seed.kind,
                seed.fixed.len()
            );
            verified(job.spec(), c, by).map(Some)
        }
        _ => Ok(None),
    }
}

/// Every edge of `base`, a colouring of K_(n-1), fixed: the SAT solver colours the
/// new vertex's edges.
pub fn extension_seed(base: &Colouring) -> Seed {
    Seed::from_colouring(SeedKind::Extension, base, |_, _| true)
}

/// The edges of a near-solution that repair keeps: all but its `bad` edges (those
/// in a monochromatic forbidden copy, i < j).
pub fn repair_seed(near: &Colouring, bad: &[(usize, usize)]) -> Seed {
    Seed::from_colouring(SeedKind::NearSolution, near, |i, j| {
        !bad.contains(&(i.min(j), i.max(j)))
    })
}

/// Seeds from a near-solution: every edge in no monochromatic forbidden copy
/// fixed; then the same with a random fifth of those edges released.
pub fn near_solution_seeds(
    near: &Colouring,
    patterns: &[Pattern],
    rng: &mut ChaCha8Rng,
) -> Vec<Seed> {
    let state = LocalState::new(near, patterns);
    let bad: HashSet<(usize, usize)> = state.bad_edges().into_iter().collect();
    let good =
        Seed::from_colouring(SeedKind::NearSolution, near, |i, j| !bad.contains(&(i, j))).fixed;
    let mut released = good.clone();
    released.shuffle(rng);
    released.truncate(good.len() * 4 / 5);
    released.sort_unstable();
    vec![
        Seed {
            kind: SeedKind::NearSolution,
            fixed: good,
        },
        Seed {
            kind: SeedKind::NearSolution,
            fixed: released,
        },
    ]
}

/// Draws a seed of a random kind.
pub fn draw_seed(order: usize, colours: usize, rng: &mut impl Rng) -> Seed {
    match rng.gen_range(0..3) {
        0 => star_seed(order, colours, rng),
        1 => subset_seed(order, colours, rng, SeedKind::RandomSubset),
        _ => subset_seed(order, colours, rng, SeedKind::CirculantSubset),
    }
}

fn star_seed(order: usize, colours: usize, rng: &mut impl Rng) -> Seed {
    // Random cut points split vertices 1..order into `colours` consecutive blocks.
    let mut cuts: Vec<usize> = (0..colours - 1).map(|_| rng.gen_range(0..order)).collect();
    cuts.sort_unstable();
    let fixed = (1..order)
        .map(|v| {
            let colour = 1 + cuts.iter().filter(|&&c| c < v).count();
            (edge_index(0, v), colour)
        })
        .collect();
    Seed {
        kind: SeedKind::Star,
        fixed,
    }
}

fn subset_seed(order: usize, colours: usize, rng: &mut impl Rng, kind: SeedKind) -> Seed {
    let edges = edge_count(order);
    let (low, high) = match kind {
        SeedKind::RandomSubset => (0.02, 0.10),
        _ => (0.05, 0.25),
    };
    let count = ((edges as f64 * rng.gen_range(low..high)) as usize).clamp(1, edges.max(1));
    let by_distance: Vec<usize> = (0..=order / 2)
        .map(|_| rng.gen_range(1..=colours))
        .collect();
    let mut fixed: Vec<(usize, usize)> = sample(rng, edges, count.min(edges))
        .into_iter()
        .map(|e| {
            let colour = match kind {
                SeedKind::CirculantSubset => {
                    let (i, j) = ramsift_encoder::edges::edge_endpoints(e);
                    let d = (j - i).min(order - (j - i));
                    by_distance[d]
                }
                _ => rng.gen_range(1..=colours),
            };
            (e, colour)
        })
        .collect();
    fixed.sort_unstable();
    Seed { kind, fixed }
}

#[cfg(test)]
mod tests {
    use super::*;
    use ramsift_encoder::edges::edge_endpoints;
    use rand::SeedableRng;
    use rand_chacha::ChaCha8Rng;

    #[test]
    fn star_colours_every_edge_at_vertex_zero_in_blocks() {
        let mut rng = ChaCha8Rng::seed_from_u64(3);
        let seed = star_seed(10, 3, &mut rng);
        assert_eq!(seed.fixed.len(), 9);
        let colours: Vec<usize> = seed.fixed.iter().map(|&(_, c)| c).collect();
        assert!(colours.windows(2).all(|w| w[0] <= w[1]), "{colours:?}");
    }

    #[test]
    fn seeds_are_reproducible_and_within_range() {
        let a = draw_seed(17, 2, &mut ChaCha8Rng::seed_from_u64(9));
        let b = draw_seed(17, 2, &mut ChaCha8Rng::seed_from_u64(9));
        assert_eq!(a.fixed, b.fixed);
        for kind_seed in 0..30 {
            let s = draw_seed(12, 3, &mut ChaCha8Rng::seed_from_u64(kind_seed));
            assert!(s
                .fixed
                .iter()
                .all(|&(e, c)| e < edge_count(12) && (1..=3).contains(&c)));
            let vars = VariableMap::new(12, 3);
            assert_eq!(s.units(&vars).len(), 3 * s.fixed.len());
        }
    }

    #[test]
    fn near_solution_seeds_leave_the_bad_edges_free() {
        // The pentagon colouring of K5 (colour 1 at distance ±1) plus vertex 5,
        // joined in colour 1 to 0 and 2 and in colour 2 to 1, 3 and 4: for (3,3)
        // the colour-2 triangle {1,3,5} is bad, most other edges are not.
        let near = Colouring::from_fn(6, 2, |i, j| match (i, j) {
            (0 | 2, 5) => 1,
            (_, 5) => 2,
            _ if j - i == 1 || j - i == 4 => 1,
            _ => 2,
        });
        let state = LocalState::new(&near, &Pattern::cliques(&[3, 3]));
        let bad: Vec<usize> = state
            .bad_edges()
            .into_iter()
            .map(|(i, j)| edge_index(i, j))
            .collect();
        assert!(bad.contains(&edge_index(1, 3)) && !bad.contains(&edge_index(0, 1)));
        let mut rng = ChaCha8Rng::seed_from_u64(1);
        let seeds = near_solution_seeds(&near, &Pattern::cliques(&[3, 3]), &mut rng);
        assert!(!bad.is_empty() && bad.len() < 15);
        assert_eq!(seeds[0].fixed.len() + bad.len(), 15);
        for seed in &seeds {
            for &(edge, colour) in &seed.fixed {
                assert!(!bad.contains(&edge));
                let (i, j) = edge_endpoints(edge);
                assert_eq!(near.colour(i, j) as usize, colour);
            }
        }
        assert!(seeds[1].fixed.len() < seeds[0].fixed.len());
    }
}
