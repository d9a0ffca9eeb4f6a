//! The map between (edge, colour) pairs and CNF variables.
//!
//! * Two colours: one variable per edge, `var = e + 1`; true means colour 1,
//!   false means colour 2.
//! * r >= 3 colours: one variable per edge and colour, `var = e·r + (c - 1) + 1`,
//!   true meaning "edge e may have colour c". Each edge gets an at-least-one clause.
//!   No at-most-one clauses are needed for soundness: from any model, give each edge
//!   the smallest colour whose variable is true. A monochromatic forbidden clique in
//!   that colouring would have all its variables true in that colour, falsifying the
//!   clause that forbids it, so the decoded colouring is valid; conversely every valid
//!   colouring, read as "exactly one true variable per edge", is a model.
//!
//! Here `e` is the edge index of [`crate::edges`], colours are 1-based.

use crate::colouring::Colouring;
use crate::edges::{edge_count, edge_index};

/// Variable numbering for one order and number of colours.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct VariableMap {
    order: usize,
    colours: usize,
}

impl VariableMap {
    pub fn new(order: usize, colours: usize) -> Self {
        assert!(colours >= 2);
        VariableMap { order, colours }
    }

    pub fn order(&self) -> usize {
        self.order
    }

    pub fn colours(&self) -> usize {
        self.colours
    }

    /// Number of variables that describe the colouring (auxiliary variables of
    /// symmetry-breaking constraints are numbered after these).
    pub fn colour_variable_count(&self) -> usize {
        let per_edge = if self.colours == 2 { 1 } else { self.colours };
        edge_count(self.order) * per_edge
    }

    /// The DIMACS literal meaning "edge `e` has colour `colour`" (for two colours)
    /// or "edge `e` may have colour `colour`" (for more).
    #[inline]
    pub fn colour_literal(&self, edge: usize, colour: usize) -> i32 {
        debug_assert!(colour >= 1 && colour <= self.colours);
        if self.colours == 2 {
            let var = (edge + 1) as i32;
            if colour == 1 {
                var
            } else {
                -var
            }
        } else {
            (edge * self.colours + colour) as i32
        }
    }

    /// Literal for edge {a, b} having `colour`.
    #[inline]
    pub fn edge_colour_literal(&self, a: usize, b: usize, colour: usize) -> i32 {
        self.colour_literal(edge_index(a, b), colour)
    }

    /// Decodes a model; `is_true(var)` reports the value of a 1-based variable.
    pub fn decode(&self, mut is_true: impl FnMut(usize) -> bool) -> Colouring {
        let mut colouring = Colouring::monochromatic(self.order, self.colours);
        for j in 0..self.order {
            for i in 0..j {
                let e = edge_index(i, j);
                let colour = (1..=self.colours)
                    .find(|&c| {
                        let lit = self.colour_literal(e, c);
                        is_true(lit.unsigned_abs() as usize) == (lit > 0)
                    })
                    // Unreachable in a model (at-least-one clause); keep colour 1.
                    .unwrap_or(1);
                colouring.set(i, j, colour as u8);
            }
        }
        colouring
    }

    /// The assignment (indexed by variable - 1) that reads as exactly this colouring.
    pub fn assignment_of(&self, colouring: &Colouring) -> Vec<bool> {
        assert_eq!(colouring.order(), self.order);
        let mut values = vec![false; self.colour_variable_count()];
        for e in 0..edge_count(self.order) {
            let lit = self.colour_literal(e, colouring.colour_of_edge(e) as usize);
            values[lit.unsigned_abs() as usize - 1] = lit > 0;
        }
        values
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn two_colour_numbering() {
        let map = VariableMap::new(5, 2);
        assert_eq!(map.colour_variable_count(), 10);
        assert_eq!(map.edge_colour_literal(0, 1, 1), 1);
        assert_eq!(map.edge_colour_literal(0, 1, 2), -1);
        assert_eq!(map.edge_colour_literal(3, 4, 1), 10);
    }

    #[test]
    fn three_colour_numbering() {
        let map = VariableMap::new(4, 3);
        assert_eq!(map.colour_variable_count(), 18);
        assert_eq!(map.edge_colour_literal(0, 1, 1), 1);
        assert_eq!(map.edge_colour_literal(0, 1, 3), 3);
        assert_eq!(map.edge_colour_literal(0, 2, 1), 4);
    }

    #[test]
    fn decode_inverts_assignment() {
        for colours in 2..=4 {
            let map = VariableMap::new(6, colours);
            let colouring =
                Colouring::from_fn(6, colours, |i, j| ((i * 7 + j * 3) % colours + 1) as u8);
            let values = map.assignment_of(&colouring);
            assert_eq!(map.decode(|v| values[v - 1]), colouring);
        }
    }
}
