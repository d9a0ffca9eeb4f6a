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

/// The largest order of a circulant (3,t)-colouring (a cyclic triangle-free graph
/// with independence number below t), for t = 3..=6: OEIS A000789, terms due to
/// Kalbfleisch, "Construction of special edge-chromatic graphs", Canad. Math. Bull.
/// 8 (1965), and tabulated by Harborth & Krause, "Ramsey numbers for circulant
/// colorings", Congressus Numerantium 161 (2003). For t ≤ 5 it equals R(3,t) − 1;
/// t = 6 is the first strict case (16 < R(3,6) − 1 = 17), witnessed by the circulant
/// graph on 16 vertices with distances {1, 3, 8} (OEIS A000789, example).
pub const LARGEST_CIRCULANT_3T: &[(usize, usize)] = &[(3, 5), (4, 8), (5, 13), (6, 16)];

/// A graph Ramsey number R(G, H) = value, with the specification entries naming G
/// and H in ramsift's syntax.
#[derive(Clone, Copy, Debug)]
pub struct GraphRamseyValue {
    pub spec: &'static str,
    pub value: usize,
    pub source: &'static str,
}

/// Small graph Ramsey numbers. Chvátal & Harary, "Generalized Ramsey theory for
/// graphs III: small off-diagonal numbers", Pacific J. Math. 41 (1972), and
/// Radziszowski DS1 (sections on cycles and on small graphs). The entries marked
/// "from memory" were recalled, not read in the source; every one is confirmed in
/// both directions by these tests (a witness at R − 1 and a checked refutation at R).
pub const GRAPH_VALUES: &[GraphRamseyValue] = &[
    GraphRamseyValue {
        spec: "C4,C4",
        value: 6,
        source: "Chvátal & Harary 1972; DS1 (from memory)",
    },
    GraphRamseyValue {
        spec: "3,C4",
        value: 7,
        source: "Chvátal & Harary 1972; DS1 (from memory)",
    },
    GraphRamseyValue {
        spec: "C4,4",
        value: 10,
        source: "Chvátal & Harary 1972; DS1 (from memory)",
    },
    GraphRamseyValue {
        spec: "C5,C5",
        value: 9,
        source: "R(C_n,C_n) = 2n - 1 for odd n >= 5 (Rosta 1973; Faudree & Schelp 1974; DS1)",
    },
    GraphRamseyValue {
        spec: "K4-e,K4-e",
        value: 10,
        source: "Chvátal & Harary 1972; DS1 (from memory)",
    },
    GraphRamseyValue {
        spec: "K1:3,K1:3",
        value: 6,
        source: "R(K1,n, K1,m) = n + m - e, e = 1 iff n and m are both even (Harary 1972; DS1; from memory)",
    },
];
