//! The figures, rasterized with resvg: the pixels show each colour class in its own
//! hue, the dashed classes with gaps, and the matrix cells in their fills.

use resvg::{tiny_skia, usvg};

use ramsift_driver::draw::style::style_of;
use ramsift_driver::draw::svg::{circle_positions, matrix_geometry, render};
use ramsift_driver::draw::{tikz, Figure, Layout};

/// The pentagon colouring of K5: colour 1 at distance ±1, colour 2 at ±2 (the
/// (3,3;5) colouring, Radziszowski DS1).
fn pentagon() -> Figure {
    let n = 5;
    let mut cells = vec![0u8; n * n];
    for i in 0..n {
        for j in 0..n {
            if i != j {
                let d = (j + n - i) % n;
                cells[i * n + j] = if d == 1 || d == 4 { 1 } else { 2 };
            }
        }
    }
    Figure {
        order: n,
        colours: 2,
        cells,
        shown: vec![1, 2],
        title: Some("pentagon".into()),
    }
}

fn rasterize(svg: &str) -> tiny_skia::Pixmap {
    let tree = usvg::Tree::from_str(svg, &usvg::Options::default()).expect("valid SVG");
    let size = tree.size().to_int_size();
    let mut pixmap = tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
    resvg::render(&tree, tiny_skia::Transform::default(), &mut pixmap.as_mut());
    pixmap
}

fn pixel(p: &tiny_skia::Pixmap, x: f64, y: f64) -> (u8, u8, u8) {
    let c = p.pixel(x.round() as u32, y.round() as u32).unwrap();
    (c.red(), c.green(), c.blue())
}

fn close(a: (u8, u8, u8), b: (u8, u8, u8), tolerance: i32) -> bool {
    (a.0 as i32 - b.0 as i32).abs() <= tolerance
        && (a.1 as i32 - b.1 as i32).abs() <= tolerance
        && (a.2 as i32 - b.2 as i32).abs() <= tolerance
}

/// The 3×3 pixel neighbourhood of points along the segment, excluding 15% at each
/// end (vertex discs); a line 1–2 px wide is anti-aliased across such a block.
fn along(p: &tiny_skia::Pixmap, from: (f64, f64), to: (f64, f64)) -> Vec<Vec<(u8, u8, u8)>> {
    (15..=85)
        .map(|t| {
            let t = t as f64 / 100.0;
            let (x, y) = (from.0 + t * (to.0 - from.0), from.1 + t * (to.1 - from.1));
            (-1..=1)
                .flat_map(|dy| (-1..=1).map(move |dx| (dx, dy)))
                .map(|(dx, dy)| pixel(p, x + dx as f64, y + dy as f64))
                .collect()
        })
        .collect()
}

#[test]
fn circle_layout_draws_each_class_in_its_style() {
    let figure = pentagon();
    let size = 400.0;
    let pixmap = rasterize(&render(&figure, Layout::Circle, size));
    let positions = circle_positions(5, size / 2.0, size / 2.0, size / 2.0 - 24.0);
    let (blue, vermillion) = (style_of(1).rgb, style_of(2).rgb);
    // Edge {0,1} is colour 1, solid: blue along its whole middle.
    let solid = along(&pixmap, positions[0], positions[1]);
    let blue_share = solid
        .iter()
        .filter(|block| block.iter().any(|&c| close(c, blue, 40)))
        .count();
    assert!(
        blue_share * 10 >= solid.len() * 9,
        "{blue_share} of {}",
        solid.len()
    );
    assert!(!solid.iter().flatten().any(|&c| close(c, vermillion, 40)));
    // Edge {0,2} is colour 2, dashed: vermillion with white gaps (whole blocks white).
    let dashed = along(&pixmap, positions[0], positions[2]);
    let on = dashed
        .iter()
        .filter(|block| block.iter().any(|&c| close(c, vermillion, 40)))
        .count();
    let gaps = dashed
        .iter()
        .filter(|block| close(block[4], (255, 255, 255), 40))
        .count();
    assert!(on >= dashed.len() / 3, "{on} of {}", dashed.len());
    assert!(
        gaps >= dashed.len() / 8,
        "no gaps in the dashed line: {gaps}"
    );
    // The two hues differ in greyscale too (luminance, ITU-R BT.601 weights).
    let luma = |c: (u8, u8, u8)| 0.299 * c.0 as f64 + 0.587 * c.1 as f64 + 0.114 * c.2 as f64;
    assert!((luma(blue) - luma(vermillion)).abs() > 20.0);
    // Vertices are black discs.
    assert!(close(
        pixel(&pixmap, positions[3].0, positions[3].1),
        (0, 0, 0),
        30
    ));
}

#[test]
fn matrix_layout_fills_each_cell_in_its_colour() {
    let figure = pentagon();
    let size = 240.0;
    let pixmap = rasterize(&render(&figure, Layout::Matrix, size));
    let (cell, origin) = matrix_geometry(5, size);
    for i in 0..5 {
        for j in 0..5 {
            let mut counts = [0usize; 3]; // white, colour 1, colour 2
            let mut total = 0;
            for dy in 3..(cell as usize - 3) {
                for dx in 3..(cell as usize - 3) {
                    let c = pixel(
                        &pixmap,
                        origin + j as f64 * cell + dx as f64,
                        origin + i as f64 * cell + dy as f64,
                    );
                    total += 1;
                    if close(c, (255, 255, 255), 30) {
                        counts[0] += 1;
                    } else if close(c, style_of(1).rgb, 40) {
                        counts[1] += 1;
                    } else if close(c, style_of(2).rgb, 40) {
                        counts[2] += 1;
                    }
                }
            }
            if i == j {
                assert_eq!(counts[0], total, "diagonal cell ({i},{i}) is white");
            } else {
                let c = figure.colour(i, j) as usize;
                let other = 3 - c;
                assert!(counts[c] * 2 > total, "cell ({i},{j}): {counts:?}");
                assert_eq!(counts[other], 0, "cell ({i},{j}): {counts:?}");
                // Colour 2's fill is hatched (white lines), colour 1's is solid.
                if c == 2 {
                    assert!(counts[0] > 0, "cell ({i},{j}) has no hatching");
                } else {
                    assert_eq!(counts[0], 0, "cell ({i},{j})");
                }
            }
        }
    }
}

#[test]
fn tikz_has_one_styled_draw_per_edge() {
    let text = tikz::render(&pentagon(), Layout::Circle, 6.0);
    assert_eq!(text.matches("\\draw[ramsiftca, solid").count(), 5);
    assert_eq!(text.matches("\\draw[ramsiftcb, dashed").count(), 5);
    assert!(text.contains("\\definecolor{ramsiftca}{HTML}{0072B2}"));
    let matrix = tikz::render(&pentagon(), Layout::Matrix, 6.0);
    assert_eq!(matrix.matches("\\fill[ramsiftca]").count(), 10);
    assert_eq!(
        matrix
            .matches("\\fill[ramsiftcb, postaction={pattern=north east lines")
            .count(),
        10
    );
}
