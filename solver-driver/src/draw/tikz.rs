//! TikZ output: a `tikzpicture` to `\input` into a LaTeX manuscript (needs
//! `\usepackage{tikz}`, `\usetikzlibrary{patterns}` and `\usepackage{xcolor}`).

use std::fmt::Write;

use super::style::style_of;
use super::{Figure, Layout};

/// The TikZ text of a figure; coordinates in centimetres on a `size`-cm square.
pub fn render(figure: &Figure, layout: Layout, size: f64) -> String {
    let mut out = String::new();
    out.push_str("% ramsift figure: needs \\usepackage{tikz}, \\usetikzlibrary{patterns}\n");
    if let Some(title) = &figure.title {
        let _ = writeln!(out, "% {title}");
    }
    for c in 1..=figure.colours as u8 {
        let _ = writeln!(
            out,
            "\\definecolor{{ramsiftc{}}}{{HTML}}{{{}}}",
            letter(c),
            &style_of(c).hex[1..]
        );
    }
    out.push_str("\\begin{tikzpicture}\n");
    match layout {
        Layout::Circle => write_circle(&mut out, figure, size),
        Layout::Matrix => write_matrix(&mut out, figure, size),
    }
    out.push_str("\\end{tikzpicture}\n");
    out
}

/// The circle layout: vertex coordinates, each shown colour's edges, the vertices.
fn write_circle(out: &mut String, figure: &Figure, size: f64) {
    let n = figure.order;
    let radius = size / 2.0;
    let angle = |v: usize| 90.0 + 360.0 * v as f64 / n.max(1) as f64;
    for v in 0..n {
        let _ = writeln!(
            out,
            "  \\coordinate (v{v}) at ({:.3}:{radius:.3}cm);",
            angle(v)
        );
    }
    for c in &figure.shown {
        let s = style_of(*c);
        let _ = writeln!(out, "  % colour {c}: {}", s.name);
        for j in 0..n {
            for i in (0..j).filter(|&i| figure.colour(i, j) == *c) {
                let _ = writeln!(
                    out,
                    "  \\draw[ramsiftc{}, {}, line width={:.2}pt] (v{i}) -- (v{j});",
                    letter(*c),
                    s.tikz_dash,
                    s.width * 0.6
                );
            }
        }
    }
    for v in 0..n {
        let _ = writeln!(
            out,
            "  \\fill (v{v}) circle (2pt) node[anchor=center, label={{[font=\\tiny]{:.1}:{v}}}] {{}};",
            angle(v)
        );
    }
}

/// The matrix layout: one filled cell per ordered pair, in its colour and pattern.
fn write_matrix(out: &mut String, figure: &Figure, size: f64) {
    let n = figure.order;
    let cell = size / n.max(1) as f64;
    for i in 0..n {
        for j in (0..n).filter(|&j| j != i) {
            let c = figure.colour(i, j);
            let pattern = match style_of(c).fill {
                "hatch" => ", postaction={pattern=north east lines, pattern color=white}",
                "dots" => ", postaction={pattern=dots, pattern color=white}",
                "cross" => ", postaction={pattern=crosshatch, pattern color=white}",
                "backhatch" => ", postaction={pattern=north west lines, pattern color=white}",
                "grid" => ", postaction={pattern=grid, pattern color=white}",
                _ => "",
            };
            let (x, y) = (j as f64 * cell, (n - 1 - i) as f64 * cell);
            let _ = writeln!(
                out,
                "  \\fill[ramsiftc{}{pattern}] ({x:.3},{y:.3}) rectangle +({cell:.3},{cell:.3});",
                letter(c)
            );
        }
    }
    let _ = writeln!(out, "  \\draw (0,0) rectangle ({size:.3},{size:.3});");
}

/// TikZ colour names cannot hold digits: colour 1 is `ramsiftca`, 2 `ramsiftcb`, …
fn letter(c: u8) -> char {
    (b'a' + (c - 1) % 26) as char
}
