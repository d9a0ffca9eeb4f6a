//! The lex-leader scheme sb_l (Codish, Miller, Prosser & Stuckey, Constraints 2019)
//! on the colour-1 graph: for each i = 0..n-2, row i ⪯ row i+1, where row v is the
//! sequence of literals "edge {v,k} has colour 1" over k = 0..n-1 with k ∉ {i, i+1},
//! in increasing k, compared lexicographically with false < true.
//!
//! Comparator for a ⪯ b over positions p = 0..m-1 (m = n-2), with auxiliary e_p
//! meaning "a and b agree on positions 0..=p" for p = 0..m-2 (e_{-1} is true and
//! has no variable):
//!
//! ```text
//! (¬e_{p-1} ∨ ¬a_p ∨ b_p)                      every p
//! (¬e_{p-1} ∨ ¬a_p ∨ e_p), (¬e_{p-1} ∨ b_p ∨ e_p)   p < m-1
//! ```
//!
//! (the literal ¬e_{-1} is left out). Pair i uses variables
//! `first + i·(m-1) + p`; in all (n-1)(n-3) auxiliary variables for n >= 3.

use crate::variables::VariableMap;

/// Appends the clauses; returns the number of auxiliary variables used.
pub fn clauses(vars: &VariableMap, first_aux: usize, out: &mut Vec<Vec<i32>>) -> usize {
    let n = vars.order();
    if n < 3 {
        return 0;
    }
    let m = n - 2;
    let aux_per_pair = m - 1;
    for i in 0..n - 1 {
        let columns: Vec<usize> = (0..n).filter(|&k| k != i && k != i + 1).collect();
        let aux = |p: usize| (first_aux + i * aux_per_pair + p) as i32;
        for (p, &k) in columns.iter().enumerate() {
            let a = vars.edge_colour_literal(i, k, 1);
            let b = vars.edge_colour_literal(i + 1, k, 1);
            let mut guard = Vec::new();
            if p > 0 {
                guard.push(-aux(p - 1));
            }
            let with = |extra: &[i32]| {
                let mut c = guard.clone();
                c.extend_from_slice(extra);
                c
            };
            out.push(with(&[-a, b]));
            if p + 1 < m {
                out.push(with(&[-a, aux(p)]));
                out.push(with(&[b, aux(p)]));
            }
        }
    }
    (n - 1) * aux_per_pair
}

/// The auxiliary values that extend a colour assignment satisfying sb_l
/// (`value(var)` gives colour variables): e_p = "agree on positions 0..=p".
pub fn extend_assignment(vars: &VariableMap, first_aux: usize, values: &mut Vec<bool>) {
    let n = vars.order();
    if n < 3 {
        return;
    }
    let m = n - 2;
    let lit_value =
        |values: &Vec<bool>, lit: i32| values[lit.unsigned_abs() as usize - 1] == (lit > 0);
    for i in 0..n - 1 {
        let columns: Vec<usize> = (0..n).filter(|&k| k != i && k != i + 1).collect();
        let mut equal = true;
        for (p, &k) in columns.iter().enumerate().take(m - 1) {
            let a = lit_value(values, vars.edge_colour_literal(i, k, 1));
            let b = lit_value(values, vars.edge_colour_literal(i + 1, k, 1));
            equal = equal && a == b;
            let var = first_aux + i * (m - 1) + p;
            if values.len() < var {
                values.resize(var, false);
            }
            values[var - 1] = equal;
        }
    }
}
