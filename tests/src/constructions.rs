//! Classical extremal colourings built from their definitions.

use ramsift_encoder::Colouring;

/// The circulant 2-colouring of K_n: edge {i, j} has colour 1 iff the distance
/// (j - i) mod n lies in `distances` (which must be closed under negation mod n).
pub fn circulant(order: usize, distances: &[usize]) -> Colouring {
    Colouring::from_fn(order, 2, |i, j| {
        if distances.contains(&((j - i) % order)) {
            1
        } else {
            2
        }
    })
}

/// The nonzero squares mod a prime p.
pub fn quadratic_residues(p: usize) -> Vec<usize> {
    let mut squares: Vec<usize> = (1..p).map(|x| x * x % p).collect();
    squares.sort_unstable();
    squares.dedup();
    squares
}

/// The Paley colouring of K_p (p ≡ 1 mod 4 prime): colour 1 iff i - j is a nonzero square.
pub fn paley(p: usize) -> Colouring {
    circulant(p, &quadratic_residues(p))
}
