//! Bounded random-mutation tests of every input format the checker (and the
//! shard workflow) reads: DIMACS CNF, text and binary DRAT, LRAT, the bundle
//! manifest, the colouring file, graph6, and a plan's `plan.json` and shard
//! `result.json`. Each format gets at least 10,000 mutants of a real input made
//! by ramsift itself. No mutant may panic or run longer than a few seconds, and
//! every mutant the checker accepts is justified again independently: a proof by
//! the minimal forward RUP/RAT checker below (written apart from the checker's
//! backward one), a colouring by brute force over all vertex subsets.

use std::path::Path;
use std::sync::atomic::{AtomicBool, AtomicU64};
use std::time::{Duration, Instant};

use ramsift_checker::bundle::check_bundle;
use ramsift_checker::cnf::{parse_cnf, Cnf};
use ramsift_checker::colouring_file::parse_colouring_file;
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::{parse_drat, StepKind};
use ramsift_checker::graph6::decode_graph6_file;
use ramsift_checker::input::read_input;
use ramsift_checker::lrat::{check_lrat, parse_lrat, write_lrat, LratStep};
use ramsift_checker::{check_colouring, Claim, ClaimGraph, ColourMatrix};
use ramsift_driver::certify::refute::{refute, RefuteOptions, RefuteResult};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};

const MUTANTS: usize = 10_000;
/// The longest any single mutant may take: far above any honest run here.
const PER_MUTANT: Duration = Duration::from_secs(3);

/// SplitMix64 (Steele, Lea & Flood, OOPSLA 2014): a reproducible stream.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
}

/// Tokens a crafted file might hold at the edges of every range.
const SPICE: &[&str] = &[
    "0",
    "-0",
    "1",
    "-1",
    "2147483647",
    "-2147483647",
    "-2147483648",
    "2147483648",
    "99999999999999999999",
    "d",
    "c",
    "p",
    "cnf",
    " ",
    "\n",
    "\t",
    "a",
    "x",
    "-",
    "",
    "18446744073709551615",
    "9223372036854775807",
    "-9223372036854775808",
];

/// One random mutation: a bit flip, a byte replaced, a range deleted or doubled,
/// a spicy token inserted, or the tail cut.
fn mutate(rng: &mut Rng, base: &[u8]) -> Vec<u8> {
    let mut out = base.to_vec();
    for _ in 0..1 + rng.below(3) {
        let at = rng.below(out.len() + 1);
        match rng.below(6) {
            0 if at < out.len() => out[at] ^= 1 << rng.below(8),
            1 if at < out.len() => out[at] = rng.next() as u8,
            2 => {
                let end = (at + 1 + rng.below(16)).min(out.len());
                out.drain(at.min(end)..end);
            }
            3 => {
                let end = (at + 1 + rng.below(16)).min(out.len());
                let copy = out[at.min(end)..end].to_vec();
                out.splice(at..at, copy);
            }
            4 => {
                let token = SPICE[rng.below(SPICE.len())];
                out.splice(at..at, format!(" {token} ").bytes());
            }
            _ => out.truncate(at),
        }
    }
    out
}

/// Runs `MUTANTS` mutants of `base` through `judge`, timing each one.
fn fuzz(name: &str, seed: u64, base: &[u8], mut judge: impl FnMut(&[u8]) -> bool) {
    let mut rng = Rng(seed);
    let (mut accepted, mut slowest) = (0, Duration::ZERO);
    for _ in 0..MUTANTS {
        let mutant = mutate(&mut rng, base);
        let started = Instant::now();
        accepted += judge(&mutant) as usize;
        slowest = slowest.max(started.elapsed());
    }
    assert!(slowest < PER_MUTANT, "{name}: a mutant took {slowest:?}");
    eprintln!(
        "{name}: {MUTANTS} mutants, {accepted} accepted and re-justified, slowest {slowest:?}"
    );
}

/// A proof step for the reference checker.
enum Step {
    Add(Vec<i32>),
    Delete(Vec<i32>),
}

/// The minimal forward checker: unit propagation by repeated scans. A lemma that
/// is neither RUP nor RAT on its first literal is left out (a backward checker
/// may skip lemmas nothing uses); the proof is valid when the first empty lemma,
/// or at the end the empty clause, is RUP. Deletions of unit clauses and of
/// absent clauses are ignored, as the checker documents.
fn reference_refutes(formula: &[Vec<i32>], steps: &[Step]) -> bool {
    // Variables renamed densely so the assignment is a plain array.
    let mut index: std::collections::HashMap<u32, usize> = std::collections::HashMap::new();
    let mut dense = |clause: &[i32]| -> Vec<(usize, bool)> {
        clause
            .iter()
            .map(|&l| {
                let next = index.len();
                (*index.entry(l.unsigned_abs()).or_insert(next), l > 0)
            })
            .collect()
    };
    let formula: Vec<Vec<(usize, bool)>> = formula.iter().map(|c| dense(c)).collect();
    let steps: Vec<(bool, Vec<(usize, bool)>)> = steps
        .iter()
        .map(|s| match s {
            Step::Add(c) => (true, dense(c)),
            Step::Delete(c) => (false, dense(c)),
        })
        .collect();
    let mut value = vec![0i8; index.len()];
    let lit_value =
        |value: &[i8], (v, positive): (usize, bool)| if positive { value[v] } else { -value[v] };
    // Unit propagation by repeated scans under the negation of `lemma`.
    let mut rup = |db: &[Vec<(usize, bool)>], lemma: &[(usize, bool)]| -> bool {
        value.iter_mut().for_each(|x| *x = 0);
        for &(v, positive) in lemma {
            let want = if positive { -1 } else { 1 };
            if value[v] == -want {
                return true;
            }
            value[v] = want;
        }
        loop {
            let mut changed = false;
            for clause in db {
                let mut open = None;
                let mut count = 0;
                let mut satisfied = false;
                for &lit in clause {
                    match lit_value(&value, lit) {
                        1 => {
                            satisfied = true;
                            break;
                        }
                        0 if open != Some(lit) => {
                            count += 1;
                            open = Some(lit);
                        }
                        _ => {}
                    }
                }
                if satisfied {
                    continue;
                }
                match (count, open) {
                    (0, _) => return true,
                    (1, Some((v, positive))) => {
                        value[v] = if positive { 1 } else { -1 };
                        changed = true;
                    }
                    _ => {}
                }
            }
            if !changed {
                return false;
            }
        }
    };
    let same = |a: &[(usize, bool)], b: &[(usize, bool)]| {
        let (mut a, mut b) = (a.to_vec(), b.to_vec());
        a.sort_unstable();
        a.dedup();
        b.sort_unstable();
        b.dedup();
        a == b
    };
    // Each entry: a clause and whether it may propagate (failed lemmas stay as
    // RAT candidates and deletion targets, as in a backward checker's database).
    let mut db: Vec<(Vec<(usize, bool)>, bool)> = formula.into_iter().map(|c| (c, true)).collect();
    for (add, clause) in steps {
        if add {
            let valid: Vec<Vec<(usize, bool)>> =
                db.iter().filter(|e| e.1).map(|e| e.0.clone()).collect();
            let ok = rup(&valid, &clause)
                || clause.first().is_some_and(|&(v, positive)| {
                    db.iter()
                        .filter(|e| e.0.contains(&(v, !positive)))
                        .all(|(d, _)| {
                            let mut resolvent = clause.clone();
                            resolvent.extend(d.iter().copied().filter(|&l| l != (v, !positive)));
                            rup(&valid, &resolvent)
                        })
                });
            if clause.is_empty() {
                return ok;
            }
            db.push((clause, ok));
        } else if let Some(at) = db.iter().rposition(|e| same(&e.0, &clause)) {
            let mut key = clause.clone();
            key.sort_unstable();
            key.dedup();
            if key.len() > 1 {
                db.remove(at);
            }
        }
    }
    let valid: Vec<Vec<(usize, bool)>> = db.iter().filter(|e| e.1).map(|e| e.0.clone()).collect();
    rup(&valid, &[])
}

fn drat_steps(bytes: &[u8]) -> Option<Vec<Step>> {
    let steps = parse_drat("m", bytes).ok()?.to_steps();
    Some(
        steps
            .into_iter()
            .map(|s| match s.kind {
                StepKind::Add => Step::Add(s.literals),
                StepKind::Delete => Step::Delete(s.literals),
            })
            .collect(),
    )
}

/// A real bundle of R(a,b) <= n from ramsift refute (no symmetry breaking, so the
/// formula is the plain Ramsey formula; R(3,3)=6 and R(3,4)=9: Greenwood & Gleason
/// 1955; Radziszowski DS1).
fn make_bundle(dir: &Path, sizes: &[usize], order: usize, text_proof: bool) {
    let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), order).unwrap();
    let set: SymmetrySet = "none".parse().unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
    let options = RefuteOptions {
        text_proof,
        ..RefuteOptions::default()
    };
    let report = refute(
        &encoding,
        dir,
        &options,
        &AtomicBool::new(false),
        &AtomicU64::new(0),
    )
    .unwrap();
    assert!(matches!(report.result, RefuteResult::Refuted { .. }));
}

fn formula_of(dir: &Path) -> (Cnf, Vec<u8>) {
    let bytes = read_input(&dir.join("formula.cnf.gz")).unwrap();
    (parse_cnf("f", &bytes).unwrap(), bytes)
}

#[test]
fn cnf_mutants() {
    let dir = tempfile::tempdir().unwrap();
    make_bundle(dir.path(), &[3, 3], 6, true);
    let (_, text) = formula_of(dir.path());
    let proof = std::fs::read(dir.path().join("proof.drat.txt")).unwrap();
    let steps = parse_drat("p", &proof).unwrap();
    fuzz("CNF", 1, &text, |m| {
        let Ok(cnf) = parse_cnf("m", m) else {
            return false;
        };
        if check_drat(&cnf, &steps, false).is_err() {
            return false;
        }
        assert!(
            reference_refutes(&cnf.to_vecs(), &drat_steps(&proof).unwrap()),
            "accepted a proof of a mutated formula that the reference rejects: {}",
            String::from_utf8_lossy(m)
        );
        true
    });
}

fn proof_mutants(name: &str, seed: u64, text_proof: bool) {
    let dir = tempfile::tempdir().unwrap();
    make_bundle(dir.path(), &[3, 3], 6, text_proof);
    let (cnf, _) = formula_of(dir.path());
    let file = if text_proof {
        "proof.drat.txt"
    } else {
        "proof.drat"
    };
    let proof = std::fs::read(dir.path().join(file)).unwrap();
    assert!(check_drat(&cnf, &parse_drat("p", &proof).unwrap(), false).is_ok());
    fuzz(name, seed, &proof, |m| {
        let Ok(steps) = parse_drat("m", m) else {
            return false;
        };
        if check_drat(&cnf, &steps, false).is_err() {
            return false;
        }
        assert!(
            reference_refutes(&cnf.to_vecs(), &drat_steps(m).unwrap()),
            "{name}: accepted a mutant proof the reference rejects: {:?}",
            String::from_utf8_lossy(m)
        );
        true
    });
}

#[test]
fn text_drat_mutants() {
    proof_mutants("text DRAT", 2, true);
}

#[test]
fn binary_drat_mutants() {
    proof_mutants("binary DRAT", 3, false);
}

#[test]
fn lrat_mutants() {
    let dir = tempfile::tempdir().unwrap();
    make_bundle(dir.path(), &[3, 3], 6, true);
    let (cnf, _) = formula_of(dir.path());
    let proof = std::fs::read(dir.path().join("proof.drat.txt")).unwrap();
    let (_, lemmas) = check_drat(&cnf, &parse_drat("p", &proof).unwrap(), true).unwrap();
    let lrat = write_lrat(&lemmas.unwrap());
    fuzz("LRAT", 4, lrat.as_bytes(), |m| {
        let Ok(lines) = parse_lrat("m", m) else {
            return false;
        };
        if check_lrat(&cnf, &lines).is_err() {
            return false;
        }
        // Deletions by id become deletions by content for the reference.
        let mut by_id: std::collections::HashMap<u64, Vec<i32>> = (0..cnf.len())
            .map(|i| (i as u64 + 1, cnf.clause(i).to_vec()))
            .collect();
        let mut steps = Vec::new();
        for line in lines {
            match line.step {
                LratStep::Add(lemma) => {
                    by_id.insert(lemma.id, lemma.literals.clone());
                    let empty = lemma.literals.is_empty();
                    steps.push(Step::Add(lemma.literals));
                    if empty {
                        break;
                    }
                }
                LratStep::Delete { clauses, .. } => {
                    for id in clauses {
                        steps.extend(by_id.remove(&id).map(Step::Delete));
                    }
                }
            }
        }
        assert!(
            reference_refutes(&cnf.to_vecs(), &steps),
            "accepted LRAT mutant: {:?}",
            String::from_utf8_lossy(m)
        );
        true
    });
}

#[test]
fn manifest_mutants() {
    let dir = tempfile::tempdir().unwrap();
    make_bundle(dir.path(), &[3, 3], 6, false);
    let path = dir.path().join("manifest.json");
    let base = std::fs::read(&path).unwrap();
    fuzz("manifest", 5, &base, |m| {
        std::fs::write(&path, m).unwrap();
        match check_bundle(dir.path(), &[]) {
            Ok(verdict) if verdict.passed() => {
                // The formula must equal the claim's and the proof must refute it,
                // so only a claim with the same formula can pass: R(3,3) <= 6.
                assert_eq!(
                    verdict.claim,
                    "R(3,3) <= 6",
                    "{}",
                    String::from_utf8_lossy(m)
                );
                true
            }
            _ => false,
        }
    });
}

/// Whether some colour class holds its forbidden clique, by trying every subset.
fn brute_force_has_clique(matrix: &ColourMatrix, claim: &Claim) -> Option<bool> {
    let sizes = claim.clique_sizes()?;
    let n = matrix.order();
    if n > 16 {
        return None;
    }
    let found = (0u32..1 << n).any(|set| {
        let vertices: Vec<usize> = (0..n).filter(|v| set >> v & 1 == 1).collect();
        sizes.iter().enumerate().any(|(c, &k)| {
            vertices.len() == k
                && vertices.iter().enumerate().all(|(p, &a)| {
                    vertices[p + 1..]
                        .iter()
                        .all(|&b| matrix.colour(a, b) as usize == c + 1)
                })
        })
    });
    Some(found)
}

#[test]
fn colouring_file_mutants() {
    // The pentagon and its complement: the (3,3;5) colouring (Radziszowski DS1).
    let base = b"# pentagon\nramsift-colouring spec=3,3 order=5\n. 1 2 2 1\n1 . 1 2 2\n2 1 . 1 2\n2 2 1 . 1\n1 2 2 1 .\n";
    fuzz("colouring file", 6, base, |m| {
        let Ok(text) = std::str::from_utf8(m) else {
            return false;
        };
        let Ok(file) = parse_colouring_file("m", text) else {
            return false;
        };
        if !check_colouring(&file.matrix, &file.claim).is_valid() {
            return false;
        }
        if let Some(has) = brute_force_has_clique(&file.matrix, &file.claim) {
            assert!(
                !has,
                "accepted a colouring with a monochromatic clique: {text}"
            );
        }
        true
    });
}

#[test]
fn graph6_mutants() {
    // C5 ("Dhc", McKay's graph6 description), a (3,3)-colouring, and the Paley
    // graph of order 13 written by ramsift's graph6 writer, which has triangles in
    // both colours (1+3=4 among the quadratic residues {1,3,4,9,10,12} mod 13), so
    // its mutants exercise the rejecting path at a larger order.
    let paley = ramsift_tests::constructions::paley(13);
    let base = format!(
        ">>graph6<<Dhc\n{}\n",
        ramsift_driver::output::graph6::colour_one_graph6(&paley)
    );
    let claim = Claim {
        forbidden: vec![ClaimGraph::Clique(3), ClaimGraph::Clique(3)],
    };
    fuzz("graph6", 7, base.as_bytes(), |m| {
        let Ok(graphs) = decode_graph6_file("m", m) else {
            return false;
        };
        let mut any = false;
        for g in graphs
            .iter()
            .filter(|g| check_colouring(g, &claim).is_valid())
        {
            any = true;
            if g.order() <= 16 {
                assert_eq!(brute_force_has_clique(g, &claim), Some(false));
            }
        }
        any
    });
}

#[test]
fn plan_and_shard_result_mutants() {
    use ramsift_driver::shard::plan::{plan_sha256, Plan};
    use ramsift_driver::shard::result::complete_result;
    let dir = tempfile::tempdir().unwrap();
    let plan_dir = dir.path().join("plan");
    let status = std::process::Command::new(ramsift_tests::binaries::workspace_binary("ramsift"))
        .args([
            "shard",
            "plan",
            "3,4",
            "9",
            "--shards",
            "4",
            "--symmetry",
            "lex-leader",
            "--out",
        ])
        .arg(&plan_dir)
        .status()
        .unwrap();
    assert!(status.success());
    let status = std::process::Command::new(ramsift_tests::binaries::workspace_binary("ramsift"))
        .args(["shard", "run"])
        .arg(&plan_dir)
        .args(["--index", "0"])
        .status()
        .unwrap();
    assert_eq!(status.code(), Some(0));
    let plan_path = plan_dir.join("plan.json");
    let plan_base = std::fs::read(&plan_path).unwrap();
    fuzz("plan.json", 8, &plan_base, |m| {
        std::fs::write(&plan_path, m).unwrap();
        match Plan::read(&plan_dir) {
            Ok(plan) if plan.order <= 40 => plan.encoding().is_ok(),
            _ => false,
        }
    });
    std::fs::write(&plan_path, &plan_base).unwrap();
    let result_path = plan_dir.join("shards").join("00000").join("result.json");
    let result_base = std::fs::read(&result_path).unwrap();
    let sha = plan_sha256(&plan_dir).unwrap();
    assert!(complete_result(&plan_dir, 0, &sha).is_some());
    fuzz("result.json", 9, &result_base, |m| {
        std::fs::write(&result_path, m).unwrap();
        complete_result(&plan_dir, 0, &sha).is_some()
    });
}

/// The colourings of K6 in two colours (edge e's colour as bit 14 - e, so that
/// numeric order is the checker's order: edge index first, colour 1 smallest)
/// that are the least of their class under relabelling the vertices and
/// swapping the colours; written apart from the checker by brute force.
fn least_colourings_of_k6() -> Vec<u32> {
    let edges: Vec<(usize, usize)> = (1..6).flat_map(|j| (0..j).map(move |i| (i, j))).collect();
    let index = |a: usize, b: usize| {
        edges
            .iter()
            .position(|&e| e == (a.min(b), a.max(b)))
            .unwrap()
    };
    let mut perms: Vec<Vec<usize>> = vec![vec![]];
    for _ in 0..6 {
        let mut longer = Vec::new();
        for p in &perms {
            for v in (0..6).filter(|v| !p.contains(v)) {
                longer.push([p.clone(), vec![v]].concat());
            }
        }
        perms = longer;
    }
    let mut seen = vec![false; 1 << 15];
    let mut least = Vec::new();
    for colouring in 0u32..1 << 15 {
        if seen[colouring as usize] {
            continue;
        }
        least.push(colouring);
        for p in &perms {
            for swap in [0, (1 << 15) - 1] {
                let image = edges.iter().enumerate().fold(0u32, |acc, (e, &(a, b))| {
                    let bit = colouring >> (14 - e) & 1;
                    acc | bit << (14 - index(p[a], p[b]))
                });
                seen[(image ^ swap) as usize] = true;
            }
        }
    }
    least
}

/// Whether every least colouring of K6 satisfies `clause` (variable e+1 true is colour 1).
fn kept_by_every_least_colouring(least: &[u32], clause: &[i32]) -> bool {
    least.iter().all(|&c| {
        clause.iter().any(|&l| {
            let colour_one = c >> (14 - (l.unsigned_abs() - 1)) & 1 == 0;
            colour_one == (l > 0)
        })
    })
}

#[test]
fn minimality_certificate_mutants() {
    // R(3,3) <= 6 with the minimality scheme alone (R(3,3) = 6: Greenwood & Gleason 1955).
    let dir = tempfile::tempdir().unwrap();
    ramsift_tests::bundle_files::make_bundle("3,3", 6, "minimality", dir.path());
    let path = dir.path().join("minimality.txt");
    let base = std::fs::read(&path).unwrap();
    let least = least_colourings_of_k6();
    // 156 graphs on 6 vertices (OEIS A000088), none self-complementary (n = 2 mod 4),
    // so 78 classes up to colour swap; "edge {0,1} has colour 2" loses the least ones.
    assert_eq!(least.len(), 78);
    assert!(!kept_by_every_least_colouring(&least, &[-1]));
    fuzz("minimality certificate", 9, &base, |m| {
        std::fs::write(&path, m).unwrap();
        ramsift_tests::bundle_files::set_hash(dir.path(), "minimality.txt");
        match check_bundle(dir.path(), &[]) {
            Ok(verdict) if verdict.passed() => {
                // Every clause the checker took must keep the least member of every class.
                for line in String::from_utf8_lossy(m).lines().skip(2) {
                    let clause: Vec<i32> = line
                        .rsplit('/')
                        .next()
                        .unwrap()
                        .split_whitespace()
                        .map(|t| t.parse().unwrap())
                        .collect();
                    let clause = &clause[..clause.len() - 1];
                    assert!(
                        kept_by_every_least_colouring(&least, clause),
                        "unsound clause accepted: {line}"
                    );
                }
                true
            }
            _ => false,
        }
    });
}

#[test]
fn nested_premise_mutants() {
    // R(3,4) <= 9 resting on R(3,3) <= 6 in premises/ (both: Greenwood & Gleason 1955).
    let dir = tempfile::tempdir().unwrap();
    let top = dir.path().join("top");
    let refuted = std::process::Command::new(ramsift_tests::binaries::workspace_binary("ramsift"))
        .args(["refute", "3,4", "9", "-q", "--out"])
        .arg(&top)
        .stdout(std::process::Stdio::null())
        .status();
    assert_eq!(refuted.unwrap().code(), Some(20));
    let path = top.join("premises/R3-3-6/manifest.json");
    let base = std::fs::read(&path).unwrap();
    fuzz("nested premise manifest", 10, &base, |m| {
        std::fs::write(&path, m).unwrap();
        match check_bundle(&top, &[]) {
            Ok(verdict) if verdict.unconditional() => {
                // Only a premise bundle that proves R(3,3) <= 6 itself may certify it.
                assert_eq!(verdict.premises.len(), 1);
                assert_eq!(verdict.premises[0].statement, "R(3,3) <= 6");
                let premise = check_bundle(&top.join("premises/R3-3-6"), &[]).unwrap();
                assert_eq!(
                    premise.claim,
                    "R(3,3) <= 6",
                    "{}",
                    String::from_utf8_lossy(m)
                );
                true
            }
            _ => false,
        }
    });
}
