//! Verifying the clauses of the `minimality` scheme (`minimality.txt`), each on
//! its own, before they join the formula the DRAT trace is checked against.
//!
//! Format (one header line, an order line, then one clause per line):
//! `ramsift minimality clauses 1`, `vertices N colours R order edge-index,colour-ascending`,
//! and `p_0 … p_{N-1} / s_1 … s_R / literals 0`.
//!
//! A clause is accepted when: `p` is a permutation of the vertices; `s` a
//! permutation of the colours mapping each colour to one with the same forbidden
//! graph; its literals name colour variables, without a variable twice. Then its
//! negation, the partial assignment α, fixes some edges' colours (two colours:
//! variable e+1 true is colour 1, false colour 2; more: colour c when its variable
//! is true and those of smaller colours false). Walking the edges in index order,
//! compare α's colour of edge {i,j} with `s` of α's colour of {p_i,p_j}: equal goes
//! on, the same edge under the identity colour map is equal, smaller accepts,
//! anything else (larger, or unknown) rejects. So every colouring A that falsifies
//! the clause has a relabelling strictly smaller than A, and the least member of
//! A's class (which the formula, invariant under these relabellings, keeps)
//! satisfies the clause: adding it preserves satisfiability.

use crate::claim::ClaimGraph;
use crate::input_error::InputError;
use crate::regenerate::lit;

/// The first line.
pub const FORMAT_LINE: &str = "ramsift minimality clauses 1";
/// The only comparison order this checker implements.
pub const MATRIX_ORDER: &str = "edge-index,colour-ascending";

/// Reads and verifies every clause; returns them for the DRAT check, or the
/// first one that fails, with its line.
pub fn verified_clauses(
    name: &str,
    bytes: &[u8],
    forbidden: &[ClaimGraph],
    order: usize,
) -> Result<Vec<Vec<i32>>, InputError> {
    let text =
        std::str::from_utf8(bytes).map_err(|e| InputError::at_byte(name, e.valid_up_to() as u64, "not UTF-8 text"))?;
    let mut lines = text.lines();
    if lines.next() != Some(FORMAT_LINE) {
        return Err(InputError::at_line(name, 1, format!("expected the line {FORMAT_LINE:?}")));
    }
    let r = forbidden.len();
    let expected = format!("vertices {order} colours {r} order {MATRIX_ORDER}");
    if lines.next() != Some(expected.as_str()) {
        return Err(InputError::at_line(
            name,
            2,
            format!("expected {expected:?} (the claim's order and colours, and the order this checker implements)"),
        ));
    }
    // A line holds n + r numbers and at most one literal per colour variable, each
    // of at most `width` characters; anything longer is refused before it is split.
    let variables = order * order.saturating_sub(1) / 2 * if r == 2 { 1 } else { r };
    let width = variables.max(order).max(r).to_string().len() + 2;
    let longest = (order + r + variables + 1) * width + 8;
    let mut clauses = Vec::new();
    for (index, line) in lines.enumerate() {
        if line.len() > longest {
            let why = format!("the line is longer than the {longest} characters a clause of this claim can take");
            return Err(InputError::at_line(name, index + 3, why));
        }
        let clause = verify_line(line, forbidden, order).map_err(|why| InputError::at_line(name, index + 3, why))?;
        clauses.push(clause);
    }
    Ok(clauses)
}

fn numbers(part: &str) -> Result<Vec<i64>, String> {
    part.split_whitespace().map(|t| t.parse::<i64>().map_err(|_| format!("{t:?} is not a number"))).collect()
}

/// Checks one clause line; returns the clause.
fn verify_line(line: &str, forbidden: &[ClaimGraph], n: usize) -> Result<Vec<i32>, String> {
    let r = forbidden.len();
    let parts: Vec<&str> = line.split('/').collect();
    let [p, s, clause] = parts[..] else { return Err("expected vertex map / colour map / clause".into()) };
    let (p, s, clause) = (numbers(p)?, numbers(s)?, numbers(clause)?);
    let is_permutation = |xs: &[i64], low: i64| {
        let mut sorted = xs.to_vec();
        sorted.sort_unstable();
        sorted.iter().enumerate().all(|(k, &x)| x == low + k as i64)
    };
    if p.len() != n || !is_permutation(&p, 0) {
        return Err(format!("the vertex map is not a permutation of 0..{n}"));
    }
    if s.len() != r || !is_permutation(&s, 1) {
        return Err(format!("the colour map is not a permutation of 1..={r}"));
    }
    if (1..=r).any(|c| forbidden[c - 1] != forbidden[s[c - 1] as usize - 1]) {
        return Err("the colour map exchanges colours with different forbidden graphs".into());
    }
    let variables = n * n.saturating_sub(1) / 2 * if r == 2 { 1 } else { r };
    let Some((&0, literals)) = clause.split_last() else { return Err("the clause does not end with 0".into()) };
    // Values α gives the colour variables (the clause's negation): 1 true, -1 false;
    // kept for the clause's variables only, so a line costs its own length.
    let mut alpha: std::collections::HashMap<usize, i8> = std::collections::HashMap::with_capacity(literals.len());
    for &l in literals {
        let var = l.unsigned_abs() as usize;
        if l == 0 || var > variables {
            return Err(format!("literal {l} is not a colour variable (1..={variables})"));
        }
        if alpha.insert(var, if l > 0 { -1 } else { 1 }).is_some() {
            return Err(format!("variable {var} occurs twice"));
        }
    }
    // The colour α fixes for edge {a,b}: the first colour whose literal (the
    // regenerated formula's variable map) α makes true, those before it false.
    let colour_of = |a: usize, b: usize| -> u8 {
        for c in 1..=r {
            let l = lit(r, a, b, c);
            match alpha.get(&(l.unsigned_abs() as usize)).map_or(0, |&v| v * l.signum() as i8) {
                1 => return c as u8,
                -1 => continue,
                _ => return 0,
            }
        }
        0
    };
    let identity = s.iter().enumerate().all(|(k, &c)| c == k as i64 + 1);
    // Under the identity colour map an edge the vertex map sends to itself compares
    // equal; in a column j that p fixes, only moved rows i need a look, so the walk
    // costs O(n + literals), not O(n^2).
    let moved: Vec<usize> = (0..n).filter(|&i| p[i] as usize != i).collect();
    for j in 1..n {
        let fixed_column = identity && p[j] as usize == j;
        let rows: Box<dyn Iterator<Item = usize>> =
            if fixed_column { Box::new(moved.iter().copied().take_while(|&i| i < j)) } else { Box::new(0..j) };
        for i in rows {
            let (u, v) = (p[i] as usize, p[j] as usize);
            if identity && (u.min(v), u.max(v)) == (i, j) {
                continue;
            }
            let (own, theirs) = (colour_of(i, j), colour_of(u, v));
            if own == 0 || theirs == 0 {
                return Err(format!(
                    "at edge {{{i},{j}}} a colour is not fixed by the clause, so the relabelling is not shown smaller"
                ));
            }
            let theirs = s[theirs as usize - 1] as u8;
            if theirs < own {
                return Ok(literals.iter().map(|&l| l as i32).collect());
            }
            if theirs > own {
                return Err(format!("at edge {{{i},{j}}} the relabelled colouring is larger"));
            }
        }
    }
    Err("the relabelled colouring is never smaller".into())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn triangles() -> Vec<ClaimGraph> {
        crate::claim::Claim::parse("3,3").unwrap().forbidden
    }

    fn check(line: &str) -> Result<Vec<i32>, String> {
        verify_line(line, &triangles(), 3)
    }

    /// K_3, two colours: edges {0,1}=1, {0,2}=2, {1,2}=3. A = (colour 2, colour 1, ·):
    /// swapping vertices 1 and 2 gives ({0,2},{0,1},…) = (1, 2, …), smaller at {0,1}.
    #[test]
    fn accepts_a_decreasing_relabelling_and_its_mutants_fail() {
        assert_eq!(check("0 2 1 / 1 2 / 1 -2 0"), Ok(vec![1, -2]));
        // Does not decrease: the identity.
        assert!(check("0 1 2 / 1 2 / 1 -2 0").is_err());
        // Not a permutation.
        assert!(check("0 2 2 / 1 2 / 1 -2 0").is_err());
        assert!(check("0 2 / 1 2 / 1 -2 0").is_err());
        // A literal dropped: edge {0,2} unknown.
        assert!(check("0 2 1 / 1 2 / 1 0").is_err());
        // A witness of another clause (A = (1, 2, ·) is already least).
        assert!(check("0 2 1 / 1 2 / -1 2 0").is_err());
        // The colour swap alone makes (2,1,·) into (1,2,·): smaller too.
        assert_eq!(check("0 1 2 / 2 1 / 1 -2 0"), Ok(vec![1, -2]));
        // Colours with different forbidden graphs may not be exchanged.
        let mixed = crate::claim::Claim::parse("3,4").unwrap().forbidden;
        assert!(verify_line("0 1 2 / 2 1 / 1 -2 0", &mixed, 3).is_err());
    }

    #[test]
    fn the_header_must_name_the_claim_and_the_order() {
        let good = format!("{FORMAT_LINE}\nvertices 3 colours 2 order {MATRIX_ORDER}\n0 2 1 / 1 2 / 1 -2 0\n");
        assert_eq!(verified_clauses("m", good.as_bytes(), &triangles(), 3).unwrap(), vec![vec![1, -2]]);
        let other_order = good.replace(MATRIX_ORDER, "row-major,colour-descending");
        assert!(verified_clauses("m", other_order.as_bytes(), &triangles(), 3).is_err());
        let wrong_claim = good.replace("vertices 3", "vertices 4");
        assert!(verified_clauses("m", wrong_claim.as_bytes(), &triangles(), 3).is_err());
        let bad_line = format!("{good}0 1 2 / 1 2 / 1 -2 0\n");
        let e = verified_clauses("m", bad_line.as_bytes(), &triangles(), 3).unwrap_err();
        assert!(e.to_string().contains(":4"), "{e}");
    }
}
