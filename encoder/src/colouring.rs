//! An edge colouring of K_n with colours 1..=r, stored by edge index (see [`crate::edges`]).

use crate::edges::{edge_count, edge_index};

/// A complete edge colouring of K_n.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Colouring {
    order: usize,
    colours: usize,
    edge_colours: Vec<u8>,
}

impl Colouring {
    /// All edges coloured 1.
    pub fn monochromatic(order: usize, colours: usize) -> Self {
        assert!((1..=255).contains(&colours));
        Colouring {
            order,
            colours,
            edge_colours: vec![1; edge_count(order)],
        }
    }

    /// Builds a colouring from a function of the edge's endpoints (i < j).
    pub fn from_fn(
        order: usize,
        colours: usize,
        mut colour_of: impl FnMut(usize, usize) -> u8,
    ) -> Self {
        let mut colouring = Self::monochromatic(order, colours);
        for j in 0..order {
            for i in 0..j {
                colouring.set(i, j, colour_of(i, j));
            }
        }
        colouring
    }

    pub fn order(&self) -> usize {
        self.order
    }

    pub fn colours(&self) -> usize {
        self.colours
    }

    /// Colour (1-based) of edge {a, b}.
    #[inline]
    pub fn colour(&self, a: usize, b: usize) -> u8 {
        self.edge_colours[edge_index(a, b)]
    }

    /// Colour of the edge with the given index.
    #[inline]
    pub fn colour_of_edge(&self, index: usize) -> u8 {
        self.edge_colours[index]
    }

    pub fn set(&mut self, a: usize, b: usize, colour: u8) {
        assert!(
            colour >= 1 && colour as usize <= self.colours,
            "colour {colour} out of range"
        );
        self.edge_colours[edge_index(a, b)] = colour;
    }

    /// Colours by edge index.
    pub fn edge_colours(&self) -> &[u8] {
        &self.edge_colours
    }
}
