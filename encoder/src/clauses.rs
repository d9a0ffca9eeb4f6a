//! The clauses of the Ramsey encoding (cliques and other forbidden graphs),
//! generated as a stream.
//!
//! For each colour c with forbidden clique K_k and each k-subset S of the vertices,
//! one clause says "not every edge inside S has colour c". For another forbidden
//! graph H on v vertices, each v-subset S gets one clause per distinct labelling of
//! H on S ([`crate::graphs::SmallGraph::labellings`], in their sorted order): one
//! clause per copy of H in K_n, C(n,v)·v!/|Aut H| in all. With three or more colours
//! each edge also gets an at-least-one clause (see [`crate::variables`]). Clauses are
//! produced in a fixed order (at-least-one clauses, then colour by colour, subsets in
//! lexicographic order, literals by edge pairs in lexicographic order), so the same
//! instance always yields the same file.

use thiserror::Error;

use crate::colouring::Colouring;
use crate::combinations::{binomial, for_each_subset};
use crate::edges::edge_count;
use crate::spec::{Forbidden, Instance};
use crate::symmetry::{self, Scheme, SymmetryClauses, SymmetrySet};
use crate::variables::VariableMap;

/// The default clause limit: about 4 GB of literals held in a solver.
pub const DEFAULT_MAX_CLAUSES: u64 = 100_000_000;

/// Bounds that keep an instance within this machine's reach.
#[derive(Clone, Copy, Debug)]
pub struct EncodingLimits {
    pub max_clauses: u64,
}

impl Default for EncodingLimits {
    fn default() -> Self {
        EncodingLimits {
            max_clauses: DEFAULT_MAX_CLAUSES,
        }
    }
}

#[derive(Debug, Error, PartialEq, Eq)]
pub enum EncodeError {
    #[error("{instance} needs {count} clauses, over the limit of {limit}; raise the limit if this machine can hold them")]
    TooManyClauses {
        instance: String,
        count: String,
        limit: u64,
    },
    #[error("{instance} needs {count} variables, more than DIMACS literals (32-bit) can name")]
    TooManyVariables { instance: String, count: u128 },
    #[error("the degree-bounds scheme rests on clique Ramsey numbers; {instance} forbids other graphs, so use colour-swap and lex-leader only")]
    DegreeBoundsNeedCliques { instance: String },
}

/// The encoding of one instance (a clause per forbidden copy in each colour), with
/// its symmetry-breaking clauses.
#[derive(Clone, Debug)]
pub struct RamseyEncoding {
    instance: Instance,
    variables: VariableMap,
    /// Clauses of the clique encoding proper (without symmetry breaking).
    base_clause_count: u64,
    symmetry: SymmetrySet,
    symmetry_clauses: SymmetryClauses,
}

impl RamseyEncoding {
    /// Prepares the encoding without symmetry breaking, refusing instances over the limits.
    pub fn new(instance: &Instance, limits: &EncodingLimits) -> Result<Self, EncodeError> {
        Self::with_symmetry(instance, &SymmetrySet::none(), limits)
    }

    /// Prepares the encoding with the given symmetry-breaking schemes.
    pub fn with_symmetry(
        instance: &Instance,
        symmetry: &SymmetrySet,
        limits: &EncodingLimits,
    ) -> Result<Self, EncodeError> {
        let variables = VariableMap::new(instance.order(), instance.colours());
        let var_count =
            (instance.order() as u128) * (instance.order() as u128) * instance.colours() as u128;
        if var_count > i32::MAX as u128 {
            return Err(EncodeError::TooManyVariables {
                instance: instance.to_string(),
                count: var_count,
            });
        }
        if symmetry.contains(Scheme::DegreeBounds) && !instance.spec().is_cliques() {
            return Err(EncodeError::DegreeBoundsNeedCliques {
                instance: instance.to_string(),
            });
        }
        let count = Self::count_clauses(instance);
        match count {
            Some(count) if count <= limits.max_clauses as u128 => Ok(RamseyEncoding {
                instance: instance.clone(),
                variables,
                base_clause_count: count as u64,
                symmetry: symmetry.clone(),
                symmetry_clauses: symmetry::symmetry_clauses(instance, symmetry),
            }),
            _ => Err(EncodeError::TooManyClauses {
                instance: instance.to_string(),
                count: count.map_or_else(|| "more than 2^128".to_string(), |c| c.to_string()),
                limit: limits.max_clauses,
            }),
        }
    }

    /// Number of clauses the instance needs, or `None` beyond 2^128.
    pub fn count_clauses(instance: &Instance) -> Option<u128> {
        let n = instance.order() as u128;
        let mut total: u128 = if instance.colours() > 2 {
            edge_count(instance.order()) as u128
        } else {
            0
        };
        for graph in instance.spec().forbidden() {
            let copies_per_subset = match graph {
                Forbidden::Clique(_) => 1,
                Forbidden::Graph(g) => g.graph.labellings().len() as u128,
            };
            let subsets = binomial(n, graph.vertex_count() as u128)?;
            total = total.checked_add(subsets.checked_mul(copies_per_subset)?)?;
        }
        Some(total)
    }

    /// Number of literals over all clauses the instance needs without symmetry
    /// breaking (what a solver must hold), or `None` beyond 2^128.
    pub fn count_literals(instance: &Instance) -> Option<u128> {
        let n = instance.order() as u128;
        let r = instance.colours() as u128;
        let mut total: u128 = if r > 2 {
            edge_count(instance.order()) as u128 * r
        } else {
            0
        };
        for graph in instance.spec().forbidden() {
            let (copies_per_subset, edges) = match graph {
                Forbidden::Clique(k) => (1, (k * (k - 1) / 2) as u128),
                Forbidden::Graph(g) => (
                    g.graph.labellings().len() as u128,
                    g.graph.edges().len() as u128,
                ),
            };
            let subsets = binomial(n, graph.vertex_count() as u128)?;
            total =
                total.checked_add(subsets.checked_mul(copies_per_subset)?.checked_mul(edges)?)?;
        }
        Some(total)
    }

    /// Literals over all clauses of this encoding, symmetry breaking included.
    pub fn literal_count(&self) -> u128 {
        let base = Self::count_literals(&self.instance).unwrap_or(u128::MAX);
        let symmetry: usize = self.symmetry_clauses.clauses.iter().map(Vec::len).sum();
        base.saturating_add(symmetry as u128)
    }

    pub fn instance(&self) -> &Instance {
        &self.instance
    }

    pub fn variables(&self) -> &VariableMap {
        &self.variables
    }

    /// Colour variables plus the auxiliary variables of symmetry breaking.
    pub fn variable_count(&self) -> usize {
        self.variables.colour_variable_count() + self.symmetry_clauses.aux_variables
    }

    pub fn clause_count(&self) -> u64 {
        self.base_clause_count + self.symmetry_clauses.clauses.len() as u64
    }

    pub fn symmetry(&self) -> &SymmetrySet {
        &self.symmetry
    }

    pub fn symmetry_clauses(&self) -> &SymmetryClauses {
        &self.symmetry_clauses
    }

    /// The assignment of every variable (auxiliaries included) that a colouring
    /// satisfying the symmetry constraints extends to.
    pub fn full_assignment(&self, colouring: &Colouring) -> Vec<bool> {
        let mut values = self.variables.assignment_of(colouring);
        let mut next = self.variables.colour_variable_count() + 1;
        if self.symmetry.contains(Scheme::LexLeader) {
            symmetry::lex_leader::extend_assignment(&self.variables, next, &mut values);
            let n = self.instance.order();
            if n >= 3 {
                next += (n - 1) * (n - 3);
            }
        }
        if self.symmetry.contains(Scheme::DegreeBounds) {
            symmetry::degree_bounds::extend_assignment(
                &self.instance,
                &self.variables,
                next,
                &mut values,
            );
        }
        values.resize(self.variable_count(), false);
        values
    }

    /// Calls `emit` with every clause as DIMACS literals, in the documented order.
    pub fn for_each_clause<E>(
        &self,
        mut emit: impl FnMut(&[i32]) -> Result<(), E>,
    ) -> Result<(), E> {
        let n = self.instance.order();
        let r = self.instance.colours();
        let vars = &self.variables;
        let mut clause: Vec<i32> = Vec::new();
        if r > 2 {
            for e in 0..edge_count(n) {
                clause.clear();
                clause.extend((1..=r).map(|c| vars.colour_literal(e, c)));
                emit(&clause)?;
            }
        }
        for colour in 1..=r {
            match self.instance.spec().forbidden_in(colour) {
                Forbidden::Clique(k) => for_each_subset(n, *k, |subset| {
                    clause.clear();
                    for (pos, &a) in subset.iter().enumerate() {
                        for &b in &subset[pos + 1..] {
                            clause.push(-vars.edge_colour_literal(a, b, colour));
                        }
                    }
                    emit(&clause)
                })?,
                Forbidden::Graph(g) => {
                    let labellings = g.graph.labellings();
                    for_each_subset(n, g.graph.vertex_count(), |subset| {
                        for edges in &labellings {
                            clause.clear();
                            clause.extend(edges.iter().map(|&(a, b)| {
                                -vars.edge_colour_literal(subset[a], subset[b], colour)
                            }));
                            emit(&clause)?;
                        }
                        Ok(())
                    })?
                }
            }
        }
        for clause in &self.symmetry_clauses.clauses {
            emit(clause)?;
        }
        Ok(())
    }

    /// All clauses in memory (for small instances and tests).
    pub fn clauses(&self) -> Vec<Vec<i32>> {
        let mut all = Vec::with_capacity(self.clause_count() as usize);
        self.for_each_clause::<()>(|c| {
            all.push(c.to_vec());
            Ok(())
        })
        .expect("collecting cannot fail");
        all
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::spec::RamseySpec;
    use crate::Colouring;
    use proptest::prelude::*;

    fn encoding(sizes: &[usize], n: usize) -> RamseyEncoding {
        let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
        RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap()
    }

    #[test]
    fn literal_count_equals_the_emitted_literals() {
        // R(3,3) at 6: C(6,3) = 20 triangles per colour, 3 literals each: 120 (by hand).
        assert_eq!(
            RamseyEncoding::count_literals(&encoding(&[3, 3], 6).instance),
            Some(120)
        );
        for (spec, n, symmetry) in [
            ("3,3", 6, "none"),
            ("4,5", 12, "colour-swap,lex-leader,degree-bounds"),
            ("3,3,3", 8, "colour-swap,lex-leader"),
            ("C4,K4", 7, "lex-leader"),
            ("C5,P4", 8, "none"),
        ] {
            let instance = Instance::new(spec.parse().unwrap(), n).unwrap();
            let set: SymmetrySet = symmetry.parse().unwrap();
            let encoding =
                RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
            let mut emitted = 0u128;
            encoding
                .for_each_clause::<()>(|c| {
                    emitted += c.len() as u128;
                    Ok(())
                })
                .unwrap();
            assert_eq!(
                encoding.literal_count(),
                emitted,
                "{spec} at {n} [{symmetry}]"
            );
        }
    }

    fn satisfies(clauses: &[Vec<i32>], values: &[bool]) -> bool {
        clauses.iter().all(|c| {
            c.iter()
                .any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))
        })
    }

    #[test]
    fn counts_match_the_stream() {
        for (sizes, n) in [(&[3, 3][..], 5), (&[3, 4][..], 8), (&[3, 3, 3][..], 6)] {
            let enc = encoding(sizes, n);
            assert_eq!(enc.clauses().len() as u64, enc.clause_count());
        }
        // (5,5;43): 2·C(43,5) = 1,925,196 clauses (C(43,5) = 962,598, common practice).
        let instance = Instance::new(RamseySpec::cliques(&[5, 5]).unwrap(), 43).unwrap();
        assert_eq!(RamseyEncoding::count_clauses(&instance), Some(1_925_196));
    }

    #[test]
    fn refuses_instances_over_the_limit() {
        let instance = Instance::new(RamseySpec::cliques(&[5, 5]).unwrap(), 43).unwrap();
        let err =
            RamseyEncoding::new(&instance, &EncodingLimits { max_clauses: 1000 }).unwrap_err();
        assert!(err.to_string().contains("1925196"), "{err}");
        let huge = Instance::new(RamseySpec::cliques(&[30, 30]).unwrap(), 60_000).unwrap();
        assert!(RamseyEncoding::new(&huge, &EncodingLimits::default()).is_err());
    }

    proptest! {
        /// A colouring satisfies the CNF exactly when it has no monochromatic forbidden clique,
        /// checked here against a direct subset enumeration.
        #[test]
        fn models_are_exactly_the_valid_colourings(
            sizes in proptest::collection::vec(2usize..=4, 2..=3),
            n in 4usize..=7,
            seed in any::<u64>(),
        ) {
            let enc = encoding(&sizes, n);
            let r = sizes.len();
            let mut state = seed | 1;
            let colouring = Colouring::from_fn(n, r, |_, _| {
                state ^= state << 13; state ^= state >> 7; state ^= state << 17;
                (state % r as u64 + 1) as u8
            });
            let mut valid = true;
            for (c, &k) in sizes.iter().enumerate() {
                for_each_subset::<()>(n, k, |s| {
                    let mono = s.iter().enumerate().all(|(p, &a)| {
                        s[p + 1..].iter().all(|&b| colouring.colour(a, b) as usize == c + 1)
                    });
                    if mono { valid = false; }
                    Ok(())
                }).unwrap();
            }
            let values = enc.variables().assignment_of(&colouring);
            prop_assert_eq!(satisfies(&enc.clauses(), &values), valid);
        }
    }
}
