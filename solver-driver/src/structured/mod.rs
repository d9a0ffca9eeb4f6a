//! Structured searches for lower bounds: colourings invariant under a group acting
//! on the vertices (circulant, Cayley over abelian groups, block-circulant, or the
//! cyclic group of one prescribed vertex permutation).
//!
//! The unknowns are the edge orbits, not the edges, so the formulas are small and
//! the searches exhaustive *within the family*: "no circulant colouring exists at
//! this order" is a result, and a scan over orders gives the largest circulant lower
//! bound in one run. Most of the best published lower bounds for small classical
//! Ramsey numbers come from such colourings (Radziszowski, "Small Ramsey Numbers",
//! EJC DS1, §2).
//!
//! * [`families`] builds the edge orbits of each family.
//! * [`orbit_formula`] writes the exact CNF over orbits.
//! * [`solve`] solves it and verifies the colouring with the checker's code.
//! * [`scan`] runs a family over a range of orders.

pub mod families;
pub mod orbit_formula;
pub mod scan;
pub mod solve;

use std::fmt;
use std::str::FromStr;
use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_encoder::RamseySpec;

pub use families::{AbelianGroup, EdgeOrbits, FamilyError, FamilyKind};
pub use solve::{family_colourings, search_family, FamilyOutcome, FamilyReport, FamilySearchError};

/// The most fixed vertices `fixed-vertices` tries.
pub const MAX_FIXED: usize = 4;
/// The most blocks `fixed-vertices` tries.
pub const MAX_FIXED_BLOCKS: usize = 5;

/// Which families a structured search tries at an order.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum FamilyChoice {
    /// Cayley colourings of Z_n.
    Circulant,
    /// Cayley colourings of every product of cyclic groups of order n (Z_n first),
    /// or of one given group.
    Cayley(Option<AbelianGroup>),
    /// Block-circulant colourings with the given number of blocks (or with 2 and
    /// 3) and the given number of fixed vertices (usually 0).
    BlockCirculant(Option<usize>, usize),
    /// Block-circulant colourings with fixed vertices: for each number of fixed
    /// vertices 1..=[`MAX_FIXED`] and of blocks 1..=[`MAX_FIXED_BLOCKS`] that fits
    /// the order, within [`families::MAX_ORBITS`] orbits.
    FixedVertices,
    /// Distance colourings: the colour of {i, j} depends on |i − j| only.
    Distance,
    /// Colourings invariant under a vertex permutation given by its cycles, for
    /// each permutation in turn.
    Automorphism(Vec<crate::local::VertexCycles>),
    /// Cayley (circulant first) and block-circulant without fixed vertices, in
    /// that order.
    All,
}

impl fmt::Display for FamilyChoice {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FamilyChoice::Circulant => f.write_str("circulant"),
            FamilyChoice::Cayley(None) => f.write_str("cayley"),
            FamilyChoice::Cayley(Some(g)) => write!(f, "cayley {g}"),
            FamilyChoice::BlockCirculant(None, 0) => f.write_str("block-circulant"),
            FamilyChoice::BlockCirculant(Some(b), 0) => write!(f, "block-circulant {b}"),
            FamilyChoice::BlockCirculant(None, x) => write!(f, "block-circulant, {x} fixed"),
            FamilyChoice::BlockCirculant(Some(b), x) => {
                write!(f, "block-circulant {b}, {x} fixed")
            }
            FamilyChoice::FixedVertices => f.write_str("fixed-vertices"),
            FamilyChoice::Distance => f.write_str("distance"),
            FamilyChoice::Automorphism(all) => {
                write!(f, "automorphism {}", crate::local::VertexCycles::list(all))
            }
            FamilyChoice::All => f.write_str("structured"),
        }
    }
}

impl FromStr for FamilyChoice {
    type Err = String;

    /// `circulant`, `cayley`, `block-circulant`, `fixed-vertices`, `distance`,
    /// `structured`.
    fn from_str(text: &str) -> Result<Self, String> {
        match text {
            "circulant" => Ok(FamilyChoice::Circulant),
            "cayley" => Ok(FamilyChoice::Cayley(None)),
            "block-circulant" => Ok(FamilyChoice::BlockCirculant(None, 0)),
            "fixed-vertices" => Ok(FamilyChoice::FixedVertices),
            "distance" => Ok(FamilyChoice::Distance),
            "structured" => Ok(FamilyChoice::All),
            other => Err(format!(
                "family {other:?}: expected circulant, cayley, block-circulant, fixed-vertices, distance or structured"
            )),
        }
    }
}

impl FamilyChoice {
    /// The families tried at `order`, in order. Families that do not exist at this
    /// order (a group of another size, blocks that do not divide it) are left out;
    /// one named explicitly that does not fit is an error.
    pub fn families(&self, order: usize) -> Result<Vec<EdgeOrbits>, FamilyError> {
        let mut out = Vec::new();
        match self {
            FamilyChoice::Circulant => out.push(EdgeOrbits::circulant(order)?),
            FamilyChoice::Cayley(Some(group)) => {
                if group.size() != order {
                    return Err(FamilyError::GroupOrder {
                        group: group.to_string(),
                        size: group.size(),
                        order,
                    });
                }
                out.push(EdgeOrbits::cayley(group)?);
            }
            FamilyChoice::Cayley(None) => {
                for group in AbelianGroup::all_of_order(order) {
                    out.push(EdgeOrbits::cayley(&group)?);
                }
            }
            FamilyChoice::BlockCirculant(Some(blocks), fixed) => {
                out.push(EdgeOrbits::block_circulant_fixed(order, *blocks, *fixed)?)
            }
            FamilyChoice::BlockCirculant(None, fixed) => {
                for blocks in [2, 3] {
                    if let Ok(orbits) = EdgeOrbits::block_circulant_fixed(order, blocks, *fixed) {
                        out.push(orbits);
                    }
                }
            }
            FamilyChoice::FixedVertices => {
                for fixed in 1..=MAX_FIXED {
                    for blocks in 1..=MAX_FIXED_BLOCKS {
                        if let Ok(orbits) = EdgeOrbits::block_circulant_fixed(order, blocks, fixed)
                        {
                            out.push(orbits);
                        }
                    }
                }
            }
            FamilyChoice::Distance => out.push(EdgeOrbits::distance(order)?),
            FamilyChoice::Automorphism(all) => {
                for cycles in all {
                    families::cycles_fit(cycles, order)?;
                    out.push(EdgeOrbits::invariant_under(cycles)?);
                }
            }
            FamilyChoice::All => {
                out.extend(FamilyChoice::Cayley(None).families(order)?);
                out.extend(FamilyChoice::BlockCirculant(None, 0).families(order)?);
            }
        }
        Ok(out)
    }
}

/// A colouring found at one order, and where it came from.
#[derive(Clone, Copy, Debug)]
pub struct FoundColouring<'a> {
    pub family: &'a str,
    pub colouring: &'a ramsift_encoder::Colouring,
    /// E.g. "colour 1: distances {1,2,4,8}; colour 2: distances {3,5,6,7}".
    pub description: &'a str,
}

/// What trying every family of a choice at one order gave.
#[derive(Clone, Debug)]
pub struct OrderReport {
    pub order: usize,
    pub families: Vec<FamilyReport>,
}

impl OrderReport {
    /// The first colouring found, if any, with its family and description.
    pub fn found(&self) -> Option<FoundColouring<'_>> {
        self.families.iter().find_map(|r| match &r.outcome {
            FamilyOutcome::Found {
                colouring,
                description,
                ..
            } => Some(FoundColouring {
                family: &r.family,
                colouring,
                description,
            }),
            _ => None,
        })
    }

    /// Found, none (every family proved empty) or unknown.
    pub fn verdict(&self) -> ScanVerdict {
        if self.found().is_some() {
            ScanVerdict::Found
        } else if !self.families.is_empty()
            && self
                .families
                .iter()
                .all(|r| r.outcome == FamilyOutcome::NoneInFamily)
        {
            ScanVerdict::None
        } else {
            ScanVerdict::Unknown
        }
    }
}

/// What a structured search says about one order (or one family at an order).
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ScanVerdict {
    /// A colouring of the family exists.
    Found,
    /// The family has no colouring (proved by exhaustion within it).
    None,
    /// The search was stopped before it could tell.
    Unknown,
}

impl ScanVerdict {
    /// The word in text and JSON output.
    pub fn word(self) -> &'static str {
        match self {
            ScanVerdict::Found => "found",
            ScanVerdict::None => "none",
            ScanVerdict::Unknown => "unknown",
        }
    }
}

impl fmt::Display for ScanVerdict {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.word())
    }
}

/// Tries the families of `choice` at `order` one after the other, stopping at the
/// first colouring found.
pub fn search_order(
    choice: &FamilyChoice,
    spec: &RamseySpec,
    order: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<OrderReport, FamilySearchError> {
    let mut families = Vec::new();
    for orbits in choice.families(order)? {
        let report = search_family(&orbits, spec, stop, deadline)?;
        let done = matches!(report.outcome, FamilyOutcome::Found { .. });
        families.push(report);
        if done {
            break;
        }
    }
    Ok(OrderReport { order, families })
}
