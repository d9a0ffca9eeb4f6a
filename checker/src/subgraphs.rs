//! Search for a monochromatic copy of a graph H in one colour class of K_n.
//!
//! A clique is searched by branch and bound over bitsets (one row of 64-bit words
//! per vertex), in the style of the published maximum-clique algorithms (Tomita &
//! Seki, DMTCS 2003, "MCQ"; San Segundo, Rodríguez-Losada & Jiménez, Computers &
//! OR 2011, bitsets): the candidates are coloured greedily, and since a clique
//! takes at most one vertex of each colour class, a branch whose clique so far plus
//! the candidates' colours falls short of k is cut. The bound only cuts branches
//! that cannot hold a k-clique, so the search is exact. A complete multipartite
//! colour class is settled at the root, however large.
//!
//! Any other H is searched by direct backtracking: H's vertices are placed one at
//! a time on distinct vertices of K_n, and a placement is kept only while every
//! edge of H between placed vertices has the colour. Every injective placement
//! that is a copy is reached, so the search is exhaustive.

use crate::matrix::ColourMatrix;

/// The vertices (in H's vertex order) of a copy of H in colour `colour`; for a
/// clique, in increasing order.
pub fn find_monochromatic_copy(
    matrix: &ColourMatrix,
    colour: u8,
    vertices: usize,
    edges: &[(usize, usize)],
) -> Option<Vec<usize>> {
    let clique = edges.len() == vertices * vertices.saturating_sub(1) / 2;
    if clique {
        return find_clique(matrix, colour, vertices);
    }
    // For each H-vertex, its H-neighbours placed before it.
    let earlier: Vec<Vec<usize>> = (0..vertices)
        .map(|v| {
            let before = |&(a, b): &(usize, usize)| match (a == v, b == v) {
                (true, _) if b < v => Some(b),
                (_, true) if a < v => Some(a),
                _ => None,
            };
            edges.iter().filter_map(before).collect()
        })
        .collect();
    let mut placed = Vec::with_capacity(vertices);
    place(matrix, colour, &earlier, clique, &mut placed).then_some(placed)
}

type Bits = Vec<u64>;

/// The lowest vertex of a set.
fn lowest(set: &[u64]) -> Option<usize> {
    set.iter().position(|&w| w != 0).map(|w| w * 64 + set[w].trailing_zeros() as usize)
}

/// A k-clique of colour `colour`, sorted, or None.
fn find_clique(matrix: &ColourMatrix, colour: u8, k: usize) -> Option<Vec<usize>> {
    let (n, words) = (matrix.order(), matrix.order().div_ceil(64));
    if k == 0 {
        return Some(Vec::new());
    }
    let mut rows: Vec<Bits> = vec![vec![0; words]; n];
    for (i, row) in rows.iter_mut().enumerate() {
        (0..n).filter(|&j| j != i && matrix.colour(i, j) == colour).for_each(|j| row[j / 64] |= 1 << (j % 64));
    }
    let mut all: Bits = vec![0; words];
    (0..n).for_each(|v| all[v / 64] |= 1 << (v % 64));
    let mut chosen = Vec::with_capacity(k);
    expand(&rows, all, k, &mut chosen).then(|| {
        chosen.sort_unstable();
        chosen
    })
}

/// Extends `chosen` to k vertices from `candidates` (all adjacent to every chosen one).
fn expand(rows: &[Bits], mut candidates: Bits, k: usize, chosen: &mut Vec<usize>) -> bool {
    // Greedy colouring: each colour class is an independent set built from the lowest vertex up.
    let mut order: Vec<(usize, usize)> = Vec::new();
    let mut uncoloured = candidates.clone();
    let mut colour = 0;
    while uncoloured.iter().any(|&w| w != 0) {
        colour += 1;
        let mut open = uncoloured.clone();
        while let Some(v) = lowest(&open) {
            open[v / 64] &= !(1 << (v % 64));
            uncoloured[v / 64] &= !(1 << (v % 64));
            open.iter_mut().zip(&rows[v]).for_each(|(o, r)| *o &= !r);
            order.push((v, colour));
        }
    }
    for &(v, colour) in order.iter().rev() {
        if chosen.len() + colour < k {
            return false;
        }
        chosen.push(v);
        if chosen.len() == k {
            return true;
        }
        let next: Bits = candidates.iter().zip(&rows[v]).map(|(c, r)| c & r).collect();
        if expand(rows, next, k, chosen) {
            return true;
        }
        chosen.pop();
        candidates[v / 64] &= !(1 << (v % 64));
    }
    false
}

fn place(matrix: &ColourMatrix, colour: u8, earlier: &[Vec<usize>], increasing: bool, placed: &mut Vec<usize>) -> bool {
    let v = placed.len();
    if v == earlier.len() {
        return true;
    }
    let start = if increasing { placed.last().map_or(0, |&l| l + 1) } else { 0 };
    for x in start..matrix.order() {
        if placed.contains(&x) || !earlier[v].iter().all(|&u| matrix.colour(placed[u], x) == colour) {
            continue;
        }
        placed.push(x);
        if place(matrix, colour, earlier, increasing, placed) {
            return true;
        }
        placed.pop();
    }
    false
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn clique(m: &ColourMatrix, colour: u8, k: usize) -> Option<Vec<usize>> {
        let edges: Vec<(usize, usize)> = (0..k).flat_map(|b| (0..b).map(move |a| (a, b))).collect();
        find_monochromatic_copy(m, colour, k, &edges)
    }

    /// The pentagon 0-1-2-3-4-0 in colour 1, its complement in colour 2.
    fn pentagon() -> ColourMatrix {
        let mut m = ColourMatrix::filled(5, 2);
        for i in 0..5 {
            m.set(i, (i + 1) % 5, 1);
        }
        m
    }

    #[test]
    fn pentagon_has_no_monochromatic_triangle() {
        let m = pentagon();
        assert_eq!(clique(&m, 1, 3), None);
        assert_eq!(clique(&m, 2, 3), None);
        let edge = clique(&m, 1, 2).expect("an edge of colour 1");
        assert_eq!(m.colour(edge[0], edge[1]), 1);
        let mut with_chord = pentagon();
        with_chord.set(0, 2, 1);
        assert_eq!(clique(&with_chord, 1, 3), Some(vec![0, 1, 2]));
    }

    #[test]
    fn finds_a_four_cycle_and_not_in_a_star() {
        // Colour 1 = the 4-cycle 0-1-2-3-0 plus nothing else, on 5 vertices.
        let mut m = ColourMatrix::filled(5, 2);
        for (a, b) in [(0, 1), (1, 2), (2, 3), (0, 3)] {
            m.set(a, b, 1);
        }
        let c4 = [(0, 1), (1, 2), (2, 3), (0, 3)];
        let copy = find_monochromatic_copy(&m, 1, 4, &c4).expect("a C4");
        for &(a, b) in &c4 {
            assert_eq!(m.colour(copy[a], copy[b]), 1);
        }
        // A star K_{1,4} at vertex 4 in colour 1 has no 4-cycle.
        let mut star = ColourMatrix::filled(5, 2);
        for v in 0..4 {
            star.set(v, 4, 1);
        }
        assert!(find_monochromatic_copy(&star, 1, 4, &c4).is_none());
    }

    /// Brute force over all k-subsets, written as plainly as possible.
    fn brute_force(m: &ColourMatrix, colour: u8, k: usize) -> bool {
        let n = m.order();
        (0u32..1 << n).filter(|mask| mask.count_ones() as usize == k).any(|mask| {
            let vs: Vec<usize> = (0..n).filter(|&v| mask >> v & 1 == 1).collect();
            vs.iter().enumerate().all(|(p, &a)| vs[p + 1..].iter().all(|&b| m.colour(a, b) == colour))
        })
    }

    proptest! {
        #[test]
        fn cliques_agree_with_brute_force(
            n in 2usize..=20, k in 2usize..=7, density in 1u32..=9, seed in any::<u64>()
        ) {
            let mut m = ColourMatrix::filled(n, 2);
            let mut state = seed | 1;
            for j in 0..n {
                for i in 0..j {
                    state ^= state << 13;
                    state ^= state >> 7;
                    state ^= state << 17;
                    if state % 10 < density as u64 { m.set(i, j, 1); }
                }
            }
            let found = clique(&m, 1, k);
            prop_assert_eq!(found.is_some(), brute_force(&m, 1, k));
            if let Some(vs) = found {
                prop_assert_eq!(vs.len(), k);
                prop_assert!(vs.windows(2).all(|w| w[0] < w[1] && m.colour(w[0], w[1]) == 1));
            }
        }
    }
}
