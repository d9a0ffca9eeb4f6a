//! Enumeration of the k-element subsets of {0, …, n-1} in lexicographic order,
//! without allocating per subset.

/// Calls `visit` once for every k-subset of `0..n`, in lexicographic order, with the
/// subset's elements in increasing order. Stops early and returns the error if
/// `visit` fails. k = 0 visits the empty set once; k > n visits nothing.
pub fn for_each_subset<E>(
    n: usize,
    k: usize,
    mut visit: impl FnMut(&[usize]) -> Result<(), E>,
) -> Result<(), E> {
    if k > n {
        return Ok(());
    }
    let mut subset: Vec<usize> = (0..k).collect();
    loop {
        visit(&subset)?;
        // Find the rightmost element that can still move right.
        let mut pos = k;
        while pos > 0 && subset[pos - 1] == n - k + pos - 1 {
            pos -= 1;
        }
        if pos == 0 {
            return Ok(());
        }
        subset[pos - 1] += 1;
        for next in pos..k {
            subset[next] = subset[next - 1] + 1;
        }
    }
}

/// The binomial coefficient C(n, k), or `None` if it does not fit in a u128.
pub fn binomial(n: u128, k: u128) -> Option<u128> {
    if k > n {
        return Some(0);
    }
    let k = k.min(n - k);
    let mut value: u128 = 1;
    for i in 0..k {
        // value * (n - i) is divisible by (i + 1) after the multiplication.
        value = value.checked_mul(n - i)? / (i + 1);
    }
    Some(value)
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn collect(n: usize, k: usize) -> Vec<Vec<usize>> {
        let mut out = Vec::new();
        for_each_subset::<()>(n, k, |s| {
            out.push(s.to_vec());
            Ok(())
        })
        .unwrap();
        out
    }

    #[test]
    fn small_cases_in_lexicographic_order() {
        assert_eq!(
            collect(4, 2),
            vec![
                vec![0, 1],
                vec![0, 2],
                vec![0, 3],
                vec![1, 2],
                vec![1, 3],
                vec![2, 3]
            ]
        );
        assert_eq!(collect(3, 0), vec![Vec::<usize>::new()]);
        assert!(collect(2, 3).is_empty());
    }

    #[test]
    fn binomial_known_values() {
        // C(43,5) = 962598 (common practice; also 43·42·41·40·39/120 by hand).
        assert_eq!(binomial(43, 5), Some(962_598));
        assert_eq!(binomial(17, 4), Some(2380));
        assert_eq!(binomial(5, 7), Some(0));
        assert_eq!(binomial(1000, 500), None);
    }

    proptest! {
        #[test]
        fn count_matches_binomial(n in 0usize..12, k in 0usize..8) {
            let subsets = collect(n, k);
            prop_assert_eq!(subsets.len() as u128, binomial(n as u128, k as u128).unwrap());
            for pair in subsets.windows(2) {
                prop_assert!(pair[0] < pair[1]);
            }
        }
    }
}
