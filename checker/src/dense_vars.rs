//! Dense variable numbering for the proof checkers. The formula's variables keep
//! their numbers; any other variable a proof mentions (an extension variable, or
//! just a huge number in a crafted file) gets the next free number. The checkers'
//! arrays therefore grow with the count of variables actually used, never with the
//! size of a number written in a file. Renaming variables that do not occur in the
//! formula changes no RUP, RAT or LRAT step, so verdicts are unaffected.

/// The renaming; register every literal of the proof with [`DenseVars::add`], then
/// [`DenseVars::sealed`] before asking for dense numbers. The extra variables are
/// kept as one sorted array (4 bytes each), found by binary search.
#[derive(Clone, Debug, Default)]
pub struct DenseVars {
    formula_max: u32,
    extra: Vec<u32>,
}

impl DenseVars {
    /// Keeps variables 1..=(largest variable among the formula's `literals`).
    pub fn new(literals: &[i32]) -> Self {
        let formula_max = literals.iter().map(|l| l.unsigned_abs()).max().unwrap_or(0);
        DenseVars { formula_max, ..DenseVars::default() }
    }

    /// Registers the variable of `lit` (a literal within ±(2^31−1)).
    pub fn add(&mut self, lit: i32) {
        let var = lit.unsigned_abs();
        if var > self.formula_max && self.extra.last() != Some(&var) {
            self.extra.push(var);
        }
    }

    /// Ready for lookups: the extra variables sorted, each once.
    pub fn sealed(mut self) -> Self {
        self.extra.sort_unstable();
        self.extra.dedup();
        self.extra.shrink_to_fit();
        self
    }

    /// The dense literal of a registered literal.
    pub fn dense(&self, lit: i32) -> i32 {
        let var = lit.unsigned_abs();
        let dense = if var <= self.formula_max {
            var
        } else {
            self.formula_max + 1 + self.extra.binary_search(&var).expect("a registered variable") as u32
        };
        dense as i32 * lit.signum()
    }

    /// The literal as the proof wrote it.
    pub fn original(&self, dense: i32) -> i32 {
        let var = dense.unsigned_abs();
        let back = if var <= self.formula_max { var } else { self.extra[(var - self.formula_max - 1) as usize] };
        back as i32 * dense.signum()
    }

    /// The largest dense variable.
    pub fn max_var(&self) -> usize {
        self.formula_max as usize + self.extra.len()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn large_numbers_become_small_and_map_back() {
        let mut vars = DenseVars::new(&[1, -3]);
        for lit in [2, -2_000_000_000, 2_147_483_647, 2_000_000_000] {
            vars.add(lit);
        }
        let vars = vars.sealed();
        assert_eq!(vars.max_var(), 5);
        assert_eq!(vars.dense(-2_000_000_000), -4);
        assert_eq!(vars.dense(2_000_000_000), 4);
        assert_eq!(vars.dense(2_147_483_647), 5);
        assert_eq!(vars.dense(2), 2);
        assert_eq!(vars.original(-5), -2_147_483_647);
        assert_eq!(vars.original(3), 3);
    }
}
