//! Soundness of every symmetry-breaking scheme and every combination of them:
//! each class of valid colourings (up to vertex relabelling, and colour permutation
//! among equal forbidden graphs when colour-swap is on) keeps at least one member
//! that satisfies the symmetry-breaking clauses. Exhaustive for two colours up to
//! n = 7 and three colours up to n = 5; random colourings at n = 8, 9 (two colours)
//! and n = 6 (three colours).

use ramsift_encoder::edges::edge_count;
use ramsift_encoder::symmetry::colour_swap::equal_colour_classes;
use ramsift_encoder::{
    Colouring, EncodingLimits, Instance, RamseyEncoding, RamseySpec, Scheme, SymmetrySet,
};

/// All permutations of 0..n (Heap's algorithm).
fn permutations(n: usize) -> Vec<Vec<usize>> {
    fn heap(k: usize, p: &mut Vec<usize>, out: &mut Vec<Vec<usize>>) {
        if k <= 1 {
            out.push(p.clone());
            return;
        }
        for i in 0..k {
            heap(k - 1, p, out);
            let j = if k % 2 == 0 { i } else { 0 };
            p.swap(j, k - 1);
        }
    }
    let mut out = Vec::new();
    heap(n, &mut (0..n).collect(), &mut out);
    out
}

/// Colour permutations allowed by colour-swap: those preserving every forbidden graph.
fn colour_permutations(instance: &Instance, swap: bool) -> Vec<Vec<u8>> {
    let r = instance.colours();
    let identity: Vec<u8> = (0..=r as u8).collect();
    if !swap {
        return vec![identity];
    }
    let spec = instance.spec();
    permutations(r)
        .into_iter()
        .filter(|p| (0..r).all(|c| spec.forbidden()[c] == spec.forbidden()[p[c]]))
        .map(|p| {
            std::iter::once(0)
                .chain(p.iter().map(|&c| c as u8 + 1))
                .collect()
        })
        .collect()
}

fn has_mono_clique(c: &Colouring, colour: u8, k: usize) -> bool {
    fn grow(c: &Colouring, colour: u8, k: usize, chosen: &mut Vec<usize>, from: usize) -> bool {
        if chosen.len() == k {
            return true;
        }
        for v in from..c.order() {
            if chosen.iter().all(|&u| c.colour(u, v) == colour) {
                chosen.push(v);
                if grow(c, colour, k, chosen, v + 1) {
                    return true;
                }
                chosen.pop();
            }
        }
        false
    }
    grow(c, colour, k, &mut Vec::new(), 0)
}

fn is_valid(c: &Colouring, sizes: &[usize]) -> bool {
    sizes
        .iter()
        .enumerate()
        .all(|(i, &k)| !has_mono_clique(c, i as u8 + 1, k))
}

fn satisfies_symmetry(encoding: &RamseyEncoding, c: &Colouring) -> bool {
    let values = encoding.full_assignment(c);
    encoding.symmetry_clauses().clauses.iter().all(|clause| {
        clause
            .iter()
            .any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))
    })
}

/// Relabels vertices by `p` and colours by `q`.
fn transform(c: &Colouring, p: &[usize], q: &[u8]) -> Colouring {
    let mut out = Colouring::monochromatic(c.order(), c.colours());
    for j in 0..c.order() {
        for i in 0..j {
            out.set(p[i], p[j], q[c.colour(i, j) as usize]);
        }
    }
    out
}

fn colouring_from_code(n: usize, r: usize, mut code: u64) -> Colouring {
    let mut c = Colouring::monochromatic(n, r);
    for e in 0..edge_count(n) {
        let (i, j) = ramsift_encoder::edges::edge_endpoints(e);
        c.set(i, j, (code % r as u64) as u8 + 1);
        code /= r as u64;
    }
    c
}

fn code_of(c: &Colouring) -> u64 {
    let r = c.colours() as u64;
    (0..edge_count(c.order()))
        .rev()
        .fold(0, |acc, e| acc * r + (c.colour_of_edge(e) - 1) as u64)
}

/// Exhaustive check: returns the number of classes of valid colourings examined.
fn exhaustive(sizes: &[usize], n: usize, set: &SymmetrySet) -> usize {
    let spec = RamseySpec::cliques(sizes).unwrap();
    exhaustive_spec(&spec, n, set, &|c| is_valid(c, sizes))
}

/// [`exhaustive`] for any specification, judging validity with `valid`.
fn exhaustive_spec(
    spec: &RamseySpec,
    n: usize,
    set: &SymmetrySet,
    valid: &dyn Fn(&Colouring) -> bool,
) -> usize {
    let instance = Instance::new(spec.clone(), n).unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, set, &EncodingLimits::default()).unwrap();
    let r = spec.colours();
    let total = (r as u64).pow(edge_count(n) as u32);
    let mut covered = vec![false; total as usize];
    let perms = permutations(n);
    let colour_perms = colour_permutations(&instance, set.contains(Scheme::ColourSwap));
    let mut classes = 0;
    for code in 0..total {
        if covered[code as usize] {
            continue;
        }
        let c = colouring_from_code(n, r, code);
        let mut orbit = Vec::new();
        for p in &perms {
            for q in &colour_perms {
                let t = transform(&c, p, q);
                let t_code = code_of(&t);
                if !covered[t_code as usize] {
                    covered[t_code as usize] = true;
                    orbit.push(t);
                }
            }
        }
        if !valid(&c) {
            continue;
        }
        classes += 1;
        assert!(
            orbit.iter().any(|t| satisfies_symmetry(&encoding, t)),
            "symmetry {set} loses the class of {:?} for {spec} at n = {n}",
            c.edge_colours()
        );
    }
    classes
}

#[test]
fn two_colours_exhaustive_up_to_seven() {
    for set in SymmetrySet::all_combinations() {
        // (n,n;n): every colouring but the two monochromatic ones is valid, so this
        // covers all graphs; the others bring degree bounds and unequal colours in.
        for (sizes, n) in [
            (vec![3, 3], 5),
            (vec![3, 4], 6),
            (vec![3, 4], 7),
            (vec![4, 4], 6),
            (vec![4, 4], 7),
            (vec![3, 5], 7),
            (vec![5, 5], 5),
            (vec![6, 6], 6),
            (vec![7, 7], 7),
        ] {
            let classes = exhaustive(&sizes, n, &set);
            if sizes == [7, 7] {
                // 1044 graphs on 7 vertices up to isomorphism (OEIS A000088), less the
                // complete and the empty graph; colour-swap pairs complements up.
                if !set.contains(Scheme::ColourSwap) {
                    assert_eq!(classes, 1042, "{set}");
                }
            }
        }
    }
}

#[test]
fn three_colours_exhaustive_up_to_five() {
    for set in SymmetrySet::all_combinations() {
        for (sizes, n) in [
            (vec![3, 3, 3], 4),
            (vec![3, 3, 3], 5),
            (vec![3, 3, 4], 5),
            (vec![5, 5, 5], 5),
            (vec![2, 3, 3], 5),
        ] {
            exhaustive(&sizes, n, &set);
        }
    }
}

/// Random valid colourings at larger orders: some relabelling satisfies the constraints.
fn random_check(sizes: &[usize], n: usize, samples: usize, seed: u64) {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
    let perms = permutations(n);
    let mut state = seed;
    let mut next = move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        state
    };
    for set in SymmetrySet::all_combinations() {
        let encoding =
            RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
        let colour_perms = colour_permutations(&instance, set.contains(Scheme::ColourSwap));
        let mut checked = 0;
        while checked < samples {
            let c = Colouring::from_fn(n, sizes.len(), |_, _| {
                (next() % sizes.len() as u64) as u8 + 1
            });
            if !is_valid(&c, sizes) {
                continue;
            }
            checked += 1;
            let kept = perms.iter().any(|p| {
                colour_perms
                    .iter()
                    .any(|q| satisfies_symmetry(&encoding, &transform(&c, p, q)))
            });
            assert!(
                kept,
                "{set} loses {:?} ({sizes:?}, n = {n})",
                c.edge_colours()
            );
        }
    }
}

#[test]
fn two_colours_random_at_eight_and_nine() {
    random_check(&[4, 4], 8, 6, 0x1234_5678_9abc_def1);
    random_check(&[8, 8], 8, 6, 0x0fed_cba9_8765_4321);
    random_check(&[5, 5], 9, 2, 0x1357_9bdf_2468_ace1);
    random_check(&[4, 4], 9, 2, 0x2468_ace1_3579_bdf1);
}

#[test]
fn three_colours_random_at_six() {
    random_check(&[3, 3, 3], 6, 4, 0x5555_aaaa_3333_cccc);
    random_check(&[6, 6, 6], 6, 4, 0x7777_1111_9999_eeee);
}

#[test]
fn equal_classes_are_found() {
    let instance = Instance::new(RamseySpec::cliques(&[3, 4, 3, 4, 5]).unwrap(), 6).unwrap();
    assert_eq!(
        equal_colour_classes(&instance),
        vec![vec![1, 3], vec![2, 4]]
    );
}

#[test]
fn forbidden_graphs_other_than_cliques_keep_every_class() {
    // Validity is judged by the encoder's own clauses without symmetry breaking
    // (their agreement with the checker's subgraph search is tested elsewhere).
    for set in SymmetrySet::all_combinations() {
        if set.contains(Scheme::DegreeBounds) {
            continue; // refused for non-clique specifications
        }
        for (text, n) in [
            ("C4,C4", 5),
            ("C5,C5", 6),
            ("C4,K1:3", 5),
            ("P4,K4-e", 6),
            ("C4,C4,P3", 4),
        ] {
            let spec: RamseySpec = text.parse().unwrap();
            let plain = RamseyEncoding::new(
                &Instance::new(spec.clone(), n).unwrap(),
                &EncodingLimits::default(),
            )
            .unwrap();
            let clauses = plain.clauses();
            let valid = |c: &Colouring| {
                let values = plain.variables().assignment_of(c);
                clauses.iter().all(|cl| {
                    cl.iter()
                        .any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))
                })
            };
            let classes = exhaustive_spec(&spec, n, &set, &valid);
            // R(C4,C4) = 6 and R(C5,C5) = 9 (Chvátal & Harary 1972; Radziszowski DS1):
            // colourings exist at 5 and 6, so the check is not vacuous there.
            if text == "C4,C4" || text == "C5,C5" {
                assert!(classes > 0, "{text} at {n}");
            }
        }
    }
}
