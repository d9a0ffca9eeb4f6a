//! Classical extremal colourings built from their definitions, and a check of
//! their symmetries.

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

/// Exoo's two-stage construction of a (4,6;34) colouring (Geoffrey Exoo's Ramsey
/// construction pages, Indiana State University, ginger.indstate.edu/ge/RAMSEY/r.4.6.html): 2×2 blocks
/// A = [0 0; 0 0], B = [1 0; 0 1], C = [0 1; 1 0], D = [1 1; 1 1] fill a 17×17
/// block array (upper triangle below, row by row, the diagonal block first) to give
/// a colouring of K34 with exactly two monochromatic K4s in colour 0 and no K6 in
/// colour 1; recolouring [`EXOO_4_6_34_RECOLOURED`] then gives a (4,6;34)
/// colouring. Colour 0 there is colour 1 here. Every block is unchanged by
/// swapping both its rows and its columns, so this near-solution is invariant
/// under the fixed-point-free involution 2i ↔ 2i+1 (cycle type 2x17).
pub fn exoo_4_6_34_blocks() -> Colouring {
    const ROWS: [&str; 17] = [
        "ADBBACCDBDCABDCDC",
        "CCCCBBDBDBABACDC",
        "CDBDDACDDCDBCAA",
        "ABDDBBBACCCDBD",
        "CCBDCABDDDCBB",
        "AABDBDCCBDBD",
        "CCDBBBBCDBD",
        "CDBDCBDDCA",
        "ADDDCCABC",
        "CCBBABBB",
        "CCCCCCD",
        "CBDBBD",
        "ADCDA",
        "ACBC",
        "CCB",
        "AD",
        "C",
    ];
    let block = |i: usize, j: usize| {
        let (bi, bj) = (i.min(j) / 2, i.max(j) / 2);
        ROWS[bi].as_bytes()[bj - bi]
    };
    Colouring::from_fn(34, 2, |i, j| {
        let same_parity = i % 2 == j % 2;
        let zero = match block(i, j) {
            b'A' => true,
            b'B' => !same_parity,
            b'C' => same_parity,
            _ => false,
        };
        if zero {
            1
        } else {
            2
        }
    })
}

/// The eleven edges Exoo recolours in [`exoo_4_6_34_blocks`] (same source).
pub const EXOO_4_6_34_RECOLOURED: [(usize, usize); 11] = [
    (1, 26),
    (6, 14),
    (7, 15),
    (10, 14),
    (10, 15),
    (12, 14),
    (12, 15),
    (18, 23),
    (19, 22),
    (24, 25),
    (30, 31),
];

/// The first edge {i, j} (i < j) whose colour differs from that of {σ(i), σ(j)},
/// or None when the colouring is invariant under the vertex permutation `sigma`.
pub fn first_edge_moved(colouring: &Colouring, sigma: &[usize]) -> Option<(usize, usize)> {
    let order = colouring.order();
    (0..order)
        .flat_map(|j| (0..j).map(move |i| (i, j)))
        .find(|&(i, j)| colouring.colour(i, j) != colouring.colour(sigma[i], sigma[j]))
}
