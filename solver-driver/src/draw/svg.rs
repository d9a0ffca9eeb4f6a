//! SVG output: a self-contained drawing with a legend.

use std::fmt::Write;

use super::style::style_of;
use super::{Figure, Layout};

/// Vertex positions on a circle of radius `radius` around (`cx`, `cy`), vertex 0 at
/// the top, counter-clockwise.
pub fn circle_positions(n: usize, cx: f64, cy: f64, radius: f64) -> Vec<(f64, f64)> {
    (0..n)
        .map(|v| {
            let angle = std::f64::consts::TAU * v as f64 / n.max(1) as f64;
            (cx - radius * angle.sin(), cy - radius * angle.cos())
        })
        .collect()
}

/// Geometry of the matrix layout: cell size and the top-left corner.
pub fn matrix_geometry(n: usize, size: f64) -> (f64, f64) {
    let cell = (size - 40.0) / n.max(1) as f64;
    (cell, 20.0)
}

/// The SVG text of a figure of `size` × `size` pixels (plus a legend below).
pub fn render(figure: &Figure, layout: Layout, size: f64) -> String {
    let legend_height = 18.0 * figure.colours as f64 + 10.0;
    let mut out = String::new();
    let _ = writeln!(
        out,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{size}" height="{h}" viewBox="0 0 {size} {h}">"#,
        h = size + legend_height
    );
    if let Some(title) = &figure.title {
        let _ = writeln!(out, "<title>{}</title>", escape(title));
    }
    write_fill_patterns(&mut out, figure.colours);
    let _ = writeln!(out, r#"<rect width="100%" height="100%" fill="white"/>"#);
    match layout {
        Layout::Circle => write_circle(&mut out, figure, size),
        Layout::Matrix => write_matrix(&mut out, figure, size),
    }
    write_legend(&mut out, figure.colours, size);
    out.push_str("</svg>\n");
    out
}

/// One fill pattern per colour (its base colour and a white mark), for the matrix
/// cells and the legend.
fn write_fill_patterns(out: &mut String, colours: usize) {
    out.push_str("<defs>\n");
    for c in 1..=colours as u8 {
        let s = style_of(c);
        let mark = match s.fill {
            "hatch" => r#"<path d="M0,6 L6,0" stroke="white" stroke-width="1.2"/>"#,
            "dots" => r#"<circle cx="3" cy="3" r="1.1" fill="white"/>"#,
            "cross" => r#"<path d="M0,6 L6,0 M0,0 L6,6" stroke="white" stroke-width="0.9"/>"#,
            "backhatch" => r#"<path d="M0,0 L6,6" stroke="white" stroke-width="1.2"/>"#,
            "grid" => r#"<path d="M3,0 L3,6 M0,3 L6,3" stroke="white" stroke-width="0.9"/>"#,
            _ => "",
        };
        let _ = writeln!(
            out,
            r#"<pattern id="fill{c}" width="6" height="6" patternUnits="userSpaceOnUse"><rect width="6" height="6" fill="{}"/>{mark}</pattern>"#,
            s.hex
        );
    }
    out.push_str("</defs>\n");
}

/// The circle layout: each shown colour's edges in its style, then the vertices.
fn write_circle(out: &mut String, figure: &Figure, size: f64) {
    let n = figure.order;
    let positions = circle_positions(n, size / 2.0, size / 2.0, size / 2.0 - 24.0);
    for c in &figure.shown {
        let s = style_of(*c);
        let _ = writeln!(
            out,
            r#"<g stroke="{}" stroke-width="{}" stroke-dasharray="{}" stroke-linecap="butt" fill="none" data-colour="{c}">"#,
            s.hex,
            s.width,
            if s.dash.is_empty() { "none" } else { s.dash }
        );
        for j in 0..n {
            for i in (0..j).filter(|&i| figure.colour(i, j) == *c) {
                let ((x1, y1), (x2, y2)) = (positions[i], positions[j]);
                let _ = writeln!(
                    out,
                    r#"<line x1="{x1:.2}" y1="{y1:.2}" x2="{x2:.2}" y2="{y2:.2}"/>"#
                );
            }
        }
        out.push_str("</g>\n");
    }
    for (v, (x, y)) in positions.iter().enumerate() {
        let _ = writeln!(
            out,
            r#"<circle cx="{x:.2}" cy="{y:.2}" r="4" fill="black"/><text x="{:.2}" y="{:.2}" font-size="10" text-anchor="middle" font-family="sans-serif">{v}</text>"#,
            x + (x - size / 2.0) * 0.06,
            y + (y - size / 2.0) * 0.06 + 3.0
        );
    }
}

/// The matrix layout: one cell per ordered pair, in its colour's fill.
fn write_matrix(out: &mut String, figure: &Figure, size: f64) {
    let n = figure.order;
    let (cell, origin) = matrix_geometry(n, size);
    for i in 0..n {
        for j in 0..n {
            let (x, y) = (origin + j as f64 * cell, origin + i as f64 * cell);
            let fill = if i == j {
                "white".to_string()
            } else {
                format!("url(#fill{})", figure.colour(i, j))
            };
            let _ = writeln!(
                out,
                r#"<rect x="{x:.2}" y="{y:.2}" width="{cell:.2}" height="{cell:.2}" fill="{fill}" stroke="white" stroke-width="0.5"/>"#
            );
        }
    }
    let _ = writeln!(
        out,
        r#"<rect x="{origin}" y="{origin}" width="{w:.2}" height="{w:.2}" fill="none" stroke="black" stroke-width="1"/>"#,
        w = cell * n as f64
    );
}

/// The legend below the drawing: each colour's line style and fill.
fn write_legend(out: &mut String, colours: usize, size: f64) {
    for c in 1..=colours as u8 {
        let s = style_of(c);
        let y = size + 14.0 + 18.0 * (c as f64 - 1.0);
        let _ = writeln!(
            out,
            r#"<line x1="20" y1="{y}" x2="60" y2="{y}" stroke="{}" stroke-width="{}" stroke-dasharray="{}"/><rect x="66" y="{}" width="10" height="10" fill="url(#fill{c})"/><text x="82" y="{}" font-size="11" font-family="sans-serif">colour {c} ({})</text>"#,
            s.hex,
            s.width,
            if s.dash.is_empty() { "none" } else { s.dash },
            y - 5.0,
            y + 4.0,
            s.name
        );
    }
}

fn escape(text: &str) -> String {
    text.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
}
