//! Upper bounds by recursion.
//!
//! * Two colours: R(s,2) = s; R(s,t) ≤ R(s−1,t) + R(s,t−1), and one less when both
//!   terms are even (Greenwood & Gleason 1955). Applied to upper bounds U this
//!   stays valid: if both true values equal their even bounds the rule applies,
//!   otherwise their sum is already at most U₁ + U₂ − 1.
//! * r colours: R(k_1,…,k_r) ≤ 2 − r + Σ_i R(k_1,…,k_i − 1,…,k_r), with R(…,2,…)
//!   dropping the 2 and R(k) = k for one colour.
//! * Erdős–Szekeres: R(s,t) ≤ C(s+t−2, s−1).
//!
//! `known` lets exact published values replace the recursion where they exist.

use std::collections::HashMap;

use num_bigint::BigUint;

use super::probabilistic::binomial;

/// The recursive upper bound, as a big integer (it grows exponentially).
pub fn recursive_upper(sizes: &[usize], known: &dyn Fn(&[usize]) -> Option<u64>) -> BigUint {
    let mut memo = HashMap::new();
    upper(sizes, known, &mut memo)
}

fn upper(
    sizes: &[usize],
    known: &dyn Fn(&[usize]) -> Option<u64>,
    memo: &mut HashMap<Vec<usize>, BigUint>,
) -> BigUint {
    let mut key: Vec<usize> = sizes.iter().copied().filter(|&k| k != 2).collect();
    key.sort_unstable();
    if key.contains(&1) {
        return BigUint::from(1u32);
    }
    match key.len() {
        0 => return BigUint::from(2u32),
        1 => return BigUint::from(key[0]),
        _ => {}
    }
    if let Some(v) = known(&key) {
        return BigUint::from(v);
    }
    if let Some(v) = memo.get(&key) {
        return v.clone();
    }
    let r = key.len();
    let terms: Vec<BigUint> = (0..r)
        .map(|i| {
            let mut smaller = key.clone();
            smaller[i] -= 1;
            upper(&smaller, known, memo)
        })
        .collect();
    let mut total: BigUint = terms.iter().sum();
    if r == 2 {
        let even = |x: &BigUint| !x.bit(0);
        if even(&terms[0]) && even(&terms[1]) {
            total -= 1u32;
        }
    } else {
        total -= (r - 2) as u32;
    }
    memo.insert(key, total.clone());
    total
}

/// Erdős–Szekeres: C(s+t−2, s−1), two colours only.
pub fn erdos_szekeres(sizes: &[usize]) -> Option<BigUint> {
    (sizes.len() == 2).then(|| binomial((sizes[0] + sizes[1] - 2) as u64, (sizes[0] - 1) as u64))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn recursion_alone_reproduces_the_small_classical_bounds() {
        let none = |_: &[usize]| None;
        // R(3,3) ≤ R(2,3)+R(3,2) = 6 (exact); R(3,4) ≤ 6+4−1 = 9 (both even: 6 and 4);
        // R(4,4) ≤ 9+9 = 18 (Greenwood & Gleason 1955, all exact; DS1).
        assert_eq!(recursive_upper(&[3, 3], &none), BigUint::from(6u32));
        assert_eq!(recursive_upper(&[3, 4], &none), BigUint::from(9u32));
        assert_eq!(recursive_upper(&[4, 4], &none), BigUint::from(18u32));
        // R(3,3,3) ≤ 2 − 3 + 3·R(2,3,3) = 3·6 − 1 = 17 (exact; Greenwood & Gleason).
        assert_eq!(recursive_upper(&[3, 3, 3], &none), BigUint::from(17u32));
        assert_eq!(erdos_szekeres(&[4, 4]), Some(BigUint::from(20u32)));
    }
}
