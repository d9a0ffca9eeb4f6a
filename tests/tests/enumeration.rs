//! Enumeration up to isomorphism against the published counts of Ramsey colourings,
//! with the default minimality check and with lex-leader constraints.

use std::sync::atomic::AtomicBool;

use ramsift_checker::check_colouring;
use ramsift_driver::certify::witness_check::{to_claim, to_matrix};
use ramsift_driver::enumerate::canonical::{canonical_form, colour_maps, ColourTable};
use ramsift_driver::enumerate::{enumerate, EnumerateOptions};
use ramsift_encoder::{Instance, RamseySpec};

/// The number of classes; with minimality, also that no two classes found are
/// isomorphic (by the canonical forms, an independent algorithm).
fn count_with(sizes: &[usize], n: usize, swap_colours: bool, lex_leader: bool) -> usize {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
    let result = enumerate(
        &instance,
        &EnumerateOptions {
            swap_colours,
            timeout: None,
            lex_leader,
        },
        &AtomicBool::new(false),
        |_, _| {},
    )
    .unwrap();
    assert!(result.complete);
    for colouring in &result.classes {
        assert!(check_colouring(&to_matrix(colouring), &to_claim(instance.spec())).is_valid());
    }
    let maps = colour_maps(instance.spec(), swap_colours);
    let mut forms: Vec<Vec<u8>> = result
        .classes
        .iter()
        .map(|c| canonical_form(&ColourTable::from_fn(n, |i, j| c.colour(i, j)), &maps))
        .collect();
    forms.sort();
    forms.dedup();
    assert_eq!(
        forms.len(),
        result.classes.len(),
        "two classes found are isomorphic"
    );
    result.classes.len()
}

/// Both schemes must give the same count.
fn count(sizes: &[usize], n: usize, swap_colours: bool) -> usize {
    let minimal = count_with(sizes, n, swap_colours, false);
    let by_lex_leader = count_with(sizes, n, swap_colours, true);
    assert_eq!(minimal, by_lex_leader, "R({sizes:?}) order {n}");
    minimal
}

#[test]
fn counts_of_two_colour_ramsey_graphs() {
    // Numbers of (s,t;n)-graphs up to isomorphism, McKay's Ramsey-graph data page
    // (users.cecs.anu.edu.au/~bdm/data/ramsey.html) and Radziszowski DS1.
    assert_eq!(count(&[3, 3], 5, false), 1);
    assert_eq!(count(&[3, 4], 7, false), 9);
    assert_eq!(count(&[3, 4], 8, false), 3);
    assert_eq!(count(&[3, 5], 13, false), 1);
    assert_eq!(count(&[4, 4], 17, false), 1);
    // At R(s,t) there is none (R(3,4) = 9, Greenwood & Gleason 1955).
    assert_eq!(count(&[3, 4], 9, false), 0);
}

#[test]
fn the_two_three_colourings_of_k16() {
    // Exactly 2 good 3-colourings of K16 up to isomorphism and colour permutation
    // (Kalbfleisch & Stanton 1968; Radziszowski DS1).
    assert_eq!(count(&[3, 3, 3], 16, true), 2);
}

#[test]
fn larger_counts_with_the_minimality_check() {
    // McKay's Ramsey-graph data page (users.cecs.anu.edu.au/~bdm/data/ramsey.html):
    // 12 (3,5;12)-graphs, 7 (3,6;17)-graphs, 2 (4,4;16)-graphs. The lex-leader
    // enumeration of these takes minutes, so only the default runs here.
    assert_eq!(count_with(&[3, 5], 12, false, false), 12);
    assert_eq!(count_with(&[3, 6], 17, false, false), 7);
    assert_eq!(count_with(&[4, 4], 16, false, false), 2);
}
