//! The partial colour matrix: what the solver's assignment says about each edge.
//!
//! With two colours an assigned edge variable gives the colour (true: colour 1).
//! With r >= 3 colours edge e is known to have colour c when its colour-c
//! variable is true and every smaller colour's variable is false: that is the
//! colour a model decodes to, and the colour of every exactly-one assignment
//! extending it.

use ramsift_cdcl::Assignment;
use ramsift_encoder::edges::edge_index;
use ramsift_encoder::VariableMap;

/// The index of edge {a, b}, a != b, in either order.
#[inline]
pub fn edge_of(a: usize, b: usize) -> usize {
    edge_index(a.min(b), a.max(b))
}

/// Known colours of the edges (0: unknown), indexed by edge index.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PartialMatrix {
    order: usize,
    colour: Vec<u8>,
}

impl PartialMatrix {
    pub fn read(vars: &VariableMap, assignment: Assignment<'_>) -> Self {
        let order = vars.order();
        let r = vars.colours();
        let edges = order * order.saturating_sub(1) / 2;
        let colour = (0..edges)
            .map(|e| {
                if r == 2 {
                    match assignment.value(e + 1) {
                        Some(true) => 1,
                        Some(false) => 2,
                        None => 0,
                    }
                } else {
                    for c in 1..=r {
                        match assignment.value(e * r + c) {
                            Some(true) => return c as u8,
                            Some(false) => continue,
                            None => return 0,
                        }
                    }
                    0
                }
            })
            .collect();
        PartialMatrix { order, colour }
    }

    /// A matrix from colours by edge index (0 unknown).
    pub fn from_edge_colours(order: usize, colour: Vec<u8>) -> Self {
        assert_eq!(colour.len(), order * order.saturating_sub(1) / 2);
        PartialMatrix { order, colour }
    }

    pub fn order(&self) -> usize {
        self.order
    }

    /// The known colour of edge {a, b}, a != b (0: unknown).
    #[inline]
    pub fn get(&self, a: usize, b: usize) -> u8 {
        self.colour[edge_of(a, b)]
    }

    #[inline]
    pub fn edge(&self, e: usize) -> u8 {
        self.colour[e]
    }

    /// The literals, true now, that make edge `e` known (empty when unknown).
    pub fn reasons(&self, vars: &VariableMap, e: usize, out: &mut Vec<i32>) {
        let c = self.colour[e] as usize;
        if c == 0 {
            return;
        }
        if vars.colours() == 2 {
            out.push(vars.colour_literal(e, c));
        } else {
            out.push(vars.colour_literal(e, c));
            out.extend((1..c).map(|d| -vars.colour_literal(e, d)));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn three_colours_need_the_smaller_colours_excluded() {
        let vars = VariableMap::new(3, 3);
        // Edge 0: colour 2 known (var 1 false, var 2 true). Edge 1: var 4 unknown.
        // Edge 2: colour 1 (var 7 true).
        let mut values = vec![0i8; 9];
        values[0] = -1;
        values[1] = 1;
        values[6] = 1;
        let m = PartialMatrix::read(&vars, Assignment::from_values(&values));
        assert_eq!((m.edge(0), m.edge(1), m.edge(2)), (2, 0, 1));
        let mut reasons = Vec::new();
        m.reasons(&vars, 0, &mut reasons);
        assert_eq!(reasons, vec![2, -1]);
    }
}
