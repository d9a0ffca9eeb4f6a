//! A full colouring of K_n held for local search: the colour of each edge and, per
//! colour, each vertex's neighbourhood as a 128-bit set, so that the change in the
//! number of monochromatic forbidden cliques caused by recolouring one edge is
//! computed from common neighbourhoods alone (the *delta*), without a recount.
//!
//! Recolouring {u, v} from a to b destroys exactly the monochromatic K_{k_a} of
//! colour a through u and v, that is the (k_a − 2)-cliques of colour a inside
//! N_a(u) ∩ N_a(v), and creates exactly the (k_b − 2)-cliques of colour b inside
//! N_b(u) ∩ N_b(v).

use rand::Rng;

use ramsift_encoder::edges::{edge_count, edge_index};
use ramsift_encoder::Colouring;

/// The largest order local search handles (neighbourhoods are 128-bit sets).
pub const MAX_LOCAL_ORDER: usize = 128;

/// A colouring with per-colour neighbourhood sets and its clique count.
#[derive(Clone, Debug)]
pub struct LocalState {
    order: usize,
    sizes: Vec<usize>,
    /// Colour (0-based) of each edge, by edge index.
    colour: Vec<u8>,
    /// `neighbours[c * order + v]`: the colour-c neighbours of v.
    neighbours: Vec<u128>,
    /// Number of monochromatic forbidden cliques, kept up to date by [`Self::recolour`].
    cost: u64,
}

/// Number of `need`-cliques inside `candidates` in the graph `neighbours`.
pub fn count_cliques(neighbours: &[u128], candidates: u128, need: usize) -> u64 {
    match need {
        0 => 1,
        1 => u64::from(candidates.count_ones()),
        _ => {
            let mut total = 0;
            let mut rest = candidates;
            while rest != 0 {
                let v = rest.trailing_zeros() as usize;
                rest &= rest - 1;
                // Only later vertices, so each clique is counted once.
                let next = rest & neighbours[v];
                if need == 2 {
                    total += u64::from(next.count_ones());
                } else if next.count_ones() as usize >= need - 1 {
                    total += count_cliques(neighbours, next, need - 1);
                }
            }
            total
        }
    }
}

impl LocalState {
    /// The state of a colouring (colours 1..=r) for forbidden clique sizes `sizes`.
    pub fn new(colouring: &Colouring, sizes: &[usize]) -> Self {
        let n = colouring.order();
        assert!(
            n <= MAX_LOCAL_ORDER,
            "local search handles orders up to {MAX_LOCAL_ORDER}"
        );
        assert_eq!(colouring.colours(), sizes.len());
        let mut state = LocalState {
            order: n,
            sizes: sizes.to_vec(),
            colour: vec![0; edge_count(n)],
            neighbours: vec![0; sizes.len() * n],
            cost: 0,
        };
        for j in 0..n {
            for i in 0..j {
                let c = colouring.colour(i, j) - 1;
                state.colour[edge_index(i, j)] = c;
                state.neighbours[c as usize * n + i] |= 1 << j;
                state.neighbours[c as usize * n + j] |= 1 << i;
            }
        }
        state.cost = state.recount();
        state
    }

    /// A uniformly random colouring.
    pub fn random(order: usize, sizes: &[usize], rng: &mut impl Rng) -> Self {
        let r = sizes.len();
        let colouring = Colouring::from_fn(order, r, |_, _| rng.gen_range(1..=r as u8));
        Self::new(&colouring, sizes)
    }

    pub fn order(&self) -> usize {
        self.order
    }

    pub fn colours(&self) -> usize {
        self.sizes.len()
    }

    /// Monochromatic forbidden cliques now.
    pub fn cost(&self) -> u64 {
        self.cost
    }

    /// Colour (1-based) of edge {u, v}.
    pub fn colour(&self, u: usize, v: usize) -> u8 {
        self.colour[edge_index(u, v)] + 1
    }

    fn graph(&self, c: usize) -> &[u128] {
        &self.neighbours[c * self.order..(c + 1) * self.order]
    }

    /// Cliques of colour `c` (1-based) that edge {u, v} would complete if it had
    /// colour c: the (k_c − 2)-cliques of colour c in the common neighbourhood.
    pub fn cliques_through(&self, u: usize, v: usize, c: u8) -> u64 {
        let c = c as usize - 1;
        let graph = self.graph(c);
        count_cliques(graph, graph[u] & graph[v], self.sizes[c] - 2)
    }

    /// Change of the cost if edge {u, v} were recoloured `to` (1-based).
    pub fn delta(&self, u: usize, v: usize, to: u8) -> i64 {
        let from = self.colour(u, v);
        if from == to {
            return 0;
        }
        self.cliques_through(u, v, to) as i64 - self.cliques_through(u, v, from) as i64
    }

    /// Recolours edge {u, v}, updating the cost by the delta.
    pub fn recolour(&mut self, u: usize, v: usize, to: u8) {
        let delta = self.delta(u, v, to);
        let from = self.colour(u, v) as usize - 1;
        let to0 = to as usize - 1;
        let n = self.order;
        self.neighbours[from * n + u] &= !(1 << v);
        self.neighbours[from * n + v] &= !(1 << u);
        self.neighbours[to0 * n + u] |= 1 << v;
        self.neighbours[to0 * n + v] |= 1 << u;
        self.colour[edge_index(u, v)] = to0 as u8;
        self.cost = (self.cost as i64 + delta) as u64;
    }

    /// Counts every monochromatic forbidden clique from scratch.
    pub fn recount(&self) -> u64 {
        (0..self.colours())
            .map(|c| {
                let all = if self.order == 128 {
                    u128::MAX
                } else {
                    (1u128 << self.order) - 1
                };
                count_cliques(self.graph(c), all, self.sizes[c])
            })
            .sum()
    }

    /// Edges {u, v} (u < v) that lie in at least one monochromatic forbidden clique.
    pub fn bad_edges(&self) -> Vec<(usize, usize)> {
        let mut bad = Vec::new();
        for v in 0..self.order {
            for u in 0..v {
                if self.cliques_through(u, v, self.colour(u, v)) > 0 {
                    bad.push((u, v));
                }
            }
        }
        bad
    }

    /// The colouring.
    pub fn to_colouring(&self) -> Colouring {
        Colouring::from_fn(self.order, self.colours(), |i, j| self.colour(i, j))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;
    use rand::{Rng, SeedableRng};
    use rand_chacha::ChaCha8Rng;

    /// Direct count over all vertex subsets, for comparison.
    fn brute_force(colouring: &Colouring, sizes: &[usize]) -> u64 {
        let n = colouring.order();
        let mut total = 0;
        for (c, &k) in sizes.iter().enumerate() {
            ramsift_encoder::combinations::for_each_subset::<()>(n, k, |s| {
                let mono = s.iter().enumerate().all(|(p, &a)| {
                    s[p + 1..]
                        .iter()
                        .all(|&b| colouring.colour(a, b) as usize == c + 1)
                });
                total += u64::from(mono);
                Ok(())
            })
            .unwrap();
        }
        total
    }

    #[test]
    fn counts_agree_with_brute_force() {
        let mut rng = ChaCha8Rng::seed_from_u64(5);
        for (sizes, n) in [
            (vec![3, 3], 9),
            (vec![3, 4], 10),
            (vec![3, 3, 3], 8),
            (vec![4, 4], 12),
        ] {
            let state = LocalState::random(n, &sizes, &mut rng);
            assert_eq!(state.cost(), brute_force(&state.to_colouring(), &sizes));
        }
    }

    proptest! {
        /// The delta evaluation equals a full recount after every move.
        #[test]
        fn delta_equals_recount_after_every_move(
            sizes in proptest::collection::vec(3usize..=5, 2..=3),
            n in 6usize..=20,
            seed in any::<u64>(),
            moves in 1usize..60,
        ) {
            let mut rng = ChaCha8Rng::seed_from_u64(seed);
            let mut state = LocalState::random(n, &sizes, &mut rng);
            for _ in 0..moves {
                let v = rng.gen_range(1..n);
                let u = rng.gen_range(0..v);
                let to = rng.gen_range(1..=sizes.len() as u8);
                let before = state.cost();
                let delta = state.delta(u, v, to);
                state.recolour(u, v, to);
                prop_assert_eq!(state.cost() as i64, before as i64 + delta);
                prop_assert_eq!(state.cost(), state.recount());
            }
            prop_assert_eq!(state.cost(), brute_force(&state.to_colouring(), &sizes));
        }
    }
}
