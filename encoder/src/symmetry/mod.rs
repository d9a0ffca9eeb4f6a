//! Symmetry breaking: named, switchable constraints that remove symmetric copies of
//! colourings while keeping at least one copy of every colouring up to relabelling
//! of the vertices (and of colours with equal forbidden graphs). Each scheme
//! carries the published argument that it preserves satisfiability; that text is
//! recorded in DIMACS headers and bundle manifests.
//!
//! Auxiliary variables are numbered after the colour variables: first those of
//! `lex-leader` (see [`lex_leader`]), then those of `degree-bounds` (see
//! [`degree_bounds`]). The checker re-derives the same clauses with its own code,
//! so the numbering below is part of the bundle format.

pub mod colour_swap;
pub mod degree_bounds;
pub mod lex_leader;

use std::fmt;
use std::str::FromStr;

use thiserror::Error;

use crate::spec::{Instance, RamseySpec};
use crate::variables::VariableMap;

pub use degree_bounds::Premise;

/// One symmetry-breaking scheme.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Scheme {
    /// Colour permutation among colours with equal forbidden graphs.
    ColourSwap,
    /// Lexicographic order of consecutive adjacency rows of the colour-1 graph.
    LexLeader,
    /// Maximum degree in each colour, from smaller Ramsey numbers.
    DegreeBounds,
    /// Lex-minimality checks during the search: no clauses in the formula; the
    /// search adds each clause with the permutation that justifies it.
    Minimality,
}

impl Scheme {
    /// The static schemes: those that put clauses in the formula.
    pub const ALL: [Scheme; 3] = [Scheme::ColourSwap, Scheme::LexLeader, Scheme::DegreeBounds];

    /// Applied during the search rather than written into the formula.
    pub fn is_dynamic(self) -> bool {
        self == Scheme::Minimality
    }

    pub fn name(self) -> &'static str {
        match self {
            Scheme::ColourSwap => "colour-swap",
            Scheme::LexLeader => "lex-leader",
            Scheme::DegreeBounds => "degree-bounds",
            Scheme::Minimality => "minimality",
        }
    }

    /// The argument that the scheme keeps a representative of every class.
    pub fn justification(self) -> &'static str {
        match self {
            Scheme::ColourSwap => {
                "Permuting colours with equal forbidden graphs maps valid colourings to valid \
                 colourings, so one may require that the anchor edge {0,n-1} takes the first \
                 colour of each such class whenever it takes a colour of the class (value \
                 symmetry breaking; Crawford, Ginsberg, Luks & Roy, KR 1996). Combined with \
                 lex-leader on two colours: lex-leader makes vertex 0's colour-1 neighbours \
                 the last vertices, so {0,n-1} has colour 1 iff vertex 0 has a colour-1 edge; \
                 of a colouring and its colour swap one has minimum colour-1 degree at least 1 \
                 (an isolated vertex and a dominating vertex cannot coexist), and its \
                 lex-leader form puts a minimum-degree vertex first. With three or more colours \
                 and lex-leader, only the colours after colour 1 are permuted."
            }
            Scheme::LexLeader => {
                "sb_l of Codish, Miller, Prosser & Stuckey, 'Constraints for symmetry breaking \
                 in graph representation', Constraints 24 (2019): for consecutive vertices i, i+1 \
                 the adjacency rows of the colour-1 graph, without columns i and i+1, are in \
                 lexicographic order (non-edge < edge). Every graph has an isomorphic copy \
                 satisfying it; the vertex relabelling is applied to the whole colouring."
            }
            Scheme::DegreeBounds => {
                "The colour-c neighbours of any vertex carry a colouring with no K_{k_c - 1} in \
                 colour c and no K_{k_d} in any other colour d, so there are at most \
                 R(k_1, ..., k_c - 1, ..., k_r) - 1 of them (Greenwood & Gleason 1955). Rests \
                 on the smaller Ramsey values listed as premises; encoded with Sinz's \
                 sequential counter (CP 2005)."
            }
            Scheme::Minimality => {
                "Dynamic symmetry breaking by minimality checks (Kirchweger & Szeider, 'SAT \
                 modulo symmetries for graph generation', CP 2021). Order: the colour matrix \
                 read edge by edge in index order ({0,1},{0,2},{1,2},{0,3},…: edge {i,j}, i<j, \
                 has index j(j-1)/2+i), colour 1 < colour 2 < …. Each added clause comes with \
                 a vertex permutation p (and a permutation s of colours with equal forbidden \
                 graphs): every colouring A falsifying the clause has s(A[p(i)][p(j)]) \
                 smaller than A in that order. Every class of colourings under relabelling has \
                 a least member, which therefore satisfies every such clause, and the formula \
                 (invariant under these relabellings) keeps it. Combines with degree-bounds \
                 (also invariant); not with colour-swap or lex-leader, which pick other members."
            }
        }
    }
}

impl fmt::Display for Scheme {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

#[derive(Debug, Error, PartialEq, Eq)]
pub enum SymmetryError {
    #[error("unknown symmetry scheme {0:?}: expected none, colour-swap, lex-leader, degree-bounds or minimality (comma separated)")]
    Unknown(String),
    #[error("minimality cannot be combined with {0}: they keep different members of a class (minimality combines with degree-bounds only)")]
    Incompatible(&'static str),
}

/// A set of schemes, kept in canonical order.
#[derive(Clone, Debug, Default, PartialEq, Eq, Hash)]
pub struct SymmetrySet {
    schemes: Vec<Scheme>,
}

impl SymmetrySet {
    pub fn none() -> Self {
        SymmetrySet::default()
    }

    pub fn of(schemes: &[Scheme]) -> Self {
        let mut schemes = schemes.to_vec();
        schemes.sort();
        schemes.dedup();
        SymmetrySet { schemes }
    }

    pub fn contains(&self, scheme: Scheme) -> bool {
        self.schemes.contains(&scheme)
    }

    pub fn schemes(&self) -> &[Scheme] {
        &self.schemes
    }

    /// Whether a scheme applied during the search is in the set.
    pub fn has_dynamic(&self) -> bool {
        self.schemes.iter().any(|s| s.is_dynamic())
    }

    /// Minimality keeps the least member of each class; colour-swap and
    /// lex-leader keep other members, so they do not combine with it.
    pub fn check_compatible(&self) -> Result<(), SymmetryError> {
        if self.contains(Scheme::Minimality) {
            for other in [Scheme::ColourSwap, Scheme::LexLeader] {
                if self.contains(other) {
                    return Err(SymmetryError::Incompatible(other.name()));
                }
            }
        }
        Ok(())
    }

    pub fn is_empty(&self) -> bool {
        self.schemes.is_empty()
    }

    /// The default for refutations: every scheme that applies to `spec` (degree
    /// bounds rest on clique Ramsey numbers, so graphs get colour-swap and
    /// lex-leader only).
    pub fn for_refutation(spec: &RamseySpec) -> Self {
        if spec.is_cliques() {
            SymmetrySet::of(&[Scheme::ColourSwap, Scheme::LexLeader, Scheme::DegreeBounds])
        } else {
            SymmetrySet::of(&[Scheme::ColourSwap, Scheme::LexLeader])
        }
    }

    /// The default of `ramsift refute` and `shard plan`, where it was measured to
    /// win (BENCHMARKS.md, "Minimality checks"): with two colours, minimality
    /// during the search, with degree bounds for cliques (both invariant under
    /// relabelling, so they combine); with three or more colours the static
    /// schemes of [`SymmetrySet::for_refutation`], which refute (3,3,3;17) in
    /// 0.03 s against 0.22 s.
    pub fn for_certified_refutation(spec: &RamseySpec) -> Self {
        match (spec.colours(), spec.is_cliques()) {
            (3.., _) => SymmetrySet::for_refutation(spec),
            (_, true) => SymmetrySet::of(&[Scheme::DegreeBounds, Scheme::Minimality]),
            (_, false) => SymmetrySet::of(&[Scheme::Minimality]),
        }
    }

    /// The schemes enumeration uses: lex-leader (and colour-swap when classes up to
    /// colour permutation are asked for). Degree bounds are left out: they cut
    /// colourings by degree, not only isomorphic copies.
    pub fn for_enumeration(swap_colours: bool) -> Self {
        if swap_colours {
            SymmetrySet::of(&[Scheme::ColourSwap, Scheme::LexLeader])
        } else {
            SymmetrySet::of(&[Scheme::LexLeader])
        }
    }

    /// Every subset of the schemes (for soundness tests and benchmarks).
    pub fn all_combinations() -> Vec<SymmetrySet> {
        (0..1u32 << Scheme::ALL.len())
            .map(|mask| {
                let chosen: Vec<Scheme> = Scheme::ALL
                    .iter()
                    .enumerate()
                    .filter(|(i, _)| mask >> i & 1 == 1)
                    .map(|(_, &s)| s)
                    .collect();
                SymmetrySet::of(&chosen)
            })
            .collect()
    }
}

impl FromStr for SymmetrySet {
    type Err = SymmetryError;

    fn from_str(text: &str) -> Result<Self, SymmetryError> {
        let text = text.trim();
        if text == "none" || text.is_empty() {
            return Ok(SymmetrySet::none());
        }
        let mut schemes = Vec::new();
        for part in text.split(',') {
            let part = part.trim();
            let scheme = Scheme::ALL
                .into_iter()
                .chain([Scheme::Minimality])
                .find(|s| s.name() == part)
                .ok_or_else(|| SymmetryError::Unknown(part.to_string()))?;
            schemes.push(scheme);
        }
        let set = SymmetrySet::of(&schemes);
        set.check_compatible()?;
        Ok(set)
    }
}

impl fmt::Display for SymmetrySet {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.schemes.is_empty() {
            return f.write_str("none");
        }
        let names: Vec<&str> = self.schemes.iter().map(|s| s.name()).collect();
        f.write_str(&names.join(","))
    }
}

/// A `--symmetry` choice: `default` (what the task chooses for the
/// specification) or a set of schemes (`none`, or a comma list of names).
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum SymmetryChoice {
    Default,
    Schemes(SymmetrySet),
}

impl SymmetryChoice {
    /// The set chosen, with `default` meaning `for_default`.
    pub fn resolve(&self, for_default: impl FnOnce() -> SymmetrySet) -> SymmetrySet {
        match self {
            SymmetryChoice::Default => for_default(),
            SymmetryChoice::Schemes(set) => set.clone(),
        }
    }
}

impl FromStr for SymmetryChoice {
    type Err = SymmetryError;

    fn from_str(text: &str) -> Result<Self, SymmetryError> {
        match text.trim() {
            "default" => Ok(SymmetryChoice::Default),
            other => other.parse().map(SymmetryChoice::Schemes),
        }
    }
}

impl fmt::Display for SymmetryChoice {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SymmetryChoice::Default => f.write_str("default"),
            SymmetryChoice::Schemes(set) => set.fmt(f),
        }
    }
}

/// The symmetry-breaking clauses of an instance, with their auxiliary variables.
#[derive(Clone, Debug, Default)]
pub struct SymmetryClauses {
    pub clauses: Vec<Vec<i32>>,
    /// Auxiliary variables used (numbered after the colour variables).
    pub aux_variables: usize,
    /// Smaller Ramsey values the clauses rest on.
    pub premises: Vec<Premise>,
}

/// Generates the clauses of `set` for `instance`.
pub fn symmetry_clauses(instance: &Instance, set: &SymmetrySet) -> SymmetryClauses {
    let vars = VariableMap::new(instance.order(), instance.colours());
    let mut out = SymmetryClauses::default();
    let mut next_var = vars.colour_variable_count() + 1;
    if set.contains(Scheme::ColourSwap) {
        out.clauses.extend(colour_swap::clauses(
            instance,
            &vars,
            set.contains(Scheme::LexLeader),
        ));
    }
    if set.contains(Scheme::LexLeader) {
        let used = lex_leader::clauses(&vars, next_var, &mut out.clauses);
        next_var += used;
        out.aux_variables += used;
    }
    if set.contains(Scheme::DegreeBounds) {
        let (used, premises) = degree_bounds::clauses(instance, &vars, next_var, &mut out.clauses);
        out.aux_variables += used;
        out.premises = premises;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn minimality_parses_and_refuses_unsound_company() {
        let set: SymmetrySet = "minimality,degree-bounds".parse().unwrap();
        assert!(set.has_dynamic() && set.contains(Scheme::DegreeBounds));
        assert_eq!(set.to_string(), "degree-bounds,minimality");
        for refused in ["minimality,lex-leader", "colour-swap,minimality"] {
            assert!(matches!(
                refused.parse::<SymmetrySet>(),
                Err(SymmetryError::Incompatible(_))
            ));
        }
    }

    #[test]
    fn certified_refutation_defaults_follow_the_colour_count() {
        let cliques = |sizes: &[usize]| RamseySpec::cliques(sizes).unwrap();
        assert_eq!(
            SymmetrySet::for_certified_refutation(&cliques(&[3, 7])).to_string(),
            "degree-bounds,minimality"
        );
        assert_eq!(
            SymmetrySet::for_certified_refutation(&"C4,4".parse().unwrap()).to_string(),
            "minimality"
        );
        assert_eq!(
            SymmetrySet::for_certified_refutation(&cliques(&[3, 3, 3])),
            SymmetrySet::for_refutation(&cliques(&[3, 3, 3]))
        );
    }
}
