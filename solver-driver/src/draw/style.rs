//! One style per colour class: hue, dash pattern, width, and matrix fill pattern.

/// How the edges and matrix cells of one colour look.
#[derive(Clone, Copy, Debug)]
pub struct ColourStyle {
    /// The Okabe–Ito hue, as `#rrggbb`.
    pub hex: &'static str,
    pub rgb: (u8, u8, u8),
    /// SVG `stroke-dasharray` ("" for a solid line), in pixels.
    pub dash: &'static str,
    /// TikZ dash option.
    pub tikz_dash: &'static str,
    pub width: f64,
    /// Matrix fill: "solid", or a hatch direction.
    pub fill: &'static str,
    pub name: &'static str,
}

/// Styles for colours 1, 2, … (cycling after the sixth).
pub const STYLES: [ColourStyle; 6] = [
    ColourStyle {
        hex: "#0072B2",
        rgb: (0x00, 0x72, 0xB2),
        dash: "",
        tikz_dash: "solid",
        width: 1.6,
        fill: "solid",
        name: "blue, solid",
    },
    ColourStyle {
        hex: "#D55E00",
        rgb: (0xD5, 0x5E, 0x00),
        dash: "10 5",
        tikz_dash: "dashed",
        width: 1.2,
        fill: "hatch",
        name: "vermillion, dashed",
    },
    ColourStyle {
        hex: "#009E73",
        rgb: (0x00, 0x9E, 0x73),
        dash: "2 5",
        tikz_dash: "dotted",
        width: 1.4,
        fill: "dots",
        name: "bluish green, dotted",
    },
    ColourStyle {
        hex: "#E69F00",
        rgb: (0xE6, 0x9F, 0x00),
        dash: "10 4 2 4",
        tikz_dash: "dash dot",
        width: 1.2,
        fill: "cross",
        name: "orange, dash-dot",
    },
    ColourStyle {
        hex: "#CC79A7",
        rgb: (0xCC, 0x79, 0xA7),
        dash: "16 6",
        tikz_dash: "loosely dashed",
        width: 1.0,
        fill: "backhatch",
        name: "reddish purple, long dashes",
    },
    ColourStyle {
        hex: "#56B4E9",
        rgb: (0x56, 0xB4, 0xE9),
        dash: "6 3 6 8",
        tikz_dash: "densely dashed",
        width: 0.8,
        fill: "grid",
        name: "sky blue, paired dashes",
    },
];

/// The style of colour `c` (1-based).
pub fn style_of(c: u8) -> ColourStyle {
    STYLES[(c as usize - 1) % STYLES.len()]
}
