//! The problem specification: how many colours, the forbidden graph of each colour,
//! and the order n of the complete graph whose edges are coloured.
//!
//! On the command line a specification is a comma list with one entry per colour,
//! `4,4` or `3,3,3` (a bare number k, or `Kk`, means the complete graph K_k); the
//! order is given separately. [`Forbidden`] is an enum so that other small graphs
//! can take the place of cliques without changing the rest of the pipeline.

use std::fmt;
use std::str::FromStr;

use thiserror::Error;

/// The most colours a specification may have. Beyond four colours no Ramsey
/// question is within reach of SAT solving, so this bound only rejects typos.
pub const MAX_COLOURS: usize = 16;

/// The largest order: K_65536 has just under 2^31 edges, the most DIMACS's
/// 32-bit literals can name with one variable per edge.
pub const MAX_ORDER: usize = 65_536;

/// Errors found while reading or validating a specification.
#[derive(Debug, Error, PartialEq, Eq)]
pub enum SpecError {
    #[error("empty specification: expected a comma list of clique sizes such as 4,4")]
    Empty,
    #[error("entry {position} of the specification is {token:?}: expected a clique size such as 4 or K4")]
    BadEntry { position: usize, token: String },
    #[error("entry {position} of the specification forbids K{size}: a forbidden clique needs at least 2 vertices")]
    CliqueTooSmall { position: usize, size: usize },
    #[error("the specification has {count} colour(s): a Ramsey question needs at least 2 and at most {MAX_COLOURS}")]
    ColourCount { count: usize },
    #[error("order 0: K_0 has no edges; the order must be at least 1")]
    ZeroOrder,
    #[error("order {order} is above the largest supported order {MAX_ORDER}")]
    OrderTooLarge { order: usize },
    #[error("colour {colour} forbids K{size}, which has more vertices than K_{order}: the question is trivial; use an order of at least {size}")]
    GraphLargerThanOrder {
        colour: usize,
        size: usize,
        order: usize,
    },
}

/// The graph that must not appear monochromatic in one colour.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Forbidden {
    /// The complete graph on this many vertices.
    Clique(usize),
}

impl Forbidden {
    /// Number of vertices of the forbidden graph.
    pub fn vertex_count(&self) -> usize {
        match *self {
            Forbidden::Clique(k) => k,
        }
    }
}

impl fmt::Display for Forbidden {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            Forbidden::Clique(k) => write!(f, "K{k}"),
        }
    }
}

/// One forbidden graph per colour; colour c (1-based) forbids `forbidden[c-1]`.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct RamseySpec {
    forbidden: Vec<Forbidden>,
}

impl RamseySpec {
    /// Builds a specification, checking the number of colours and graph sizes.
    pub fn new(forbidden: Vec<Forbidden>) -> Result<Self, SpecError> {
        if forbidden.len() < 2 || forbidden.len() > MAX_COLOURS {
            return Err(SpecError::ColourCount {
                count: forbidden.len(),
            });
        }
        for (position, graph) in forbidden.iter().enumerate() {
            if graph.vertex_count() < 2 {
                return Err(SpecError::CliqueTooSmall {
                    position: position + 1,
                    size: graph.vertex_count(),
                });
            }
        }
        Ok(RamseySpec { forbidden })
    }

    /// Clique sizes, one per colour: `RamseySpec::cliques(&[4, 4])`.
    pub fn cliques(sizes: &[usize]) -> Result<Self, SpecError> {
        Self::new(sizes.iter().map(|&k| Forbidden::Clique(k)).collect())
    }

    pub fn colours(&self) -> usize {
        self.forbidden.len()
    }

    pub fn forbidden(&self) -> &[Forbidden] {
        &self.forbidden
    }

    /// The forbidden graph of colour `colour` (1-based).
    pub fn forbidden_in(&self, colour: usize) -> Forbidden {
        self.forbidden[colour - 1]
    }

    /// The forbidden clique size of each colour, in colour order.
    pub fn clique_sizes(&self) -> Vec<usize> {
        self.forbidden
            .iter()
            .map(|g| match *g {
                Forbidden::Clique(k) => k,
            })
            .collect()
    }
}

impl FromStr for RamseySpec {
    type Err = SpecError;

    fn from_str(text: &str) -> Result<Self, SpecError> {
        let text = text.trim();
        if text.is_empty() {
            return Err(SpecError::Empty);
        }
        let mut forbidden = Vec::new();
        for (index, raw) in text.split(',').enumerate() {
            let token = raw.trim();
            let digits = token
                .strip_prefix('K')
                .or_else(|| token.strip_prefix('k'))
                .unwrap_or(token);
            let size = digits
                .parse::<usize>()
                .ok()
                .filter(|_| digits.bytes().all(|b| b.is_ascii_digit()))
                .ok_or_else(|| SpecError::BadEntry {
                    position: index + 1,
                    token: token.to_string(),
                })?;
            forbidden.push(Forbidden::Clique(size));
        }
        RamseySpec::new(forbidden)
    }
}

impl fmt::Display for RamseySpec {
    /// The command-line form, `4,4`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, graph) in self.forbidden.iter().enumerate() {
            if i > 0 {
                f.write_str(",")?;
            }
            match graph {
                Forbidden::Clique(k) => write!(f, "{k}")?,
            }
        }
        Ok(())
    }
}

/// A specification together with the order n of the complete graph.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct Instance {
    spec: RamseySpec,
    order: usize,
}

impl Instance {
    /// Checks that the question is not trivial: every forbidden graph fits in K_n.
    pub fn new(spec: RamseySpec, order: usize) -> Result<Self, SpecError> {
        if order == 0 {
            return Err(SpecError::ZeroOrder);
        }
        if order > MAX_ORDER {
            return Err(SpecError::OrderTooLarge { order });
        }
        for (index, graph) in spec.forbidden().iter().enumerate() {
            if graph.vertex_count() > order {
                return Err(SpecError::GraphLargerThanOrder {
                    colour: index + 1,
                    size: graph.vertex_count(),
                    order,
                });
            }
        }
        Ok(Instance { spec, order })
    }

    pub fn spec(&self) -> &RamseySpec {
        &self.spec
    }

    pub fn order(&self) -> usize {
        self.order
    }

    pub fn colours(&self) -> usize {
        self.spec.colours()
    }
}

impl fmt::Display for Instance {
    /// `(4,4;17)`, the notation of the Ramsey literature.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "({};{})", self.spec, self.order)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_comma_lists() {
        let spec: RamseySpec = "4,4".parse().unwrap();
        assert_eq!(
            spec.forbidden(),
            &[Forbidden::Clique(4), Forbidden::Clique(4)]
        );
        let spec: RamseySpec = " K3, k3 ,3".parse().unwrap();
        assert_eq!(spec.colours(), 3);
        assert_eq!(spec.to_string(), "3,3,3");
    }

    #[test]
    fn rejects_bad_entries_with_their_position() {
        assert_eq!("".parse::<RamseySpec>(), Err(SpecError::Empty));
        assert_eq!(
            "4,x".parse::<RamseySpec>(),
            Err(SpecError::BadEntry {
                position: 2,
                token: "x".into()
            })
        );
        assert!(matches!(
            "4,,4".parse::<RamseySpec>(),
            Err(SpecError::BadEntry { position: 2, .. })
        ));
        assert!(matches!(
            "+4,4".parse::<RamseySpec>(),
            Err(SpecError::BadEntry { position: 1, .. })
        ));
        assert_eq!(
            "4,1".parse::<RamseySpec>(),
            Err(SpecError::CliqueTooSmall {
                position: 2,
                size: 1
            })
        );
        assert_eq!(
            "4".parse::<RamseySpec>(),
            Err(SpecError::ColourCount { count: 1 })
        );
    }

    #[test]
    fn instance_rejects_trivial_orders() {
        let spec = RamseySpec::cliques(&[3, 5]).unwrap();
        assert_eq!(Instance::new(spec.clone(), 0), Err(SpecError::ZeroOrder));
        assert!(matches!(
            Instance::new(spec.clone(), 4),
            Err(SpecError::GraphLargerThanOrder {
                colour: 2,
                size: 5,
                order: 4
            })
        ));
        assert_eq!(Instance::new(spec, 13).unwrap().to_string(), "(3,5;13)");
    }
}
