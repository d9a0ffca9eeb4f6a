//! The Paley colouring of K_17 against the checker, and single-edge mutants of it.

use ramsift_checker::{check_colouring, Claim, Verdict};
use ramsift_driver::certify::witness_check::to_matrix;
use ramsift_encoder::combinations::for_each_subset;
use ramsift_encoder::Colouring;
use ramsift_tests::constructions::{paley, quadratic_residues};

fn claim44() -> Claim {
    Claim::cliques(&[4, 4])
}

/// Plain brute force: is there a monochromatic 4-subset?
fn brute_force_has_mono_k4(colouring: &Colouring) -> bool {
    let mut found = false;
    for_each_subset::<()>(colouring.order(), 4, |s| {
        let c = colouring.colour(s[0], s[1]);
        if s.iter()
            .enumerate()
            .all(|(p, &a)| s[p + 1..].iter().all(|&b| colouring.colour(a, b) == c))
        {
            found = true;
        }
        Ok(())
    })
    .unwrap();
    found
}

#[test]
fn residues_mod_17_are_the_documented_distances() {
    // Paley graph of order 17: distances ±{1,2,4,8} (Radziszowski DS1; shared facts [V]).
    assert_eq!(quadratic_residues(17), vec![1, 2, 4, 8, 9, 13, 15, 16]);
}

#[test]
fn paley_17_is_a_4_4_colouring() {
    // The Paley graph of order 17 is the unique (4,4;17)-graph (Radziszowski DS1).
    assert_eq!(
        check_colouring(&to_matrix(&paley(17)), &claim44()),
        Verdict::Valid
    );
    assert!(!brute_force_has_mono_k4(&paley(17)));
}

#[test]
fn every_single_edge_flip_is_judged_like_brute_force() {
    let base = paley(17);
    let mut rejected = 0;
    for j in 0..17 {
        for i in 0..j {
            let mut mutant = base.clone();
            mutant.set(i, j, 3 - base.colour(i, j));
            let matrix = to_matrix(&mutant);
            let verdict = check_colouring(&matrix, &claim44());
            assert_eq!(
                verdict.is_valid(),
                !brute_force_has_mono_k4(&mutant),
                "flip {i}-{j}"
            );
            if let Verdict::Monochromatic {
                colour,
                vertices,
                graph,
                edges,
            } = verdict
            {
                assert_eq!(graph, "K4");
                assert_eq!(edges.len(), 6);
                assert_eq!(vertices.len(), 4);
                assert!(
                    vertices.contains(&i) && vertices.contains(&j),
                    "the clique must use the flipped edge"
                );
                assert!(edges
                    .iter()
                    .all(|&(a, b)| matrix.colour(a, b) == colour as u8));
                rejected += 1;
            }
        }
    }
    // Paley(17) is the unique (4,4;17)-graph (Radziszowski DS1) and has 68 edges; a flip
    // leaves 67 or 69, so the mutant is not isomorphic to it and must hold a monochromatic K4.
    assert_eq!(rejected, 136);
}
