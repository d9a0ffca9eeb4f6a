//! Local search over the colourings that have a prescribed automorphism: a vertex
//! permutation σ given by its cycle lengths. A colouring is invariant under σ
//! exactly when it is constant on every orbit of the cyclic group ⟨σ⟩ acting on
//! the edges, so a move recolours a whole edge orbit and every colouring visited
//! stays invariant. The search space shrinks from r^(edges) to r^(orbits) (about
//! a fourth of the exponent for eight 4-cycles and a 2-cycle at order 34).
//!
//! Many record lower-bound colourings have a nontrivial automorphism of this kind
//! and were found by searches restricted to one (Exoo, "On the Ramsey number
//! R(4,6)", EJC 19 (2012) #P66: the most symmetric of its colourings of K35 has an
//! automorphism group of order 4 with one fixed point). The structured search
//! (`find --method automorphism`, [`crate::structured`]) decides such a
//! restriction exactly by SAT over at most 256 orbits, when the solver gets
//! through; this search handles any number of them, heuristically.

use std::fmt;
use std::str::FromStr;

use rand::Rng;
use thiserror::Error;

use ramsift_encoder::edges::{edge_count, edge_index};
use ramsift_encoder::Colouring;

use super::moves::{LeastOf, TabuList};
use super::pattern::Pattern;
use super::state::LocalState;

/// The most cycles a description may list (more than any order local search
/// handles).
const MAX_CYCLES: usize = 128;

#[derive(Debug, Error, PartialEq, Eq)]
pub enum CyclesError {
    #[error("cycle lengths {text:?}: expected a comma list of lengths, each optionally times a count, e.g. 4x8,2 (eight 4-cycles and one 2-cycle)")]
    Syntax { text: String },
    #[error("cycle lengths {text:?}: lengths and counts are at least 1")]
    Zero { text: String },
    #[error("cycle lengths {text:?}: more than {MAX_CYCLES} cycles")]
    TooMany { text: String },
}

/// A vertex permutation given by the lengths of its cycles: vertices
/// 0..l₁ form the first cycle (v ↦ v + 1, the last back to the first), the next
/// l₂ the second, and so on; cycles of length 1 are fixed vertices.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct VertexCycles {
    lengths: Vec<usize>,
}

impl VertexCycles {
    pub fn new(lengths: Vec<usize>) -> Self {
        VertexCycles { lengths }
    }

    /// The number of vertices it permutes.
    pub fn order(&self) -> usize {
        self.lengths.iter().sum()
    }

    pub fn lengths(&self) -> &[usize] {
        &self.lengths
    }

    /// Several permutations for messages: `4x8,2 / 2x16,1,1`.
    pub fn list(all: &[VertexCycles]) -> String {
        let names: Vec<String> = all.iter().map(VertexCycles::to_string).collect();
        names.join(" / ")
    }

    /// Every shape of an involution of K_order other than the identity: p 2-cycles
    /// on vertices 0..2p and the other order − 2p vertices fixed, for p from
    /// order/2 (at most one fixed vertex) down to 1. Record colourings often have
    /// one: the published (4,6;34) colouring (Exoo's page, checked in
    /// `tests/tests/extension.rs`) is invariant under thirteen 2-cycles with eight
    /// vertices fixed.
    pub fn involutions(order: usize) -> Vec<VertexCycles> {
        (1..=order / 2)
            .rev()
            .map(|pairs| {
                let mut lengths = vec![2; pairs];
                lengths.resize(order - pairs, 1);
                VertexCycles { lengths }
            })
            .collect()
    }

    /// σ as an array: `permutation()[v]` is the image of v.
    pub fn permutation(&self) -> Vec<usize> {
        let mut image = Vec::with_capacity(self.order());
        let mut first = 0;
        for &length in &self.lengths {
            image.extend((0..length).map(|i| first + (i + 1) % length));
            first += length;
        }
        image
    }
}

impl FromStr for VertexCycles {
    type Err = CyclesError;

    /// `4x8,2`: eight cycles of length 4, then one of length 2.
    fn from_str(text: &str) -> Result<Self, CyclesError> {
        let syntax = || CyclesError::Syntax {
            text: text.to_string(),
        };
        let number = |s: &str| -> Result<usize, CyclesError> {
            let s = s.trim();
            if s.is_empty() || !s.bytes().all(|b| b.is_ascii_digit()) {
                return Err(syntax());
            }
            let value: usize = s.parse().map_err(|_| syntax())?;
            if value == 0 {
                return Err(CyclesError::Zero {
                    text: text.to_string(),
                });
            }
            Ok(value)
        };
        let mut lengths = Vec::new();
        for part in text.split(',') {
            let (length, count) = match part.split_once(['x', 'X']) {
                Some((length, count)) => (number(length)?, number(count)?),
                None => (number(part)?, 1),
            };
            if lengths.len() + count > MAX_CYCLES {
                return Err(CyclesError::TooMany {
                    text: text.to_string(),
                });
            }
            lengths.extend(std::iter::repeat_n(length, count));
        }
        Ok(VertexCycles { lengths })
    }
}

impl fmt::Display for VertexCycles {
    /// Runs of equal lengths as `LENxCOUNT`: `4x8,2`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let mut parts = Vec::new();
        let mut rest = &self.lengths[..];
        while let Some(&length) = rest.first() {
            let run = rest.iter().take_while(|&&l| l == length).count();
            parts.push(if run == 1 {
                length.to_string()
            } else {
                format!("{length}x{run}")
            });
            rest = &rest[run..];
        }
        f.write_str(&parts.join(","))
    }
}

/// The edge orbits of ⟨σ⟩: the moves of the search.
#[derive(Clone, Debug)]
pub struct EdgeOrbitMoves {
    cycles: VertexCycles,
    /// The edges of each orbit, as (u, v) with u < v.
    orbits: Vec<Vec<(usize, usize)>>,
    /// The orbit of each edge, by edge index.
    orbit_of_edge: Vec<u32>,
}

impl EdgeOrbitMoves {
    pub fn new(cycles: &VertexCycles) -> Self {
        let n = cycles.order();
        let sigma = cycles.permutation();
        let mut orbit_of_edge = vec![u32::MAX; edge_count(n)];
        let mut orbits = Vec::new();
        for v in 0..n {
            for u in 0..v {
                if orbit_of_edge[edge_index(u, v)] != u32::MAX {
                    continue;
                }
                let id = orbits.len() as u32;
                let mut members = Vec::new();
                let (mut a, mut b) = (u, v);
                while orbit_of_edge[edge_index(a.min(b), a.max(b))] == u32::MAX {
                    orbit_of_edge[edge_index(a.min(b), a.max(b))] = id;
                    members.push((a.min(b), a.max(b)));
                    (a, b) = (sigma[a], sigma[b]);
                }
                orbits.push(members);
            }
        }
        EdgeOrbitMoves {
            cycles: cycles.clone(),
            orbits,
            orbit_of_edge,
        }
    }

    pub fn cycles(&self) -> &VertexCycles {
        &self.cycles
    }

    pub fn orbit_count(&self) -> usize {
        self.orbits.len()
    }

    pub fn orbit(&self, index: usize) -> &[(usize, usize)] {
        &self.orbits[index]
    }

    /// The orbit of each edge, by edge index.
    pub fn orbit_of_edge(&self) -> &[u32] {
        &self.orbit_of_edge
    }

    /// A uniformly random invariant colouring.
    pub fn random_state(&self, patterns: &[Pattern], rng: &mut impl Rng) -> LocalState {
        let r = patterns.len();
        let colours: Vec<u8> = (0..self.orbits.len())
            .map(|_| rng.gen_range(1..=r as u8))
            .collect();
        let colouring = Colouring::from_fn(self.cycles.order(), r, |i, j| {
            colours[self.orbit_of_edge[edge_index(i, j)] as usize]
        });
        LocalState::new(&colouring, patterns)
    }

    /// Whether `colouring` is constant on every orbit.
    pub fn is_invariant(&self, colouring: &Colouring) -> bool {
        self.orbits.iter().all(|orbit| {
            let (u, v) = orbit[0];
            let c = colouring.colour(u, v);
            orbit.iter().all(|&(x, y)| colouring.colour(x, y) == c)
        })
    }

    /// The orbits holding an edge of a monochromatic forbidden copy (every edge of
    /// such an orbit is in one, by invariance).
    fn bad_orbits(&self, state: &LocalState) -> Vec<usize> {
        (0..self.orbits.len())
            .filter(|&o| {
                let (u, v) = self.orbits[o][0];
                state.through(u, v) > 0
            })
            .collect()
    }
}

/// The tabu tenure of an orbit: this many steps, plus a random 0..=`.1` more.
/// The value of the first probes at (4,6;34), kept; no other tenure was
/// compared (BENCHMARKS.md says so).
const ORBIT_TENURE: (u64, u64) = (5, 4);

/// One tabu step over the recolourings of whole orbits: of the orbits in a
/// monochromatic copy when `focused`, else of every orbit. The best allowed move
/// is made (tabu orbits only when they reach a new best cost), ties broken at
/// random. Returns false when no move was allowed.
pub fn orbit_tabu_step(
    state: &mut LocalState,
    moves: &EdgeOrbitMoves,
    tabu: &mut TabuList,
    best_cost: u64,
    focused: bool,
    rng: &mut impl Rng,
) -> bool {
    let r = state.colours() as u8;
    let step = tabu.advance();
    let candidates: Vec<usize> = if focused {
        moves.bad_orbits(state)
    } else {
        (0..moves.orbit_count()).collect()
    };
    let mut best = LeastOf::new();
    for o in candidates {
        let orbit = moves.orbit(o);
        let from = state.colour(orbit[0].0, orbit[0].1);
        let free = tabu.free_at(o, step);
        for to in (1..=r).filter(|&c| c != from) {
            let cost = state.cost_if_recoloured(orbit, to);
            if free || cost < best_cost {
                best.offer(cost as i64, (o, to), rng);
            }
        }
    }
    let Some((_, (o, to))) = best.least() else {
        return false;
    };
    for &(u, v) in moves.orbit(o) {
        state.recolour(u, v, to);
    }
    tabu.forbid(o, ORBIT_TENURE, rng);
    true
}

#[cfg(test)]
mod tests {
    use super::*;
    use rand::SeedableRng;
    use rand_chacha::ChaCha8Rng;

    #[test]
    fn cycle_lengths_parse_and_print() {
        let cycles: VertexCycles = "4x8,2".parse().unwrap();
        assert_eq!(cycles.order(), 34);
        assert_eq!(cycles.lengths().len(), 9);
        assert_eq!(cycles.to_string(), "4x8,2");
        assert_eq!(
            "3,3,1".parse::<VertexCycles>().unwrap().to_string(),
            "3x2,1"
        );
        for bad in ["", "4x", "x2", "4x0", "0", "4;2", "-1", "4x2x2"] {
            assert!(bad.parse::<VertexCycles>().is_err(), "{bad:?}");
        }
        assert!("1x200".parse::<VertexCycles>().is_err());
    }

    #[test]
    fn the_permutation_has_the_cycles_asked_for() {
        let cycles: VertexCycles = "4x2,2,1".parse().unwrap();
        let sigma = cycles.permutation();
        assert_eq!(sigma, vec![1, 2, 3, 0, 5, 6, 7, 4, 9, 8, 10]);
    }

    #[test]
    fn involution_shapes_are_every_involution_but_the_identity() {
        for order in 2..=20 {
            let shapes = VertexCycles::involutions(order);
            assert_eq!(shapes.len(), order / 2);
            for (k, shape) in shapes.iter().enumerate() {
                let sigma = shape.permutation();
                assert_eq!(sigma.len(), order);
                assert!((0..order).all(|v| sigma[sigma[v]] == v), "{shape}");
                let fixed = (0..order).filter(|&v| sigma[v] == v).count();
                // At most one fixed vertex first, then two more each time.
                assert_eq!(fixed, order % 2 + 2 * k, "{shape}");
            }
        }
        let at_34: Vec<String> = VertexCycles::involutions(34)
            .iter()
            .map(VertexCycles::to_string)
            .collect();
        assert_eq!(at_34[0], "2x17");
        assert!(at_34.contains(&"2x13,1x8".to_string()));
        assert_eq!(at_34[16], "2,1x32");
    }

    #[test]
    fn orbits_partition_the_edges_and_are_closed_under_the_permutation() {
        for text in ["4x8,2", "3x11,1", "17", "2x5,1x3"] {
            let cycles: VertexCycles = text.parse().unwrap();
            let (n, sigma) = (cycles.order(), cycles.permutation());
            let moves = EdgeOrbitMoves::new(&cycles);
            let total: usize = moves.orbits.iter().map(Vec::len).sum();
            assert_eq!(total, edge_count(n), "{text}");
            for v in 0..n {
                for u in 0..v {
                    let (a, b) = (sigma[u], sigma[v]);
                    assert_eq!(
                        moves.orbit_of_edge[edge_index(u, v)],
                        moves.orbit_of_edge[edge_index(a.min(b), a.max(b))],
                        "{text}: {{{u},{v}}}"
                    );
                }
            }
        }
        // Z_17 acting regularly: the 8 distance classes of the circulants.
        assert_eq!(EdgeOrbitMoves::new(&"17".parse().unwrap()).orbit_count(), 8);
    }

    #[test]
    fn steps_keep_the_colouring_invariant_and_the_count_exact() {
        let cycles: VertexCycles = "3x5,1".parse().unwrap();
        let moves = EdgeOrbitMoves::new(&cycles);
        let patterns = Pattern::cliques(&[3, 5]);
        let mut rng = ChaCha8Rng::seed_from_u64(11);
        let mut state = moves.random_state(&patterns, &mut rng);
        let mut tabu = TabuList::for_items(moves.orbit_count());
        let mut best = state.cost();
        for step in 0..200 {
            assert!(orbit_tabu_step(
                &mut state,
                &moves,
                &mut tabu,
                best,
                step % 2 == 0,
                &mut rng
            ));
            assert!(moves.is_invariant(&state.to_colouring()));
            assert_eq!(state.cost(), state.recount());
            best = best.min(state.cost());
        }
    }

    #[test]
    fn orbit_search_reaches_the_paley_colouring_of_k17() {
        // R(4,4) = 18 and the one (4,4;17) colouring is Paley's, a circulant
        // (Radziszowski DS1; McKay's data): a 17-cycle automorphism admits it.
        let moves = EdgeOrbitMoves::new(&"17".parse().unwrap());
        let patterns = Pattern::cliques(&[4, 4]);
        let mut rng = ChaCha8Rng::seed_from_u64(2);
        let mut state = moves.random_state(&patterns, &mut rng);
        let mut tabu = TabuList::for_items(moves.orbit_count());
        let mut best = state.cost();
        for _ in 0..2000 {
            if best == 0 {
                break;
            }
            orbit_tabu_step(&mut state, &moves, &mut tabu, best, false, &mut rng);
            best = best.min(state.cost());
        }
        assert_eq!(state.cost(), 0);
        assert_eq!(state.recount(), 0);
    }
}
