//! Small forbidden graphs: the named families, graph6 and edge lists, their
//! automorphism counts, and their distinct labellings on v positions (one per copy
//! of the graph on a fixed v-set of vertices).
//!
//! A copy of H (v vertices) in K_n is a v-subset S of the vertices together with one
//! of the v!/|Aut H| distinct ways of laying H's edges on S. So the copies are
//! enumerated as subsets × [`SmallGraph::labellings`], each exactly once, and there
//! are C(n,v)·v!/|Aut H| = n!/((n−v)!·|Aut H|) of them.

use std::collections::BTreeSet;

/// The most vertices a forbidden graph may have (its labellings are found by
/// running through all v! permutations).
pub const MAX_GRAPH_VERTICES: usize = 10;

/// A small simple graph on vertices 0..vertices.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct SmallGraph {
    vertices: usize,
    /// Edges (a, b) with a < b, sorted, without repeats.
    edges: Vec<(usize, usize)>,
}

impl SmallGraph {
    /// A graph from an edge list; loops are refused, repeats merged.
    pub fn new(
        vertices: usize,
        edges: impl IntoIterator<Item = (usize, usize)>,
    ) -> Result<Self, String> {
        let mut set = BTreeSet::new();
        for (a, b) in edges {
            if a == b {
                return Err(format!("edge {a}-{b} is a loop"));
            }
            if a >= vertices || b >= vertices {
                return Err(format!("edge {a}-{b} names a vertex outside 0..{vertices}"));
            }
            set.insert((a.min(b), a.max(b)));
        }
        Ok(SmallGraph {
            vertices,
            edges: set.into_iter().collect(),
        })
    }

    pub fn complete(k: usize) -> Self {
        Self::new(k, (0..k).flat_map(|b| (0..b).map(move |a| (a, b)))).expect("valid")
    }

    pub fn cycle(k: usize) -> Self {
        Self::new(k, (0..k).map(|i| (i, (i + 1) % k))).expect("valid")
    }

    /// The path on k vertices.
    pub fn path(k: usize) -> Self {
        Self::new(k, (1..k).map(|i| (i - 1, i))).expect("valid")
    }

    /// K_{a,b}: parts 0..a and a..a+b.
    pub fn complete_bipartite(a: usize, b: usize) -> Self {
        Self::new(a + b, (0..a).flat_map(|x| (a..a + b).map(move |y| (x, y)))).expect("valid")
    }

    /// The wheel W_k: a hub (vertex k) joined to every vertex of the cycle C_k on
    /// 0..k; k + 1 vertices.
    pub fn wheel(k: usize) -> Self {
        let rim = (0..k).map(|i| (i, (i + 1) % k));
        let spokes = (0..k).map(|i| (i, k));
        Self::new(k + 1, rim.chain(spokes)).expect("valid")
    }

    /// The book B_k: k triangles sharing the edge {0, 1}; k + 2 vertices.
    pub fn book(k: usize) -> Self {
        let pages = (2..k + 2).flat_map(|p| [(0, p), (1, p)]);
        Self::new(k + 2, std::iter::once((0, 1)).chain(pages)).expect("valid")
    }

    /// K_k minus one edge.
    pub fn complete_minus_edge(k: usize) -> Self {
        let mut g = Self::complete(k);
        g.edges.retain(|&e| e != (0, 1));
        g
    }

    pub fn vertex_count(&self) -> usize {
        self.vertices
    }

    pub fn edges(&self) -> &[(usize, usize)] {
        &self.edges
    }

    pub fn is_complete(&self) -> bool {
        self.edges.len() == self.vertices * self.vertices.saturating_sub(1) / 2
    }

    /// The distinct edge sets obtained by relabelling the vertices: one per coset of
    /// the automorphism group, so v!/|Aut| of them, each sorted.
    pub fn labellings(&self) -> Vec<Vec<(usize, usize)>> {
        let mut seen = BTreeSet::new();
        let mut perm: Vec<usize> = (0..self.vertices).collect();
        for_each_permutation(&mut perm, 0, &mut |p| {
            let mut edges: Vec<(usize, usize)> = self
                .edges
                .iter()
                .map(|&(a, b)| (p[a].min(p[b]), p[a].max(p[b])))
                .collect();
            edges.sort_unstable();
            seen.insert(edges);
        });
        seen.into_iter().collect()
    }

    /// |Aut H|, as v! divided by the number of distinct labellings.
    pub fn automorphism_count(&self) -> u64 {
        let factorial: u64 = (1..=self.vertices as u64).product();
        factorial / self.labellings().len() as u64
    }

    /// The graph6 form (B. D. McKay's format; vertices up to 62).
    pub fn to_graph6(&self) -> String {
        let n = self.vertices;
        let mut bits = Vec::new();
        for j in 1..n {
            for i in 0..j {
                bits.push(self.edges.binary_search(&(i, j)).is_ok());
            }
        }
        let mut out = String::new();
        out.push((n as u8 + 63) as char);
        for chunk in bits.chunks(6) {
            let mut value = 0u8;
            for (k, &bit) in chunk.iter().enumerate() {
                if bit {
                    value |= 1 << (5 - k);
                }
            }
            out.push((value + 63) as char);
        }
        out
    }

    /// Reads graph6 (one graph, up to 62 vertices).
    pub fn from_graph6(text: &str) -> Result<Self, String> {
        let bytes = text.as_bytes();
        let Some(&first) = bytes.first() else {
            return Err("empty graph6 string".into());
        };
        if !(63..=125).contains(&first) {
            return Err(format!(
                "graph6 byte 0 is {first}: expected a vertex count byte 63..=125 (at most 62 vertices)"
            ));
        }
        let n = (first - 63) as usize;
        let needed = (n * n.saturating_sub(1) / 2).div_ceil(6);
        if bytes.len() != 1 + needed {
            return Err(format!(
                "graph6 string for {n} vertices must have {} bytes, found {}",
                1 + needed,
                bytes.len()
            ));
        }
        let mut edges = Vec::new();
        let mut bit = 0;
        for j in 1..n {
            for i in 0..j {
                let byte = bytes[1 + bit / 6];
                if !(63..=126).contains(&byte) {
                    return Err(format!(
                        "graph6 byte {} is {byte}: expected 63..=126",
                        1 + bit / 6
                    ));
                }
                if (byte - 63) >> (5 - bit % 6) & 1 == 1 {
                    edges.push((i, j));
                }
                bit += 1;
            }
        }
        Self::new(n, edges)
    }
}

fn for_each_permutation(perm: &mut Vec<usize>, start: usize, visit: &mut dyn FnMut(&[usize])) {
    if start == perm.len() {
        visit(perm);
        return;
    }
    for i in start..perm.len() {
        perm.swap(start, i);
        for_each_permutation(perm, start + 1, visit);
        perm.swap(start, i);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn automorphism_counts_of_the_families() {
        // |Aut| of standard graphs (common practice): C_k dihedral 2k, P_k 2,
        // K_{1,k} k!, K_{a,b} a!b! (a ≠ b), W_k 2k (k ≥ 4), B_k 2·k!, K_k − e 2(k−2)!.
        assert_eq!(SmallGraph::cycle(5).automorphism_count(), 10);
        assert_eq!(SmallGraph::cycle(4).automorphism_count(), 8);
        assert_eq!(SmallGraph::path(4).automorphism_count(), 2);
        assert_eq!(SmallGraph::complete_bipartite(1, 3).automorphism_count(), 6);
        assert_eq!(
            SmallGraph::complete_bipartite(2, 3).automorphism_count(),
            12
        );
        assert_eq!(SmallGraph::wheel(5).automorphism_count(), 10);
        assert_eq!(SmallGraph::book(3).automorphism_count(), 12);
        assert_eq!(SmallGraph::complete_minus_edge(4).automorphism_count(), 4);
        assert_eq!(SmallGraph::complete(4).automorphism_count(), 24);
    }

    #[test]
    fn graph6_of_the_pentagon() {
        // C5 as 0-1-2-3-4-0 is `Dhc` (McKay's graph6 description; shared facts).
        let c5 = SmallGraph::cycle(5);
        assert_eq!(c5.to_graph6(), "Dhc");
        assert_eq!(SmallGraph::from_graph6("Dhc").unwrap(), c5);
        assert!(SmallGraph::from_graph6("Dh").is_err());
        assert!(SmallGraph::from_graph6("").is_err());
    }
}
