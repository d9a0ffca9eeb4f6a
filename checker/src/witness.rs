//! The verdict on a witness colouring: valid for the claim, or the first
//! monochromatic forbidden graph found, named as the claim names it, with its edges.

use std::fmt;

use crate::claim::{Claim, ClaimGraph};
use crate::matrix::ColourMatrix;
use crate::subgraphs::find_monochromatic_copy;

/// Outcome of checking a colouring against a claim.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Verdict {
    /// No colour class contains its forbidden graph.
    Valid,
    /// Colour `colour` contains its forbidden graph (`graph`, as the claim names
    /// it) on `vertices`, using `edges` of K_n.
    Monochromatic { colour: usize, graph: String, vertices: Vec<usize>, edges: Vec<(usize, usize)> },
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
            Verdict::Monochromatic { colour, graph, vertices, edges } => {
                let edges: Vec<String> = edges.iter().map(|(a, b)| format!("{a}-{b}")).collect();
                write!(
                    f,
                    "colour {colour} has a monochromatic {graph} on vertices {vertices:?}, edges {}",
                    edges.join(" ")
                )
            }
            Verdict::ColourOutOfRange { colour, colours } => {
                write!(f, "colour {colour} is used, but the claim has only {colours} colours")
            }
        }
    }
}

/// Checks every colour class of `matrix` for the clique the claim forbids in it.
pub fn check_colouring(matrix: &ColourMatrix, claim: &Claim) -> Verdict {
    let used = matrix.max_colour() as usize;
    if used > claim.colours() {
        return Verdict::ColourOutOfRange { colour: used, colours: claim.colours() };
    }
    for (index, graph) in claim.forbidden.iter().enumerate() {
        let colour = index + 1;
        if graph.vertices() > matrix.order() {
            continue; // no room for a copy (and no edge list built for a huge clique)
        }
        let copy = find_monochromatic_copy(matrix, colour as u8, graph.vertices(), &graph.edge_list());
        if let Some(vertices) = copy {
            let edges = graph
                .edge_list()
                .iter()
                .map(|&(a, b)| (vertices[a].min(vertices[b]), vertices[a].max(vertices[b])))
                .collect();
            let graph = if let ClaimGraph::Graph { token, .. } = graph { token.clone() } else { format!("K{graph}") };
            return Verdict::Monochromatic { colour, graph, vertices, edges };
        }
    }
    Verdict::Valid
}
