//! Variables (0-based) and literals (`2·var + negated`), and their DIMACS names.

use std::ops::Not;

/// A literal: variable `code >> 1`, negated when the low bit is set.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
#[repr(transparent)]
pub struct Lit(pub u32);

impl Lit {
    #[inline]
    pub fn new(var: usize, negated: bool) -> Self {
        Lit(((var as u32) << 1) | u32::from(negated))
    }

    /// From a non-zero DIMACS literal.
    #[inline]
    pub fn from_dimacs(l: i32) -> Self {
        debug_assert!(l != 0);
        Lit::new(l.unsigned_abs() as usize - 1, l < 0)
    }

    #[inline]
    pub fn to_dimacs(self) -> i32 {
        let v = self.var() as i32 + 1;
        if self.is_negated() {
            -v
        } else {
            v
        }
    }

    #[inline]
    pub fn var(self) -> usize {
        (self.0 >> 1) as usize
    }

    #[inline]
    pub fn is_negated(self) -> bool {
        self.0 & 1 == 1
    }

    #[inline]
    pub fn index(self) -> usize {
        self.0 as usize
    }
}

impl Not for Lit {
    type Output = Lit;
    #[inline]
    fn not(self) -> Lit {
        Lit(self.0 ^ 1)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dimacs_round_trip() {
        for l in [1, -1, 7, -42] {
            assert_eq!(Lit::from_dimacs(l).to_dimacs(), l);
        }
        assert_eq!(!Lit::from_dimacs(3), Lit::from_dimacs(-3));
        assert_eq!(Lit::from_dimacs(-3).var(), 2);
    }
}
