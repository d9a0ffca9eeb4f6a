//! The degree-bounds scheme: every vertex has at most R(k_1, …, k_c - 1, …, k_r) - 1
//! edges of colour c (see [`super::Scheme::DegreeBounds`]), encoded as an at-most-K
//! constraint with Sinz's sequential counter (CP 2005).
//!
//! For colour c (1..=r, skipping colours whose bound is vacuous or unknown) and
//! vertex v (0..n-1), the literals x_1..x_m (m = n-1) are "edge {v,u} has colour c"
//! for u ≠ v in increasing order, and the counter variables s_{i,j} (i = 1..m-1,
//! j = 1..K, "at least j of x_1..x_i") are numbered `base + (i-1)·K + (j-1)`, blocks
//! following each other in (colour, vertex) order. Clauses:
//!
//! ```text
//! K = 0:        ¬x_i for every i
//! otherwise:    ¬x_1 ∨ s_{1,1};   ¬s_{1,j} for 1 < j <= K
//!               for 1 < i < m:  ¬x_i ∨ s_{i,1};  ¬s_{i-1,1} ∨ s_{i,1};
//!                               ¬x_i ∨ ¬s_{i-1,j-1} ∨ s_{i,j} and ¬s_{i-1,j} ∨ s_{i,j} for 1 < j <= K;
//!                               ¬x_i ∨ ¬s_{i-1,K}
//!               ¬x_m ∨ ¬s_{m-1,K}
//! ```

use crate::published::{upper_bound, BoundReason};
use crate::spec::Instance;
use crate::variables::VariableMap;

/// A smaller Ramsey value the clauses rest on.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Premise {
    /// Clique sizes of the smaller number, in increasing order.
    pub cliques: Vec<usize>,
    pub upper_bound: usize,
    /// Where the bound comes from; None when it holds by definition.
    pub source: Option<String>,
}

impl Premise {
    /// The premise in words, `R(3,4) <= 9`.
    pub fn statement(&self) -> String {
        let list: Vec<String> = self.cliques.iter().map(|k| k.to_string()).collect();
        format!("R({}) <= {}", list.join(","), self.upper_bound)
    }

    /// Whether the premise holds by definition (no citation needed).
    pub fn is_elementary(&self) -> bool {
        self.source.is_none()
    }
}

/// The degree bound of each colour (None: no usable bound), with its premise.
pub fn colour_bounds(instance: &Instance) -> Vec<Option<(usize, Premise)>> {
    let Some(sizes) = instance.spec().clique_sizes() else {
        // The bounds rest on clique Ramsey numbers; other graphs get none.
        return vec![None; instance.colours()];
    };
    (0..sizes.len())
        .map(|c| {
            let mut smaller = sizes.clone();
            smaller[c] -= 1;
            let (bound, reason) = upper_bound(&smaller)?;
            let max_degree = bound - 1;
            if max_degree >= instance.order() - 1 {
                return None;
            }
            let source = match reason {
                BoundReason::Definition => None,
                BoundReason::Published(s) => Some(s.to_string()),
            };
            // Ramsey numbers are symmetric in their arguments: R(4,3) is listed as R(3,4).
            smaller.sort_unstable();
            Some((
                max_degree,
                Premise {
                    cliques: smaller,
                    upper_bound: bound,
                    source,
                },
            ))
        })
        .collect()
}

/// Appends the clauses; returns (auxiliary variables used, premises).
pub fn clauses(
    instance: &Instance,
    vars: &VariableMap,
    first_aux: usize,
    out: &mut Vec<Vec<i32>>,
) -> (usize, Vec<Premise>) {
    let n = instance.order();
    let mut next = first_aux;
    let mut premises: Vec<Premise> = Vec::new();
    for (index, bound) in colour_bounds(instance).into_iter().enumerate() {
        let Some((max_degree, premise)) = bound else {
            continue;
        };
        let colour = index + 1;
        for v in 0..n {
            let xs: Vec<i32> = (0..n)
                .filter(|&u| u != v)
                .map(|u| vars.edge_colour_literal(v, u, colour))
                .collect();
            next += at_most(&xs, max_degree, next, out);
        }
        if !premises.contains(&premise) {
            premises.push(premise);
        }
    }
    (next - first_aux, premises)
}

/// Sinz's sequential counter for "at most `k` of `xs`"; returns auxiliaries used.
fn at_most(xs: &[i32], k: usize, base: usize, out: &mut Vec<Vec<i32>>) -> usize {
    let m = xs.len();
    if k == 0 {
        out.extend(xs.iter().map(|&x| vec![-x]));
        return 0;
    }
    if k >= m {
        return 0;
    }
    let s = |i: usize, j: usize| (base + (i - 1) * k + (j - 1)) as i32;
    out.push(vec![-xs[0], s(1, 1)]);
    for j in 2..=k {
        out.push(vec![-s(1, j)]);
    }
    for i in 2..m {
        let x = xs[i - 1];
        out.push(vec![-x, s(i, 1)]);
        out.push(vec![-s(i - 1, 1), s(i, 1)]);
        for j in 2..=k {
            out.push(vec![-x, -s(i - 1, j - 1), s(i, j)]);
            out.push(vec![-s(i - 1, j), s(i, j)]);
        }
        out.push(vec![-x, -s(i - 1, k)]);
    }
    out.push(vec![-xs[m - 1], -s(m - 1, k)]);
    (m - 1) * k
}

/// Extends `values` with the counter values of a colouring: s_{i,j} = "at least j
/// of x_1..x_i are true".
pub fn extend_assignment(
    instance: &Instance,
    vars: &VariableMap,
    first_aux: usize,
    values: &mut Vec<bool>,
) {
    let n = instance.order();
    let lit_value =
        |values: &Vec<bool>, lit: i32| values[lit.unsigned_abs() as usize - 1] == (lit > 0);
    let mut next = first_aux;
    for (index, bound) in colour_bounds(instance).into_iter().enumerate() {
        let Some((k, _)) = bound else { continue };
        let m = n - 1;
        for v in 0..n {
            if k == 0 || k >= m {
                continue;
            }
            let mut count = 0;
            for (pos, u) in (0..n).filter(|&u| u != v).enumerate().take(m - 1) {
                if lit_value(values, vars.edge_colour_literal(v, u, index + 1)) {
                    count += 1;
                }
                let i = pos + 1;
                for j in 1..=k {
                    let var = next + (i - 1) * k + (j - 1);
                    if values.len() < var {
                        values.resize(var, false);
                    }
                    values[var - 1] = count >= j;
                }
            }
            next += (m - 1) * k;
        }
    }
}
