//! Upper bounds on small Ramsey numbers, used as premises by degree bounds.
//! Each entry names its source. Entries with a 1 or 2 are derived, not tabled:
//! R(…, 1, …) = 1 and R(…, 2, …) = R(… without the 2) hold by definition.

/// A tabled upper bound: R(cliques) <= bound.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct KnownBound {
    /// Sorted clique sizes (Ramsey numbers are symmetric in their arguments).
    pub cliques: &'static [usize],
    pub bound: usize,
    pub source: &'static str,
}

const DS1: &str = "Radziszowski, Small Ramsey Numbers, EJC Dynamic Survey DS1";

/// Exact values and the best published upper bounds that the encoder relies on.
pub const KNOWN_BOUNDS: &[KnownBound] = &[
    KnownBound {
        cliques: &[3, 3],
        bound: 6,
        source: "Greenwood & Gleason 1955; DS1",
    },
    KnownBound {
        cliques: &[3, 4],
        bound: 9,
        source: "Greenwood & Gleason 1955; DS1",
    },
    KnownBound {
        cliques: &[3, 5],
        bound: 14,
        source: "Greenwood & Gleason 1955; DS1",
    },
    KnownBound {
        cliques: &[3, 6],
        bound: 18,
        source: DS1,
    },
    KnownBound {
        cliques: &[3, 7],
        bound: 23,
        source: DS1,
    },
    KnownBound {
        cliques: &[3, 8],
        bound: 28,
        source: DS1,
    },
    KnownBound {
        cliques: &[3, 9],
        bound: 36,
        source: DS1,
    },
    KnownBound {
        cliques: &[3, 10],
        bound: 41,
        source: "Angeltveit 2024, arXiv 2401.00392; DS1",
    },
    KnownBound {
        cliques: &[4, 4],
        bound: 18,
        source: "Greenwood & Gleason 1955; DS1",
    },
    KnownBound {
        cliques: &[4, 5],
        bound: 25,
        source: "McKay & Radziszowski 1995; DS1",
    },
    KnownBound {
        cliques: &[5, 5],
        bound: 46,
        source: "Angeltveit & McKay 2024, arXiv 2409.15709",
    },
    KnownBound {
        cliques: &[3, 3, 3],
        bound: 17,
        source: "Greenwood & Gleason 1955",
    },
];

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
    KNOWN_BOUNDS
        .iter()
        .find(|k| k.cliques == rest.as_slice())
        .map(|k| (k.bound, BoundReason::Published(k.source)))
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
    }
}
