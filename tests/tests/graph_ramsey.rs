//! Graph Ramsey numbers R(G, H) for small graphs, both directions: a verified
//! witness at R − 1 and a refutation bundle at R that the checker passes, plus the
//! copy count of the encoding against n!/((n−v)!·|Aut G|).

use std::sync::atomic::{AtomicBool, AtomicU64};
use std::time::Duration;

use ramsift_checker::bundle::check_bundle;
use ramsift_checker::check_colouring;
use ramsift_driver::certify::refute::{refute, RefuteOptions, RefuteResult};
use ramsift_driver::certify::witness_check::{to_claim, to_matrix};
use ramsift_driver::search::formula::Formula;
use ramsift_driver::search::job::{SearchJob, SearchOptions, SearchResult};
use ramsift_driver::search::portfolio::search;
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};
use ramsift_tests::published::GRAPH_VALUES;

fn instance(spec: &str, n: usize) -> Instance {
    Instance::new(spec.parse::<RamseySpec>().unwrap(), n).unwrap()
}

#[test]
fn witnesses_below_and_certified_refutations_at_each_value() {
    for value in GRAPH_VALUES {
        let below = instance(value.spec, value.value - 1);
        let encoding = RamseyEncoding::new(&below, &EncodingLimits::default()).unwrap();
        let options = SearchOptions {
            threads: 2,
            timeout: Some(Duration::from_secs(120)),
            ..SearchOptions::default()
        };
        let report = search(
            &SearchJob::new(below.clone(), SymmetrySet::none(), options),
            &Formula::from_encoding(&encoding),
            |_| {},
        )
        .unwrap();
        let SearchResult::Found { colouring, .. } = report.result else {
            panic!(
                "{}: a colouring of K_{} exists ({})",
                value.spec,
                value.value - 1,
                value.source
            );
        };
        // The checker's own subgraph search, from the specification's text.
        assert!(
            check_colouring(&to_matrix(&colouring), &to_claim(below.spec())).is_valid(),
            "{}",
            value.spec
        );

        let at = instance(value.spec, value.value);
        // The previous default and the new one (minimality alone for graphs).
        for schemes in ["colour-swap,lex-leader", "minimality"] {
            let symmetry: SymmetrySet = schemes.parse().unwrap();
            let encoding =
                RamseyEncoding::with_symmetry(&at, &symmetry, &EncodingLimits::default()).unwrap();
            let dir = tempfile::tempdir().unwrap();
            let out = dir.path().join("bundle");
            let report = refute(
                &encoding,
                &out,
                &RefuteOptions {
                    timeout: Some(Duration::from_secs(120)),
                    ..RefuteOptions::default()
                },
                &AtomicBool::new(false),
                &AtomicU64::new(0),
            )
            .unwrap();
            assert!(
                matches!(report.result, RefuteResult::Refuted { .. }),
                "{}: R = {} ({})",
                value.spec,
                value.value,
                value.source
            );
            let verdict = check_bundle(&out, &[]).unwrap();
            assert!(verdict.passed(), "{}: {:?}", value.spec, verdict.failure);
            assert!(verdict.unconditional());
            assert!(
                verdict.claim.ends_with(&format!("<= {}", value.value)),
                "{}",
                verdict.claim
            );
        }
    }
}

#[test]
fn one_clause_per_copy() {
    // Copies of G in K_n: n!/((n−v)!·|Aut G|) (common practice). |Aut| values:
    // C_k dihedral (2k), K_{1,3} (3! = 6), W_6 = hub + C_5 (10), B_2 = K_4 − e (4), P_4 (2).
    for (spec, n, v, aut) in [
        ("C4,2", 8, 4, 8u128),
        ("C5,2", 9, 5, 10),
        ("K1:3,2", 7, 4, 6),
        ("W_6,2", 8, 6, 10),
        ("K4-e,2", 9, 4, 4),
        ("P4,2", 10, 4, 2),
        ("C7,2", 9, 7, 14),
    ] {
        let inst = instance(spec, n);
        let falling: u128 = (n - v + 1..=n).map(|x| x as u128).product();
        let copies = falling / aut;
        // The second colour forbids K2 (every edge): C(n,2) one-literal clauses.
        let k2 = (n * (n - 1) / 2) as u128;
        assert_eq!(
            RamseyEncoding::count_clauses(&inst),
            Some(copies + k2),
            "{spec} at {n}"
        );
        let encoding = RamseyEncoding::new(&inst, &EncodingLimits::default()).unwrap();
        let clauses = encoding.clauses();
        assert_eq!(clauses.len() as u128, copies + k2);
        // No two clauses name the same copy.
        let mut sets: Vec<Vec<i32>> = clauses
            .into_iter()
            .map(|mut c| {
                c.sort_unstable();
                c
            })
            .collect();
        sets.sort();
        sets.dedup();
        assert_eq!(sets.len() as u128, copies + k2, "{spec}: repeated copies");
    }
}

#[test]
fn local_search_finds_a_witness_below_each_graph_value() {
    use ramsift_driver::local::search::LocalProgress;
    use ramsift_driver::local::{local_search, LocalOptions};
    for value in GRAPH_VALUES {
        let below = instance(value.spec, value.value - 1);
        let options = LocalOptions {
            threads: 2,
            seed: 5,
            timeout: Some(Duration::from_secs(60)),
            ..LocalOptions::default()
        };
        let report = local_search(
            &below,
            &options,
            &AtomicBool::new(false),
            &LocalProgress::default(),
        )
        .unwrap();
        let (colouring, _) = report.found.unwrap_or_else(|| {
            panic!(
                "{}: a colouring of K_{} exists ({})",
                value.spec,
                value.value - 1,
                value.source
            )
        });
        // Independent check: the checker's own claim parser and subgraph search.
        let verdict =
            ramsift_checker::check_colouring(&to_matrix(&colouring), &to_claim(below.spec()));
        assert!(verdict.is_valid(), "{}: {verdict}", value.spec);
    }
}

#[test]
fn repair_mends_a_damaged_graph_colouring() {
    use ramsift_driver::search::repair::{repair, Repair, RepairStage};
    // A (C4,K4;9) colouring (R(C4,K4) = 10, Chvátal & Harary 1972; DS1, from memory)
    // found by the SAT search, then damaged on one edge at a time until it has a
    // monochromatic copy; freeing the copies' edges must mend it.
    let below = instance("C4,4", 9);
    let encoding = RamseyEncoding::new(&below, &EncodingLimits::default()).unwrap();
    let formula = Formula::from_encoding(&encoding);
    let options = SearchOptions {
        threads: 1,
        seed: 3,
        timeout: Some(Duration::from_secs(120)),
        ..SearchOptions::default()
    };
    let job = SearchJob::new(below.clone(), SymmetrySet::none(), options);
    let SearchResult::Found { colouring, .. } = search(&job, &formula, |_| {}).unwrap().result
    else {
        panic!("(C4,K4;9) has colourings");
    };
    let claim = to_claim(below.spec());
    let mut near = colouring.clone();
    'damage: for j in 1..9 {
        for i in 0..j {
            near = colouring.clone();
            near.set(i, j, 3 - colouring.colour(i, j));
            if !ramsift_checker::check_colouring(&to_matrix(&near), &claim).is_valid() {
                break 'damage;
            }
        }
    }
    assert!(!ramsift_checker::check_colouring(&to_matrix(&near), &claim).is_valid());
    match repair(&formula, &near, &AtomicBool::new(false), None).unwrap() {
        Repair::Repaired(SearchResult::Found { colouring, .. }, stage) => {
            assert_eq!(stage, RepairStage::CopyEdges);
            assert!(ramsift_checker::check_colouring(&to_matrix(&colouring), &claim).is_valid());
        }
        other => panic!("not repaired: {other:?}"),
    }
}
