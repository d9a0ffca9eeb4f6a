//! The verdict on a witness colouring: valid for the claim, or the first
//! monochromatic forbidden graph found.

use std::fmt;

use crate::claim::{Claim, ClaimGraph};
use crate::cliques::find_monochromatic_clique;
use crate::matrix::ColourMatrix;
use crate::subgraphs::find_monochromatic_copy;

/// Outcome of checking a colouring against a claim.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Verdict {
    /// No colour class contains its forbidden graph.
    Valid,
    /// Colour `colour` contains a clique of the forbidden size on `vertices`.
    Monochromatic { colour: usize, vertices: Vec<usize> },
    /// The matrix uses a colour the claim does not have.
    ColourOutOfRange { colour: usize, colours: usize },
}

impl Verdict {
    pub fn is_valid(&self) -> bool {
        *self == Verdict::Valid
    }
}

impl fmt::Display for Verdict {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Verdict::Valid => f.write_str("valid"),
            Verdict::Monochromatic { colour, vertices } => {
                let list: Vec<String> = vertices.iter().map(|v| v.to_string()).collect();
                write!(
                    f,
                    "colour {colour} has a monochromatic K{} on vertices {{{}}}",
                    vertices.len(),
                    list.join(", ")
                )
            }
            Verdict::ColourOutOfRange { colour, colours } => {
                write!(
                    f,
                    "colour {colour} is used, but the claim has only {colours} colours"
                )
            }
        }
    }
}

/// Checks every colour class of `matrix` for the clique the claim forbids in it.
pub fn check_colouring(matrix: &ColourMatrix, claim: &Claim) -> Verdict {
    let used = matrix.max_colour() as usize;
    if used > claim.colours() {
        return Verdict::ColourOutOfRange {
            colour: used,
            colours: claim.colours(),
        };
    }
    for (index, graph) in claim.forbidden.iter().enumerate() {
        let colour = index + 1;
        let copy = match graph {
            ClaimGraph::Clique(k) => find_monochromatic_clique(matrix, colour as u8, *k),
            ClaimGraph::Graph {
                vertices, edges, ..
            } => find_monochromatic_copy(matrix, colour as u8, *vertices, edges),
        };
        if let Some(vertices) = copy {
            return Verdict::Monochromatic { colour, vertices };
        }
    }
    Verdict::Valid
}
