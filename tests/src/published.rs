//! Published Ramsey values used as check values, each with its source.

/// A classical Ramsey number R(k_1, …, k_r) = value.
#[derive(Clone, Copy, Debug)]
pub struct RamseyValue {
    pub cliques: &'static [usize],
    pub value: usize,
    pub source: &'static str,
}

/// Exact values small enough for the test suite.
pub const CLASSICAL: &[RamseyValue] = &[
    RamseyValue {
        cliques: &[3, 3],
        value: 6,
        source: "Greenwood & Gleason 1955; Radziszowski, Small Ramsey Numbers, EJC DS1",
    },
    RamseyValue {
        cliques: &[3, 4],
        value: 9,
        source: "Greenwood & Gleason 1955; Radziszowski, Small Ramsey Numbers, EJC DS1",
    },
    RamseyValue {
        cliques: &[3, 5],
        value: 14,
        source: "Greenwood & Gleason 1955; Radziszowski, Small Ramsey Numbers, EJC DS1",
    },
    RamseyValue {
        cliques: &[4, 4],
        value: 18,
        source: "Greenwood & Gleason 1955; Radziszowski, Small Ramsey Numbers, EJC DS1",
    },
    RamseyValue {
        cliques: &[3, 3, 3],
        value: 17,
        source: "Greenwood & Gleason 1955",
    },
];

/// Number of 2-colourings of the labelled K_5 with no monochromatic triangle: each is
/// a pentagon and its complement, and there are 4!/2 = 12 labelled 5-cycles
/// (common practice, derivable by hand).
pub const TRIANGLE_FREE_K5_COLOURINGS: usize = 12;
