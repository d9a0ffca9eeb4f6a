//! The forbidden graph of one colour as local search counts it: copies of it in a
//! colour class held as 128-bit neighbourhood sets, and the copies through one
//! edge (what recolouring that edge destroys or creates).
//!
//! A clique K_k through edge {u, v} is a (k − 2)-clique in N(u) ∩ N(v). Another
//! graph H is counted through its embeddings: every injective map of H's
//! vertices sending edges to edges and one edge (a, b) of H onto (u, v) or (v, u)
//! extends, by backtracking over the other vertices of H (each one's candidates
//! are the common neighbours of its already placed neighbours), to embeddings;
//! each copy of H through {u, v} is met |Aut H| times, so the count is divided
//! by it (|Aut H| is itself counted as the embeddings of H into H).

use ramsift_encoder::{Forbidden, RamseySpec};

/// A forbidden graph prepared for counting.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Pattern {
    Clique(usize),
    Graph(GraphPattern),
}

/// A graph other than a clique: its adjacency as bit masks and |Aut|.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct GraphPattern {
    /// Bit j of `adjacent[i]`: {i, j} is an edge.
    adjacent: Vec<u16>,
    edges: Vec<(usize, usize)>,
    automorphisms: u64,
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

/// Visits every `need`-clique inside `candidates` in the graph `neighbours`, as
/// its vertices in increasing order after those already in `chosen`.
pub fn for_each_clique(
    neighbours: &[u128],
    candidates: u128,
    need: usize,
    chosen: &mut Vec<usize>,
    visit: &mut dyn FnMut(&[usize]),
) {
    if need == 0 {
        return visit(chosen);
    }
    let mut rest = candidates;
    while rest != 0 {
        let v = rest.trailing_zeros() as usize;
        rest &= rest - 1;
        let next = rest & neighbours[v];
        if next.count_ones() as usize + 1 >= need {
            chosen.push(v);
            for_each_clique(neighbours, next, need - 1, chosen, visit);
            chosen.pop();
        }
    }
}

impl GraphPattern {
    fn new(vertices: usize, edges: &[(usize, usize)]) -> Self {
        let mut adjacent = vec![0u16; vertices];
        for &(a, b) in edges {
            adjacent[a] |= 1 << b;
            adjacent[b] |= 1 << a;
        }
        let mut pattern = GraphPattern {
            adjacent,
            edges: edges.to_vec(),
            automorphisms: 1,
        };
        // The embeddings of H into itself are exactly its automorphisms.
        let own: Vec<u128> = pattern.adjacent.iter().map(|&m| u128::from(m)).collect();
        let mut placed = vec![usize::MAX; vertices];
        pattern.automorphisms = pattern.extend(&own, &mut placed, 0, (1u128 << vertices) - 1);
        pattern
    }

    fn vertices(&self) -> usize {
        self.adjacent.len()
    }

    /// Embeddings extending `placed` (H vertex → host vertex, or MAX), placing
    /// the H vertices from `next` on, into host vertices of `free`.
    fn extend(&self, host: &[u128], placed: &mut [usize], next: usize, free: u128) -> u64 {
        if next == self.vertices() {
            return 1;
        }
        if placed[next] != usize::MAX {
            return self.extend(host, placed, next + 1, free);
        }
        let mut candidates = free;
        let mut neighbours = self.adjacent[next];
        while neighbours != 0 {
            let w = neighbours.trailing_zeros() as usize;
            neighbours &= neighbours - 1;
            if placed[w] != usize::MAX {
                candidates &= host[placed[w]];
            }
        }
        let mut total = 0;
        while candidates != 0 {
            let x = candidates.trailing_zeros() as usize;
            candidates &= candidates - 1;
            placed[next] = x;
            total += self.extend(host, placed, next + 1, free & !(1u128 << x));
            placed[next] = usize::MAX;
        }
        total
    }

    /// Copies of H in `host` (on vertices `all`) that use edge {u, v}, with the
    /// edge counted as present whether or not `host` has it.
    fn copies_through(&self, host: &[u128], all: u128, u: usize, v: usize) -> u64 {
        let mut placed = vec![usize::MAX; self.vertices()];
        let mut embeddings = 0;
        let with_edge: Vec<u128> = host
            .iter()
            .enumerate()
            .map(|(x, &m)| match x {
                _ if x == u => m | 1u128 << v,
                _ if x == v => m | 1u128 << u,
                _ => m,
            })
            .collect();
        for &(a, b) in &self.edges {
            for (x, y) in [(u, v), (v, u)] {
                placed[a] = x;
                placed[b] = y;
                embeddings += self.extend(
                    &with_edge,
                    &mut placed,
                    0,
                    all & !(1u128 << x) & !(1u128 << y),
                );
                placed[a] = usize::MAX;
                placed[b] = usize::MAX;
            }
        }
        embeddings / self.automorphisms
    }

    /// Every copy of H in `host`.
    fn count(&self, host: &[u128], all: u128) -> u64 {
        let mut placed = vec![usize::MAX; self.vertices()];
        self.extend(host, &mut placed, 0, all) / self.automorphisms
    }
}

impl Pattern {
    /// The patterns of a specification, colour by colour.
    pub fn for_spec(spec: &RamseySpec) -> Vec<Pattern> {
        spec.forbidden()
            .iter()
            .map(|f| match f {
                Forbidden::Clique(k) => Pattern::Clique(*k),
                Forbidden::Graph(g) => {
                    let graph = &g.graph;
                    Pattern::Graph(GraphPattern::new(graph.vertex_count(), graph.edges()))
                }
            })
            .collect()
    }

    /// Cliques of these sizes.
    pub fn cliques(sizes: &[usize]) -> Vec<Pattern> {
        sizes.iter().map(|&k| Pattern::Clique(k)).collect()
    }

    /// Copies through edge {u, v} of the colour class `host` (on vertices `all`),
    /// the edge counted as present.
    pub fn copies_through(&self, host: &[u128], all: u128, u: usize, v: usize) -> u64 {
        match self {
            Pattern::Clique(k) => count_cliques(host, host[u] & host[v], k - 2),
            Pattern::Graph(g) => g.copies_through(host, all, u, v),
        }
    }

    /// Every copy in the colour class `host` (on vertices `all`).
    pub fn count(&self, host: &[u128], all: u128) -> u64 {
        match self {
            Pattern::Clique(k) => count_cliques(host, all, *k),
            Pattern::Graph(g) => g.count(host, all),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use ramsift_encoder::SmallGraph;

    fn pattern(g: &SmallGraph) -> GraphPattern {
        GraphPattern::new(g.vertex_count(), g.edges())
    }

    #[test]
    fn automorphism_counts_match_the_encoder() {
        // |Aut C_n| = 2n, |Aut P_n| = 2, |Aut K_{1,3}| = 6, |Aut K4 − e| = 4
        // (dihedral groups and small cases, common practice); the encoder counts
        // them its own way.
        for g in [
            SmallGraph::cycle(5),
            SmallGraph::path(4),
            SmallGraph::complete_bipartite(1, 3),
            SmallGraph::complete_minus_edge(4),
            SmallGraph::wheel(5),
            SmallGraph::book(3),
        ] {
            assert_eq!(pattern(&g).automorphisms, g.automorphism_count(), "{g:?}");
        }
        assert_eq!(pattern(&SmallGraph::cycle(5)).automorphisms, 10);
    }

    #[test]
    fn copies_in_a_complete_graph() {
        // K_n has n!/(2n) = (n−1)!/2 Hamiltonian cycles: 12 five-cycles in K5
        // (common practice); each edge of K5 is in 12·5/10 = 6 of them.
        let all = (1u128 << 5) - 1;
        let host: Vec<u128> = (0..5).map(|v| all & !(1u128 << v)).collect();
        let c5 = pattern(&SmallGraph::cycle(5));
        assert_eq!(c5.count(&host, all), 12);
        assert_eq!(c5.copies_through(&host, all, 0, 1), 6);
        // Paths P3 in K4: 4·3·2/2 = 12.
        let all4 = (1u128 << 4) - 1;
        let host4: Vec<u128> = (0..4).map(|v| all4 & !(1u128 << v)).collect();
        assert_eq!(pattern(&SmallGraph::path(3)).count(&host4, all4), 12);
    }
}
