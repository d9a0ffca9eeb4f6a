//! Enumeration up to isomorphism against the published counts of Ramsey colourings.

use std::sync::atomic::AtomicBool;

use ramsift_checker::check_colouring;
use ramsift_driver::certify::witness_check::{to_claim, to_matrix};
use ramsift_driver::enumerate::{enumerate, EnumerateOptions};
use ramsift_encoder::{Instance, RamseySpec};

fn count(sizes: &[usize], n: usize, swap_colours: bool) -> usize {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
    let result = enumerate(
        &instance,
        &EnumerateOptions {
            swap_colours,
            timeout: None,
        },
        &AtomicBool::new(false),
        |_, _| {},
    )
    .unwrap();
    assert!(result.complete);
    for colouring in &result.classes {
        assert!(check_colouring(&to_matrix(colouring), &to_claim(instance.spec())).is_valid());
    }
    result.classes.len()
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
