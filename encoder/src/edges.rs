//! Numbering of the edges of K_n.
//!
//! Edge {i, j} with 0 <= i < j has index `j(j-1)/2 + i` (colexicographic order).
//! The index does not depend on n, so K_n's edges are a prefix of K_{n+1}'s:
//! a file written for one order can be read against the next without renumbering.

/// Number of edges of K_n.
pub fn edge_count(order: usize) -> usize {
    order * order.saturating_sub(1) / 2
}

/// Index of edge {a, b} (a != b, in either order).
#[inline]
pub fn edge_index(a: usize, b: usize) -> usize {
    debug_assert_ne!(a, b, "a loop is not an edge of K_n");
    let (i, j) = if a < b { (a, b) } else { (b, a) };
    j * (j - 1) / 2 + i
}

/// The endpoints (i, j), i < j, of the edge with the given index.
pub fn edge_endpoints(index: usize) -> (usize, usize) {
    // Largest j with j(j-1)/2 <= index.
    let mut j = (((8.0 * index as f64 + 1.0).sqrt() + 1.0) / 2.0) as usize;
    while j * (j - 1) / 2 > index {
        j -= 1;
    }
    while (j + 1) * j / 2 <= index {
        j += 1;
    }
    (index - j * (j - 1) / 2, j)
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn first_edges_in_colex_order() {
        assert_eq!(edge_index(0, 1), 0);
        assert_eq!(edge_index(0, 2), 1);
        assert_eq!(edge_index(1, 2), 2);
        assert_eq!(edge_index(3, 0), 3);
        assert_eq!(edge_count(5), 10);
    }

    #[test]
    fn indices_cover_each_edge_once() {
        let n = 30;
        let mut seen = vec![false; edge_count(n)];
        for j in 0..n {
            for i in 0..j {
                let e = edge_index(i, j);
                assert!(!seen[e]);
                seen[e] = true;
            }
        }
        assert!(seen.into_iter().all(|s| s));
    }

    proptest! {
        #[test]
        fn endpoints_invert_index(i in 0usize..5000, d in 1usize..5000) {
            let j = i + d;
            prop_assert_eq!(edge_endpoints(edge_index(i, j)), (i, j));
        }
    }
}
