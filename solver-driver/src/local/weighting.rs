//! Clique weighting: the breakout method (Morris, "The breakout method for escaping
//! from local minima", AAAI 1993), the scheme that clause-weighting local search
//! for SAT builds on, applied to monochromatic cliques instead of clauses (each
//! monochromatic clique is exactly one falsified clause of the CNF).
//!
//! Every monochromatic clique carries a weight, 1 until it has been met at a local
//! minimum. A move is scored by its *weighted* change: the weights of the cliques
//! it creates less those of the cliques it destroys. When no allowed move lowers
//! the weighted cost, the weights of the cliques present grow by one, so the
//! copies that persist become dearer than the ones a move would create, and the
//! search walks out of the minimum. Weights are smoothed back towards 1 every
//! [`DECAY_PERIOD`] increases (as in pure additive weighting, Thornton, Pham,
//! Bain & Ferreira, AAAI 2004), so old minima do not rule the search for ever.
//!
//! A clique is named by its vertex set, so a clique that comes back keeps the
//! weight it had. Forbidden graphs other than cliques are counted with weight 1
//! (their copies are not named by their vertex sets alone).

use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};

use rand::Rng;

use ramsift_encoder::edges::edge_index;

use super::moves::{LeastOf, TabuList};
use super::state::LocalState;

/// Weight increases between two smoothing passes.
pub const DECAY_PERIOD: u64 = 64;

/// A multiplicative hasher for 128-bit vertex sets (the default hasher spends
/// more time than the clique enumeration it serves).
#[derive(Default)]
pub struct VertexSetHasher(u64);

impl Hasher for VertexSetHasher {
    fn finish(&self) -> u64 {
        self.0
    }

    fn write(&mut self, bytes: &[u8]) {
        for &b in bytes {
            self.0 = (self.0.rotate_left(5) ^ u64::from(b)).wrapping_mul(0x51_7c_c1_b7_27_22_0a_95);
        }
    }

    fn write_u128(&mut self, set: u128) {
        let folded = (set as u64) ^ ((set >> 64) as u64).rotate_left(29);
        self.0 = (self.0 ^ folded).wrapping_mul(0x9e37_79b9_7f4a_7c15);
        self.0 ^= self.0 >> 32;
    }
}

/// The weights of the monochromatic cliques met at local minima; every other
/// clique weighs 1.
#[derive(Clone, Debug, Default)]
pub struct CliqueWeights {
    weights: HashMap<u128, u32, BuildHasherDefault<VertexSetHasher>>,
    increases: u64,
}

impl CliqueWeights {
    pub fn new() -> Self {
        Self::default()
    }

    /// The weight of the clique on the vertex set `set`.
    pub fn weight(&self, set: u128) -> u64 {
        self.weights.get(&set).map_or(1, |&w| u64::from(w))
    }

    /// Cliques whose weight is above 1.
    pub fn raised(&self) -> usize {
        self.weights.len()
    }

    /// Weighted monochromatic copies through {u, v} in colour `c` (1-based), the
    /// edge counted as present.
    pub fn through(&self, state: &LocalState, u: usize, v: usize, c: u8) -> u64 {
        let mut total = 0;
        let named = state.for_each_clique_through(u, v, c, &mut |set| total += self.weight(set));
        if named {
            total
        } else {
            state.copies_through(u, v, c)
        }
    }

    /// The weighted cost of the state: every monochromatic copy at its weight.
    pub fn cost(&self, state: &LocalState) -> u64 {
        let mut seen = Vec::new();
        let mut unnamed = 0;
        for (u, v) in state.bad_edges() {
            let c = state.colour(u, v);
            if !state.for_each_clique_through(u, v, c, &mut |set| seen.push(set)) {
                unnamed += state.through(u, v);
            }
        }
        seen.sort_unstable();
        seen.dedup();
        let named: u64 = seen.iter().map(|&s| self.weight(s)).sum();
        // A graph copy with e edges is met once through each of its e edges; the
        // unweighted part is only a score, so it is left as that multiple.
        named + unnamed
    }

    /// Raises by one the weight of every monochromatic clique of the state, and
    /// smooths every [`DECAY_PERIOD`] raises.
    pub fn raise_present(&mut self, state: &LocalState) {
        let mut present = Vec::new();
        for (u, v) in state.bad_edges() {
            let c = state.colour(u, v);
            state.for_each_clique_through(u, v, c, &mut |set| present.push(set));
        }
        present.sort_unstable();
        present.dedup();
        for set in present {
            *self.weights.entry(set).or_insert(1) += 1;
        }
        self.increases += 1;
        if self.increases % DECAY_PERIOD == 0 {
            self.weights.retain(|_, w| {
                *w -= 1;
                *w > 1
            });
        }
    }
}

/// One weighted step over the bad edges: the allowed move with the least
/// weighted change (ties at random) is made when that change is negative; else
/// the weights of the present cliques are raised (no move). A move is allowed
/// when its edge is not tabu, or when it reaches an unweighted cost below
/// `best_cost`. Returns false when no edge is bad.
pub fn weighted_step(
    state: &mut LocalState,
    weights: &mut CliqueWeights,
    tabu: &mut TabuList,
    best_cost: u64,
    rng: &mut impl Rng,
) -> bool {
    let bad = state.bad_edges();
    if bad.is_empty() {
        return false;
    }
    let r = state.colours() as u8;
    let step = tabu.advance();
    let mut best = LeastOf::new();
    for &(u, v) in &bad {
        let from = state.colour(u, v);
        let loss = weights.through(state, u, v, from) as i64;
        let free = tabu.free_at(edge_index(u, v), step);
        for to in (1..=r).filter(|&c| c != from) {
            let allowed = free || {
                let delta = state.copies_through(u, v, to) as i64 - state.through(u, v) as i64;
                (state.cost() as i64 + delta) < best_cost as i64
            };
            if !allowed {
                continue;
            }
            let change = weights.through(state, u, v, to) as i64 - loss;
            best.offer(change, (u, v, to), rng);
        }
    }
    match best.least() {
        Some((change, (u, v, to))) if change < 0 => {
            state.recolour(u, v, to);
            let tenure = tabu_tenure(state.order(), bad.len());
            tabu.forbid(edge_index(u, v), tenure, rng);
        }
        _ => weights.raise_present(state),
    }
    true
}

/// The tenure of the weighted rule: a fixed part that grows with the order (an
/// edge of K_n is in n − 2 triangles, so a recoloured edge's neighbourhood is
/// revisited about that often) and a random part following the bad edges.
pub fn tabu_tenure(order: usize, bad: usize) -> (u64, u64) {
    ((order / 8) as u64 + 1, bad as u64 / 8 + 1)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::local::pattern::Pattern;
    use rand::SeedableRng;
    use rand_chacha::ChaCha8Rng;

    #[test]
    fn unit_weights_give_the_plain_cost() {
        let mut rng = ChaCha8Rng::seed_from_u64(2);
        for sizes in [vec![3, 3], vec![3, 4], vec![4, 4], vec![3, 3, 3]] {
            let state = LocalState::random(11, &Pattern::cliques(&sizes), &mut rng);
            let weights = CliqueWeights::new();
            assert_eq!(weights.cost(&state), state.cost(), "{sizes:?}");
            for (u, v) in [(0, 1), (3, 7), (9, 10)] {
                for c in 1..=sizes.len() as u8 {
                    assert_eq!(
                        weights.through(&state, u, v, c),
                        state.copies_through(u, v, c)
                    );
                }
            }
        }
    }

    #[test]
    fn raising_counts_each_present_clique_once() {
        let mut rng = ChaCha8Rng::seed_from_u64(4);
        let state = LocalState::random(10, &Pattern::cliques(&[3, 3]), &mut rng);
        let mut weights = CliqueWeights::new();
        weights.raise_present(&state);
        // Every present triangle now weighs 2: the weighted cost doubles.
        assert_eq!(weights.cost(&state), 2 * state.cost());
        assert_eq!(weights.raised() as u64, state.cost());
        for _ in 1..DECAY_PERIOD {
            weights.raise_present(&state);
        }
        // 64 raises give 65, and the smoothing pass at the 64th takes one off.
        assert_eq!(weights.cost(&state), 64 * state.cost());
    }

    #[test]
    fn weighted_steps_reach_classical_witnesses() {
        // R(3,3) = 6, R(3,4) = 9, R(4,4) = 18 (Radziszowski DS1): colourings of
        // K5, K8 and K17 exist.
        for (sizes, n, steps) in [
            (vec![3, 3], 5, 500),
            (vec![3, 4], 8, 5_000),
            (vec![4, 4], 17, 200_000),
        ] {
            let mut rng = ChaCha8Rng::seed_from_u64(7);
            let mut state = LocalState::random(n, &Pattern::cliques(&sizes), &mut rng);
            let (mut weights, mut tabu) = (CliqueWeights::new(), TabuList::new(n));
            let mut best = state.cost();
            for _ in 0..steps {
                if !weighted_step(&mut state, &mut weights, &mut tabu, best, &mut rng) {
                    break;
                }
                best = best.min(state.cost());
            }
            assert_eq!(state.cost(), 0, "{sizes:?} on K{n}");
            assert_eq!(state.recount(), 0);
        }
    }
}
