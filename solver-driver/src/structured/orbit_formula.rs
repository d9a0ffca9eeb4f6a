//! The CNF of "no monochromatic forbidden clique" restricted to the colourings of one
//! family: one variable per orbit (two colours) or per orbit and colour (more), and
//! one clause per distinct set of orbits spanned by a clique through an anchor.
//!
//! A clique's clause only depends on which orbits its edges lie in, so cliques with
//! the same orbit set give the same clause; they are kept once. Because every clique
//! is the image under the group of a clique through an anchor, and the group maps
//! each orbit to itself, a family colouring satisfies these clauses exactly when it
//! has no monochromatic forbidden clique at all. The formula is therefore exact for
//! the family: unsatisfiable means no colouring of the family exists at this order.

use std::collections::HashSet;

use ramsift_encoder::edges::edge_index;
use ramsift_encoder::RamseySpec;

use super::families::{EdgeOrbits, MAX_ORBITS};

/// The orbit formula of one family and specification.
#[derive(Clone, Debug)]
pub struct OrbitFormula {
    pub colours: usize,
    pub orbit_count: usize,
    pub variable_count: usize,
    pub clauses: Vec<Vec<i32>>,
    /// Cliques through anchors that were enumerated (before removing repeats).
    pub cliques_enumerated: u64,
}

/// The literal "orbit `orbit` has colour `colour`" (two colours) or "may have
/// colour `colour`" (more), numbered like the encoder's edge variables.
pub fn orbit_literal(orbit: usize, colour: usize, colours: usize) -> i32 {
    if colours == 2 {
        let var = orbit as i32 + 1;
        if colour == 1 {
            var
        } else {
            -var
        }
    } else {
        (orbit * colours + colour) as i32
    }
}

impl OrbitFormula {
    pub fn new(orbits: &EdgeOrbits, spec: &RamseySpec) -> Self {
        Self::new_until(orbits, spec, None).expect("no deadline")
    }

    /// As [`Self::new`], giving up (`None`) once `deadline` passes: the cliques
    /// through the anchors can number in the tens of millions.
    pub fn new_until(
        orbits: &EdgeOrbits,
        spec: &RamseySpec,
        deadline: Option<std::time::Instant>,
    ) -> Option<Self> {
        let r = spec.colours();
        let sizes = spec.vertex_counts();
        let mut cliques_enumerated = 0u64;
        let mut clauses = Vec::new();
        if r > 2 {
            for orbit in 0..orbits.orbit_count {
                clauses.push((1..=r).map(|c| orbit_literal(orbit, c, r)).collect());
            }
        }
        // The orbit sets of all k-cliques are the same for every colour with clique
        // size k: compute them once per size.
        let mut by_size: Vec<(usize, Vec<OrbitSet>)> = Vec::new();
        for &k in &sizes {
            if by_size.iter().any(|(size, _)| *size == k) {
                continue;
            }
            let (masks, count) = orbit_sets_of_cliques(orbits, k, deadline)?;
            cliques_enumerated += count;
            by_size.push((k, masks));
        }
        for (colour, &k) in sizes.iter().enumerate() {
            let masks = &by_size
                .iter()
                .find(|(size, _)| *size == k)
                .expect("computed")
                .1;
            for mask in masks {
                clauses.push(
                    mask.members()
                        .map(|o| -orbit_literal(o, colour + 1, r))
                        .collect(),
                );
            }
        }
        Some(OrbitFormula {
            colours: r,
            orbit_count: orbits.orbit_count,
            variable_count: orbits.orbit_count * if r == 2 { 1 } else { r },
            clauses,
            cliques_enumerated,
        })
    }
}

/// The distinct orbit sets (as bit masks, sorted) of k-cliques through an anchor,
/// and how many cliques were enumerated; `None` if the deadline passed first.
fn orbit_sets_of_cliques(
    orbits: &EdgeOrbits,
    k: usize,
    deadline: Option<std::time::Instant>,
) -> Option<(Vec<OrbitSet>, u64)> {
    let mut walk = CliqueWalk {
        orbits,
        k,
        chosen: Vec::with_capacity(k),
        seen: HashSet::new(),
        count: 0,
        deadline,
        late: false,
    };
    if k >= 2 {
        for (anchor, companions) in &orbits.anchors {
            walk.chosen.clear();
            walk.chosen.push(*anchor);
            walk.extend(companions, 0, OrbitSet::default());
        }
    }
    if walk.late {
        return None;
    }
    let mut masks: Vec<OrbitSet> = walk.seen.into_iter().collect();
    masks.sort_unstable();
    Some((masks, walk.count))
}

/// A set of orbits (at most [`MAX_ORBITS`]), as a bit set whose words run from
/// the highest orbits to the lowest, so that sets compare as the numbers they
/// spell (and clauses keep the order they had as 128-bit masks).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash, PartialOrd, Ord)]
struct OrbitSet([u64; WORDS]);

const WORDS: usize = MAX_ORBITS / 64;

impl OrbitSet {
    fn insert(&mut self, orbit: usize) {
        self.0[WORDS - 1 - orbit / 64] |= 1 << (orbit % 64);
    }

    /// The orbits in the set, in increasing order.
    fn members(&self) -> impl Iterator<Item = usize> + '_ {
        (0..WORDS).flat_map(move |w| {
            let mut bits = self.0[WORDS - 1 - w];
            std::iter::from_fn(move || {
                (bits != 0).then(|| {
                    let low = bits.trailing_zeros() as usize;
                    bits &= bits - 1;
                    w * 64 + low
                })
            })
        })
    }
}

/// Depth-first enumeration of cliques through one anchor, over increasing
/// companions, carrying the orbit mask of the clique so far.
struct CliqueWalk<'a> {
    orbits: &'a EdgeOrbits,
    k: usize,
    chosen: Vec<usize>,
    seen: HashSet<OrbitSet>,
    count: u64,
    deadline: Option<std::time::Instant>,
    /// Set once the deadline has passed; the walk then unwinds.
    late: bool,
}

impl CliqueWalk<'_> {
    fn extend(&mut self, companions: &[usize], start: usize, mask: OrbitSet) {
        if self.late {
            return;
        }
        if self.chosen.len() == self.k {
            self.count += 1;
            self.seen.insert(mask);
            if self.count % (1 << 20) == 0
                && self
                    .deadline
                    .is_some_and(|d| std::time::Instant::now() >= d)
            {
                self.late = true;
            }
            return;
        }
        let still_needed = self.k - self.chosen.len();
        for index in start..companions.len() {
            if companions.len() - index < still_needed {
                break;
            }
            let v = companions[index];
            let mut next = mask;
            for &u in &self.chosen {
                next.insert(self.orbits.orbit_of_edge[edge_index(u, v)] as usize);
            }
            self.chosen.push(v);
            self.extend(companions, index + 1, next);
            self.chosen.pop();
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn triangle_clauses_of_the_pentagon_family() {
        // Z_5 has two distance classes {1,4} and {2,3}; a triangle through 0 uses
        // either both classes (0,1,3 has distances 1,2,3→2) or... enumerate by hand:
        // triangles {0,a,b}: (1,2): d 1,2,1 → {1,2}; (1,3): 1,3→2,2 → {1,2};
        // (1,4): 1,4→1,3→2 → {1,2}; (2,3): 2,3,1 → {1,2}; (2,4): 2,4→1,2 → {1,2};
        // (3,4): 3→2,4→1,1 → {1,2}. Every triangle uses both classes.
        let orbits = EdgeOrbits::circulant(5).unwrap();
        let spec = RamseySpec::cliques(&[3, 3]).unwrap();
        let formula = OrbitFormula::new(&orbits, &spec);
        assert_eq!(formula.cliques_enumerated, 6);
        let mut clauses = formula.clauses.clone();
        clauses.sort();
        assert_eq!(clauses, vec![vec![-1, -2], vec![1, 2]]);
    }

    #[test]
    fn orbit_sets_list_their_members_and_order_as_numbers() {
        let mut low = OrbitSet::default();
        low.insert(0);
        low.insert(63);
        low.insert(64);
        let mut high = OrbitSet::default();
        high.insert(200);
        assert_eq!(low.members().collect::<Vec<_>>(), vec![0, 63, 64]);
        assert_eq!(high.members().collect::<Vec<_>>(), vec![200]);
        // {200} spells a larger number than {0, 63, 64}.
        assert!(low < high);
    }
}
