//! Families of structured colourings, each described by the partition of the edges
//! of K_n into orbits of a group acting on the vertices: a colouring invariant under
//! the group gives every edge of an orbit the same colour, so the orbits are the
//! unknowns.
//!
//! * **Cayley colourings of an abelian group** G = Z_{m1} × … × Z_{mk} (vertices are
//!   the group elements; the colour of {x, y} depends only on ±(x − y)). The
//!   circulant colourings are the case G = Z_n; Z_a × Z_b and the elementary abelian
//!   groups Z_2^d are the other cases offered on the command line.
//! * **Block-circulant colourings** with b blocks of m vertices: vertex (p, i) is
//!   p·m + i, and the colour of {(p, i), (q, j)} (p ≤ q) depends only on p, q and
//!   j − i mod m (up to sign when p = q). The group is Z_m rotating every block
//!   at once. With f *fixed vertices* added after the blocks (order b·m + f), the
//!   rotation fixes them: the colour of an edge from a fixed vertex to block p is
//!   one unknown, and each edge between fixed vertices is its own. These are the
//!   colourings with a cyclic automorphism of order m having b orbits of size m
//!   and f fixed points, the shape of many published Ramsey colourings found by
//!   search (Exoo, "On the Ramsey number R(4,6)", EJC 19 (2012) #P66: a colouring
//!   of K35 whose automorphisms fix one vertex).
//!
//! * **Distance colourings** (Kuznetsov, "Computational lower limits on small
//!   Ramsey numbers", arXiv:1505.07186): the colour of {i, j} depends only on
//!   |i − j|, with vertices on a line rather than a cycle. No group acts, but
//!   translating a clique keeps its distances, so every clique has the orbit set
//!   of one through vertex 0 and the formula stays exact. The circulant
//!   colourings of K_n are the distance colourings whose colour of d equals that
//!   of n − d, and the first m vertices of a distance colouring are one of K_m.
//! * **Colourings with a prescribed automorphism**: invariant under one vertex
//!   permutation given by its cycle lengths (any mix, fixed vertices included),
//!   the edge orbits being those of the cyclic group it generates. The
//!   block-circulant families are the cases of equal cycles plus fixed vertices.
//!
//! Each family also lists its *anchors*: a set of (vertex, companions) pairs such
//! that every clique of K_n is mapped by the group onto a clique made of one anchor
//! vertex and some of its companions. Only those cliques need clauses.

use std::fmt;
use std::str::FromStr;

use thiserror::Error;

use ramsift_encoder::edges::{edge_count, edge_index};
use ramsift_encoder::Colouring;

use crate::local::automorphism::{EdgeOrbitMoves, VertexCycles};

/// The most orbits a family may have: clause sets are kept as 256-bit masks.
pub const MAX_ORBITS: usize = 256;

#[derive(Debug, Error, PartialEq, Eq)]
pub enum FamilyError {
    #[error("group {text:?}: expected Zn, a product such as Z3xZ5, or a power such as Z2^4 (factors of at least 2)")]
    BadGroup { text: String },
    #[error("group {group} has {size} elements, but the order asked for is {order}")]
    GroupOrder {
        group: String,
        size: usize,
        order: usize,
    },
    #[error(
        "{family} at order {order} has {orbits} edge orbits; at most {MAX_ORBITS} are supported"
    )]
    TooManyOrbits {
        family: String,
        order: usize,
        orbits: usize,
    },
    #[error("the automorphism's cycles {cycles} move {moved} vertices, but K_{order} has {order}")]
    CyclesOrder {
        cycles: String,
        moved: usize,
        order: usize,
    },
    #[error("structured searches handle specifications in which every colour forbids a clique; {spec} forbids other graphs")]
    NeedsCliques { spec: String },
    #[error("block-circulant colourings with {blocks} blocks and {fixed} fixed vertices need the order less {fixed} to be divisible by {blocks} (with blocks of at least 2 vertices); {order} is not")]
    BlockOrder {
        blocks: usize,
        fixed: usize,
        order: usize,
    },
}

/// A finite abelian group given as a product of cyclic factors.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct AbelianGroup {
    factors: Vec<usize>,
}

impl AbelianGroup {
    pub fn cyclic(n: usize) -> Self {
        AbelianGroup { factors: vec![n] }
    }

    pub fn new(factors: Vec<usize>) -> Self {
        AbelianGroup { factors }
    }

    pub fn factors(&self) -> &[usize] {
        &self.factors
    }

    pub fn size(&self) -> usize {
        self.factors.iter().product()
    }

    /// Element `x` (mixed-radix index, first factor most significant) as coordinates.
    fn coordinates(&self, mut x: usize) -> Vec<usize> {
        let mut coords = vec![0; self.factors.len()];
        for (slot, &m) in coords.iter_mut().zip(&self.factors).rev() {
            *slot = x % m;
            x /= m;
        }
        coords
    }

    fn index(&self, coords: &[usize]) -> usize {
        coords
            .iter()
            .zip(&self.factors)
            .fold(0, |acc, (&c, &m)| acc * m + c)
    }

    /// y − x.
    pub fn difference(&self, x: usize, y: usize) -> usize {
        let (a, b) = (self.coordinates(x), self.coordinates(y));
        let diff: Vec<usize> = a
            .iter()
            .zip(&b)
            .zip(&self.factors)
            .map(|((&p, &q), &m)| (q + m - p) % m)
            .collect();
        self.index(&diff)
    }

    /// −x.
    pub fn negate(&self, x: usize) -> usize {
        self.difference(x, 0)
    }

    /// The products of cyclic groups that the searches try at order n: one per
    /// factorisation of n into factors ≥ 2 in non-decreasing order, fewest factors
    /// first (so Z_n first). Isomorphic products such as Z_6 and Z_2 × Z_3 both
    /// appear: a little repeated work, nothing lost.
    pub fn all_of_order(n: usize) -> Vec<AbelianGroup> {
        fn split(rest: usize, min: usize, current: &mut Vec<usize>, out: &mut Vec<Vec<usize>>) {
            if rest == 1 {
                if !current.is_empty() {
                    out.push(current.clone());
                }
                return;
            }
            for f in min..=rest {
                if rest % f == 0 {
                    current.push(f);
                    split(rest / f, f, current, out);
                    current.pop();
                }
            }
        }
        let mut out = Vec::new();
        split(n, 2, &mut Vec::new(), &mut out);
        out.sort_by_key(|f| f.len());
        out.into_iter().map(AbelianGroup::new).collect()
    }
}

impl fmt::Display for AbelianGroup {
    /// `Z17`, `Z3xZ5`, `Z2^4`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.factors.len() > 1 && self.factors.iter().all(|&m| m == self.factors[0]) {
            return write!(f, "Z{}^{}", self.factors[0], self.factors.len());
        }
        let parts: Vec<String> = self.factors.iter().map(|m| format!("Z{m}")).collect();
        f.write_str(&parts.join("x"))
    }
}

impl FromStr for AbelianGroup {
    type Err = FamilyError;

    fn from_str(text: &str) -> Result<Self, FamilyError> {
        let bad = || FamilyError::BadGroup {
            text: text.to_string(),
        };
        let number = |s: &str| -> Result<usize, FamilyError> {
            s.parse::<usize>()
                .ok()
                .filter(|&m| m >= 2 && s.bytes().all(|b| b.is_ascii_digit()))
                .ok_or_else(bad)
        };
        let mut factors = Vec::new();
        for part in text.trim().split(['x', 'X', '*']) {
            let part = part.trim();
            let body = part
                .strip_prefix('Z')
                .or_else(|| part.strip_prefix('z'))
                .ok_or_else(bad)?;
            match body.split_once('^') {
                Some((base, power)) => {
                    let base = number(base)?;
                    let power: usize = power.parse().ok().filter(|&p| p >= 1).ok_or_else(bad)?;
                    factors.extend(std::iter::repeat_n(base, power));
                }
                None => factors.push(number(body)?),
            }
        }
        if factors.is_empty() || factors.len() > 20 {
            return Err(bad());
        }
        Ok(AbelianGroup { factors })
    }
}

/// `Ok` when `cycles` permute exactly the vertices of K_order.
pub fn cycles_fit(cycles: &VertexCycles, order: usize) -> Result<(), FamilyError> {
    if cycles.order() == order {
        Ok(())
    } else {
        Err(FamilyError::CyclesOrder {
            cycles: cycles.to_string(),
            moved: cycles.order(),
            order,
        })
    }
}

/// Which kind of structured colouring.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub enum FamilyKind {
    Cayley(AbelianGroup),
    BlockCirculant {
        blocks: usize,
        fixed: usize,
    },
    /// Invariant under one vertex permutation given by its cycle lengths.
    Automorphism(VertexCycles),
    /// The colour of {i, j} depends on |i − j| only.
    Distance,
}

impl fmt::Display for FamilyKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FamilyKind::Cayley(g) if g.factors().len() == 1 => {
                write!(f, "circulant ({g})")
            }
            FamilyKind::Cayley(g) => write!(f, "Cayley ({g})"),
            FamilyKind::BlockCirculant { blocks, fixed: 0 } => {
                write!(f, "block-circulant ({blocks} blocks)")
            }
            FamilyKind::BlockCirculant { blocks: 1, fixed } => {
                write!(f, "block-circulant (1 block, {fixed} fixed)")
            }
            FamilyKind::BlockCirculant { blocks, fixed } => {
                write!(f, "block-circulant ({blocks} blocks, {fixed} fixed)")
            }
            FamilyKind::Automorphism(cycles) => write!(f, "invariant under cycles {cycles}"),
            FamilyKind::Distance => f.write_str("distance"),
        }
    }
}

/// The edge orbits of one family at one order.
#[derive(Clone, Debug)]
pub struct EdgeOrbits {
    pub kind: FamilyKind,
    pub order: usize,
    /// Orbit of each edge, by edge index.
    pub orbit_of_edge: Vec<u32>,
    pub orbit_count: usize,
    /// (anchor vertex, its companions): every clique is the image of one made of an
    /// anchor and companions of that anchor.
    pub anchors: Vec<(usize, Vec<usize>)>,
}

impl EdgeOrbits {
    /// Cayley colourings of `group` (its size is the order).
    pub fn cayley(group: &AbelianGroup) -> Result<Self, FamilyError> {
        let n = group.size();
        // Orbit of a difference class {g, −g}, numbered in order of first appearance.
        let mut class_of = vec![u32::MAX; n];
        let mut count = 0u32;
        for g in 1..n {
            if class_of[g] == u32::MAX {
                class_of[g] = count;
                class_of[group.negate(g)] = count;
                count += 1;
            }
        }
        let mut orbit_of_edge = vec![0u32; edge_count(n)];
        for j in 0..n {
            for i in 0..j {
                orbit_of_edge[edge_index(i, j)] = class_of[group.difference(i, j)];
            }
        }
        let kind = FamilyKind::Cayley(group.clone());
        Self::checked(EdgeOrbits {
            kind,
            order: n,
            orbit_of_edge,
            orbit_count: count as usize,
            // The group is transitive: every clique can be moved to contain 0.
            anchors: vec![(0, (1..n).collect())],
        })
    }

    /// Circulant colourings of K_n (Cayley colourings of Z_n).
    pub fn circulant(order: usize) -> Result<Self, FamilyError> {
        Self::cayley(&AbelianGroup::cyclic(order))
    }

    /// Block-circulant colourings with `blocks` blocks of order / blocks vertices.
    pub fn block_circulant(order: usize, blocks: usize) -> Result<Self, FamilyError> {
        Self::block_circulant_fixed(order, blocks, 0)
    }

    /// Block-circulant colourings with `blocks` blocks of (order − fixed) / blocks
    /// vertices and `fixed` fixed vertices after them.
    pub fn block_circulant_fixed(
        order: usize,
        blocks: usize,
        fixed: usize,
    ) -> Result<Self, FamilyError> {
        let moved = order.saturating_sub(fixed);
        if blocks == 0 || fixed >= order || moved % blocks != 0 || moved / blocks < 2 {
            return Err(FamilyError::BlockOrder {
                blocks,
                fixed,
                order,
            });
        }
        let m = moved / blocks;
        let mut ids = std::collections::HashMap::new();
        let mut orbit_of_edge = vec![0u32; edge_count(order)];
        for v in 0..order {
            for u in 0..v {
                // (block or fixed-vertex number, position, ...) of each end.
                let key = match (u < moved, v < moved) {
                    (true, true) => {
                        let (p, i, q, j) = (u / m, u % m, v / m, v % m);
                        let d = (j + m - i) % m;
                        (0, p, q, if p == q { d.min(m - d) } else { d })
                    }
                    (true, false) => (1, u / m, v, 0),
                    _ => (2, u, v, 0),
                };
                let next = ids.len() as u32;
                let id = *ids.entry(key).or_insert(next);
                orbit_of_edge[edge_index(u, v)] = id;
            }
        }
        // A clique's lowest block p holds some (p, i); rotating by −i moves it to (p, 0),
        // keeping the other vertices in blocks ≥ p or fixed. A clique of fixed
        // vertices only is its own image; its least vertex anchors it.
        let anchors = (0..blocks)
            .map(|p| p * m)
            .chain(moved..order)
            .map(|a| (a, (a + 1..order).collect()))
            .collect();
        Self::checked(EdgeOrbits {
            kind: FamilyKind::BlockCirculant { blocks, fixed },
            order,
            orbit_count: ids.len(),
            orbit_of_edge,
            anchors,
        })
    }

    /// Distance colourings of K_n: orbit d − 1 holds the edges {i, i + d}.
    pub fn distance(order: usize) -> Result<Self, FamilyError> {
        let mut orbit_of_edge = vec![0u32; edge_count(order)];
        for j in 0..order {
            for i in 0..j {
                orbit_of_edge[edge_index(i, j)] = (j - i - 1) as u32;
            }
        }
        Self::checked(EdgeOrbits {
            kind: FamilyKind::Distance,
            order,
            orbit_of_edge,
            orbit_count: order.saturating_sub(1),
            // Translating a clique down to vertex 0 keeps every distance.
            anchors: vec![(0, (1..order).collect())],
        })
    }

    /// Colourings invariant under the vertex permutation with these cycles
    /// (vertices 0..l₁ the first cycle, and so on; [`VertexCycles`]).
    pub fn invariant_under(cycles: &VertexCycles) -> Result<Self, FamilyError> {
        let moves = EdgeOrbitMoves::new(cycles);
        // A clique's lowest cycle holds some vertex; the power of the permutation
        // that takes it to the cycle's first vertex keeps every other vertex in its
        // own cycle, so all of them come after that first vertex.
        let order = cycles.order();
        let mut anchors = Vec::new();
        let mut first = 0;
        for &length in cycles.lengths() {
            anchors.push((first, (first + 1..order).collect()));
            first += length;
        }
        Self::checked(EdgeOrbits {
            kind: FamilyKind::Automorphism(cycles.clone()),
            order,
            orbit_of_edge: moves.orbit_of_edge().to_vec(),
            orbit_count: moves.orbit_count(),
            anchors,
        })
    }

    fn checked(self) -> Result<Self, FamilyError> {
        if self.orbit_count > MAX_ORBITS {
            return Err(FamilyError::TooManyOrbits {
                family: self.kind.to_string(),
                order: self.order,
                orbits: self.orbit_count,
            });
        }
        Ok(self)
    }

    /// The colouring with orbit o coloured `orbit_colours[o]`.
    pub fn expand(&self, orbit_colours: &[u8], colours: usize) -> Colouring {
        Colouring::from_fn(self.order, colours, |i, j| {
            orbit_colours[self.orbit_of_edge[edge_index(i, j)] as usize]
        })
    }

    /// Human-readable description of a colouring in this family: for Cayley
    /// colourings the group elements (differences) of each colour, one of each pair
    /// ±g ("colour 1: distances {1,2,4,8}" for circulants, coordinates otherwise);
    /// for distance colourings the distances of each colour.
    pub fn describe(&self, orbit_colours: &[u8], colours: usize) -> String {
        // The edges {0, g} meet every orbit of these families; g names its orbit,
        // as a distance, or by its coordinates in a product of cyclic groups.
        let coordinates = match &self.kind {
            FamilyKind::Cayley(group) if group.factors().len() > 1 => Some(group),
            FamilyKind::Cayley(_) | FamilyKind::Distance => None,
            _ => return format!("{} orbits", self.orbit_count),
        };
        let mut parts = Vec::new();
        for c in 1..=colours as u8 {
            let mut seen = vec![false; self.orbit_count];
            let mut members = Vec::new();
            for g in 1..self.order {
                let orbit = self.orbit_of_edge[edge_index(0, g)] as usize;
                if orbit_colours[orbit] == c && !seen[orbit] {
                    seen[orbit] = true;
                    members.push(match coordinates {
                        None => g.to_string(),
                        Some(group) => {
                            let coords: Vec<String> =
                                group.coordinates(g).iter().map(|x| x.to_string()).collect();
                            format!("({})", coords.join(","))
                        }
                    });
                }
            }
            let noun = if coordinates.is_some() {
                "differences"
            } else {
                "distances"
            };
            parts.push(format!("colour {c}: {noun} {{{}}}", members.join(",")));
        }
        parts.join("; ")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn circulant_orbits_are_distances() {
        let orbits = EdgeOrbits::circulant(17).unwrap();
        assert_eq!(orbits.orbit_count, 8);
        let of = |i, j| orbits.orbit_of_edge[edge_index(i, j)];
        assert_eq!(of(0, 3), of(5, 8));
        assert_eq!(of(0, 3), of(0, 14)); // distance 3 = distance −3
        assert_ne!(of(0, 3), of(0, 4));
        // Z_16 has 8 distance classes, the class of 8 being its own negative.
        assert_eq!(EdgeOrbits::circulant(16).unwrap().orbit_count, 8);
    }

    #[test]
    fn elementary_abelian_classes_are_the_nonzero_elements() {
        let group: AbelianGroup = "Z2^4".parse().unwrap();
        assert_eq!(group.size(), 16);
        assert_eq!(group.to_string(), "Z2^4");
        // In Z_2^d every element is its own negative: 2^d − 1 orbits.
        assert_eq!(EdgeOrbits::cayley(&group).unwrap().orbit_count, 15);
        let z3z5: AbelianGroup = "Z3xZ5".parse().unwrap();
        // 14 nonzero elements, none of order 2: 7 classes.
        assert_eq!(EdgeOrbits::cayley(&z3z5).unwrap().orbit_count, 7);
    }

    #[test]
    fn group_names_are_checked() {
        for bad in ["", "Z1", "Q8", "Z3x", "Z2^0", "Z-3"] {
            assert!(bad.parse::<AbelianGroup>().is_err(), "{bad}");
        }
        assert_eq!(
            AbelianGroup::all_of_order(12)
                .iter()
                .map(|g| g.to_string())
                .collect::<Vec<_>>(),
            vec!["Z12", "Z2xZ6", "Z3xZ4", "Z2xZ2xZ3"]
        );
    }

    #[test]
    fn block_circulant_orbits_commute_with_rotation() {
        let orbits = EdgeOrbits::block_circulant(12, 3).unwrap();
        let m = 4;
        let rotate = |v: usize| (v / m) * m + (v % m + 1) % m;
        for v in 0..12 {
            for u in 0..v {
                assert_eq!(
                    orbits.orbit_of_edge[edge_index(u, v)],
                    orbits.orbit_of_edge[edge_index(rotate(u), rotate(v))]
                );
            }
        }
        // Within each block: ⌊m/2⌋ = 2 classes; between two blocks: m = 4 classes.
        assert_eq!(orbits.orbit_count, 3 * 2 + 3 * 4);
        assert!(EdgeOrbits::block_circulant(13, 3).is_err());
    }

    #[test]
    fn fixed_vertices_stay_put_under_the_rotation() {
        // 3 blocks of 4 and 2 fixed vertices (12, 13).
        let orbits = EdgeOrbits::block_circulant_fixed(14, 3, 2).unwrap();
        let m = 4;
        let rotate = |v: usize| {
            if v >= 12 {
                v
            } else {
                (v / m) * m + (v % m + 1) % m
            }
        };
        for v in 0..14 {
            for u in 0..v {
                assert_eq!(
                    orbits.orbit_of_edge[edge_index(u, v)],
                    orbits.orbit_of_edge
                        [edge_index(rotate(u).min(rotate(v)), rotate(u).max(rotate(v)))]
                );
            }
        }
        // As without fixed vertices (18), plus one class per (fixed vertex, block)
        // and the edge between the two fixed vertices.
        assert_eq!(orbits.orbit_count, 18 + 2 * 3 + 1);
        assert_eq!(orbits.anchors.len(), 3 + 2);
        assert!(EdgeOrbits::block_circulant_fixed(14, 4, 3).is_err());
        assert!(EdgeOrbits::block_circulant_fixed(3, 1, 3).is_err());
    }

    #[test]
    fn a_prescribed_automorphism_with_equal_cycles_is_a_block_circulant_family() {
        // Two 8-cycles and a fixed vertex: the same edge partition as two blocks
        // of 8 and one fixed vertex (the same vertex labels, the same rotation).
        let cycles: VertexCycles = "8x2,1".parse().unwrap();
        let invariant = EdgeOrbits::invariant_under(&cycles).unwrap();
        let blocks = EdgeOrbits::block_circulant_fixed(17, 2, 1).unwrap();
        assert_eq!(invariant.orbit_count, blocks.orbit_count);
        for e in 0..edge_count(17) {
            for f in 0..edge_count(17) {
                assert_eq!(
                    invariant.orbit_of_edge[e] == invariant.orbit_of_edge[f],
                    blocks.orbit_of_edge[e] == blocks.orbit_of_edge[f]
                );
            }
        }
        assert_eq!(invariant.anchors.len(), 3);
        assert_eq!(invariant.kind.to_string(), "invariant under cycles 8x2,1");
        // Eight 4-cycles and a 2-cycle on 34 vertices: 145 orbits, held since
        // clause sets grew to 256 bits.
        let exoo_shape = EdgeOrbits::invariant_under(&"4x8,2".parse().unwrap()).unwrap();
        assert_eq!(exoo_shape.orbit_count, 145);
        assert!(EdgeOrbits::invariant_under(&"1x40".parse().unwrap()).is_err());
    }

    #[test]
    fn distance_classes_hold_the_circulants() {
        let orbits = EdgeOrbits::distance(17).unwrap();
        assert_eq!(orbits.orbit_count, 16);
        let of = |i, j| orbits.orbit_of_edge[edge_index(i, j)];
        assert_eq!(of(0, 3), of(5, 8));
        // Distance 3 and 14 are apart here (on a line), together for circulants.
        assert_ne!(of(0, 3), of(0, 14));
        let circulant = EdgeOrbits::circulant(17).unwrap();
        for e in 0..edge_count(17) {
            for f in 0..edge_count(17) {
                if orbits.orbit_of_edge[e] == orbits.orbit_of_edge[f] {
                    assert_eq!(circulant.orbit_of_edge[e], circulant.orbit_of_edge[f]);
                }
            }
        }
        let colours: Vec<u8> = (1..17).map(|d| if d % 2 == 0 { 1 } else { 2 }).collect();
        assert_eq!(
            EdgeOrbits::distance(5).unwrap().describe(&colours[..4], 2),
            "colour 1: distances {2,4}; colour 2: distances {1,3}"
        );
    }
}
