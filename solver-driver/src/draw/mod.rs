//! Figures of a colouring for manuscripts: the complete graph with vertices on a
//! circle and one line style per colour class, and the adjacency-matrix picture,
//! each as SVG or TikZ.
//!
//! Colour classes stay distinguishable in greyscale and for colour-blind readers:
//! each class has a hue from the Okabe–Ito palette (Okabe & Ito, "Color Universal
//! Design", 2002; Wong, Nature Methods 8:441, 2011) *and* its own dash pattern and
//! line width; in the matrix, its own fill pattern.
//!
//! * [`style`] holds the per-colour styles; [`svg`] and [`tikz`] write the two
//!   formats.

pub mod style;
pub mod svg;
pub mod tikz;

/// What to draw.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Layout {
    /// Vertices on a circle, each edge drawn in its colour's style.
    Circle,
    /// The n×n adjacency matrix, cell (i, j) filled in the style of edge {i, j}.
    Matrix,
}

/// A colouring to draw: `colour(i, j)` in 1..=colours for i ≠ j.
#[derive(Clone, Debug)]
pub struct Figure {
    pub order: usize,
    pub colours: usize,
    /// Row-major, 0 on the diagonal.
    pub cells: Vec<u8>,
    /// Colours whose edges are drawn in the circle layout (all by default).
    pub shown: Vec<u8>,
    pub title: Option<String>,
}

impl Figure {
    pub fn colour(&self, i: usize, j: usize) -> u8 {
        self.cells[i * self.order + j]
    }
}
