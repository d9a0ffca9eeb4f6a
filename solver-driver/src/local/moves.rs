//! The two move rules of local search, one step each.
//!
//! * **Tabu search**: evaluate every recolouring of every edge, take the best one
//!   whose edge was not recoloured in the last `tenure` steps (a tabu move is still
//!   allowed when it reaches a new best cost, the usual aspiration rule), ties broken
//!   at random. Glover, "Tabu search — Part I", ORSA J. Computing 1989.
//! * **Focused tabu search**: the same rule over the recolourings of the *bad*
//!   edges only (those in a monochromatic forbidden copy, whose counts the state
//!   keeps), the focusing of min-conflicts search (Minton, Johnston, Philips &
//!   Laird, Artificial Intelligence 1992): a step costs the bad edges, not all
//!   C(n,2), and the tenure follows their number.
//! * **Simulated annealing**: recolour a random edge to a random other colour and
//!   keep the change with the Metropolis probability exp(−Δ/T). Kirkpatrick, Gelatt
//!   & Vecchi, Science 1983.

use rand::Rng;

use ramsift_encoder::edges::{edge_count, edge_endpoints, edge_index};

use super::state::LocalState;

/// Tabu memory: the step until which each edge may not be recoloured.
#[derive(Clone, Debug)]
pub struct TabuList {
    until: Vec<u64>,
    step: u64,
}

impl TabuList {
    /// A list over the edges of K_order.
    pub fn new(order: usize) -> Self {
        Self::for_items(edge_count(order))
    }

    /// A list over `count` items numbered 0..count (edges, or edge orbits).
    pub fn for_items(count: usize) -> Self {
        TabuList {
            until: vec![0; count],
            step: 0,
        }
    }

    /// Starts a new step and returns its number.
    pub fn advance(&mut self) -> u64 {
        self.step += 1;
        self.step
    }

    /// Whether edge `e` may be recoloured at step `step`.
    pub fn free_at(&self, e: usize, step: u64) -> bool {
        self.until[e] <= step
    }

    /// Makes edge `e` tabu for `tenure.0` plus a random 0..=`tenure.1` more steps
    /// after the current one.
    pub fn forbid(&mut self, e: usize, tenure: (u64, u64), rng: &mut impl Rng) {
        self.until[e] = self.step + tenure.0 + rng.gen_range(0..=tenure.1);
    }
}

/// The candidate with the least score among those offered, ties broken
/// uniformly at random (reservoir sampling over the tied ones).
pub struct LeastOf<T> {
    least: Option<(i64, T)>,
    ties: u32,
}

impl<T> LeastOf<T> {
    pub fn new() -> Self {
        LeastOf {
            least: None,
            ties: 0,
        }
    }

    /// Offers `item` with `score`.
    pub fn offer(&mut self, score: i64, item: T, rng: &mut impl Rng) {
        match &self.least {
            Some((least, _)) if score > *least => {}
            Some((least, _)) if score == *least => {
                self.ties += 1;
                if rng.gen_range(0..self.ties) == 0 {
                    self.least = Some((score, item));
                }
            }
            _ => {
                self.ties = 1;
                self.least = Some((score, item));
            }
        }
    }

    /// The chosen candidate and its score, if any was offered.
    pub fn least(self) -> Option<(i64, T)> {
        self.least
    }
}

impl<T> Default for LeastOf<T> {
    fn default() -> Self {
        Self::new()
    }
}

/// The tabu rule over the recolourings of `edges`: the best move whose edge is
/// not tabu (or that reaches a new best cost), ties broken uniformly at random;
/// the edge is then tabu for `tenure.0` plus a random 0..=`tenure.1` more steps.
/// Returns false when no move was allowed.
fn tabu_move(
    state: &mut LocalState,
    tabu: &mut TabuList,
    best_cost: u64,
    edges: impl IntoIterator<Item = (usize, usize)>,
    tenure: (u64, u64),
    rng: &mut impl Rng,
) -> bool {
    let r = state.colours() as u8;
    let step = tabu.advance();
    let mut best = LeastOf::new();
    for (u, v) in edges {
        let free = tabu.free_at(edge_index(u, v), step);
        let (from, loss) = (state.colour(u, v), state.through(u, v) as i64);
        for to in (1..=r).filter(|&c| c != from) {
            let delta = state.copies_through(u, v, to) as i64 - loss;
            let allowed = free || (state.cost() as i64 + delta) < best_cost as i64;
            if allowed {
                best.offer(delta, (u, v, to), rng);
            }
        }
    }
    let Some((_, (u, v, to))) = best.least() else {
        return false;
    };
    state.recolour(u, v, to);
    tabu.forbid(edge_index(u, v), tenure, rng);
    true
}

/// One tabu step over every edge; returns false when no move was allowed. Edges
/// in no monochromatic copy can only make things worse or stay level; they are
/// still candidates, so that plateaus can be crossed.
pub fn tabu_step(
    state: &mut LocalState,
    tabu: &mut TabuList,
    best_cost: u64,
    rng: &mut impl Rng,
) -> bool {
    let n = state.order();
    let edges = (1..n).flat_map(|v| (0..v).map(move |u| (u, v)));
    let span = edge_count(n) as u64 / 16 + 1;
    tabu_move(state, tabu, best_cost, edges, (5, span), rng)
}

/// One focused tabu step (moves on bad edges only, tenure following their
/// number); returns false when no move was allowed or no edge is bad.
pub fn focused_tabu_step(
    state: &mut LocalState,
    tabu: &mut TabuList,
    best_cost: u64,
    rng: &mut impl Rng,
) -> bool {
    let bad = state.bad_edges();
    let span = bad.len() as u64 / 4 + 1;
    tabu_move(state, tabu, best_cost, bad, (2, span), rng)
}

/// A kick of a near-solution, to restart local search from it: every edge in a
/// remaining monochromatic copy is recoloured to a random other colour with
/// probability 1/2 (the perturbation of iterated local search, Lourenço, Martin &
/// Stützle, "Iterated local search", Handbook of Metaheuristics 2003), the rest
/// kept. Returns the kicked colouring.
pub fn kick(state: &mut LocalState, rng: &mut impl Rng) -> ramsift_encoder::Colouring {
    let r = state.colours() as u8;
    for (u, v) in state.bad_edges() {
        if r > 1 && rng.gen_bool(0.5) {
            let to = other_colour(state.colour(u, v), r, rng);
            state.recolour(u, v, to);
        }
    }
    state.to_colouring()
}

/// A colour of 1..=r other than `from`, uniformly at random (r ≥ 2).
fn other_colour(from: u8, r: u8, rng: &mut impl Rng) -> u8 {
    let to = rng.gen_range(1..r);
    if to >= from {
        to + 1
    } else {
        to
    }
}

/// One annealing step at temperature `temperature`; returns whether the move was kept.
pub fn anneal_step(state: &mut LocalState, temperature: f64, rng: &mut impl Rng) -> bool {
    let n = state.order();
    let r = state.colours() as u8;
    let (u, v) = edge_endpoints(rng.gen_range(0..edge_count(n)));
    let to = other_colour(state.colour(u, v), r, rng);
    let delta = state.delta(u, v, to);
    let keep = delta <= 0 || rng.gen::<f64>() < (-(delta as f64) / temperature).exp();
    if keep {
        state.recolour(u, v, to);
    }
    keep
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::local::pattern::Pattern;
    use rand::SeedableRng;
    use rand_chacha::ChaCha8Rng;

    #[test]
    fn tabu_reaches_a_pentagon_from_random_starts() {
        // (3,3;5) colourings exist (C5 and its complement, Radziszowski DS1).
        type Step = fn(&mut LocalState, &mut TabuList, u64, &mut ChaCha8Rng) -> bool;
        let steps: [Step; 2] = [
            |s, t, b, r| tabu_step(s, t, b, r),
            |s, t, b, r| focused_tabu_step(s, t, b, r),
        ];
        for step in steps {
            for seed in 0..10 {
                let mut rng = ChaCha8Rng::seed_from_u64(seed);
                let mut state = LocalState::random(5, &Pattern::cliques(&[3, 3]), &mut rng);
                let mut tabu = TabuList::new(5);
                let mut best = state.cost();
                for _ in 0..500 {
                    if state.cost() == 0 {
                        break;
                    }
                    step(&mut state, &mut tabu, best, &mut rng);
                    best = best.min(state.cost());
                }
                assert_eq!(state.cost(), 0, "seed {seed}");
                assert_eq!(state.recount(), 0);
                assert!(state.bad_edges().is_empty());
            }
        }
    }

    #[test]
    fn a_kick_changes_only_edges_of_remaining_copies() {
        let mut rng = ChaCha8Rng::seed_from_u64(9);
        let patterns = Pattern::cliques(&[3, 4]);
        let mut state = LocalState::random(12, &patterns, &mut rng);
        let before = state.to_colouring();
        let bad = state.bad_edges();
        let kicked = kick(&mut state, &mut rng);
        let mut changed = 0;
        for v in 0..12 {
            for u in 0..v {
                if kicked.colour(u, v) != before.colour(u, v) {
                    assert!(bad.contains(&(u, v)), "{{{u},{v}}} was in no copy");
                    changed += 1;
                }
            }
        }
        // About half of the bad edges move (a random colouring of K12 has many).
        assert!(
            changed > 0 && changed < bad.len(),
            "{changed} of {}",
            bad.len()
        );
        assert_eq!(state.cost(), state.recount());
    }

    #[test]
    fn annealing_keeps_the_cost_exact() {
        let mut rng = ChaCha8Rng::seed_from_u64(1);
        let mut state = LocalState::random(12, &Pattern::cliques(&[3, 4]), &mut rng);
        for _ in 0..2000 {
            anneal_step(&mut state, 0.5, &mut rng);
        }
        assert_eq!(state.cost(), state.recount());
    }
}
