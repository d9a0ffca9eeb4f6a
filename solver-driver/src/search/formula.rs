//! An encoding's clauses held in memory once, in a flat array, and shared read-only
//! by every worker. The formula keeps the instance and symmetry breaking it
//! encodes, so that no search has to read them back out of its variables.

use ramsift_encoder::{Instance, RamseyEncoding, SymmetrySet, VariableMap};

/// Clauses as DIMACS literals, stored back to back.
#[derive(Clone, Debug)]
pub struct Formula {
    instance: Instance,
    symmetry: SymmetrySet,
    variables: VariableMap,
    variable_count: usize,
    literals: Vec<i32>,
    /// `starts[i]..starts[i+1]` is clause i.
    starts: Vec<usize>,
}

impl Formula {
    /// Collects the clauses of an encoding.
    pub fn from_encoding(encoding: &RamseyEncoding) -> Self {
        let mut literals = Vec::new();
        let mut starts = Vec::with_capacity(encoding.clause_count() as usize + 1);
        starts.push(0);
        encoding
            .for_each_clause::<()>(|clause| {
                literals.extend_from_slice(clause);
                starts.push(literals.len());
                Ok(())
            })
            .expect("collecting cannot fail");
        Formula {
            instance: encoding.instance().clone(),
            symmetry: encoding.symmetry().clone(),
            variables: *encoding.variables(),
            variable_count: encoding.variable_count(),
            literals,
            starts,
        }
    }

    pub fn instance(&self) -> &Instance {
        &self.instance
    }

    pub fn symmetry(&self) -> &SymmetrySet {
        &self.symmetry
    }

    pub fn variables(&self) -> &VariableMap {
        &self.variables
    }

    pub fn variable_count(&self) -> usize {
        self.variable_count
    }

    pub fn clause_count(&self) -> usize {
        self.starts.len() - 1
    }

    pub fn clause(&self, index: usize) -> &[i32] {
        &self.literals[self.starts[index]..self.starts[index + 1]]
    }

    pub fn clauses(&self) -> impl Iterator<Item = &[i32]> {
        (0..self.clause_count()).map(move |i| self.clause(i))
    }

    /// The plain formula of K_n for these clique sizes (for unit tests).
    #[cfg(test)]
    pub(crate) fn of_cliques(sizes: &[usize], n: usize) -> Self {
        use ramsift_encoder::{EncodingLimits, RamseySpec};
        let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
        Formula::from_encoding(&RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap())
    }
}
