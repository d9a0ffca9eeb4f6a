//! Certified refutations of the classical upper bounds, checked by the checker crate
//! alone, for the default symmetry breaking, lex-leader alone, every combination at
//! small orders, and no symmetry breaking (fully formal bundles).

use std::sync::atomic::{AtomicBool, AtomicU64};

use ramsift_checker::bundle::check_bundle;
use ramsift_driver::certify::refute::{refute, RefuteOptions, RefuteResult};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, Scheme, SymmetrySet};

/// Refutes (sizes; order) with `symmetry` into a fresh directory and checks the bundle.
fn refute_and_check(
    sizes: &[usize],
    order: usize,
    symmetry: &str,
    options: RefuteOptions,
) -> ramsift_checker::bundle::BundleVerdict {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), order).unwrap();
    let set: SymmetrySet = symmetry.parse().unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let report = refute(
        &encoding,
        dir.path(),
        &options,
        &AtomicBool::new(false),
        &AtomicU64::new(0),
    )
    .unwrap();
    assert!(
        matches!(report.result, RefuteResult::Refuted { .. }),
        "{instance} [{symmetry}] was not refuted"
    );
    let verdict = check_bundle(dir.path(), &[]).unwrap();
    assert!(
        verdict.passed(),
        "{instance} [{symmetry}]: {:?}",
        verdict.failure
    );
    verdict
}

#[test]
fn classical_upper_bounds_pass_with_each_default_and_alone() {
    // R(3,3)=6, R(3,4)=9, R(3,5)=14, R(4,4)=18 (Greenwood & Gleason 1955; Radziszowski DS1).
    for (sizes, value) in [
        (&[3, 3][..], 6),
        (&[3, 4][..], 9),
        (&[3, 5][..], 14),
        (&[4, 4][..], 18),
    ] {
        for symmetry in ["colour-swap,lex-leader", "lex-leader", "minimality"] {
            let verdict = refute_and_check(sizes, value, symmetry, RefuteOptions::default());
            let list: Vec<String> = sizes.iter().map(|k| k.to_string()).collect();
            assert_eq!(verdict.claim, format!("R({}) <= {value}", list.join(",")));
            assert!(verdict.unconditional(), "no premises without degree bounds");
        }
        // The new default: the bundle's own proof passes (premises are certified by
        // `ramsift refute`, not by this library call).
        refute_and_check(
            sizes,
            value,
            "minimality,degree-bounds",
            RefuteOptions::default(),
        );
    }
}

#[test]
fn fully_formal_bundles_without_symmetry_breaking() {
    // R(3,3)=6 and R(3,4)=9 (Greenwood & Gleason 1955); R(2,3,3) = R(3,3) = 6 by definition.
    for (sizes, value) in [(&[3, 3][..], 6), (&[3, 4][..], 9), (&[2, 3, 3][..], 6)] {
        let verdict = refute_and_check(sizes, value, "none", RefuteOptions::default());
        assert!(verdict.symmetry.is_empty());
        assert!(verdict.unconditional());
    }
}

#[test]
fn every_scheme_combination_yields_a_passing_bundle() {
    for set in SymmetrySet::all_combinations() {
        let symmetry = set.to_string();
        refute_and_check(&[3, 4], 9, &symmetry, RefuteOptions::default());
        // R(3,3,3) = 17 (Greenwood & Gleason 1955). Without lex-leader or degree bounds
        // varisat does not finish (3,3,3;17) in test time (BENCHMARKS.md).
        if set.contains(Scheme::LexLeader) || set.contains(Scheme::DegreeBounds) {
            refute_and_check(&[3, 3, 3], 17, &symmetry, RefuteOptions::default());
        }
    }
    // The combinations minimality ships in (it does not combine with the others).
    for symmetry in ["minimality", "minimality,degree-bounds"] {
        refute_and_check(&[3, 4], 9, symmetry, RefuteOptions::default());
        refute_and_check(&[3, 3, 3], 17, symmetry, RefuteOptions::default());
    }
    for refused in ["minimality,lex-leader", "colour-swap,minimality"] {
        assert!(refused.parse::<SymmetrySet>().is_err(), "{refused}");
    }
}

#[test]
fn degree_bounds_name_their_premise() {
    // Degree bounds for (4,4;18) rest on R(3,4) <= 9 (Greenwood & Gleason 1955).
    let verdict = refute_and_check(
        &[4, 4],
        18,
        "lex-leader,degree-bounds",
        RefuteOptions::default(),
    );
    assert_eq!(verdict.premises.len(), 1);
    assert_eq!(verdict.premises[0].statement, "R(3,4) <= 9");
    assert!(verdict.premises[0].certified_by.is_none());
    assert!(!verdict.unconditional());
}

#[test]
fn text_and_gzip_traces_pass() {
    for (text, gzip) in [(true, false), (false, true), (true, true)] {
        for symmetry in ["colour-swap,lex-leader", "minimality"] {
            let options = RefuteOptions {
                text_proof: text,
                gzip_proof: gzip,
                ..RefuteOptions::default()
            };
            refute_and_check(&[3, 5], 14, symmetry, options);
        }
    }
}

#[test]
fn a_satisfiable_instance_writes_no_bundle() {
    // R(3,4) = 9: K8 has a good colouring, so there is nothing to refute.
    let instance = Instance::new(RamseySpec::cliques(&[3, 4]).unwrap(), 8).unwrap();
    let encoding = RamseyEncoding::with_symmetry(
        &instance,
        &"lex-leader".parse().unwrap(),
        &EncodingLimits::default(),
    )
    .unwrap();
    let dir = tempfile::tempdir().unwrap();
    let report = refute(
        &encoding,
        dir.path(),
        &RefuteOptions::default(),
        &AtomicBool::new(false),
        &AtomicU64::new(0),
    )
    .unwrap();
    assert!(matches!(report.result, RefuteResult::Found(_)));
    assert_eq!(
        std::fs::read_dir(dir.path()).unwrap().count(),
        0,
        "no bundle files and no temporary trace"
    );
}

#[test]
fn the_trace_size_is_counted_while_it_is_written() {
    // What `refute`'s progress line shows: the bytes of DRAT trace so far. R(4,4) = 18
    // (Greenwood & Gleason 1955; Radziszowski DS1).
    let instance = Instance::new(RamseySpec::cliques(&[4, 4]).unwrap(), 18).unwrap();
    let set: SymmetrySet = "lex-leader".parse().unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let seen = AtomicU64::new(0);
    let report = refute(
        &encoding,
        dir.path(),
        &RefuteOptions::default(),
        &AtomicBool::new(false),
        &seen,
    )
    .unwrap();
    let RefuteResult::Refuted { proof_bytes, .. } = report.result else {
        panic!("not refuted")
    };
    assert!(proof_bytes > 0);
    assert_eq!(seen.load(std::sync::atomic::Ordering::Relaxed), proof_bytes);
}

/// Runs one of the workspace's binaries with `args`.
fn run(program: &str, args: &[&str]) -> std::process::Output {
    std::process::Command::new(ramsift_tests::binaries::workspace_binary(program))
        .args(args)
        .output()
        .unwrap()
}

#[test]
fn refute_merge_and_the_checker_print_the_same_fingerprint() {
    // R(3,3) = 6 (Greenwood & Gleason 1955). The fingerprint is the SHA-256 of
    // manifest.json, which lists the SHA-256 of every other file.
    let dir = tempfile::tempdir().unwrap();
    let bundle = dir.path().join("b");
    let fingerprint_of = |program: &str, args: &[&str]| {
        let value: serde_json::Value =
            serde_json::from_slice(&run(program, args).stdout).expect("one JSON record");
        value["manifest_sha256"]
            .as_str()
            .expect("a fingerprint")
            .to_string()
    };
    let b = bundle.to_str().unwrap();
    let refuted = fingerprint_of("ramsift", &["refute", "3,3", "6", "--out", b, "--json"]);
    assert_eq!(
        refuted,
        ramsift_tests::bundle_files::sha256_of(&bundle.join("manifest.json"))
    );
    assert_eq!(
        fingerprint_of("ramsift-check", &["bundle", b, "--json"]),
        refuted
    );
    let plan = dir.path().join("plan");
    let merged = dir.path().join("merged");
    let (p, m) = (plan.to_str().unwrap(), merged.to_str().unwrap());
    let planned = run(
        "ramsift",
        &["shard", "plan", "3,3", "6", "--shards", "2", "--out", p],
    );
    assert_eq!(planned.status.code(), Some(0));
    assert_eq!(
        run("ramsift", &["shard", "local", p]).status.code(),
        Some(0)
    );
    let fingerprint = fingerprint_of("ramsift", &["shard", "merge", p, "--out", m, "--json"]);
    assert_eq!(
        fingerprint,
        ramsift_tests::bundle_files::sha256_of(&merged.join("manifest.json"))
    );
    assert_eq!(
        fingerprint_of("ramsift-check", &["bundle", m, "--json"]),
        fingerprint
    );
}

#[test]
fn bundles_and_witnesses_say_how_they_were_made() {
    // R(3,3) = 6 (Greenwood & Gleason 1955): a bundle at 6, a witness at 5.
    let dir = tempfile::tempdir().unwrap();
    let ramsift = |args: &[&str]| run("ramsift", args).status.code();
    let (bundle, witness) = (dir.path().join("b"), dir.path().join("w"));
    assert_eq!(
        ramsift(&[
            "refute",
            "3,3",
            "6",
            "-q",
            "--out",
            bundle.to_str().unwrap()
        ]),
        Some(20)
    );
    assert_eq!(
        ramsift(&["find", "3,3", "5", "-q", "--out", witness.to_str().unwrap()]),
        Some(10)
    );
    let json = |path: &std::path::Path| -> serde_json::Value {
        serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap()
    };
    for (record, command) in [
        (json(&bundle.join("manifest.json")), "refute"),
        (json(&witness.join("summary.json")), "find"),
    ] {
        let p = &record["provenance"];
        assert_eq!(p["command_line"][1], command, "{p}");
        assert_eq!(p["version"], env!("CARGO_PKG_VERSION"));
        assert!(p["date_utc"].as_str().unwrap().ends_with('Z'), "{p}");
        assert!(
            p["cores"].as_u64().unwrap() >= 1 && !p["source_revision"].as_str().unwrap().is_empty()
        );
    }
    let text = std::fs::read_to_string(witness.join("witness.colouring")).unwrap();
    assert!(
        text.lines().any(|l| l.starts_with("# made by ramsift ")),
        "{text}"
    );
    let parsed = ramsift_checker::colouring_file::parse_colouring_file("w", &text).unwrap();
    assert!(ramsift_checker::check_colouring(&parsed.matrix, &parsed.claim).is_valid());
}
