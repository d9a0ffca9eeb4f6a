//! Mutation tests of the checker: real traces and bundles are damaged in many ways,
//! and every mutant that is not a refutation (as judged by the plain reference in
//! `ramsift_tests::reference_drat`, or invalid by construction) must be rejected.
//! No false accept is tolerated; the counts are printed (run with --nocapture).

use std::path::Path;
use std::sync::atomic::{AtomicBool, AtomicU64};

use ramsift_checker::bundle::check_bundle;
use ramsift_checker::cnf::{parse_cnf, Cnf};
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::{parse_drat, DratProof, DratStep, StepKind};
use ramsift_checker::input::read_input;
use ramsift_driver::certify::refute::{refute, RefuteOptions, RefuteResult};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};
use ramsift_tests::bundle_files::{
    copy_dir, edit_manifest, make_bundle, passes, set_hash, unlist_role,
};
use ramsift_tests::reference_drat::reference_refutes;

/// A tiny deterministic generator (xorshift), so the mutants are the same every run.
struct Rng(u64);
impl Rng {
    fn below(&mut self, n: usize) -> usize {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        (self.0 % n.max(1) as u64) as usize
    }
}

fn make_cliques_bundle(sizes: &[usize], order: usize, symmetry: &str, dir: &Path) {
    let spec: Vec<String> = sizes.iter().map(|k| k.to_string()).collect();
    make_bundle(&spec.join(","), order, symmetry, dir);
}

fn load(dir: &Path) -> (Cnf, Vec<DratStep>) {
    let cnf = parse_cnf("f", &read_input(&dir.join("formula.cnf.gz")).unwrap()).unwrap();
    let steps = parse_drat("p", &read_input(&dir.join("proof.drat")).unwrap())
        .unwrap()
        .to_steps();
    (cnf, steps)
}

fn as_reference(steps: &[DratStep]) -> Vec<(bool, Vec<i32>)> {
    steps
        .iter()
        .map(|s| (s.kind == StepKind::Add, s.literals.clone()))
        .collect()
}

#[derive(Default, Debug)]
struct Tally {
    must_reject: usize,
    rejected: usize,
    harmless: usize,
}

/// Judges one mutant: if the reference finds no refutation, ours must reject it.
fn judge(tally: &mut Tally, what: &str, cnf: &Cnf, steps: &[DratStep]) {
    let reference = reference_refutes(cnf.variables, &cnf.to_vecs(), &as_reference(steps));
    let ours = check_drat(cnf, &DratProof::from_steps(steps), false).is_ok();
    if reference {
        tally.harmless += 1;
        return;
    }
    tally.must_reject += 1;
    assert!(!ours, "FALSE ACCEPT of mutant: {what}");
    tally.rejected += 1;
}

fn mutate_trace(
    sizes: &[usize],
    order: usize,
    symmetry: &str,
    mutants_per_kind: usize,
    seed: u64,
) -> Tally {
    let dir = tempfile::tempdir().unwrap();
    make_cliques_bundle(sizes, order, symmetry, dir.path());
    let (cnf, steps) = load(dir.path());
    assert!(
        check_drat(&cnf, &DratProof::from_steps(&steps), false).is_ok(),
        "the unmutated trace passes"
    );
    assert!(reference_refutes(
        cnf.variables,
        &cnf.to_vecs(),
        &as_reference(&steps)
    ));
    let adds: Vec<usize> = (0..steps.len())
        .filter(|&i| steps[i].kind == StepKind::Add)
        .collect();
    let mut rng = Rng(seed);
    let mut tally = Tally::default();
    for _ in 0..mutants_per_kind {
        // A lemma deleted.
        let i = adds[rng.below(adds.len())];
        let mut m = steps.clone();
        m.remove(i);
        judge(&mut tally, &format!("lemma {i} deleted"), &cnf, &m);
        // A literal flipped.
        let i = adds[rng.below(adds.len())];
        let mut m = steps.clone();
        if !m[i].literals.is_empty() {
            let k = rng.below(m[i].literals.len());
            m[i].literals[k] = -m[i].literals[k];
            judge(
                &mut tally,
                &format!("literal {k} of lemma {i} flipped"),
                &cnf,
                &m,
            );
        }
        // Truncation.
        let cut = rng.below(steps.len());
        judge(
            &mut tally,
            &format!("truncated to {cut} steps"),
            &cnf,
            &steps[..cut],
        );
        // A lemma moved before its antecedents (to the front).
        let i = adds[rng.below(adds.len())];
        let mut m = steps.clone();
        let lemma = m.remove(i);
        m.insert(0, lemma);
        judge(
            &mut tally,
            &format!("lemma {i} moved to the front"),
            &cnf,
            &m,
        );
        // A clause dropped from the formula.
        let j = rng.below(cnf.len());
        let mut clauses = cnf.to_vecs();
        clauses.remove(j);
        let weaker = Cnf::new(cnf.variables, clauses);
        judge(
            &mut tally,
            &format!("formula clause {j} dropped"),
            &weaker,
            &steps,
        );
    }
    tally
}

#[test]
fn damaged_traces_are_rejected() {
    let mut total = Tally::default();
    // Real traces of R(3,3) <= 6 and R(2,3,3) <= 6 (no symmetry breaking), R(3,4) <= 9
    // (lex-leader) and R(3,5) <= 14 (colour-swap, lex-leader): Greenwood & Gleason 1955;
    // Radziszowski DS1; R(2,3,3) = R(3,3) by definition.
    for (sizes, order, symmetry, count, seed) in [
        (&[3, 3][..], 6, "none", 60, 0x9e37_79b9_7f4a_7c15u64),
        (&[2, 3, 3][..], 6, "none", 40, 0x5851_f42d_4c95_7f2d),
        (&[3, 4][..], 9, "lex-leader", 40, 0x2545_f491_4f6c_dd1d),
        (
            &[3, 5][..],
            14,
            "colour-swap,lex-leader",
            60,
            0x1234_5678_9abc_def1,
        ),
    ] {
        let t = mutate_trace(sizes, order, symmetry, count, seed);
        println!("({sizes:?};{order}) [{symmetry}]: {t:?}");
        total.must_reject += t.must_reject;
        total.rejected += t.rejected;
        total.harmless += t.harmless;
    }
    println!(
        "trace mutants: {} invalid, all {} rejected; {} harmless (still a refutation)",
        total.must_reject, total.rejected, total.harmless
    );
    assert!(
        total.must_reject >= 200,
        "only {} invalid mutants",
        total.must_reject
    );
    assert_eq!(total.rejected, total.must_reject);
}

fn gzip_cnf(dir: &Path, cnf: &Cnf) {
    let mut text = format!("p cnf {} {}\n", cnf.variables, cnf.len());
    for c in cnf.clauses() {
        for l in c {
            text.push_str(&format!("{l} "));
        }
        text.push_str("0\n");
    }
    ramsift_encoder::atomic_file::write_atomically(&dir.join("formula.cnf.gz"), |w| {
        w.write_all(text.as_bytes())
    })
    .unwrap();
}

#[test]
fn damaged_bundles_fail() {
    let base = tempfile::tempdir().unwrap();
    let good = base.path().join("good");
    // R(4,4) <= 18 (Greenwood & Gleason 1955): equal colours, so colour-swap matters.
    make_cliques_bundle(&[4, 4], 18, "colour-swap,lex-leader", &good);
    assert!(check_bundle(&good, &[]).unwrap().passed());
    let other = base.path().join("other");
    make_cliques_bundle(&[3, 3], 6, "colour-swap,lex-leader", &other);

    type Mutation = Box<dyn Fn(&Path)>;
    let mut mutations: Vec<(String, Mutation)> = Vec::new();
    // R(4,4) = 18 (Greenwood & Gleason 1955): claims at orders 17 and below are false,
    // and at 19 the bundled formula is not that claim's formula.
    for order in [3usize, 5, 10, 16, 17, 19, 25] {
        mutations.push((
            format!("manifest order {order}"),
            Box::new(move |d: &Path| {
                edit_manifest(d, |m| {
                    m["claim"]["order"] = order.into();
                    m["claim"]["statement"] = format!("R(4,4) <= {order}").into();
                })
            }),
        ));
    }
    for sizes in [
        vec![3, 3],
        vec![3, 4],
        vec![4, 5],
        vec![5, 4],
        vec![4, 4, 4],
    ] {
        mutations.push((
            format!("manifest clique sizes {sizes:?}"),
            Box::new(move |d: &Path| {
                let list: Vec<String> = sizes.iter().map(|k| k.to_string()).collect();
                edit_manifest(d, |m| {
                    m["claim"]["clique_sizes"] = serde_json::json!(sizes);
                    m["claim"]["statement"] = format!("R({}) <= 18", list.join(",")).into();
                })
            }),
        ));
    }
    mutations.push((
        "statement disagrees with the fields".into(),
        Box::new(|d: &Path| edit_manifest(d, |m| m["claim"]["statement"] = "R(4,4) <= 17".into())),
    ));
    for symmetry in [
        vec![],
        vec!["lex-leader"],
        vec!["colour-swap"],
        vec!["degree-bounds"],
        vec!["no-such-scheme"],
    ] {
        mutations.push((
            format!("symmetry {symmetry:?}"),
            Box::new(move |d: &Path| {
                edit_manifest(d, |m| {
                    m["encoding"]["symmetry"] = serde_json::json!(symmetry)
                })
            }),
        ));
    }
    for (file, position) in [
        ("proof.drat", 0usize),
        ("proof.drat", 63),
        ("formula.cnf.gz", 5),
        ("formula.cnf.gz", 40),
    ] {
        mutations.push((
            format!("hash of {file} edited at {position}"),
            Box::new(move |d: &Path| {
                edit_manifest(d, |m| {
                    for f in m["files"].as_array_mut().unwrap() {
                        if f["name"] == file {
                            let mut h: Vec<char> = f["sha256"].as_str().unwrap().chars().collect();
                            h[position] = if h[position] == '0' { '1' } else { '0' };
                            f["sha256"] = h.into_iter().collect::<String>().into();
                        }
                    }
                })
            }),
        ));
    }
    mutations.push((
        "proof file missing".into(),
        Box::new(|d: &Path| std::fs::remove_file(d.join("proof.drat")).unwrap()),
    ));
    mutations.push((
        "formula file missing".into(),
        Box::new(|d: &Path| std::fs::remove_file(d.join("formula.cnf.gz")).unwrap()),
    ));
    mutations.push((
        "proof not listed".into(),
        Box::new(|d: &Path| unlist_role(d, "drat-proof")),
    ));
    mutations.push((
        "proof byte flipped (hash left stale)".into(),
        Box::new(|d: &Path| {
            let p = d.join("proof.drat");
            let mut bytes = std::fs::read(&p).unwrap();
            bytes[1] ^= 0x02;
            std::fs::write(&p, bytes).unwrap();
        }),
    ));
    for keep in [0.0, 0.3, 0.6, 0.9] {
        mutations.push((
            format!("proof truncated to {:.0}% (hash updated)", keep * 100.0),
            Box::new(move |d: &Path| {
                let p = d.join("proof.drat");
                let steps = parse_drat("p", &std::fs::read(&p).unwrap()).unwrap();
                let cut = steps.step((steps.len() as f64 * keep) as usize).offset as usize;
                let bytes = std::fs::read(&p).unwrap();
                std::fs::write(&p, &bytes[..cut]).unwrap();
                set_hash(d, "proof.drat");
            }),
        ));
    }
    let other_dir = other.clone();
    mutations.push((
        "proof of another claim (hash updated)".into(),
        Box::new(move |d: &Path| {
            std::fs::copy(other_dir.join("proof.drat"), d.join("proof.drat")).unwrap();
            set_hash(d, "proof.drat");
        }),
    ));
    let other_dir = other.clone();
    mutations.push((
        "formula of another claim (hash updated)".into(),
        Box::new(move |d: &Path| {
            std::fs::copy(other_dir.join("formula.cnf.gz"), d.join("formula.cnf.gz")).unwrap();
            set_hash(d, "formula.cnf.gz");
        }),
    ));
    for drop in [0usize, 17, 1000, 6000] {
        mutations.push((
            format!("formula clause {drop} dropped (hash updated)"),
            Box::new(move |d: &Path| {
                let cnf = parse_cnf("f", &read_input(&d.join("formula.cnf.gz")).unwrap()).unwrap();
                let mut clauses = cnf.to_vecs();
                clauses.remove(drop);
                gzip_cnf(d, &Cnf::new(cnf.variables, clauses));
                set_hash(d, "formula.cnf.gz");
            }),
        ));
    }
    mutations.push((
        "extra clause added to the formula (hash updated)".into(),
        Box::new(|d: &Path| {
            let mut cnf = parse_cnf("f", &read_input(&d.join("formula.cnf.gz")).unwrap()).unwrap();
            cnf.push(&[1]);
            gzip_cnf(d, &cnf);
            set_hash(d, "formula.cnf.gz");
        }),
    ));

    let mut rejected = 0;
    for (i, (what, mutate)) in mutations.iter().enumerate() {
        let dir = base.path().join(format!("m{i}"));
        copy_dir(&good, &dir);
        mutate(&dir);
        match check_bundle(&dir, &[]) {
            Ok(verdict) => assert!(!verdict.passed(), "FALSE PASS of bundle mutant: {what}"),
            Err(_unreadable) => {}
        }
        rejected += 1;
    }
    println!(
        "bundle mutants: {} made, {rejected} rejected",
        mutations.len()
    );
    assert!(rejected >= 30);
}

#[test]
fn graph_bundle_mutants_are_rejected() {
    // R(C4,K4) = 10 (Chvátal & Harary 1972; DS1, from memory, confirmed in
    // graph_ramsey.rs): a bundle for it, then claims about other graphs.
    let base = tempfile::tempdir().unwrap();
    let good = base.path().join("good");
    let instance = Instance::new("C4,4".parse::<RamseySpec>().unwrap(), 10).unwrap();
    let set: SymmetrySet = "colour-swap,lex-leader".parse().unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
    let report = refute(
        &encoding,
        &good,
        &RefuteOptions::default(),
        &AtomicBool::new(false),
        &AtomicU64::new(0),
    )
    .unwrap();
    assert!(matches!(report.result, RefuteResult::Refuted { .. }));
    assert!(check_bundle(&good, &[]).unwrap().passed());
    // Each list names a different claim (K2:2 would be C4 itself, so it is absent).
    let claims: [&[&str]; 7] = [
        &["C5", "4"],
        &["4", "C4"],
        &["C4", "3"],
        &["C4", "5"],
        &["P4", "4"],
        &["C4", "K4-e"],
        &["C4", "4", "4"],
    ];
    let mut rejected = 0;
    for (i, entries) in claims.iter().enumerate() {
        let dir = base.path().join(format!("g{i}"));
        copy_dir(&good, &dir);
        edit_manifest(&dir, |m| {
            m["claim"]["forbidden"] = serde_json::json!(entries)
        });
        match check_bundle(&dir, &[]) {
            Ok(verdict) => assert!(!verdict.passed(), "FALSE PASS for claim {entries:?}"),
            Err(_unreadable) => {}
        }
        rejected += 1;
    }
    // And the order: R(C4,K4) > 9, so a claim at 9 must fail.
    let dir = base.path().join("order9");
    copy_dir(&good, &dir);
    edit_manifest(&dir, |m| m["claim"]["order"] = 9.into());
    assert!(!passes(&dir));
    assert_eq!(rejected, claims.len());
}
