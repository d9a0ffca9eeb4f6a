//! Canonical forms of edge colourings of K_n under vertex relabelling (and, when
//! asked, permutations of interchangeable colours), by individualisation and
//! refinement: McKay, "Practical graph isomorphism", Congressus Numerantium 30
//! (1981). Our implementation, without automorphism pruning:
//!
//! 1. refine the ordered partition of the vertices until it is *equitable*: every
//!    cell is split by how many vertices of each colour each vertex sees in each
//!    cell, new cells ordered by that count (so the result depends on the colouring,
//!    never on the labels);
//! 2. if a cell has several vertices, branch: for each vertex v of the first
//!    smallest such cell, put v in a cell of its own in front of the rest, refine,
//!    and recurse;
//! 3. each discrete partition orders the vertices; the canonical form is the least
//!    relabelled colouring (upper triangle, row by row) over all leaves.
//!
//! Isomorphic colourings have the same search tree up to relabelling, so they get the
//! same least form; non-isomorphic ones cannot share a form, since the form is an
//! actual relabelling of the colouring.

/// A colouring as a full n×n matrix of colours (0 on the diagonal).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ColourTable {
    pub order: usize,
    pub cells: Vec<u8>,
}

impl ColourTable {
    pub fn from_fn(order: usize, colour: impl Fn(usize, usize) -> u8) -> Self {
        let mut cells = vec![0; order * order];
        for i in 0..order {
            for j in 0..order {
                if i != j {
                    cells[i * order + j] = colour(i.min(j), i.max(j));
                }
            }
        }
        ColourTable { order, cells }
    }

    #[inline]
    pub fn colour(&self, i: usize, j: usize) -> u8 {
        self.cells[i * self.order + j]
    }

    /// The upper triangle, row by row, after relabelling vertex `order[k]` as k.
    fn relabelled(&self, order: &[usize]) -> Vec<u8> {
        let n = self.order;
        let mut out = Vec::with_capacity(n * (n - 1) / 2);
        for a in 0..n {
            for b in a + 1..n {
                out.push(self.colour(order[a], order[b]));
            }
        }
        out
    }
}

/// The canonical form: the least upper triangle over all leaves and all given
/// colour permutations (`colour_maps[m][c]` is the new name of colour c; pass the
/// identity alone for vertex relabelling only).
pub fn canonical_form(table: &ColourTable, colour_maps: &[Vec<u8>]) -> Vec<u8> {
    let mut best: Option<Vec<u8>> = None;
    for map in colour_maps {
        let recoloured = ColourTable {
            order: table.order,
            cells: table.cells.iter().map(|&c| map[c as usize]).collect(),
        };
        let colours = *map.iter().max().unwrap_or(&0) as usize;
        let cells = vec![(0..table.order).collect::<Vec<usize>>()];
        search(&recoloured, colours, cells, &mut best);
    }
    best.unwrap_or_default()
}

fn search(table: &ColourTable, colours: usize, cells: Vec<Vec<usize>>, best: &mut Option<Vec<u8>>) {
    let cells = refine(table, colours, cells);
    match cells
        .iter()
        .enumerate()
        .filter(|(_, c)| c.len() > 1)
        .min_by_key(|(i, c)| (c.len(), *i))
    {
        None => {
            let order: Vec<usize> = cells.iter().map(|c| c[0]).collect();
            let form = table.relabelled(&order);
            if best.as_ref().is_none_or(|b| form < *b) {
                *best = Some(form);
            }
        }
        Some((target, _)) => {
            for &v in &cells[target] {
                let mut next = cells.clone();
                let rest: Vec<usize> = next[target].iter().copied().filter(|&u| u != v).collect();
                next[target] = vec![v];
                next.insert(target + 1, rest);
                search(table, colours, next, best);
            }
        }
    }
}

/// Splits cells until the partition is equitable.
fn refine(table: &ColourTable, colours: usize, mut cells: Vec<Vec<usize>>) -> Vec<Vec<usize>> {
    loop {
        let mut changed = false;
        let mut next: Vec<Vec<usize>> = Vec::with_capacity(cells.len());
        for cell in &cells {
            if cell.len() == 1 {
                next.push(cell.clone());
                continue;
            }
            // Signature of v: for every cell and colour, how many of the cell's
            // vertices v sees in that colour.
            let mut signed: Vec<(Vec<u32>, usize)> = cell
                .iter()
                .map(|&v| {
                    let mut sig = vec![0u32; cells.len() * colours];
                    for (k, other) in cells.iter().enumerate() {
                        for &u in other {
                            if u != v {
                                let c = table.colour(v, u) as usize;
                                sig[k * colours + c - 1] += 1;
                            }
                        }
                    }
                    (sig, v)
                })
                .collect();
            signed.sort();
            let mut start = 0;
            for i in 1..=signed.len() {
                if i == signed.len() || signed[i].0 != signed[start].0 {
                    next.push(signed[start..i].iter().map(|(_, v)| *v).collect());
                    start = i;
                }
            }
            if next.last().map(Vec::len) != Some(cell.len()) {
                changed = true;
            }
        }
        cells = next;
        if !changed {
            return cells;
        }
    }
}

/// The colour maps that identify colourings of `spec`: every permutation of
/// colours with equal forbidden graphs when `swap`, else the identity only.
pub fn colour_maps(spec: &ramsift_encoder::RamseySpec, swap: bool) -> Vec<Vec<u8>> {
    if swap {
        let classes: Vec<String> = spec.forbidden().iter().map(|g| g.to_string()).collect();
        colour_permutations(&classes)
    } else {
        vec![(0..=spec.colours() as u8).collect()]
    }
}

/// Every permutation of colours that maps each colour to one with the same
/// forbidden graph (`classes[c-1]` names colour c's class), as maps indexed by
/// colour (index 0 unused).
pub fn colour_permutations(classes: &[String]) -> Vec<Vec<u8>> {
    let r = classes.len();
    let mut out = Vec::new();
    let mut perm: Vec<u8> = (1..=r as u8).collect();
    fn permute(k: usize, perm: &mut Vec<u8>, classes: &[String], out: &mut Vec<Vec<u8>>) {
        if k == perm.len() {
            if perm
                .iter()
                .enumerate()
                .all(|(i, &c)| classes[i] == classes[c as usize - 1])
            {
                let mut map = vec![0u8];
                map.extend_from_slice(perm);
                out.push(map);
            }
            return;
        }
        for i in k..perm.len() {
            perm.swap(k, i);
            permute(k + 1, perm, classes, out);
            perm.swap(k, i);
        }
    }
    permute(0, &mut perm, classes, &mut out);
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn identity(r: usize) -> Vec<Vec<u8>> {
        vec![(0..=r as u8).collect()]
    }

    proptest! {
        /// Relabelling the vertices never changes the canonical form.
        #[test]
        fn invariant_under_relabelling(
            n in 2usize..=9,
            seed in any::<u64>(),
            shuffle in any::<u64>(),
        ) {
            let mut state = seed | 1;
            let mut next = || { state ^= state << 13; state ^= state >> 7; state ^= state << 17; state };
            let colours: Vec<u8> = (0..n * n).map(|_| (next() % 2) as u8 + 1).collect();
            let table = ColourTable::from_fn(n, |i, j| colours[i * n + j]);
            let mut perm: Vec<usize> = (0..n).collect();
            let mut s = shuffle | 1;
            for i in (1..n).rev() {
                s ^= s << 13; s ^= s >> 7; s ^= s << 17;
                perm.swap(i, (s % (i as u64 + 1)) as usize);
            }
            let relabelled = ColourTable::from_fn(n, |i, j| table.colour(perm[i], perm[j]));
            prop_assert_eq!(canonical_form(&table, &identity(2)), canonical_form(&relabelled, &identity(2)));
        }
    }

    #[test]
    fn counts_graphs_on_four_vertices() {
        // 11 graphs on 4 vertices up to isomorphism (OEIS A000088).
        let mut forms = std::collections::HashSet::new();
        for mask in 0u32..64 {
            let table = ColourTable::from_fn(4, |i, j| {
                let e = j * (j - 1) / 2 + i;
                if mask >> e & 1 == 1 {
                    1
                } else {
                    2
                }
            });
            forms.insert(canonical_form(&table, &identity(2)));
        }
        assert_eq!(forms.len(), 11);
        // Up to complementation too: (11 + s)/2 classes, s = 1 self-complementary
        // graph on 4 vertices (the path P4; common practice, checkable by hand).
        let swap = colour_permutations(&["K3".into(), "K3".into()]);
        assert_eq!(swap.len(), 2);
        let mut pairs = std::collections::HashSet::new();
        for mask in 0u32..64 {
            let table = ColourTable::from_fn(4, |i, j| {
                let e = j * (j - 1) / 2 + i;
                if mask >> e & 1 == 1 {
                    1
                } else {
                    2
                }
            });
            pairs.insert(canonical_form(&table, &swap));
        }
        assert_eq!(pairs.len(), 6);
    }
}
