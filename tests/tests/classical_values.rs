//! The search against the classical values: a colouring at R-1 that the checker
//! accepts, and "none exists" at R for the smallest cases.

use std::time::Duration;

use ramsift_checker::check_colouring;
use ramsift_checker::colouring_file::parse_colouring_file;
use ramsift_driver::output::witness::colouring_text;
use ramsift_driver::search::formula::Formula;
use ramsift_driver::search::job::{SearchJob, SearchOptions, SearchResult};
use ramsift_driver::search::portfolio::search;
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};
use ramsift_tests::published::CLASSICAL;

fn run(sizes: &[usize], order: usize, threads: usize) -> (Instance, SearchResult) {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), order).unwrap();
    let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
    let options = SearchOptions {
        threads,
        seed: 11,
        timeout: Some(Duration::from_secs(300)),
        ..SearchOptions::default()
    };
    let report = search(
        &SearchJob::new(instance.clone(), SymmetrySet::none(), options),
        &Formula::from_encoding(&encoding),
        |_| {},
    )
    .unwrap();
    (instance, report.result)
}

#[test]
fn a_checked_colouring_exists_one_below_each_classical_value() {
    for value in CLASSICAL {
        // Source of each value: value.source (Radziszowski DS1; Greenwood & Gleason 1955).
        for threads in [1, 2] {
            let (instance, result) = run(value.cliques, value.value - 1, threads);
            let SearchResult::Found { colouring, .. } = result else {
                panic!(
                    "no colouring found for {instance} ({}), expected one",
                    value.source
                );
            };
            // Through the file format and the checker's own parser, as a referee would.
            let text = colouring_text(&instance, &colouring, &[]);
            let file = parse_colouring_file("witness", &text).unwrap();
            assert_eq!(file.claim.clique_sizes(), Some(value.cliques.to_vec()));
            assert!(
                check_colouring(&file.matrix, &file.claim).is_valid(),
                "{instance}"
            );
        }
    }
}

#[test]
fn no_colouring_at_the_value_for_the_smallest_cases() {
    // R(3,3) = 6 and R(3,4) = 9 (Greenwood & Gleason 1955; Radziszowski DS1).
    for (sizes, value) in [(&[3, 3][..], 6), (&[3, 4][..], 9)] {
        for threads in [1, 2] {
            let (instance, result) = run(sizes, value, threads);
            assert_eq!(result, SearchResult::NoneExists, "{instance}");
        }
    }
}
