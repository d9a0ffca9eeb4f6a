//! The checker's own generator of the clauses a bundle claims to have refuted.
//!
//! It follows the published variable map and clause families (documented in the
//! encoder and in every DIMACS header) with code written separately from the
//! encoder, so that a bug in one is not silently shared by the other:
//!
//! * edge {i,j}, i < j, has index e = j(j-1)/2 + i; with two colours variable e+1
//!   is "colour 1", with r >= 3 colours variable e·r + c is "may have colour c";
//! * r >= 3: one at-least-one clause per edge; then, colour by colour, one clause
//!   per k-subset saying "not all of its edges have this colour"; for a forbidden
//!   graph other than a clique, one clause per copy of it in K_n, found here by
//!   running through the injective placements of its vertices and keeping each
//!   distinct edge set once. Isolated vertices change no edge set, so they are
//!   not placed at all; twins (vertices u, v with N(u) \ {v} = N(v) \ {u}, such
//!   as a star's leaves) are interchangeable, so they are placed in increasing
//!   order only. The copies are counted beforehand as n!/(n-v)!/|Aut H| (H and v
//!   without isolated vertices) and compared with the bundled formula's clause count, so
//!   the walk, at most |Aut H|/(twin orderings) placements per copy, never starts
//!   on a claim whose formula could not match;
//! * symmetry breaking: colour-swap units on the anchor edge {0,n-1}; lex-leader
//!   comparators on consecutive rows of the colour-1 graph; degree bounds as
//!   sequential counters, with the bound taken from the premises.

use std::collections::BTreeSet;

use crate::claim::ClaimGraph;

/// One claimed upper bound R(cliques) <= bound used as a premise.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PremiseBound {
    pub cliques: Vec<usize>,
    pub bound: usize,
}

/// What to regenerate.
#[derive(Clone, Debug)]
pub struct Statement {
    /// The forbidden graph of each colour.
    pub forbidden: Vec<ClaimGraph>,
    pub order: usize,
    pub symmetry: Vec<String>,
    pub premises: Vec<PremiseBound>,
}

/// The regenerated formula.
#[derive(Clone, Debug)]
pub struct Regenerated {
    pub variables: usize,
    pub clauses: Vec<Vec<i32>>,
    /// Premises the degree bounds actually used.
    pub used_premises: Vec<PremiseBound>,
}

/// "edge {a,b} has colour c" with two colours, "may have colour c" with r >= 3.
pub(crate) fn lit(colours: usize, a: usize, b: usize, colour: usize) -> i32 {
    let (i, j) = (a.min(b), a.max(b));
    let e = j * (j - 1) / 2 + i;
    match (colours, colour) {
        (2, 1) => e as i32 + 1,
        (2, _) => -(e as i32 + 1),
        _ => (e * colours + colour) as i32,
    }
}

/// Visits every sequence of `len` distinct vertices of 0..n while `visit` returns
/// true; false if stopped. Position v only takes vertices above the one at
/// `after[v]` (a position before v, or usize::MAX for none): all positions after
/// the previous one gives the k-subsets, twins of a graph give one placement per
/// ordering of each twin class. With `subsets` (each position after the previous
/// one), a position leaves room for the positions after it.
fn sequences(
    n: usize,
    after: &[usize],
    subsets: bool,
    chosen: &mut Vec<usize>,
    visit: &mut dyn FnMut(&[usize]) -> bool,
) -> bool {
    if chosen.len() == after.len() {
        return visit(chosen);
    }
    let start = chosen.get(after[chosen.len()]).map_or(0, |&l| l + 1);
    let end = if subsets { n + chosen.len() + 1 - after.len() } else { n };
    for x in start..end {
        if chosen.contains(&x) {
            continue;
        }
        chosen.push(x);
        let go_on = sequences(n, after, subsets, chosen, visit);
        chosen.pop();
        if !go_on {
            return false;
        }
    }
    true
}

/// The graph on its non-isolated vertices (renumbered in order).
fn without_isolated(vertices: usize, edges: &[(usize, usize)]) -> (usize, Vec<(usize, usize)>) {
    let kept: Vec<usize> = (0..vertices).filter(|&v| edges.iter().any(|&(a, b)| a == v || b == v)).collect();
    let new = |v: usize| kept.iter().position(|&k| k == v).expect("an edge's end is kept");
    (kept.len(), edges.iter().map(|&(a, b)| (new(a), new(b))).collect())
}

/// For each vertex of the graph, the previous vertex of its twin class (usize::MAX for none).
fn previous_twin(vertices: usize, edges: &[(usize, usize)]) -> Vec<usize> {
    let adjacent = |a: usize, b: usize| edges.contains(&(a.min(b), a.max(b)));
    let twins = |u: usize, v: usize| (0..vertices).all(|w| w == u || w == v || adjacent(u, w) == adjacent(v, w));
    (0..vertices).map(|v| (0..v).rev().find(|&u| twins(u, v)).unwrap_or(usize::MAX)).collect()
}

/// n!/(n-v)!, or None past u128.
fn placements(n: usize, v: usize) -> Option<u128> {
    (n + 1 - v..=n).try_fold(1u128, |product, k| product.checked_mul(k as u128))
}

/// The number of copies of the graph in K_n: placements over automorphisms. The
/// automorphisms are counted as orderly placements onto the graph itself that keep
/// every adjacency (pruned vertex by vertex), times the orderings of twin classes.
fn copies_of(n: usize, vertices: usize, edges: &[(usize, usize)], after: &[usize]) -> Option<u128> {
    let mut adjacent = vec![vec![false; vertices]; vertices];
    for &(a, b) in edges {
        (adjacent[a][b], adjacent[b][a]) = (true, true);
    }
    fn automorphisms(adjacent: &[Vec<bool>], after: &[usize], place: &mut Vec<usize>) -> u128 {
        let v = place.len();
        if v == adjacent.len() {
            return 1;
        }
        let start = place.get(after[v]).map_or(0, |&l| l + 1);
        let mut count = 0;
        for x in start..adjacent.len() {
            if !place.contains(&x) && (0..v).all(|u| adjacent[u][v] == adjacent[place[u]][x]) {
                place.push(x);
                count += automorphisms(adjacent, after, place);
                place.pop();
            }
        }
        count
    }
    let twin_orderings: u128 = (0..vertices)
        .map(|v| std::iter::successors(Some(v), |&u| Some(after[u]).filter(|&p| p != usize::MAX)).count() as u128)
        .product();
    Some(placements(n, vertices)? / (automorphisms(&adjacent, after, &mut Vec::new()) * twin_orderings))
}

/// Bounds that hold by definition: R(..,1,..) = 1, and entries 2 can be dropped.
fn elementary_or_premise(smaller: &[usize], premises: &[PremiseBound]) -> Option<(usize, Option<PremiseBound>)> {
    if smaller.contains(&1) {
        return Some((1, None));
    }
    let mut reduced: Vec<usize> = smaller.iter().copied().filter(|&k| k != 2).collect();
    match reduced.len() {
        0 => return Some((2, None)),
        1 => return Some((reduced[0], None)),
        _ => {}
    }
    reduced.sort_unstable();
    premises
        .iter()
        .find(|p| {
            let mut theirs: Vec<usize> = p.cliques.iter().copied().filter(|&k| k != 2).collect();
            theirs.sort_unstable();
            theirs == reduced && !p.cliques.contains(&1)
        })
        .map(|p| (p.bound, Some(p.clone())))
}

/// Regenerates the clauses; an unknown scheme name is an error, and so is a
/// formula of more than `max_clauses` clauses (generation stops there, so a
/// claim's size cannot exhaust memory or time beyond the formula it is compared with).
pub fn regenerate(statement: &Statement, max_clauses: usize) -> Result<Regenerated, String> {
    let (n, r) = (statement.order, statement.forbidden.len());
    for name in &statement.symmetry {
        if !["colour-swap", "lex-leader", "degree-bounds", "minimality"].contains(&name.as_str()) {
            return Err(format!("unknown symmetry scheme {name:?}"));
        }
    }
    let has = |name: &str| statement.symmetry.iter().any(|s| s == name);
    // Minimality keeps each class's least member; these two keep other members.
    if has("minimality") && (has("colour-swap") || has("lex-leader")) {
        return Err("minimality cannot be combined with colour-swap or lex-leader".into());
    }
    let edges = n * n.saturating_sub(1) / 2;
    let mut variables = if r == 2 { edges } else { edges * r };
    let too_many = || format!("the claim's formula has more than the {max_clauses} clauses of the bundled formula");
    let mut clauses = forbidden_clauses(statement, max_clauses).ok_or_else(too_many)?;
    // Colour swap: edge {0, n-1} takes the first colour of each class of colours with equal
    // forbidden graphs (with lex-leader and more than two colours, colour 1's class is left to it).
    if has("colour-swap") && n >= 2 {
        let mut seen: Vec<&ClaimGraph> = Vec::new();
        for c in 1..=r {
            let graph = &statement.forbidden[c - 1];
            if seen.contains(&graph) {
                continue;
            }
            seen.push(graph);
            let mut class: Vec<usize> = (1..=r).filter(|&d| statement.forbidden[d - 1] == *graph).collect();
            if has("lex-leader") && class[0] == 1 && r > 2 {
                class.remove(0);
            }
            match class.as_slice() {
                [_] | [] => {}
                [first, ..] if r == 2 => clauses.push(vec![lit(r, 0, n - 1, *first)]),
                [_, rest @ ..] => clauses.extend(rest.iter().map(|&d| vec![-lit(r, 0, n - 1, d)])),
            }
        }
    }
    if has("lex-leader") && n >= 3 {
        variables += lex_leader_clauses(n, r, variables, &mut clauses);
    }
    let mut used_premises = Vec::new();
    if has("degree-bounds") {
        let cliques = statement.forbidden.iter().map(|g| match g {
            ClaimGraph::Clique(k) => Ok(*k),
            ClaimGraph::Graph { token, .. } => {
                Err(format!("degree-bounds rests on clique Ramsey numbers, but a colour forbids {token}"))
            }
        });
        let cliques: Vec<usize> = cliques.collect::<Result<_, _>>()?;
        for colour in 1..=r {
            let mut smaller: Vec<usize> = cliques.clone();
            smaller[colour - 1] -= 1;
            let Some((bound, premise)) = elementary_or_premise(&smaller, &statement.premises) else { continue };
            let Some(k) = bound.checked_sub(1).filter(|&k| k < n - 1) else { continue };
            if let Some(p) = premise.filter(|p| !used_premises.contains(p)) {
                used_premises.push(p);
            }
            for v in 0..n {
                let xs: Vec<i32> = (0..n).filter(|&u| u != v).map(|u| lit(r, v, u, colour)).collect();
                variables += at_most_k_clauses(&xs, k, variables, &mut clauses);
                if clauses.len() > max_clauses {
                    return Err(too_many());
                }
            }
        }
    }
    if clauses.len() > max_clauses {
        return Err(too_many());
    }
    Ok(Regenerated { variables, clauses, used_premises })
}

/// The at-least-one-colour clauses (three or more colours) and one clause per
/// forbidden copy in each colour; None past `max_clauses`.
fn forbidden_clauses(statement: &Statement, max_clauses: usize) -> Option<Vec<Vec<i32>>> {
    let (n, r) = (statement.order, statement.forbidden.len());
    let mut clauses: Vec<Vec<i32>> = Vec::new();
    if r > 2 {
        for j in 0..n {
            clauses.extend((0..j).map(|i| (1..=r).map(|c| lit(r, i, j, c)).collect()));
        }
    }
    for (index, graph) in statement.forbidden.iter().enumerate() {
        let colour = index + 1;
        let complete = match graph {
            ClaimGraph::Clique(k) => {
                sequences(n, &(0..*k).map(|p| p.wrapping_sub(1)).collect::<Vec<_>>(), true, &mut Vec::new(), &mut |s| {
                    let pairs = s.iter().enumerate().flat_map(|(p, &a)| s[p + 1..].iter().map(move |&b| (a, b)));
                    clauses.push(pairs.map(|(a, b)| -lit(r, a, b, colour)).collect());
                    clauses.len() <= max_clauses
                })
            }
            ClaimGraph::Graph { vertices, edges, .. } => {
                let mut copies: BTreeSet<Vec<i32>> = BTreeSet::new();
                let room = max_clauses.saturating_sub(clauses.len());
                let (vertices, edges) = &without_isolated(*vertices, edges);
                let after = previous_twin(*vertices, edges);
                if copies_of(n, *vertices, edges, &after).is_none_or(|count| count > room as u128) {
                    return None;
                }
                let complete = sequences(n, &after, false, &mut Vec::new(), &mut |place| {
                    let mut clause: Vec<i32> =
                        edges.iter().map(|&(a, b)| -lit(r, place[a], place[b], colour)).collect();
                    clause.sort_unstable();
                    copies.insert(clause);
                    copies.len() <= room
                });
                clauses.extend(copies);
                complete
            }
        };
        complete.then_some(())?;
    }
    Some(clauses)
}

/// Lex-leader on adjacent vertex swaps: row i of the colour-1 matrix is at least
/// row i+1 (columns other than i, i+1), with equality chains as auxiliary
/// variables after `variables`. Returns the auxiliaries used.
fn lex_leader_clauses(n: usize, r: usize, variables: usize, clauses: &mut Vec<Vec<i32>>) -> usize {
    let per_pair = n - 3;
    let first = variables + 1;
    for i in 0..n - 1 {
        let cols: Vec<usize> = (0..n).filter(|&k| k != i && k != i + 1).collect();
        for (p, &k) in cols.iter().enumerate() {
            let (a, b) = (lit(r, i, k, 1), lit(r, i + 1, k, 1));
            let equal_before = (p > 0).then(|| -((first + i * per_pair + p - 1) as i32));
            let equal_here = (first + i * per_pair + p) as i32;
            let guarded = |rest: &[i32]| equal_before.into_iter().chain(rest.iter().copied()).collect::<Vec<i32>>();
            clauses.push(guarded(&[-a, b]));
            if p + 1 < cols.len() {
                clauses.push(guarded(&[-a, equal_here]));
                clauses.push(guarded(&[b, equal_here]));
            }
        }
    }
    (n - 1) * per_pair
}

/// At most `k` of the literals `xs` true (Sinz's sequential counter, auxiliaries
/// after `variables`). Returns the auxiliaries used. A deliberate copy of the
/// encoder's counter (encoder/src/symmetry/degree_bounds.rs), written apart so
/// that a bug in one is not shared by the other.
fn at_most_k_clauses(xs: &[i32], k: usize, variables: usize, clauses: &mut Vec<Vec<i32>>) -> usize {
    if k == 0 {
        clauses.extend(xs.iter().map(|&x| vec![-x]));
        return 0;
    }
    let base = variables + 1;
    let s = |i: usize, j: usize| (base + (i - 1) * k + (j - 1)) as i32;
    let m = xs.len();
    clauses.push(vec![-xs[0], s(1, 1)]);
    clauses.extend((2..=k).map(|j| vec![-s(1, j)]));
    for i in 2..m {
        let x = xs[i - 1];
        clauses.push(vec![-x, s(i, 1)]);
        clauses.push(vec![-s(i - 1, 1), s(i, 1)]);
        for j in 2..=k {
            clauses.push(vec![-x, -s(i - 1, j - 1), s(i, j)]);
            clauses.push(vec![-s(i - 1, j), s(i, j)]);
        }
        clauses.push(vec![-x, -s(i - 1, k)]);
    }
    clauses.push(vec![-xs[m - 1], -s(m - 1, k)]);
    (m - 1) * k
}

/// Sorts clauses into a sorted multiset of sorted clauses (order and literal order
/// free), in place, so that two formulas compare without copies.
pub fn normalize(clauses: &mut [Vec<i32>]) {
    clauses.iter_mut().for_each(|c| c.sort_unstable());
    clauses.sort_unstable();
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    /// Every injective placement, each distinct edge set kept once: the plain walk.
    fn distinct_copies(n: usize, vertices: usize, edges: &[(usize, usize)]) -> BTreeSet<Vec<(usize, usize)>> {
        let mut copies = BTreeSet::new();
        sequences(n, &vec![usize::MAX; vertices], false, &mut Vec::new(), &mut |place| {
            let mut copy: Vec<(usize, usize)> =
                edges.iter().map(|&(a, b)| (place[a].min(place[b]), place[a].max(place[b]))).collect();
            copy.sort_unstable();
            copies.insert(copy);
            true
        });
        copies
    }

    #[test]
    fn one_edge_among_ten_vertices_has_one_copy_per_edge() {
        let (vertices, edges) = without_isolated(10, &[(0, 1)]);
        assert_eq!((vertices, edges.clone()), (2, vec![(0, 1)]));
        assert_eq!(copies_of(20, vertices, &edges, &previous_twin(2, &edges)), Some(190)); // C(20,2)
                                                                                           // C4 in K6: 6!/2!/8 = 45 (|Aut C4| = 8, the dihedral group; common practice).
        let c4 = [(0, 1), (1, 2), (2, 3), (0, 3)];
        assert_eq!(copies_of(6, 4, &c4, &previous_twin(4, &c4)), Some(45));
    }

    proptest! {
        #[test]
        fn twin_ordered_walk_meets_every_copy_and_counts_them(
            vertices in 2usize..=6, extra in 0usize..=2, bits in any::<u16>()
        ) {
            let pairs: Vec<(usize, usize)> = (0..vertices).flat_map(|b| (0..b).map(move |a| (a, b))).collect();
            let mut edges: Vec<(usize, usize)> =
                pairs.iter().enumerate().filter(|(i, _)| bits >> (i % 16) & 1 == 1).map(|(_, &e)| e).collect();
            if edges.is_empty() { edges.push((0, 1)); }
            let n = vertices + extra;
            let (vertices, edges) = without_isolated(vertices, &edges);
            let after = previous_twin(vertices, &edges);
            let mut ordered = BTreeSet::new();
            sequences(n, &after, false, &mut Vec::new(), &mut |place| {
                let mut copy: Vec<(usize, usize)> =
                    edges.iter().map(|&(a, b)| (place[a].min(place[b]), place[a].max(place[b]))).collect();
                copy.sort_unstable();
                ordered.insert(copy);
                true
            });
            let all = distinct_copies(n, vertices, &edges);
            prop_assert_eq!(&ordered, &all);
            prop_assert_eq!(copies_of(n, vertices, &edges, &after), Some(all.len() as u128));
        }
    }
}
