//! A full colouring of K_n held for local search: the colour of each edge and, per
//! colour, each vertex's neighbourhood as a 128-bit set, so that the change in the
//! number of monochromatic forbidden copies caused by recolouring one edge is
//! computed from the neighbourhoods around that edge alone (the *delta*), without
//! a recount.
//!
//! Recolouring {u, v} from a to b destroys exactly the monochromatic copies of
//! colour a's forbidden graph through {u, v} and creates exactly those of colour
//! b's through {u, v} ([`Pattern::copies_through`]; for a clique K_k, the
//! (k − 2)-cliques inside the common neighbourhood).

use rand::Rng;

use ramsift_encoder::edges::{edge_count, edge_index};
use ramsift_encoder::Colouring;

use super::pattern::{for_each_clique, Pattern};

/// The largest order local search handles (neighbourhoods are 128-bit sets).
pub const MAX_LOCAL_ORDER: usize = 128;

/// A colouring with per-colour neighbourhood sets and its count of monochromatic
/// forbidden copies.
#[derive(Clone, Debug)]
pub struct LocalState {
    order: usize,
    patterns: Vec<Pattern>,
    /// Colour (0-based) of each edge, by edge index.
    colour: Vec<u8>,
    /// `neighbours[c * order + v]`: the colour-c neighbours of v.
    neighbours: Vec<u128>,
    /// Number of monochromatic forbidden copies, kept up to date by [`Self::recolour`].
    cost: u64,
    /// For each edge, the monochromatic copies of its own colour's forbidden graph
    /// through it (nonzero: a *bad* edge), kept up to date by [`Self::recolour`].
    through: Vec<u32>,
}

impl LocalState {
    /// The state of a colouring (colours 1..=r) for the forbidden graphs `patterns`.
    pub fn new(colouring: &Colouring, patterns: &[Pattern]) -> Self {
        let n = colouring.order();
        assert!(
            n <= MAX_LOCAL_ORDER,
            "local search handles orders up to {MAX_LOCAL_ORDER}"
        );
        assert_eq!(colouring.colours(), patterns.len());
        let mut state = LocalState {
            order: n,
            patterns: patterns.to_vec(),
            colour: vec![0; edge_count(n)],
            neighbours: vec![0; patterns.len() * n],
            cost: 0,
            through: Vec::new(),
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
        state.through = vec![0; edge_count(n)];
        state.recount_through();
        state
    }

    /// A uniformly random colouring.
    pub fn random(order: usize, patterns: &[Pattern], rng: &mut impl Rng) -> Self {
        let r = patterns.len();
        let colouring = Colouring::from_fn(order, r, |_, _| rng.gen_range(1..=r as u8));
        Self::new(&colouring, patterns)
    }

    pub fn order(&self) -> usize {
        self.order
    }

    pub fn colours(&self) -> usize {
        self.patterns.len()
    }

    /// All vertices, as a set.
    fn all(&self) -> u128 {
        if self.order == 128 {
            u128::MAX
        } else {
            (1u128 << self.order) - 1
        }
    }

    /// Monochromatic forbidden copies now.
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

    /// Copies of colour `c`'s (1-based) forbidden graph that edge {u, v} is in, or
    /// would complete if it had colour c.
    pub fn copies_through(&self, u: usize, v: usize, c: u8) -> u64 {
        let c = c as usize - 1;
        self.patterns[c].copies_through(self.graph(c), self.all(), u, v)
    }

    /// Visits, as vertex sets, the cliques of colour `c` (1-based) that edge
    /// {u, v} is in or would complete if it had colour c; returns false (visiting
    /// nothing) when colour c forbids a graph other than a clique.
    pub fn for_each_clique_through(
        &self,
        u: usize,
        v: usize,
        c: u8,
        visit: &mut dyn FnMut(u128),
    ) -> bool {
        let c = c as usize - 1;
        let Pattern::Clique(k) = self.patterns[c] else {
            return false;
        };
        let graph = self.graph(c);
        let ends = (1u128 << u) | (1u128 << v);
        for_each_clique(
            graph,
            graph[u] & graph[v],
            k - 2,
            &mut Vec::new(),
            &mut |s| visit(s.iter().fold(ends, |set, &x| set | 1u128 << x)),
        );
        true
    }

    /// Change of the cost if edge {u, v} were recoloured `to` (1-based).
    pub fn delta(&self, u: usize, v: usize, to: u8) -> i64 {
        let from = self.colour(u, v);
        if from == to {
            return 0;
        }
        self.copies_through(u, v, to) as i64 - self.copies_through(u, v, from) as i64
    }

    /// The cost if every edge of `edges` (distinct) were recoloured `to`
    /// (1-based), one after the other; the state is left as it was. Only the
    /// neighbourhoods change while the edges are tried, not the per-edge counts,
    /// so this is cheaper than recolouring and back.
    pub fn cost_if_recoloured(&mut self, edges: &[(usize, usize)], to: u8) -> u64 {
        let to0 = to as usize - 1;
        let mut cost = self.cost as i64;
        let mut undo: Vec<(usize, usize, usize)> = Vec::with_capacity(edges.len());
        for &(u, v) in edges {
            let from = self.colour[edge_index(u, v)] as usize;
            if from == to0 {
                continue;
            }
            cost += self.copies_through(u, v, to) as i64
                - self.copies_through(u, v, from as u8 + 1) as i64;
            self.move_edge(u, v, from, to0);
            undo.push((u, v, from));
        }
        for &(u, v, from) in undo.iter().rev() {
            self.move_edge(u, v, to0, from);
        }
        debug_assert!(cost >= 0);
        cost as u64
    }

    /// Moves {u, v} from colour `from` to `to` (0-based) in the neighbourhoods
    /// and the colour table only.
    fn move_edge(&mut self, u: usize, v: usize, from: usize, to: usize) {
        let n = self.order;
        self.neighbours[from * n + u] &= !(1 << v);
        self.neighbours[from * n + v] &= !(1 << u);
        self.neighbours[to * n + u] |= 1 << v;
        self.neighbours[to * n + v] |= 1 << u;
        self.colour[edge_index(u, v)] = to as u8;
    }

    /// Recolours edge {u, v}, updating the cost by the delta.
    pub fn recolour(&mut self, u: usize, v: usize, to: u8) {
        let delta = self.delta(u, v, to);
        let from = self.colour(u, v) as usize - 1;
        let to0 = to as usize - 1;
        if from == to0 {
            return;
        }
        self.update_through(u, v, from, -1);
        self.move_edge(u, v, from, to0);
        self.cost = (self.cost as i64 + delta) as u64;
        self.update_through(u, v, to0, 1);
        let clique = |c: usize| matches!(self.patterns[c], Pattern::Clique(_));
        if !clique(from) || !clique(to0) {
            self.recount_graph_through();
        }
    }

    /// Adds `sign` to the count of every other edge of each monochromatic clique of
    /// colour `c` (0-based, a clique pattern) through {u, v}, and sets {u, v}'s own
    /// count (to the cliques when adding, to 0 when removing); the cliques are the
    /// (k − 2)-cliques of the common neighbourhood. Colours that forbid another
    /// graph are recounted instead ([`Self::recount_graph_through`]).
    fn update_through(&mut self, u: usize, v: usize, c: usize, sign: i32) {
        let Pattern::Clique(k) = self.patterns[c] else {
            return;
        };
        let graph = self.graph(c);
        let mut cliques: Vec<Vec<usize>> = Vec::new();
        for_each_clique(
            graph,
            graph[u] & graph[v],
            k - 2,
            &mut Vec::new(),
            &mut |s| cliques.push(s.to_vec()),
        );
        for s in &cliques {
            let vertices: Vec<usize> = s.iter().copied().chain([u, v]).collect();
            for (p, &x) in vertices.iter().enumerate() {
                for &y in &vertices[p + 1..] {
                    if (x.min(y), x.max(y)) != (u.min(v), u.max(v)) {
                        let e = edge_index(x, y);
                        self.through[e] = (self.through[e] as i32 + sign) as u32;
                    }
                }
            }
        }
        self.through[edge_index(u, v)] = if sign > 0 { cliques.len() as u32 } else { 0 };
    }

    /// The counts of the edges whose colour forbids a graph other than a clique,
    /// from scratch (those graphs are small; their instances are too).
    fn recount_graph_through(&mut self) {
        for v in 1..self.order {
            for u in 0..v {
                let c = self.colour(u, v);
                if matches!(self.patterns[c as usize - 1], Pattern::Graph(_)) {
                    self.through[edge_index(u, v)] = self.copies_through(u, v, c) as u32;
                }
            }
        }
    }

    /// Every edge's count of monochromatic copies through it, from scratch.
    fn recount_through(&mut self) {
        for v in 1..self.order {
            for u in 0..v {
                self.through[edge_index(u, v)] =
                    self.copies_through(u, v, self.colour(u, v)) as u32;
            }
        }
    }

    /// Monochromatic copies of its own colour through edge {u, v}.
    pub fn through(&self, u: usize, v: usize) -> u64 {
        u64::from(self.through[edge_index(u, v)])
    }

    /// Counts every monochromatic forbidden copy from scratch.
    pub fn recount(&self) -> u64 {
        (0..self.colours())
            .map(|c| self.patterns[c].count(self.graph(c), self.all()))
            .sum()
    }

    /// Edges {u, v} (u < v) that lie in at least one monochromatic forbidden copy.
    pub fn bad_edges(&self) -> Vec<(usize, usize)> {
        let mut bad = Vec::new();
        for v in 0..self.order {
            for u in 0..v {
                if self.through[edge_index(u, v)] > 0 {
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
    use proptest::prelude::prop;
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
            let state = LocalState::random(n, &Pattern::cliques(&sizes), &mut rng);
            assert_eq!(state.cost(), brute_force(&state.to_colouring(), &sizes));
        }
    }

    /// Makes `moves` random recolourings; after each, the cost moved by the delta
    /// and equals a recount, and every edge's count equals its copies.
    fn random_moves_keep_counts_exact(
        state: &mut LocalState,
        rng: &mut ChaCha8Rng,
        moves: usize,
    ) -> Result<(), TestCaseError> {
        let n = state.order();
        for _ in 0..moves {
            let v = rng.gen_range(1..n);
            let u = rng.gen_range(0..v);
            let to = rng.gen_range(1..=state.colours() as u8);
            let before = state.cost();
            let delta = state.delta(u, v, to);
            state.recolour(u, v, to);
            prop_assert_eq!(state.cost() as i64, before as i64 + delta);
            prop_assert_eq!(state.cost(), state.recount());
            for y in 1..n {
                for x in 0..y {
                    prop_assert_eq!(
                        state.through(x, y),
                        state.copies_through(x, y, state.colour(x, y))
                    );
                }
            }
        }
        Ok(())
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
            let mut state = LocalState::random(n, &Pattern::cliques(&sizes), &mut rng);
            random_moves_keep_counts_exact(&mut state, &mut rng, moves)?;
            prop_assert_eq!(state.cost(), brute_force(&state.to_colouring(), &sizes));
        }
    }

    /// Copies of `graph` (edges on 0..k) in colour `colour` of a colouring, by
    /// trying every injective placement and keeping each distinct edge set.
    fn brute_force_copies(
        colouring: &Colouring,
        colour: u8,
        k: usize,
        edges: &[(usize, usize)],
    ) -> u64 {
        let n = colouring.order();
        let mut seen = std::collections::BTreeSet::new();
        let mut place = Vec::new();
        fn walk(n: usize, k: usize, place: &mut Vec<usize>, visit: &mut dyn FnMut(&[usize])) {
            if place.len() == k {
                return visit(place);
            }
            for x in 0..n {
                if !place.contains(&x) {
                    place.push(x);
                    walk(n, k, place, visit);
                    place.pop();
                }
            }
        }
        walk(n, k, &mut place, &mut |p| {
            if edges
                .iter()
                .all(|&(a, b)| colouring.colour(p[a], p[b]) == colour)
            {
                let mut set: Vec<(usize, usize)> = edges
                    .iter()
                    .map(|&(a, b)| (p[a].min(p[b]), p[a].max(p[b])))
                    .collect();
                set.sort_unstable();
                seen.insert(set);
            }
        });
        seen.len() as u64
    }

    proptest! {
        /// For forbidden graphs other than cliques (C4, C5, K1:3, K4 − e, B2, W_5),
        /// the incremental count equals a full recount after every move, and a
        /// brute-force count over placements at the end.
        #[test]
        fn graph_copies_are_counted_incrementally(
            spec in prop::sample::select(vec!["C4,C5", "K1:3,K3", "K4-e,C4", "B2,P4", "W_5,3", "C4,C4,K3"]),
            n in 5usize..=8,
            seed in any::<u64>(),
            moves in 1usize..30,
        ) {
            let spec: ramsift_encoder::RamseySpec = spec.parse().unwrap();
            let patterns = Pattern::for_spec(&spec);
            let mut rng = ChaCha8Rng::seed_from_u64(seed);
            let mut state = LocalState::random(n, &patterns, &mut rng);
            random_moves_keep_counts_exact(&mut state, &mut rng, moves)?;
            let colouring = state.to_colouring();
            let expected: u64 = spec
                .forbidden()
                .iter()
                .enumerate()
                .map(|(c, f)| {
                    let g = f.graph();
                    brute_force_copies(&colouring, c as u8 + 1, g.vertex_count(), g.edges())
                })
                .sum();
            prop_assert_eq!(state.cost(), expected);
        }
    }

    proptest! {
        /// Trying a set of recolourings gives the cost that making them gives, and
        /// leaves the state as it was (for cliques and for other graphs).
        #[test]
        fn trying_a_set_of_recolourings_predicts_and_restores(
            spec in prop::sample::select(vec!["3,3", "3,4", "3,3,3", "4,4", "C4,K3"]),
            n in 5usize..=14,
            seed in any::<u64>(),
            size in 1usize..8,
        ) {
            let spec: ramsift_encoder::RamseySpec = spec.parse().unwrap();
            let patterns = Pattern::for_spec(&spec);
            let mut rng = ChaCha8Rng::seed_from_u64(seed);
            let mut state = LocalState::random(n, &patterns, &mut rng);
            let mut edges = Vec::new();
            while edges.len() < size {
                let v = rng.gen_range(1..n);
                let u = rng.gen_range(0..v);
                if !edges.contains(&(u, v)) {
                    edges.push((u, v));
                }
            }
            let to = rng.gen_range(1..=state.colours() as u8);
            let before = state.to_colouring();
            let predicted = state.cost_if_recoloured(&edges, to);
            prop_assert_eq!(state.to_colouring(), before);
            prop_assert_eq!(state.cost(), state.recount());
            for &(u, v) in &edges {
                state.recolour(u, v, to);
            }
            prop_assert_eq!(predicted, state.cost());
            prop_assert_eq!(predicted, state.recount());
        }
    }
}
