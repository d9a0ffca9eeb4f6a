//! Sharded refutation end to end: on local cores, and on a real Slurm cluster
//! (a single-node cluster that `.ci/run` starts). Slurm tests say so and return when
//! no cluster answers, unless RAMSIFT_REQUIRE_SLURM=1 (set by CI), where they fail.

use std::path::Path;
use std::process::{Command, Output};
use std::time::{Duration, Instant};

use ramsift_checker::bundle::check_bundle;

fn ramsift(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_ramsift"))
        .args(args)
        .output()
        .expect("ramsift runs")
}

fn ok(o: &Output, code: i32) -> String {
    let out = String::from_utf8_lossy(&o.stdout).into_owned();
    assert_eq!(
        o.status.code(),
        Some(code),
        "stdout: {out}\nstderr: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    out
}

fn s(p: &Path) -> &str {
    p.to_str().unwrap()
}

/// Plans R(4,4) <= 18 (Greenwood & Gleason 1955; Radziszowski DS1) into 16 shards.
fn plan_r44(dir: &Path) {
    let out = ok(
        &ramsift(&[
            "shard",
            "plan",
            "4,4",
            "18",
            "--shards",
            "16",
            "--symmetry",
            "colour-swap,lex-leader",
            "--out",
            s(dir),
        ]),
        0,
    );
    assert!(out.contains("as 16 shards"), "{out}");
}

/// Plans `spec` at `order` into 8 shards with the default symmetry; the account.
fn plan_with_default_symmetry(spec: &str, order: &str, plan: &Path) -> String {
    ok(
        &ramsift(&[
            "shard",
            "plan",
            spec,
            order,
            "--shards",
            "8",
            "--out",
            s(plan),
        ]),
        0,
    )
}

/// Merges the plan with a composed single trace; the bundle must pass as `claim`.
fn merge_and_check(
    plan: &Path,
    bundle: &Path,
    claim: &str,
) -> ramsift_checker::bundle::BundleVerdict {
    ok(
        &ramsift(&[
            "shard",
            "merge",
            s(plan),
            "--out",
            s(bundle),
            "--single-trace",
        ]),
        20,
    );
    let verdict = check_bundle(bundle, &[]).unwrap();
    assert!(verdict.passed(), "{:?}", verdict.failure);
    assert_eq!(verdict.claim, claim);
    verdict
}

#[test]
fn local_shards_merge_into_a_passing_bundle_and_damage_is_caught() {
    let base = tempfile::tempdir().unwrap();
    let plan = base.path().join("plan");
    plan_r44(&plan);
    let status = ok(&ramsift(&["shard", "status", s(&plan)]), 1);
    assert!(
        status.contains("0 done")
            && status.contains("16 missing")
            && status.contains("--array=0-15"),
        "{status}"
    );
    let bundle = base.path().join("early");
    let refused = ramsift(&["shard", "merge", s(&plan), "--out", s(&bundle)]);
    assert_eq!(refused.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&refused.stderr).contains("16 of 16 shards are not done"));

    ok(&ramsift(&["shard", "local", s(&plan)]), 0);
    let again = ok(&ramsift(&["shard", "local", s(&plan)]), 0);
    assert!(
        again.contains("ran 0 shards"),
        "finished shards are skipped: {again}"
    );
    let status = ok(&ramsift(&["shard", "status", s(&plan), "--json"]), 0);
    let status: serde_json::Value = serde_json::from_str(&status).unwrap();
    assert_eq!(status["done"], 16);

    let bundle = base.path().join("bundle");
    let verdict = merge_and_check(&plan, &bundle, "R(4,4) <= 18");
    assert!(verdict
        .passed
        .iter()
        .any(|p| p.contains("coverage tree complete (16 cubes)")));

    // A corrupted shard result is caught at merge.
    let proof = plan.join("shards").join("00003").join("proof.drat");
    let mut bytes = std::fs::read(&proof).unwrap();
    bytes[2] ^= 0x01;
    std::fs::write(&proof, bytes).unwrap();
    let status = ok(&ramsift(&["shard", "status", s(&plan)]), 1);
    assert!(
        status.contains("1 damaged") && status.contains("--array=3"),
        "{status}"
    );
    let refused = ramsift(&[
        "shard",
        "merge",
        s(&plan),
        "--out",
        s(&base.path().join("bad")),
    ]);
    assert_eq!(refused.status.code(), Some(2));
    // Rerunning repairs it.
    ok(&ramsift(&["shard", "run", s(&plan), "--index", "3"]), 0);
    ok(
        &ramsift(&[
            "shard",
            "merge",
            s(&plan),
            "--out",
            s(&base.path().join("repaired")),
        ]),
        20,
    );
    assert!(check_bundle(&base.path().join("repaired"), &[])
        .unwrap()
        .passed());

    // A shard trace edited inside the bundle, hash and all, fails the check.
    let shard_trace = bundle.join("shards").join("00005.drat");
    let steps = ramsift_checker::drat_parse::parse_drat("p", &std::fs::read(&shard_trace).unwrap())
        .unwrap();
    let cut = steps.step(steps.len() / 2).offset as usize;
    let bytes = std::fs::read(&shard_trace).unwrap();
    std::fs::write(&shard_trace, &bytes[..cut]).unwrap();
    let hash = ramsift_driver::certify::bundle::hash_file(&shard_trace)
        .unwrap()
        .0;
    let manifest_path = bundle.join("manifest.json");
    let mut manifest: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&manifest_path).unwrap()).unwrap();
    for f in manifest["files"].as_array_mut().unwrap() {
        if f["name"] == "shards/00005.drat" {
            f["sha256"] = hash.clone().into();
        }
    }
    // Drop the composed trace, so only the shard traces carry the refutation.
    manifest["files"]
        .as_array_mut()
        .unwrap()
        .retain(|f| f["role"] != "drat-proof");
    std::fs::write(&manifest_path, serde_json::to_string(&manifest).unwrap()).unwrap();
    let verdict = check_bundle(&bundle, &[]).unwrap();
    assert!(!verdict.passed());
    assert!(verdict.failure.unwrap().contains("shard 5"));
}

#[test]
fn shards_of_a_graph_ramsey_refutation_merge_into_a_passing_bundle() {
    // R(C4,K4) = 10 (Chvátal & Harary 1972; DS1, from memory; confirmed in
    // tests/tests/graph_ramsey.rs). The default symmetry for graphs leaves out
    // degree bounds.
    let dir = tempfile::tempdir().unwrap();
    let plan = dir.path().join("plan");
    let out = plan_with_default_symmetry("C4,4", "10", &plan);
    // The planner splits until 8 cubes are open or nothing is left to split: here
    // lookahead settles every branch after two splits, so the plan is smaller.
    let plan_json: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(plan.join("plan.json")).unwrap()).unwrap();
    let cubes = plan_json["cubes"].as_array().unwrap().len();
    assert!((2..=8).contains(&cubes), "{out}");
    assert!(out.contains(&format!("as {cubes} shards")), "{out}");
    ok(&ramsift(&["shard", "local", s(&plan)]), 0);
    merge_and_check(&plan, &dir.path().join("bundle"), "R(C4,4) <= 10");
}

#[test]
fn a_sharded_r37_23_with_the_minimality_search_merges_into_a_passing_bundle() {
    // R(3,7) = 23 (Graver & Yackel 1968; Radziszowski DS1). The default plan runs
    // every shard with the minimality search; merge joins their clauses, and the
    // checker verifies them before the shard traces and the composed trace.
    let dir = tempfile::tempdir().unwrap();
    let plan = dir.path().join("plan");
    let out = plan_with_default_symmetry("3,7", "23", &plan);
    assert!(out.contains("[degree-bounds,minimality]"), "{out}");
    ok(&ramsift(&["shard", "local", s(&plan)]), 0);
    assert!(plan
        .join("shards")
        .join("00000")
        .join("minimality.txt")
        .is_file());
    let bundle = dir.path().join("bundle");
    let verdict = merge_and_check(&plan, &bundle, "R(3,7) <= 23");
    assert!(
        verdict
            .passed
            .iter()
            .any(|p| p.contains("minimality clauses verified")),
        "{:?}",
        verdict.passed
    );
    assert!(
        verdict.unconditional(),
        "merge certifies the premise R(3,6) <= 18 too"
    );
}

#[test]
fn slurm_script_has_the_array_and_chunks_large_plans() {
    let base = tempfile::tempdir().unwrap();
    let plan = base.path().join("plan");
    plan_r44(&plan);
    ok(
        &ramsift(&[
            "shard",
            "slurm",
            s(&plan),
            "--throttle",
            "4",
            "--time",
            "0:10:00",
            "--mem",
            "1G",
        ]),
        0,
    );
    let script = std::fs::read_to_string(plan.join("submit.sbatch")).unwrap();
    assert!(script.contains("#SBATCH --array=0-15%4"), "{script}");
    assert!(script.contains("#SBATCH --time=0:10:00") && script.contains("#SBATCH --mem=1G"));
    assert!(script.contains("shard run") && script.contains("SLURM_ARRAY_TASK_ID + 0"));
    ok(
        &ramsift(&["shard", "slurm", s(&plan), "--max-array-size", "10"]),
        0,
    );
    let second = std::fs::read_to_string(plan.join("submit-001.sbatch")).unwrap();
    assert!(
        second.contains("#SBATCH --array=0-5") && second.contains("SLURM_ARRAY_TASK_ID + 10"),
        "{second}"
    );
}

/// Whether a Slurm cluster answers; otherwise skip (or fail under CI).
fn slurm_available() -> bool {
    let up = Command::new("scontrol")
        .arg("ping")
        .output()
        .map(|o| String::from_utf8_lossy(&o.stdout).contains("UP"))
        .unwrap_or(false);
    if !up {
        if std::env::var("RAMSIFT_REQUIRE_SLURM").as_deref() == Ok("1") {
            panic!("RAMSIFT_REQUIRE_SLURM=1 but no Slurm controller answers `scontrol ping` (is SLURM_CONF set?)");
        }
        eprintln!("SKIPPED: no Slurm cluster answers `scontrol ping`; start one with `bash .ci/single-node-slurm.sh start` and export SLURM_CONF");
    }
    up
}

fn sbatch(args: &[&str]) -> Output {
    Command::new("sbatch")
        .args(args)
        .output()
        .expect("sbatch runs")
}

fn queue_is_empty(job: &str) -> bool {
    let o = Command::new("squeue")
        .args(["-h", "-j", job])
        .output()
        .unwrap();
    String::from_utf8_lossy(&o.stdout).trim().is_empty()
}

#[test]
fn slurm_job_array_refutes_and_survives_a_killed_shard() {
    if !slurm_available() {
        return;
    }
    let base = tempfile::tempdir().unwrap();
    let plan = base.path().join("plan");
    plan_r44(&plan);
    ok(
        &ramsift(&["shard", "slurm", s(&plan), "--throttle", "8"]),
        0,
    );
    let script = plan.join("submit.sbatch");

    // Shard 0 alone, held so it is still running when it is cancelled.
    let o = sbatch(&[
        "--parsable",
        "--array=0",
        "--export=ALL,RAMSIFT_SHARD_HOLD_SECONDS=60",
        s(&script),
    ]);
    let held = String::from_utf8_lossy(&o.stdout)
        .trim()
        .split(';')
        .next()
        .unwrap()
        .to_string();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let started = Instant::now();
    while !plan.join("shards").join("00000").exists() {
        assert!(
            started.elapsed() < Duration::from_secs(60),
            "shard 0 never started"
        );
        std::thread::sleep(Duration::from_millis(100));
    }
    std::thread::sleep(Duration::from_millis(300));
    assert!(Command::new("scancel")
        .arg(&held)
        .status()
        .unwrap()
        .success());
    while !queue_is_empty(&held) {
        assert!(
            started.elapsed() < Duration::from_secs(120),
            "cancelled job still queued"
        );
        std::thread::sleep(Duration::from_millis(100));
    }
    let status = ok(&ramsift(&["shard", "status", s(&plan)]), 1);
    assert!(
        status.contains("16 missing (1 with partial files"),
        "the killed shard is reported: {status}"
    );

    // The rest of the array, then the resubmission that status suggests.
    let o = sbatch(&["--wait", "--array=1-15", s(&script)]);
    assert!(
        o.status.success(),
        "array failed: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    let status = ok(&ramsift(&["shard", "status", s(&plan)]), 1);
    assert!(
        status.contains("15 done") && status.contains("--array=0 "),
        "{status}"
    );
    let o = sbatch(&["--wait", "--array=0", s(&script)]);
    assert!(
        o.status.success(),
        "resubmission failed: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    ok(&ramsift(&["shard", "status", s(&plan)]), 0);

    let bundle = base.path().join("bundle");
    merge_and_check(&plan, &bundle, "R(4,4) <= 18");
}

#[test]
fn results_of_another_plan_never_count() {
    let base = tempfile::tempdir().unwrap();
    let (first, second) = (base.path().join("first"), base.path().join("second"));
    // R(3,4) = 9 and R(3,5) = 14 (Greenwood & Gleason 1955; Radziszowski DS1), 2 shards each.
    for (dir, spec, n) in [(&first, "3,4", "9"), (&second, "3,5", "14")] {
        ok(
            &ramsift(&[
                "shard",
                "plan",
                spec,
                n,
                "--shards",
                "2",
                "--symmetry",
                "lex-leader",
                "--out",
                s(dir),
            ]),
            0,
        );
    }
    ok(&ramsift(&["shard", "local", s(&first)]), 0);
    // The directory is reused for another plan by hand: its old results must not count.
    std::fs::copy(second.join("plan.json"), first.join("plan.json")).unwrap();
    let status = ok(&ramsift(&["shard", "status", s(&first)]), 1);
    assert!(status.contains("0 done"), "{status}");
    let refused = ramsift(&[
        "shard",
        "merge",
        s(&first),
        "--out",
        s(&base.path().join("bundle")),
    ]);
    assert_eq!(refused.status.code(), Some(2));
    // Running again redoes the shards for the plan now in place, and the merge passes.
    ok(&ramsift(&["shard", "local", s(&first)]), 0);
    merge_and_check(&first, &base.path().join("merged"), "R(3,5) <= 14");
}

#[test]
fn a_shard_that_finds_a_colouring_says_the_claim_is_false_and_keeps_the_witness() {
    let base = tempfile::tempdir().unwrap();
    let plan = base.path().join("plan");
    // R(3,3) = 6 (Greenwood & Gleason 1955): K_5 has a good colouring, so the claim
    // R(3,3) <= 5 that the plan sets out to prove is false.
    ok(
        &ramsift(&[
            "shard",
            "plan",
            "3,3",
            "5",
            "--shards",
            "2",
            "--symmetry",
            "none",
            "--out",
            s(&plan),
        ]),
        0,
    );
    let out = ok(&ramsift(&["shard", "local", s(&plan)]), 10);
    assert!(
        out.contains("the claim R(3,3) <= 5 is FALSE; witness: "),
        "{out}"
    );
    let witness = out
        .split("witness: ")
        .nth(1)
        .unwrap()
        .lines()
        .next()
        .unwrap()
        .trim()
        .to_string();
    let file = ramsift_checker::colouring_file::parse_colouring_file(
        "w",
        &std::fs::read_to_string(&witness).unwrap(),
    )
    .unwrap();
    assert!(ramsift_checker::check_colouring(&file.matrix, &file.claim).is_valid());
    let refused = ramsift(&[
        "shard",
        "merge",
        s(&plan),
        "--out",
        s(&base.path().join("bundle")),
    ]);
    assert_eq!(refused.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&refused.stderr).contains("is FALSE; witness: "));
}

#[test]
fn manifests_name_the_solver_that_ran() {
    // R(3,3) = 6 (Greenwood & Gleason 1955): refuted single and sharded, with the
    // minimality scheme (our hooked solver runs) and with static schemes (varisat).
    let dir = tempfile::tempdir().unwrap();
    let solver_of = |bundle: &Path| -> String {
        let manifest: serde_json::Value =
            serde_json::from_str(&std::fs::read_to_string(bundle.join("manifest.json")).unwrap())
                .unwrap();
        let guide = std::fs::read_to_string(bundle.join("REFEREE.txt")).unwrap();
        let solver = manifest["solver"].as_str().unwrap().to_string();
        assert!(guide.contains(&solver), "{guide}");
        solver
    };
    for (symmetry, expected) in [
        ("minimality", ramsift_driver::HOOKED_SOLVER_NAME),
        ("colour-swap,lex-leader", ramsift_driver::SOLVER_NAME),
    ] {
        let single = dir.path().join(format!("single-{symmetry}"));
        ok(
            &ramsift(&[
                "refute",
                "3,3",
                "6",
                "--symmetry",
                symmetry,
                "--out",
                s(&single),
                "-q",
            ]),
            20,
        );
        assert_eq!(solver_of(&single), expected, "single, {symmetry}");
        let plan = dir.path().join(format!("plan-{symmetry}"));
        let args = [
            "shard",
            "plan",
            "3,3",
            "6",
            "--shards",
            "4",
            "--symmetry",
            symmetry,
            "--out",
            s(&plan),
        ];
        ok(&ramsift(&args), 0);
        ok(&ramsift(&["shard", "local", s(&plan)]), 0);
        let merged = dir.path().join(format!("merged-{symmetry}"));
        ok(
            &ramsift(&["shard", "merge", s(&plan), "--out", s(&merged)]),
            20,
        );
        assert_eq!(solver_of(&merged), expected, "sharded, {symmetry}");
    }
}
