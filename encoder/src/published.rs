//! The one table of published values and ranges of small classical Ramsey
//! numbers: the bounds report shows it, and degree bounds take their premises
//! (upper bounds) from it. Source: S. P. Radziszowski, "Small Ramsey Numbers",
//! Electronic Journal of Combinatorics, Dynamic Survey DS1, revision 17 (2024; the
//! revision number is from memory), with the papers it cites for each entry.
//! Entries with a 1 or 2 are derived, not tabled: R(…, 1, …) = 1 and
//! R(…, 2, …) = R(… without the 2) hold by definition.

/// A published range: lower ≤ R ≤ upper (equal when the value is known).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct PublishedRange {
    /// Clique sizes, sorted (Ramsey numbers are symmetric in their arguments).
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
        source: "Greenwood & Gleason 1955; DS1",
    },
    PublishedRange {
        cliques: &[3, 4],
        lower: 9,
        upper: 9,
        source: "Greenwood & Gleason 1955; DS1",
    },
    PublishedRange {
        cliques: &[3, 5],
        lower: 14,
        upper: 14,
        source: "Greenwood & Gleason 1955; DS1",
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
        source: "Exoo 1989; Angeltveit 2024, arXiv 2401.00392; DS1",
    },
    PublishedRange {
        cliques: &[4, 4],
        lower: 18,
        upper: 18,
        source: "Greenwood & Gleason 1955; DS1",
    },
    PublishedRange {
        cliques: &[4, 5],
        lower: 25,
        upper: 25,
        source: "McKay & Radziszowski 1995; DS1",
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
        source: "Exoo 1989; Angeltveit & McKay 2024, arXiv 2409.15709",
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

/// Exact published values (lower = upper).
pub fn exact(sizes: &[usize]) -> Option<u64> {
    published(sizes)
        .filter(|p| p.lower == p.upper)
        .map(|p| p.lower)
}

/// Why an upper bound holds.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum BoundReason {
    /// R(…, 1, …) = 1 or R(k) = k: immediate from the definition.
    Definition,
    /// A tabled value.
    Published(&'static str),
}

/// An upper bound on R(cliques), if one is known.
pub fn upper_bound(cliques: &[usize]) -> Option<(usize, BoundReason)> {
    if cliques.contains(&1) {
        return Some((1, BoundReason::Definition));
    }
    let mut rest: Vec<usize> = cliques.iter().copied().filter(|&k| k != 2).collect();
    if rest.len() < cliques.len() {
        // Dropping a 2 changes nothing; a lone entry k gives R(k) = k.
        return match rest.len() {
            0 => Some((2, BoundReason::Definition)),
            1 => Some((rest[0], BoundReason::Definition)),
            _ => upper_bound(&rest).map(|(b, r)| {
                (
                    b,
                    if rest.len() == 1 {
                        BoundReason::Definition
                    } else {
                        r
                    },
                )
            }),
        };
    }
    rest.sort_unstable();
    published(&rest).map(|p| (p.upper as usize, BoundReason::Published(p.source)))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn derived_and_tabled_bounds() {
        assert_eq!(upper_bound(&[1, 5]), Some((1, BoundReason::Definition)));
        assert_eq!(upper_bound(&[2, 5]), Some((5, BoundReason::Definition)));
        assert_eq!(upper_bound(&[2, 2]), Some((2, BoundReason::Definition)));
        assert_eq!(upper_bound(&[4, 3]).map(|b| b.0), Some(9));
        assert_eq!(upper_bound(&[3, 2, 3]).map(|b| b.0), Some(6));
        assert_eq!(upper_bound(&[6, 6]), None);
        // R(3,10) is open: the premise is its published upper bound (DS1).
        assert_eq!(upper_bound(&[10, 3]).map(|b| b.0), Some(41));
        assert_eq!(exact(&[3, 10]), None);
        assert_eq!(exact(&[5, 4]), Some(25));
    }
}
