//! Search for a monochromatic clique by direct enumeration of vertex subsets.
//!
//! Vertex sets are grown in increasing order: a set {v1 < v2 < … < vm} is extended
//! only by vertices larger than vm joined to all of v1..vm in the colour. Every
//! k-subset that is a clique is reached this way, and pruning only skips subsets
//! that already contain a non-edge, so the search is exhaustive.

use crate::matrix::ColourMatrix;

/// The lexicographically first k-clique in colour `colour`, if any.
pub fn find_monochromatic_clique(
    matrix: &ColourMatrix,
    colour: u8,
    k: usize,
) -> Option<Vec<usize>> {
    let n = matrix.order();
    if k == 0 {
        return Some(Vec::new());
    }
    let mut chosen = Vec::with_capacity(k);
    let all: Vec<usize> = (0..n).collect();
    extend(matrix, colour, k, &mut chosen, &all).then_some(chosen)
}

/// Tries to complete `chosen` to a k-clique using vertices from `candidates`
/// (all joined in `colour` to every chosen vertex, all larger than them).
fn extend(
    matrix: &ColourMatrix,
    colour: u8,
    k: usize,
    chosen: &mut Vec<usize>,
    candidates: &[usize],
) -> bool {
    if chosen.len() == k {
        return true;
    }
    let still_needed = k - chosen.len();
    for (pos, &v) in candidates.iter().enumerate() {
        if candidates.len() - pos < still_needed {
            break;
        }
        let next: Vec<usize> = candidates[pos + 1..]
            .iter()
            .copied()
            .filter(|&u| matrix.colour(v, u) == colour)
            .collect();
        chosen.push(v);
        if extend(matrix, colour, k, chosen, &next) {
            return true;
        }
        chosen.pop();
    }
    false
}

/// Whether every pair of `vertices` has colour `colour` (used to confirm a report).
pub fn is_monochromatic_clique(matrix: &ColourMatrix, colour: u8, vertices: &[usize]) -> bool {
    vertices.iter().enumerate().all(|(p, &a)| {
        vertices[p + 1..]
            .iter()
            .all(|&b| a != b && matrix.colour(a, b) == colour)
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

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
        assert_eq!(find_monochromatic_clique(&m, 1, 3), None);
        assert_eq!(find_monochromatic_clique(&m, 2, 3), None);
        assert_eq!(find_monochromatic_clique(&m, 1, 2), Some(vec![0, 1]));
    }

    #[test]
    fn finds_the_first_triangle() {
        let mut m = pentagon();
        m.set(0, 2, 1);
        assert_eq!(find_monochromatic_clique(&m, 1, 3), Some(vec![0, 1, 2]));
    }

    /// Brute force over all k-subsets, written as plainly as possible.
    fn brute_force(m: &ColourMatrix, colour: u8, k: usize) -> bool {
        let n = m.order();
        (0u32..1 << n).any(|mask| {
            let vs: Vec<usize> = (0..n).filter(|&v| mask >> v & 1 == 1).collect();
            vs.len() == k && is_monochromatic_clique(m, colour, &vs)
        })
    }

    proptest! {
        #[test]
        fn agrees_with_brute_force(n in 2usize..=9, k in 2usize..=5, bits in any::<u64>()) {
            let mut m = ColourMatrix::filled(n, 2);
            let mut bit = 0;
            for j in 0..n {
                for i in 0..j {
                    if bits >> (bit % 64) & 1 == 1 { m.set(i, j, 1); }
                    bit += 1;
                }
            }
            let found = find_monochromatic_clique(&m, 1, k);
            prop_assert_eq!(found.is_some(), brute_force(&m, 1, k));
            if let Some(vs) = found {
                prop_assert_eq!(vs.len(), k);
                prop_assert!(is_monochromatic_clique(&m, 1, &vs));
            }
        }
    }
}
