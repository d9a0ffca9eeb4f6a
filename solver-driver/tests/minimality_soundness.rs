//! Soundness of the minimality scheme, alone and with degree bounds (the
//! combinations `ramsift refute` and `ramsift enumerate` ship):
//!
//! * exhaustive, two colours up to n = 7 and three colours up to n = 4: the exact
//!   check marks exactly one member of every class as minimal (the classes are
//!   told apart by the canonical forms of `enumerate::canonical`, an independent
//!   algorithm), and no partial assignment below a minimal colouring gets a witness;
//! * random, n = 8 and 9: descending by witnesses ends at a colouring that brute
//!   force over all n! relabellings confirms to be its class's least member;
//! * with degree bounds, the hooked solver enumerates the published numbers of
//!   Ramsey colourings (McKay's Ramsey-graph data page).

use std::collections::HashMap;
use std::sync::atomic::AtomicBool;

use ramsift_driver::enumerate::canonical::{canonical_form, colour_maps, ColourTable};
use ramsift_driver::minimality::hook::{MinimalityHook, DEFAULT_BUDGET};
use ramsift_driver::minimality::matrix::PartialMatrix;
use ramsift_driver::minimality::search::{find_smaller, Verdict, Witness};
use ramsift_driver::minimality::solve::{blocking_clause, loaded_solver, model_colouring};
use ramsift_driver::search::interrupt::stop_requested;
use ramsift_encoder::edges::edge_index;
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, Scheme, SymmetrySet};

struct XorShift(u64);
impl XorShift {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0
    }
}

fn edges(n: usize) -> usize {
    n * (n - 1) / 2
}

fn table(n: usize, colours: &[u8]) -> ColourTable {
    ColourTable::from_fn(n, |i, j| colours[edge_index(i.min(j), i.max(j))])
}

/// Every class has exactly one minimal member, and partial assignments below a
/// minimal member never get a witness.
fn exhaustive(n: usize, r: usize, maps: &[Vec<u8>]) {
    let total = (r as u64).pow(edges(n) as u32);
    let mut minimal_per_class: HashMap<Vec<u8>, usize> = HashMap::new();
    let mut rng = XorShift(0x2545_f491_4f6c_dd1d);
    for code in 0..total {
        let mut x = code;
        let colours: Vec<u8> = (0..edges(n))
            .map(|_| {
                let c = (x % r as u64) as u8 + 1;
                x /= r as u64;
                c
            })
            .collect();
        let matrix = PartialMatrix::from_edge_colours(n, colours.clone());
        let minimal = matches!(
            find_smaller(&matrix, maps, None, &mut 0),
            Verdict::NoneFound
        );
        *minimal_per_class
            .entry(canonical_form(&table(n, &colours), maps))
            .or_default() += usize::from(minimal);
        if minimal {
            for _ in 0..3 {
                let mask = rng.next();
                let partial: Vec<u8> = colours
                    .iter()
                    .enumerate()
                    .map(|(e, &c)| if mask >> (e % 64) & 1 == 1 { c } else { 0 })
                    .collect();
                let verdict = find_smaller(
                    &PartialMatrix::from_edge_colours(n, partial),
                    maps,
                    Some(50_000),
                    &mut 0,
                );
                assert!(
                    !matches!(verdict, Verdict::Smaller(_)),
                    "n={n}: a minimal colouring was cut"
                );
            }
        }
    }
    let bad: Vec<_> = minimal_per_class.values().filter(|&&m| m != 1).collect();
    assert!(
        bad.is_empty(),
        "n={n}, r={r}: classes with {bad:?} minimal members"
    );
}

#[test]
fn two_colours_exhaustive_up_to_seven_vertices() {
    for n in 2..=7 {
        exhaustive(n, 2, &[vec![0, 1, 2]]);
        exhaustive(n, 2, &[vec![0, 1, 2], vec![0, 2, 1]]);
    }
}

#[test]
fn three_colours_exhaustive_up_to_four_vertices() {
    let all: Vec<Vec<u8>> = vec![
        vec![0, 1, 2, 3],
        vec![0, 1, 3, 2],
        vec![0, 2, 1, 3],
        vec![0, 2, 3, 1],
        vec![0, 3, 1, 2],
        vec![0, 3, 2, 1],
    ];
    for n in 2..=4 {
        exhaustive(n, 3, &all[..1]);
        exhaustive(n, 3, &all);
        // Only colours 2 and 3 interchangeable (say (3,4,4)).
        exhaustive(n, 3, &[all[0].clone(), all[1].clone()]);
    }
}

fn relabel(n: usize, colours: &[u8], w: &Witness) -> Vec<u8> {
    let mut out = vec![0; colours.len()];
    for j in 1..n {
        for i in 0..j {
            let (a, b) = (w.vertices[i], w.vertices[j]);
            out[edge_index(i, j)] = w.colours[colours[edge_index(a.min(b), a.max(b))] as usize];
        }
    }
    out
}

fn permutations(n: usize) -> Vec<Vec<usize>> {
    let mut out = vec![vec![]];
    for k in 0..n {
        out = out
            .into_iter()
            .flat_map(|p: Vec<usize>| {
                (0..=k).map(move |pos| {
                    let mut q = p.clone();
                    q.insert(pos, k);
                    q
                })
            })
            .collect();
    }
    out
}

#[test]
fn random_colourings_descend_to_the_true_least_member() {
    let maps = vec![vec![0u8, 1, 2], vec![0u8, 2, 1]];
    let mut rng = XorShift(99);
    for n in [8, 9] {
        let perms = permutations(n);
        for _ in 0..3 {
            let mut colours: Vec<u8> = (0..edges(n)).map(|_| (rng.next() % 2) as u8 + 1).collect();
            while let Verdict::Smaller(w) = find_smaller(
                &PartialMatrix::from_edge_colours(n, colours.clone()),
                &maps,
                None,
                &mut 0,
            ) {
                let smaller = relabel(n, &colours, &w);
                assert!(smaller < colours);
                colours = smaller;
            }
            for p in &perms {
                for s in &maps {
                    let w = Witness {
                        vertices: p.clone(),
                        colours: s.clone(),
                        edges: vec![],
                    };
                    assert!(
                        relabel(n, &colours, &w) >= colours,
                        "n={n}: the exact check missed a relabelling"
                    );
                }
            }
        }
    }
}

/// Classes enumerated by the hooked solver under `schemes`.
fn classes(sizes: &[usize], n: usize, schemes: &[Scheme]) -> usize {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
    let encoding = RamseyEncoding::with_symmetry(
        &instance,
        &SymmetrySet::of(schemes),
        &EncodingLimits::default(),
    )
    .unwrap();
    let vars = *encoding.variables();
    let mut hook = MinimalityHook::new(vars, colour_maps(instance.spec(), false), DEFAULT_BUDGET);
    let mut solver = loaded_solver(&encoding);
    let stop = AtomicBool::new(false);
    let mut count = 0;
    while solver.solve(&mut hook, &|| stop_requested(&stop), None)
        == ramsift_cdcl::Outcome::Satisfiable
    {
        solver.add_clause(&blocking_clause(&vars, &model_colouring(&solver, &vars)));
        count += 1;
    }
    count
}

#[test]
fn with_degree_bounds_every_class_is_still_found() {
    // McKay's Ramsey-graph data page: 9 (3,4;7)-graphs, 3 (3,4;8)-graphs,
    // 12 (3,5;12)-graphs, 2 (4,4;16)-graphs.
    for (sizes, n, expected) in [
        (&[3, 4][..], 7, 9),
        (&[3, 4], 8, 3),
        (&[3, 5], 12, 12),
        (&[4, 4], 16, 2),
    ] {
        for schemes in [
            &[Scheme::Minimality][..],
            &[Scheme::Minimality, Scheme::DegreeBounds],
        ] {
            assert_eq!(
                classes(sizes, n, schemes),
                expected,
                "{sizes:?} order {n} under {schemes:?}"
            );
        }
    }
}
