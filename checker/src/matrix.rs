//! A complete colouring of K_n as a symmetric matrix of colours 1..=r (0 on the diagonal).

/// Colours of all edges of K_n; `colour(i, j) == colour(j, i)`, diagonal 0.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ColourMatrix {
    order: usize,
    cells: Vec<u8>,
}

impl ColourMatrix {
    /// A colouring with every edge coloured `colour`.
    pub fn filled(order: usize, colour: u8) -> Self {
        let mut cells = vec![colour; order * order];
        for i in 0..order {
            cells[i * order + i] = 0;
        }
        ColourMatrix { order, cells }
    }

    pub fn order(&self) -> usize {
        self.order
    }

    #[inline]
    pub fn colour(&self, i: usize, j: usize) -> u8 {
        self.cells[i * self.order + j]
    }

    /// Sets the colour of edge {i, j} (both entries).
    pub fn set(&mut self, i: usize, j: usize, colour: u8) {
        assert_ne!(i, j, "the diagonal holds no edge");
        self.cells[i * self.order + j] = colour;
        self.cells[j * self.order + i] = colour;
    }

    /// The largest colour used (0 for K_1).
    pub fn max_colour(&self) -> u8 {
        self.cells.iter().copied().max().unwrap_or(0)
    }
}
