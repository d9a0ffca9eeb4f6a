//! Probabilistic lower bounds, decided exactly.
//!
//! Colour each edge of K_n uniformly at random with one of r colours. The expected
//! number of monochromatic forbidden cliques is
//! E(n) = Σ_c C(n, k_c) · r^(−C(k_c, 2)).
//!
//! * **Erdős 1947**: if E(n) < 1 some colouring has none, so R > n. (For two
//!   colours and k_1 = k_2 = k this is C(n,k)·2^(1−C(k,2)) < 1.)
//! * **Deletion** (alteration): some colouring has at most ⌊E(n)⌋ bad cliques;
//!   deleting a vertex of each leaves a good colouring of K_{n−⌊E(n)⌋}, so
//!   R > n − ⌊E(n)⌋ for every n; the report takes the best n.
//! * **Spencer 1975** (Lovász local lemma, two colours, k_1 = k_2 = k): if
//!   e·(C(k,2)·C(n−2,k−2) + 1)·2^(1−C(k,2)) < 1 then R(k,k) > n. The test uses an
//!   upper bound for e, so a bound it reports always holds.
//!
//! Alon & Spencer, *The Probabilistic Method*, chapters 1, 3 and 5. All comparisons
//! are between integers: E(n) < 1 ⟺ Σ_c C(n,k_c)·r^(M − C(k_c,2)) < r^M with
//! M = max_c C(k_c, 2).

use num_bigint::BigUint;
use num_traits::{One, ToPrimitive, Zero};

/// C(n, k) as a big integer.
pub fn binomial(n: u64, k: u64) -> BigUint {
    if k > n {
        return BigUint::zero();
    }
    let k = k.min(n - k);
    let mut value = BigUint::one();
    for i in 0..k {
        value = value * (n - i) / (i + 1);
    }
    value
}

fn pairs(k: usize) -> u32 {
    (k * (k - 1) / 2) as u32
}

/// r^M · E(n) and r^M, with M = max C(k_c, 2): E(n) as an exact fraction.
fn expected_bad(n: u64, sizes: &[usize]) -> (BigUint, BigUint) {
    let r = BigUint::from(sizes.len());
    let m = sizes.iter().map(|&k| pairs(k)).max().unwrap_or(0);
    let numerator = sizes
        .iter()
        .map(|&k| binomial(n, k as u64) * r.pow(m - pairs(k)))
        .fold(BigUint::zero(), |a, b| a + b);
    (numerator, r.pow(m))
}

/// The largest n in lo..=hi with `holds(n)`, for a condition that holds up to some
/// point and fails after it (binary search); `None` if it fails at lo.
fn last_holding(lo: u64, hi: u64, holds: impl Fn(u64) -> bool) -> Option<u64> {
    if !holds(lo) {
        return None;
    }
    let (mut good, mut bad) = (lo, hi + 1);
    while bad - good > 1 {
        let mid = good + (bad - good) / 2;
        if holds(mid) {
            good = mid;
        } else {
            bad = mid;
        }
    }
    Some(good)
}

/// The largest n with E(n) < 1 (Erdős 1947): R > n. E(n) grows with n, so this is a
/// binary search up to `limit`.
pub fn erdos_lower(sizes: &[usize], limit: u64) -> u64 {
    let smallest = *sizes.iter().min().expect("a colour") as u64;
    last_holding(smallest, limit.max(smallest), |n| {
        let (num, den) = expected_bad(n, sizes);
        num < den
    })
    // K_{k−1} has no K_k at all.
    .unwrap_or(smallest - 1)
}

/// n − ⌊E(n)⌋ maximised over n (deletion method): R > that value. Every n gives a
/// valid bound; the best lies near the n where E(n) ≈ n/k (the derivative of
/// n − E(n) vanishes there, k the largest clique), found by binary search, and the
/// report takes the best n within 2,000 of it.
pub fn deletion_lower(sizes: &[usize], limit: u64) -> u64 {
    let k = *sizes.iter().max().expect("a colour") as u64;
    let value = |n: u64| {
        let (num, den) = expected_bad(n, sizes);
        let bad = (num / den).to_u64().unwrap_or(u64::MAX);
        n.saturating_sub(bad)
    };
    let centre = last_holding(1, limit, |n| {
        let (num, den) = expected_bad(n, sizes);
        num * BigUint::from(k) <= den * BigUint::from(n)
    })
    .unwrap_or(1);
    let from = centre.saturating_sub(2_000).max(1);
    let to = (centre + 2_000).min(limit);
    // The first-moment n (where ⌊E(n)⌋ = 0) is a candidate too.
    (from..=to)
        .map(value)
        .max()
        .unwrap_or(0)
        .max(erdos_lower(sizes, limit))
}

/// e < 27182818285 / 10^10 (e = 2.718281828459…), so this ratio overestimates e.
const E_UPPER: (u64, u64) = (27_182_818_285, 10_000_000_000);

/// The largest n passing Spencer's local-lemma condition, for R(k,k) (two colours);
/// `None` for other specifications.
pub fn spencer_lower(sizes: &[usize], limit: u64) -> Option<u64> {
    if sizes.len() != 2 || sizes[0] != sizes[1] || sizes[0] < 3 {
        return None;
    }
    let k = sizes[0] as u64;
    let m = pairs(k as usize);
    // e·(C(k,2)·C(n−2,k−2) + 1)·2^(1−m) < 1
    // ⟸ E_num·(C(k,2)·C(n−2,k−2) + 1)·2 < E_den·2^m; the left side grows with n.
    last_holding(k, limit.max(k), |n| {
        let d = BigUint::from(k * (k - 1) / 2) * binomial(n - 2, k - 2) + 1u32;
        let left = BigUint::from(E_UPPER.0) * d * 2u32;
        let right = BigUint::from(E_UPPER.1) * BigUint::from(2u32).pow(m);
        left < right
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn erdos_bound_for_k5_worked_by_hand() {
        // C(11,5) = 462 and 2^(1−10) = 1/512: 462/512 < 1, so R(5,5) > 11.
        // C(12,5) = 792: 792/512 ≥ 1, so the method stops at 11.
        assert_eq!(binomial(11, 5), BigUint::from(462u32));
        assert_eq!(binomial(12, 5), BigUint::from(792u32));
        assert_eq!(erdos_lower(&[5, 5], 1000), 11);
    }

    #[test]
    fn local_lemma_beats_the_first_moment() {
        // Spencer's bound exceeds Erdős's by about a factor √2 asymptotically (Alon &
        // Spencer ch. 5); at k = 10 it is still smaller (98 against 100), from k = 15
        // on it is larger (947 against 792, computed by hand with exact integers).
        assert_eq!(erdos_lower(&[10, 10], 1_000_000), 100);
        assert_eq!(spencer_lower(&[10, 10], 1_000_000), Some(98));
        for k in [15usize, 20, 25] {
            let erdos = erdos_lower(&[k, k], 1_000_000);
            let spencer = spencer_lower(&[k, k], 1_000_000).unwrap();
            assert!(spencer > erdos, "k = {k}: {spencer} vs {erdos}");
        }
        assert_eq!(spencer_lower(&[3, 4], 100), None);
    }

    proptest! {
        /// √2^k growth: 2^(k/2) ≤ n_k < k·2^(k/2) for the Erdős bound n_k (from
        /// C(n,k) < n^k/k! and C(n,k) ≥ (n/k)^k).
        #[test]
        fn erdos_grows_like_root_two_to_the_k(k in 3usize..=40) {
            let n = erdos_lower(&[k, k], 1 << 40) as f64;
            let base = 2f64.powf(k as f64 / 2.0);
            prop_assert!(n >= base.floor(), "k = {}: {} < {}", k, n, base);
            prop_assert!(n < k as f64 * base, "k = {}: {}", k, n);
        }

        /// Deletion never does worse than the first moment (take the same n).
        #[test]
        fn deletion_at_least_erdos(k in 3usize..=30) {
            let limit = 1 << 30;
            prop_assert!(deletion_lower(&[k, k], limit) >= erdos_lower(&[k, k], limit));
        }
    }
}
