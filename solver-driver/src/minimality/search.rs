//! The search for a relabelling that makes a (partial) colour matrix smaller.
//!
//! Positions of the relabelled matrix are filled vertex by vertex: choosing
//! `p[k]` fixes column k ({0,k}, {1,k}, …, {k-1,k}), which comes right after the
//! columns before it in the edge order. Column k is compared entry by entry with
//! the matrix's own column k:
//!
//! * both colours known: a smaller relabelled colour decides (a witness), a larger
//!   one rules this choice of `p[k]` out, equal colours go on;
//! * the same edge on both sides under the identity colour map: equal, known or not;
//! * otherwise some completion could go either way, so this choice is ruled out.
//!
//! A column equal throughout moves on to column k + 1. So a witness found on a
//! partial matrix holds for every completion of it. On a complete matrix nothing
//! is unknown and the search, run without a budget, is exact: it finds a smaller
//! relabelling whenever one exists.

use crate::minimality::matrix::{edge_of, PartialMatrix};

/// A relabelling shown to make the matrix smaller.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Witness {
    /// `vertices[i]`: the vertex placed at position i.
    pub vertices: Vec<usize>,
    /// The colour map (index 0 unused).
    pub colours: Vec<u8>,
    /// Edges whose known colours the comparison used, sorted.
    pub edges: Vec<usize>,
}

/// What the search concluded.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Verdict {
    Smaller(Witness),
    /// No relabelling was found; exact only without a budget on a complete matrix.
    NoneFound,
    /// The budget ran out first.
    GaveUp,
}

/// Searches every colour map in `colour_maps` (each indexed by colour, index 0
/// unused; the identity first is cheapest) within `budget` candidate vertices
/// tried (None: no limit). `steps` counts the candidates tried.
pub fn find_smaller(
    matrix: &PartialMatrix,
    colour_maps: &[Vec<u8>],
    budget: Option<u64>,
    steps: &mut u64,
) -> Verdict {
    let limit = budget.map_or(u64::MAX, |b| steps.saturating_add(b));
    let mut gave_up = false;
    for map in colour_maps {
        let mut walk = Walk {
            matrix,
            map,
            identity: map.iter().enumerate().all(|(c, &d)| c == d as usize),
            vertices: Vec::with_capacity(matrix.order()),
            used: vec![false; matrix.order()],
            steps,
            limit,
        };
        match walk.descend() {
            Step::Decided(row) => return Verdict::Smaller(walk.witness(row)),
            Step::OutOfBudget => gave_up = true,
            Step::Exhausted => {}
        }
    }
    if gave_up {
        Verdict::GaveUp
    } else {
        Verdict::NoneFound
    }
}

enum Step {
    /// Decided at (row, the column of the last vertex placed).
    Decided(usize),
    Exhausted,
    OutOfBudget,
}

enum Column {
    Equal,
    Smaller(usize),
    RuledOut,
}

struct Walk<'a> {
    matrix: &'a PartialMatrix,
    map: &'a [u8],
    identity: bool,
    vertices: Vec<usize>,
    used: Vec<bool>,
    steps: &'a mut u64,
    limit: u64,
}

impl Walk<'_> {
    fn descend(&mut self) -> Step {
        let k = self.vertices.len();
        let n = self.matrix.order();
        if k == n {
            return Step::Exhausted;
        }
        for v in 0..n {
            if self.used[v] {
                continue;
            }
            *self.steps += 1;
            if *self.steps > self.limit {
                return Step::OutOfBudget;
            }
            match self.compare_column(k, v) {
                Column::RuledOut => {}
                Column::Smaller(row) => {
                    self.vertices.push(v);
                    return Step::Decided(row);
                }
                Column::Equal => {
                    self.vertices.push(v);
                    self.used[v] = true;
                    match self.descend() {
                        Step::Exhausted => {}
                        other => return other,
                    }
                    self.vertices.pop();
                    self.used[v] = false;
                }
            }
        }
        Step::Exhausted
    }

    /// Column k of the relabelled matrix, with `v` placed at position k, against
    /// the matrix's own column k.
    fn compare_column(&self, k: usize, v: usize) -> Column {
        for i in 0..k {
            let u = self.vertices[i];
            if self.identity && same_edge((u, v), (i, k)) {
                continue;
            }
            let own = self.matrix.get(i, k);
            let theirs = self.matrix.get(u, v);
            if own == 0 || theirs == 0 {
                return Column::RuledOut;
            }
            let relabelled = self.map[theirs as usize];
            if relabelled < own {
                return Column::Smaller(i);
            }
            if relabelled > own {
                return Column::RuledOut;
            }
        }
        Column::Equal
    }

    /// The witness for a decision at (row, last column): the vertex map completed
    /// with the unused vertices, and every edge compared on the way.
    fn witness(&self, row: usize) -> Witness {
        let k = self.vertices.len() - 1;
        let mut edges = Vec::new();
        for column in 0..=k {
            let rows = if column == k { row + 1 } else { column };
            for i in 0..rows {
                let (u, v) = (self.vertices[i], self.vertices[column]);
                if self.identity && same_edge((u, v), (i, column)) {
                    continue;
                }
                edges.push(edge_of(i, column));
                edges.push(edge_of(u, v));
            }
        }
        edges.sort_unstable();
        edges.dedup();
        let mut vertices = self.vertices.clone();
        vertices.extend((0..self.matrix.order()).filter(|&x| !self.vertices.contains(&x)));
        Witness {
            vertices,
            colours: self.map.to_vec(),
            edges,
        }
    }
}

fn same_edge(a: (usize, usize), b: (usize, usize)) -> bool {
    (a.0 == b.0 && a.1 == b.1) || (a.0 == b.1 && a.1 == b.0)
}

/// The matrix relabelled by a witness's maps, as colours by edge index (unknown
/// stays 0), and whether it is smaller than `matrix` in the edge order; for tests
/// and for the hook's own assertion.
pub fn relabelled_is_smaller(matrix: &PartialMatrix, witness: &Witness) -> bool {
    let n = matrix.order();
    for j in 0..n {
        for i in 0..j {
            let own = matrix.get(i, j);
            let theirs =
                witness.colours[matrix.get(witness.vertices[i], witness.vertices[j]) as usize];
            if own != theirs {
                return theirs < own;
            }
        }
    }
    false
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every 2-colouring of K_n as colours by edge index.
    fn all_colourings(n: usize) -> impl Iterator<Item = Vec<u8>> {
        let edges = n * (n - 1) / 2;
        (0u32..1 << edges).map(move |bits| (0..edges).map(|e| 1 + (bits >> e & 1) as u8).collect())
    }

    /// The count of minimal colourings against the number of graphs on n vertices
    /// (OEIS A000088: 1, 2, 4, 11, 34, 156) and of graphs up to complement
    /// (n = 2..6: 1, 2, 6, 18, 78; from the graph counts and the self-complementary
    /// counts of OEIS A000171, from memory: 1 on 4 vertices, 2 on 5, 0 on 6). Brute force over
    /// all relabellings is in `tests/minimality_soundness.rs`.
    #[test]
    fn exact_search_counts_the_classes() {
        let identity = vec![0u8, 1, 2];
        let swap = vec![0u8, 2, 1];
        for (n, graphs, up_to_complement) in
            [(2, 2, 1), (3, 4, 2), (4, 11, 6), (5, 34, 18), (6, 156, 78)]
        {
            for (maps, expected) in [
                (vec![identity.clone()], graphs),
                (vec![identity.clone(), swap.clone()], up_to_complement),
            ] {
                let mut minimal = 0;
                for colours in all_colourings(n) {
                    let m = PartialMatrix::from_edge_colours(n, colours.clone());
                    let mut steps = 0;
                    let verdict = find_smaller(&m, &maps, None, &mut steps);
                    match verdict {
                        Verdict::Smaller(w) => assert!(relabelled_is_smaller(&m, &w)),
                        Verdict::NoneFound => minimal += 1,
                        Verdict::GaveUp => unreachable!("no budget"),
                    }
                }
                assert_eq!(minimal, expected, "n={n}, {} colour maps", maps.len());
            }
        }
    }

    /// Partial matrices: a witness holds for every completion, so no partial
    /// matrix below a minimal colouring may get one.
    #[test]
    fn partial_witnesses_hold_for_every_completion() {
        let maps = vec![vec![0u8, 1, 2], vec![0u8, 2, 1]];
        let n = 5;
        let mut state = 0x9e3779b97f4a7c15u64;
        let mut next = move || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            state
        };
        let mut found = 0;
        for colours in all_colourings(n) {
            let full = PartialMatrix::from_edge_colours(n, colours.clone());
            let minimal = find_smaller(&full, &maps, None, &mut 0) == Verdict::NoneFound;
            for _ in 0..4 {
                let mask = next();
                let partial: Vec<u8> = colours
                    .iter()
                    .enumerate()
                    .map(|(e, &c)| if mask >> e & 1 == 1 { c } else { 0 })
                    .collect();
                let m = PartialMatrix::from_edge_colours(n, partial);
                if let Verdict::Smaller(w) = find_smaller(&m, &maps, Some(10_000), &mut 0) {
                    assert!(!minimal, "a minimal colouring was cut by a partial witness");
                    // The edges the witness rests on are known, so the full
                    // colouring is smaller under it too.
                    assert!(w.edges.iter().all(|&e| m.edge(e) != 0));
                    assert!(relabelled_is_smaller(&full, &w));
                    found += 1;
                }
            }
        }
        assert!(found > 1000, "only {found} partial witnesses");
    }
}
