//! Published values and ranges of small classical Ramsey numbers, as embedded in
//! the bounds report. Source: S. P. Radziszowski, "Small Ramsey Numbers",
//! Electronic Journal of Combinatorics, Dynamic Survey DS1, revision 17 (2024; the
//! revision number is from memory), with the papers it cites for each entry.

/// A published range: lower ≤ R ≤ upper (equal when the value is known).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct PublishedRange {
    /// Clique sizes, sorted.
    pub cliques: &'static [usize],
    pub lower: u64,
    pub upper: u64,
    pub source: &'static str,
}

/// The embedded table.
pub const PUBLISHED: &[PublishedRange] = &[
    PublishedRange {
        cliques: &[3, 3],
        lower: 6,
        upper: 6,
        source: "Greenwood & Gleason 1955",
    },
    PublishedRange {
        cliques: &[3, 4],
        lower: 9,
        upper: 9,
        source: "Greenwood & Gleason 1955",
    },
    PublishedRange {
        cliques: &[3, 5],
        lower: 14,
        upper: 14,
        source: "Greenwood & Gleason 1955",
    },
    PublishedRange {
        cliques: &[3, 6],
        lower: 18,
        upper: 18,
        source: "Kéry 1964; DS1",
    },
    PublishedRange {
        cliques: &[3, 7],
        lower: 23,
        upper: 23,
        source: "Graver & Yackel 1968; DS1",
    },
    PublishedRange {
        cliques: &[3, 8],
        lower: 28,
        upper: 28,
        source: "McKay & Radziszowski 1992; DS1",
    },
    PublishedRange {
        cliques: &[3, 9],
        lower: 36,
        upper: 36,
        source: "Kalbfleisch 1966; Grinstead & Roberts 1982; DS1",
    },
    PublishedRange {
        cliques: &[3, 10],
        lower: 40,
        upper: 41,
        source: "Exoo 1989; Angeltveit 2024 (arXiv 2401.00392)",
    },
    PublishedRange {
        cliques: &[4, 4],
        lower: 18,
        upper: 18,
        source: "Greenwood & Gleason 1955",
    },
    PublishedRange {
        cliques: &[4, 5],
        lower: 25,
        upper: 25,
        source: "McKay & Radziszowski 1995",
    },
    PublishedRange {
        cliques: &[4, 6],
        lower: 36,
        upper: 40,
        source: "Exoo 2012 (lower); DS1 (upper, from memory)",
    },
    PublishedRange {
        cliques: &[5, 5],
        lower: 43,
        upper: 46,
        source: "Exoo 1989; Angeltveit & McKay 2024 (arXiv 2409.15709)",
    },
    PublishedRange {
        cliques: &[3, 3, 3],
        lower: 17,
        upper: 17,
        source: "Greenwood & Gleason 1955",
    },
    PublishedRange {
        cliques: &[3, 3, 4],
        lower: 30,
        upper: 30,
        source: "Codish, Frank, Itzhakov & Miller 2016",
    },
];

/// The published range for these clique sizes (in any order), if tabulated.
pub fn published(sizes: &[usize]) -> Option<&'static PublishedRange> {
    let mut key: Vec<usize> = sizes.to_vec();
    key.sort_unstable();
    PUBLISHED.iter().find(|p| p.cliques == key.as_slice())
}

/// Exact published values, for seeding the recursion.
pub fn exact(sizes: &[usize]) -> Option<u64> {
    published(sizes)
        .filter(|p| p.lower == p.upper)
        .map(|p| p.lower)
}
