//! The minimality scheme end to end: bundles refuted with it pass the checker,
//! and every kind of damaged minimality certificate is rejected (the mutants of
//! the scheme's issue: a relabelling that does not decrease, one that is not a
//! permutation, a clause strengthened by dropping a literal, a witness taken from
//! another clause, an order that differs between manifest and file), as are
//! bundles that hide the clauses or combine the scheme unsoundly.

use std::path::Path;

use ramsift_checker::bundle::check_bundle;
use ramsift_tests::bundle_files::{
    copy_dir, edit_manifest, make_bundle, passes, set_hash, unlist_role,
};

/// Clause lines of the certificate: (vertex map, colour map, clause), as text.
fn clause_lines(dir: &Path) -> (Vec<String>, Vec<[String; 3]>) {
    let text = std::fs::read_to_string(dir.join("minimality.txt")).unwrap();
    let mut lines = text.lines();
    let header = vec![
        lines.next().unwrap().to_string(),
        lines.next().unwrap().to_string(),
    ];
    let clauses = lines
        .map(|l| {
            let parts: Vec<&str> = l.split('/').map(str::trim).collect();
            [
                parts[0].to_string(),
                parts[1].to_string(),
                parts[2].to_string(),
            ]
        })
        .collect();
    (header, clauses)
}

fn write_lines(dir: &Path, header: &[String], clauses: &[[String; 3]]) {
    let mut text = header.join("\n") + "\n";
    for [p, s, c] in clauses {
        text.push_str(&format!("{p} / {s} / {c}\n"));
    }
    std::fs::write(dir.join("minimality.txt"), text).unwrap();
    set_hash(dir, "minimality.txt");
}

#[test]
fn refutations_with_minimality_pass_in_every_shipped_combination() {
    let base = tempfile::tempdir().unwrap();
    // Upper bounds from Radziszowski DS1: R(3,5) = 14, R(4,4) = 18, R(3,3,3) = 17,
    // R(C4,C4) = 6 (Chvátal & Harary 1972), R(3,4) = 9.
    for (spec, order, symmetry) in [
        ("3,5", 14, "minimality"),
        ("4,4", 18, "minimality"),
        ("4,4", 18, "minimality,degree-bounds"),
        ("3,3,3", 17, "minimality,degree-bounds"),
        ("C4,C4", 6, "minimality"),
        ("3,4", 9, "minimality,degree-bounds"),
    ] {
        let dir = base.path().join(format!("{spec}-{order}-{symmetry}"));
        make_bundle(spec, order, symmetry, &dir);
        let verdict = check_bundle(&dir, &[]).unwrap();
        assert!(
            verdict.passed(),
            "{spec} {order} [{symmetry}]: {:?}",
            verdict.failure
        );
        assert!(
            verdict
                .passed
                .iter()
                .any(|s| s.contains("minimality clauses verified")),
            "{:?}",
            verdict.passed
        );
    }
}

/// Damages a copy of a bundle in place.
type Mutation = Box<dyn Fn(&Path)>;

#[test]
fn damaged_minimality_certificates_are_rejected() {
    let base = tempfile::tempdir().unwrap();
    let good = base.path().join("good");
    // R(4,4) <= 18 (Greenwood & Gleason 1955): equal colours, so colour maps occur.
    make_bundle("4,4", 18, "minimality", &good);
    assert!(passes(&good));
    let (header, clauses) = clause_lines(&good);
    assert!(
        clauses.len() >= 2,
        "the search added {} clauses",
        clauses.len()
    );
    // Control: rewriting the file unchanged (and re-hashing it) still passes, so
    // each mutant below fails for its damage, not for the rewriting.
    let control = base.path().join("control");
    copy_dir(&good, &control);
    write_lines(&control, &header, &clauses);
    assert!(passes(&control));
    let n = 18;
    let identity: Vec<String> = (0..n).map(|v| v.to_string()).collect();

    let mut mutants: Vec<(&str, Mutation)> = Vec::new();
    let (h, c) = (header.clone(), clauses.clone());
    mutants.push((
        "a relabelling that does not decrease (the identity)",
        Box::new(move |d| {
            let mut c = c.clone();
            c[0][0] = identity.join(" ");
            c[0][1] = "1 2".into();
            write_lines(d, &h, &c);
        }),
    ));
    let (h, c) = (header.clone(), clauses.clone());
    mutants.push((
        "a vertex map that is not a permutation",
        Box::new(move |d| {
            let mut c = c.clone();
            let mut p: Vec<&str> = c[0][0].split(' ').collect();
            p[1] = p[0];
            c[0][0] = p.join(" ");
            write_lines(d, &h, &c);
        }),
    ));
    let (h, c) = (header.clone(), clauses.clone());
    mutants.push((
        "a colour map that is not a permutation",
        Box::new(move |d| {
            let mut c = c.clone();
            c[0][1] = "1 1".into();
            write_lines(d, &h, &c);
        }),
    ));
    for k in 0..clauses.len().min(20) {
        let (h, c) = (header.clone(), clauses.clone());
        mutants.push((
            "a clause strengthened by dropping a literal",
            Box::new(move |d| {
                let mut c = c.clone();
                let mut lits: Vec<&str> = c[k][2].split(' ').collect();
                lits.remove(0);
                c[k][2] = lits.join(" ");
                write_lines(d, &h, &c);
            }),
        ));
    }
    let (h, c) = (header.clone(), clauses.clone());
    mutants.push((
        "a witness that belongs to another clause",
        Box::new(move |d| {
            let mut c = c.clone();
            let other = (1..c.len())
                .find(|&j| c[j][0] != c[0][0] && c[j][2] != c[0][2])
                .unwrap();
            c[0][2] = c[other][2].clone();
            c[other][2] = clauses[0][2].clone();
            write_lines(d, &h, &c);
        }),
    ));
    mutants.push((
        "an order in the manifest other than the file's",
        Box::new(|d| {
            edit_manifest(d, |m| {
                m["encoding"]["minimality_order"] = "row-major,colour-descending".into()
            })
        }),
    ));
    let c = clause_lines(&good).1;
    mutants.push((
        "an order in the file other than the manifest's",
        Box::new(move |d| {
            let header = vec![
                "ramsift minimality clauses 1".to_string(),
                format!("vertices {n} colours 2 order row-major,colour-descending"),
            ];
            write_lines(d, &header, &c);
        }),
    ));
    mutants.push((
        "the clauses left out of the manifest (the trace needs them)",
        Box::new(|d| unlist_role(d, "minimality-clauses")),
    ));
    mutants.push((
        "clauses given while the symmetry does not list minimality",
        Box::new(|d| edit_manifest(d, |m| m["encoding"]["symmetry"] = serde_json::json!([]))),
    ));
    mutants.push((
        "minimality combined with lex-leader",
        Box::new(|d| {
            edit_manifest(d, |m| {
                m["encoding"]["symmetry"] = serde_json::json!(["lex-leader", "minimality"])
            })
        }),
    ));
    for (k, (what, mutate)) in mutants.iter().enumerate() {
        let dir = base.path().join(format!("mutant{k}"));
        copy_dir(&good, &dir);
        mutate(&dir);
        assert!(!passes(&dir), "FALSE PASS of minimality mutant: {what}");
    }
}

#[test]
fn a_plain_drat_check_of_a_minimality_bundle_says_what_is_missing() {
    // R(3,4) = 9 (Greenwood & Gleason 1955): the trace needs the minimality
    // clauses, so a plain DRAT check fails and names minimality.txt.
    let dir = tempfile::tempdir().unwrap();
    ramsift_tests::bundle_files::make_bundle("3,4", 9, "minimality", dir.path());
    let o = std::process::Command::new(ramsift_tests::binaries::workspace_binary("ramsift-check"))
        .args(["drat", "formula.cnf.gz", "proof.drat"])
        .current_dir(dir.path())
        .output()
        .unwrap();
    let out = String::from_utf8_lossy(&o.stdout);
    assert_eq!(o.status.code(), Some(1), "{out}");
    assert!(
        out.contains("minimality.txt") && out.contains("ramsift-check bundle"),
        "{out}"
    );
}
