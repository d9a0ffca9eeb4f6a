//! Search for a monochromatic copy of a small graph H by direct backtracking: H's
//! vertices are placed one at a time on distinct vertices of K_n, and a placement is
//! kept only while every edge of H between placed vertices has the colour. Every
//! injective placement that is a copy is reached, so the search is exhaustive.

use crate::matrix::ColourMatrix;

/// The vertices (in H's vertex order) of the first copy of H in colour `colour`.
pub fn find_monochromatic_copy(
    matrix: &ColourMatrix,
    colour: u8,
    vertices: usize,
    edges: &[(usize, usize)],
) -> Option<Vec<usize>> {
    // For each H-vertex, its H-neighbours placed before it.
    let earlier: Vec<Vec<usize>> = (0..vertices)
        .map(|v| {
            edges
                .iter()
                .filter_map(|&(a, b)| match (a == v, b == v) {
                    (true, _) if b < v => Some(b),
                    (_, true) if a < v => Some(a),
                    _ => None,
                })
                .collect()
        })
        .collect();
    let mut placed = Vec::with_capacity(vertices);
    place(matrix, colour, &earlier, &mut placed).then_some(placed)
}

fn place(
    matrix: &ColourMatrix,
    colour: u8,
    earlier: &[Vec<usize>],
    placed: &mut Vec<usize>,
) -> bool {
    let v = placed.len();
    if v == earlier.len() {
        return true;
    }
    for x in 0..matrix.order() {
        if placed.contains(&x) {
            continue;
        }
        if earlier[v]
            .iter()
            .all(|&u| matrix.colour(placed[u], x) == colour)
        {
            placed.push(x);
            if place(matrix, colour, earlier, placed) {
                return true;
            }
            placed.pop();
        }
    }
    false
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_a_four_cycle_and_not_in_a_star() {
        // Colour 1 = the 4-cycle 0-1-2-3-0 plus nothing else, on 5 vertices.
        let mut m = ColourMatrix::filled(5, 2);
        for (a, b) in [(0, 1), (1, 2), (2, 3), (0, 3)] {
            m.set(a, b, 1);
        }
        let c4 = [(0, 1), (1, 2), (2, 3), (0, 3)];
        let copy = find_monochromatic_copy(&m, 1, 4, &c4).expect("a C4");
        for &(a, b) in &c4 {
            assert_eq!(m.colour(copy[a], copy[b]), 1);
        }
        // A star K_{1,4} at vertex 4 in colour 1 has no 4-cycle.
        let mut star = ColourMatrix::filled(5, 2);
        for v in 0..4 {
            star.set(v, 4, 1);
        }
        assert!(find_monochromatic_copy(&star, 1, 4, &c4).is_none());
    }
}
