//! The problem specification: how many colours, the forbidden graph of each colour,
//! and the order n of the complete graph whose edges are coloured.
//!
//! On the command line a specification is a comma list with one entry per colour;
//! the order is given separately. Each entry names a graph:
//!
//! | entry | graph |
//! |---|---|
//! | `4` or `K4` | the complete graph K_4 |
//! | `K4-e` | K_4 minus an edge |
//! | `C5` | the cycle on 5 vertices |
//! | `P4` | the path on 4 vertices |
//! | `K1:3` | the star K_{1,3} (3 leaves) |
//! | `K2:3` | the complete bipartite graph K_{2,3} |
//! | `W_6` | the wheel W_6 of the survey: a hub joined to every vertex of C_5 (6 vertices) |
//! | `B3` | the book B_3 = K_2 + 3K_1: 3 triangles sharing one edge (5 vertices) |
//!
//! Names follow Radziszowski's survey (DS1): W_n has n vertices. The spellings
//! `Wk` (once a hub joined to C_k) and `Sk` (once K_{1,k}) are refused with a
//! message, since the literature reads them otherwise.
//! | `G6:Dhc` | any graph in graph6 |
//! | `E:0-1/1-2/2-0` | any graph as an edge list (vertices 0..max) |
//!
//! So `C4,K4` asks for 2-colourings with no colour-1 C_4 and no colour-2 K_4. An
//! entry that describes a complete graph (`C3`, `P2`, `K1:1`) is read as that clique,
//! so that clique specifications keep every clique-only feature.

use std::fmt;
use std::str::FromStr;

use thiserror::Error;

use crate::graphs::{SmallGraph, MAX_GRAPH_VERTICES};

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
    #[error("entry {position} of the specification is {token:?}: expected a clique size such as 4 or K4, or a graph such as C5, P4, K1:3, K2:3, W_6, B3, K4-e, G6:Dhc or E:0-1/1-2")]
    BadEntry { position: usize, token: String },
    #[error("entry {position} of the specification ({token}) is not usable: {reason}")]
    BadGraph {
        position: usize,
        token: String,
        reason: String,
    },
    #[error("entry {position} of the specification forbids a graph on {size} vertex(es): a forbidden graph needs at least 2 vertices")]
    CliqueTooSmall { position: usize, size: usize },
    #[error("the specification has {count} colour(s): a Ramsey question needs at least 2 and at most {MAX_COLOURS}")]
    ColourCount { count: usize },
    #[error("order 0: K_0 has no edges; the order must be at least 1")]
    ZeroOrder,
    #[error("order {order} is above the largest supported order {MAX_ORDER}")]
    OrderTooLarge { order: usize },
    #[error("colour {colour} forbids a graph on {size} vertices, more vertices than K_{order} has: the question is trivial; use an order of at least {size}")]
    GraphLargerThanOrder {
        colour: usize,
        size: usize,
        order: usize,
    },
}

/// A forbidden graph other than a clique, with the entry that named it.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub struct NamedGraph {
    /// The entry in canonical form (`C5`, `K2:3`, `G6:Dhc`); equal entries mean
    /// equal graphs, which is what the colour-swap scheme compares.
    pub token: String,
    pub graph: SmallGraph,
}

/// The graph that must not appear monochromatic in one colour.
#[derive(Clone, Debug, PartialEq, Eq, Hash)]
pub enum Forbidden {
    /// The complete graph on this many vertices.
    Clique(usize),
    /// Any other small graph.
    Graph(NamedGraph),
}

impl Forbidden {
    /// Number of vertices of the forbidden graph.
    pub fn vertex_count(&self) -> usize {
        match self {
            Forbidden::Clique(k) => *k,
            Forbidden::Graph(g) => g.graph.vertex_count(),
        }
    }

    /// The clique size, for a clique.
    pub fn clique_size(&self) -> Option<usize> {
        match self {
            Forbidden::Clique(k) => Some(*k),
            Forbidden::Graph(_) => None,
        }
    }

    /// The graph itself (cliques too).
    pub fn graph(&self) -> SmallGraph {
        match self {
            Forbidden::Clique(k) => SmallGraph::complete(*k),
            Forbidden::Graph(g) => g.graph.clone(),
        }
    }

    /// Reads one entry of a specification (see the module documentation).
    pub fn parse_entry(position: usize, token: &str) -> Result<Forbidden, SpecError> {
        let entry = Entry { position, token };
        let (graph, canonical) = if let Some(code) = token.strip_prefix("G6:") {
            let g = SmallGraph::from_graph6(code).map_err(|e| entry.unusable(e))?;
            (g, format!("G6:{code}"))
        } else if let Some(list) = token.strip_prefix("E:") {
            entry.edge_list(list)?
        } else {
            let upper = token.to_ascii_uppercase();
            let (letter, rest) = upper.split_at(upper.chars().next().map_or(0, |c| c.len_utf8()));
            if letter.is_empty() || letter.bytes().all(|b| b.is_ascii_digit()) {
                return Ok(Forbidden::Clique(entry.number(token)?));
            }
            match entry.named(letter, rest)? {
                Named::Clique(k) => return Ok(Forbidden::Clique(k)),
                Named::Graph(g, canonical) => (g, canonical),
            }
        };
        if graph.edges().is_empty() {
            return Err(entry.unusable("the graph has no edge, so every colouring contains it"));
        }
        if graph.vertex_count() > MAX_GRAPH_VERTICES {
            let count = graph.vertex_count();
            return Err(entry.unusable(format!(
                "{count} vertices; forbidden graphs may have at most {MAX_GRAPH_VERTICES}"
            )));
        }
        // Isolated vertices do not change which colourings contain the graph once the
        // order is large enough, but they do change its vertex count: keep them.
        if graph.is_complete() {
            return Ok(Forbidden::Clique(graph.vertex_count()));
        }
        Ok(Forbidden::Graph(NamedGraph {
            token: canonical,
            graph,
        }))
    }
}

/// A named graph entry: a clique (`K4`), or another graph with its canonical token.
enum Named {
    Clique(usize),
    Graph(SmallGraph, String),
}

/// One entry of a specification being read, for its error messages.
struct Entry<'a> {
    position: usize,
    token: &'a str,
}

impl Entry<'_> {
    fn bad(&self) -> SpecError {
        SpecError::BadEntry {
            position: self.position,
            token: self.token.to_string(),
        }
    }

    fn unusable(&self, reason: impl Into<String>) -> SpecError {
        SpecError::BadGraph {
            position: self.position,
            token: self.token.to_string(),
            reason: reason.into(),
        }
    }

    /// A decimal number (digits only).
    fn number(&self, text: &str) -> Result<usize, SpecError> {
        text.parse::<usize>()
            .ok()
            .filter(|_| !text.is_empty() && text.bytes().all(|b| b.is_ascii_digit()))
            .ok_or_else(|| self.bad())
    }

    /// `E:0-1/1-2/…`: a graph by its edges.
    fn edge_list(&self, list: &str) -> Result<(SmallGraph, String), SpecError> {
        let mut pairs = Vec::new();
        for pair in list.split('/') {
            let (a, b) = pair.split_once('-').ok_or_else(|| self.bad())?;
            pairs.push((self.number(a)?, self.number(b)?));
        }
        let vertices = pairs.iter().map(|&(a, b)| a.max(b) + 1).max().unwrap_or(0);
        let g = SmallGraph::new(vertices, pairs).map_err(|e| self.unusable(e))?;
        let text: Vec<String> = g.edges().iter().map(|(a, b)| format!("{a}-{b}")).collect();
        Ok((g, format!("E:{}", text.join("/"))))
    }

    /// A named family member: `letter` (upper case) and the rest of the token.
    fn named(&self, letter: &str, rest: &str) -> Result<Named, SpecError> {
        let at_least = |k: usize, min: usize, what: &str| {
            if k < min {
                Err(self.unusable(what))
            } else {
                Ok(k)
            }
        };
        let graph = |g: SmallGraph, canonical: String| Ok(Named::Graph(g, canonical));
        match letter {
            "K" => self.k_entry(rest),
            "C" => {
                let k = at_least(self.number(rest)?, 3, "a cycle needs at least 3 vertices")?;
                graph(SmallGraph::cycle(k), format!("C{k}"))
            }
            "P" => {
                let k = at_least(self.number(rest)?, 2, "a path needs at least 2 vertices")?;
                graph(SmallGraph::path(k), format!("P{k}"))
            }
            // The literature writes S_n both for K_{1,n} and for K_{1,n-1}.
            "S" => Err(self.unusable(format!(
                "stars are written K1:{k} (centre and {k} leaves): S{k} is ambiguous, and ramsift no longer reads it (it used to mean K1:{k})",
                k = self.number(rest)?
            ))),
            "W" => self.wheel(rest),
            "B" => {
                let k = at_least(self.number(rest)?, 1, "a book needs at least 1 page")?;
                graph(SmallGraph::book(k), format!("B{k}"))
            }
            _ => Err(self.bad()),
        }
    }

    /// `Kk`, `Kk-e` or `Ka:b`.
    fn k_entry(&self, rest: &str) -> Result<Named, SpecError> {
        if let Some(k) = rest.strip_suffix("-E") {
            let k = self.number(k)?;
            if k < 3 {
                return Err(self.unusable("K_k − e needs k ≥ 3"));
            }
            Ok(Named::Graph(
                SmallGraph::complete_minus_edge(k),
                format!("K{k}-e"),
            ))
        } else if let Some((a, b)) = rest.split_once(':') {
            let (a, b) = (self.number(a)?, self.number(b)?);
            if a == 0 || b == 0 {
                return Err(self.unusable("both parts need a vertex"));
            }
            let (a, b) = (a.min(b), a.max(b));
            Ok(Named::Graph(
                SmallGraph::complete_bipartite(a, b),
                format!("K{a}:{b}"),
            ))
        } else {
            Ok(Named::Clique(self.number(rest)?))
        }
    }

    /// `W_n`: n vertices, a hub joined to C_(n-1) (Radziszowski DS1).
    fn wheel(&self, rest: &str) -> Result<Named, SpecError> {
        match rest.strip_prefix('_') {
            Some(n) => {
                let n = self.number(n)?;
                if n < 4 {
                    return Err(
                        self.unusable("a wheel W_n needs n ≥ 4 vertices (a hub and a cycle)")
                    );
                }
                Ok(Named::Graph(SmallGraph::wheel(n - 1), format!("W_{n}")))
            }
            None => {
                let k = self.number(rest)?;
                Err(self.unusable(format!(
                    "W{k} is no longer read: it used to mean a hub joined to C_{k} ({} vertices), but the survey's W_n has n vertices; write W_{} for that graph, or W_{k} for a hub joined to C_{}",
                    k + 1,
                    k + 1,
                    k.saturating_sub(1)
                )))
            }
        }
    }
}

impl fmt::Display for Forbidden {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Forbidden::Clique(k) => write!(f, "K{k}"),
            Forbidden::Graph(g) => f.write_str(&g.token),
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
    pub fn forbidden_in(&self, colour: usize) -> &Forbidden {
        &self.forbidden[colour - 1]
    }

    /// Whether every colour forbids a clique (the classical Ramsey numbers).
    pub fn is_cliques(&self) -> bool {
        self.forbidden.iter().all(|g| g.clique_size().is_some())
    }

    /// The forbidden clique size of each colour, in colour order, when every colour
    /// forbids a clique (None when some colour forbids another graph).
    pub fn clique_sizes(&self) -> Option<Vec<usize>> {
        self.forbidden.iter().map(Forbidden::clique_size).collect()
    }

    /// The vertex count of each colour's forbidden graph (its size, for a clique).
    pub fn vertex_counts(&self) -> Vec<usize> {
        self.forbidden.iter().map(Forbidden::vertex_count).collect()
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
            forbidden.push(Forbidden::parse_entry(index + 1, raw.trim())?);
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
                Forbidden::Graph(g) => f.write_str(&g.token)?,
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
    fn wheels_follow_the_survey_and_old_spellings_are_refused() {
        // W_n = K_1 + C_{n-1} has n vertices and 2(n-1) edges (Radziszowski DS1, from memory).
        let spec: RamseySpec = "W_6,3".parse().unwrap();
        let wheel = spec.forbidden()[0].graph();
        assert_eq!((wheel.vertex_count(), wheel.edges().len()), (6, 10));
        assert_eq!(spec.to_string(), "W_6,3");
        for (old, says) in [("W5,3", "write W_6"), ("S3,3", "K1:3"), ("W_3,3", "n ≥ 4")] {
            let error = old.parse::<RamseySpec>().unwrap_err().to_string();
            assert!(error.contains(says), "{old}: {error}");
        }
    }

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
