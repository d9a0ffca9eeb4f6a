//! TikZ output: a `tikzpicture` to `\input` into a LaTeX manuscript (needs
//! `\usepackage{tikz}`, `\usetikzlibrary{patterns}` and `\usepackage{xcolor}`).

use std::fmt::Write;

use super::style::style_of;
use super::{Figure, Layout};

/// The TikZ text of a figure; coordinates in centimetres on a `size`-cm square.
pub fn render(figure: &Figure, layout: Layout, size: f64) -> String {
    let n = figure.order;
    let mut out = String::new();
    out.push_str("% ramsift figure: needs \\usepackage{tikz}, \\usetikzlibrary{patterns}\n");
    if let Some(title) = &figure.title {
        let _ = writeln!(out, "% {title}");
    }
    for c in 1..=figure.colours as u8 {
        let s = style_of(c);
        let _ = writeln!(
            out,
            "\\definecolor{{ramsiftc{}}}{{HTML}}{{{}}}",
            letter(c),
            &s.hex[1..]
        );
    }
    out.push_str("\\begin{tikzpicture}\n");
    match layout {
        Layout::Circle => {
            let radius = size / 2.0;
            for v in 0..n {
                let angle = 90.0 + 360.0 * v as f64 / n.max(1) as f64;
                let _ = writeln!(out, "  \\coordinate (v{v}) at ({angle:.3}:{radius:.3}cm);");
            }
            for c in &figure.shown {
                let s = style_of(*c);
                let _ = writeln!(out, "  % colour {c}: {}", s.name);
                for j in 0..n {
                    for i in 0..j {
                        if figure.colour(i, j) == *c {
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
            }
            for v in 0..n {
                let _ = writeln!(
                    out,
                    "  \\fill (v{v}) circle (2pt) node[anchor=center, label={{[font=\\tiny]{:.1}:{v}}}] {{}};",
                    90.0 + 360.0 * v as f64 / n.max(1) as f64
                );
            }
        }
        Layout::Matrix => {
            let cell = size / n.max(1) as f64;
            for i in 0..n {
                for j in 0..n {
                    if i == j {
                        continue;
                    }
                    let c = figure.colour(i, j);
                    let s = style_of(c);
                    let pattern = match s.fill {
                        "hatch" => ", postaction={pattern=north east lines, pattern color=white}",
                        "dots" => ", postaction={pattern=dots, pattern color=white}",
                        "cross" => ", postaction={pattern=crosshatch, pattern color=white}",
                        "backhatch" => {
                            ", postaction={pattern=north west lines, pattern color=white}"
                        }
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
    }
    out.push_str("\\end{tikzpicture}\n");
    out
}

/// TikZ colour names cannot hold digits: colour 1 is `ramsiftca`, 2 `ramsiftcb`, …
fn letter(c: u8) -> char {
    (b'a' + (c - 1) % 26) as char
}
