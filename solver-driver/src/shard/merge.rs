//! Merging a finished plan into one certificate bundle: every shard's trace (with
//! its cube) and the coverage tree, and optionally one DRAT trace of the whole
//! formula composed from the shard traces.
//!
//! Composition (the cube-and-conquer proof composition of Heule, Kullmann & Marek,
//! SAT 2016): each lemma L of shard i becomes L ∨ ¬cube_i, which is RUP wherever L
//! was RUP under the cube; after shard i comes the clause ¬cube_i itself. Then, from
//! the leaves up, each split node with path P gets ¬P, which is RUP from its two
//! children's clauses ¬(P ∧ v) and ¬(P ∧ ¬v); the root's is the empty clause.
//! Deletions of the shard traces are left out (keeping clauses is always sound).

use std::io::{self, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicUsize, Ordering};

use anyhow::{bail, Context, Result};

use ramsift_checker::drat_parse::{parse_drat, StepKind};
use ramsift_encoder::atomic_file::{ensure_dir, write_atomically};
use ramsift_encoder::dimacs::write_encoding_to;

use super::plan::{Plan, PlanTree};
use super::run::{complete_result, plan_encoding, plan_sha256, read_plan};
use super::status::{array_list, plan_status};
use super::{shard_dir, PLAN_FILE};
use crate::certify::bundle::{
    claim_of, encoding_record, premise_records, write_guide, write_manifest_and_guide, FileRecord,
    Manifest, ShardingRecord, BUNDLE_FORMAT, FORMULA_FILE,
};
use crate::certify::refute::{certify_premises, RefuteOptions};

/// What the merge wrote.
#[derive(Clone, Debug)]
pub struct MergeReport {
    pub files: Vec<PathBuf>,
    pub shard_seconds: f64,
    pub trace_bytes: u64,
    pub composed_trace: Option<PathBuf>,
}

/// Binary DRAT encoding of one addition.
fn write_binary_lemma(out: &mut dyn Write, literals: &[i32]) -> io::Result<()> {
    let mut bytes = vec![b'a'];
    for &l in literals {
        let mut u = if l > 0 {
            2 * l as u64
        } else {
            2 * (-(l as i64)) as u64 + 1
        };
        loop {
            let low = (u & 0x7f) as u8;
            u >>= 7;
            if u == 0 {
                bytes.push(low);
                break;
            }
            bytes.push(low | 0x80);
        }
    }
    bytes.push(0);
    out.write_all(&bytes)
}

fn with_negated_cube(lemma: &[i32], cube: &[i32]) -> Vec<i32> {
    let mut clause = lemma.to_vec();
    for &c in cube {
        if !clause.contains(&-c) {
            clause.push(-c);
        }
    }
    clause
}

fn compose(plan: &Plan, plan_dir: &Path, out: &mut dyn Write) -> Result<()> {
    for cube in &plan.cubes {
        let path = shard_dir(plan_dir, cube.index).join(super::SHARD_PROOF_FILE);
        let bytes = std::fs::read(&path).with_context(|| format!("reading {}", path.display()))?;
        let steps = parse_drat(&path.display().to_string(), &bytes)?;
        for step in steps.iter().filter(|s| s.kind == StepKind::Add) {
            write_binary_lemma(out, &with_negated_cube(&step.literals, &cube.literals))?;
        }
        write_binary_lemma(out, &with_negated_cube(&[], &cube.literals))?;
    }
    fn internal(tree: &PlanTree, path: &mut Vec<i32>, out: &mut dyn Write) -> io::Result<()> {
        if let PlanTree::Split {
            split,
            positive,
            negative,
        } = tree
        {
            path.push(*split);
            internal(positive, path, out)?;
            path.pop();
            path.push(-split);
            internal(negative, path, out)?;
            path.pop();
            write_binary_lemma(out, &with_negated_cube(&[], path))?;
        }
        Ok(())
    }
    internal(&plan.tree, &mut Vec::new(), out)?;
    Ok(())
}

/// Merges the plan in `plan_dir` into a bundle in `out_dir`.
pub fn merge(
    plan_dir: &Path,
    out_dir: &Path,
    single_trace: bool,
    certify: bool,
) -> Result<MergeReport> {
    merge_counted(
        plan_dir,
        out_dir,
        single_trace,
        certify,
        &AtomicUsize::new(0),
    )
}

/// [`merge`], counting in `shards_copied` the shard traces taken in (for progress).
pub fn merge_counted(
    plan_dir: &Path,
    out_dir: &Path,
    single_trace: bool,
    certify: bool,
    shards_copied: &AtomicUsize,
) -> Result<MergeReport> {
    let plan = read_plan(plan_dir)?;
    let status = plan_status(plan_dir, plan.cubes.len());
    if let Some(&i) = status.found.first() {
        bail!(
            "shard {i} found a colouring of K_{} with no monochromatic forbidden graph, so the claim R({}) <= {} is FALSE; witness: {}",
            plan.order,
            plan.spec,
            plan.order,
            super::run::witness_path(plan_dir, i).display()
        );
    }
    let pending = status.to_resubmit();
    if !pending.is_empty() {
        bail!(
            "{} of {} shards are not done ({} damaged, {} missing); run them first, e.g. sbatch --array={} {}/submit.sbatch",
            pending.len(),
            plan.cubes.len(),
            status.damaged.len(),
            status.missing.len(),
            array_list(&pending),
            plan_dir.display()
        );
    }
    let encoding = plan_encoding(&plan)?;
    let plan_sha256 = plan_sha256(plan_dir).context("hashing the plan")?;
    ensure_dir(out_dir)?;
    let shards_out = out_dir.join("shards");
    ensure_dir(&shards_out)?;
    let formula_path = out_dir.join(FORMULA_FILE);
    write_encoding_to(&encoding, &formula_path)?;
    let mut files = vec![FileRecord::of(
        out_dir,
        FORMULA_FILE,
        "formula",
        "DIMACS CNF, gzip",
    )?];
    let mut written = vec![formula_path];
    let mut shard_seconds = 0.0;
    let mut trace_bytes = 0;
    for cube in &plan.cubes {
        let result = complete_result(plan_dir, cube.index, &plan_sha256)
            .context("a shard result changed during the merge")?;
        shard_seconds += result.seconds;
        let name = format!("shards/{:05}.drat", cube.index);
        let source = shard_dir(plan_dir, cube.index).join(super::SHARD_PROOF_FILE);
        let content = std::fs::read(&source)?;
        write_atomically(&out_dir.join(&name), |w| w.write_all(&content))?;
        let mut record = FileRecord::of(
            out_dir,
            &name,
            "shard-proof",
            "binary DRAT of formula and cube",
        )?;
        if Some(&record.sha256) != result.proof_sha256.as_ref() {
            bail!("shard {}: the trace changed during the merge", cube.index);
        }
        trace_bytes += record.bytes;
        record.shard = Some(cube.index);
        record.cube = Some(cube.literals.clone());
        files.push(record);
        written.push(out_dir.join(&name));
        shards_copied.fetch_add(1, Ordering::Relaxed);
    }
    let plan_copy = std::fs::read(plan_dir.join(PLAN_FILE))?;
    write_atomically(&out_dir.join(PLAN_FILE), |w| w.write_all(&plan_copy))?;
    files.push(FileRecord::of(
        out_dir,
        PLAN_FILE,
        "plan",
        "ramsift plan (JSON)",
    )?);
    written.push(out_dir.join(PLAN_FILE));
    let mut composed_trace = None;
    if single_trace {
        let path = out_dir.join("proof.drat");
        write_atomically(&path, |w| {
            compose(&plan, plan_dir, w).map_err(io::Error::other)
        })?;
        files.push(FileRecord::of(
            out_dir,
            "proof.drat",
            "drat-proof",
            "binary DRAT, composed from the shards",
        )?);
        written.push(path.clone());
        composed_trace = Some(path);
    }
    let manifest = Manifest {
        bundle_format: BUNDLE_FORMAT.to_string(),
        claim: claim_of(&encoding),
        encoding: encoding_record(&encoding),
        premises: premise_records(&encoding),
        tool: format!("ramsift {}", env!("CARGO_PKG_VERSION")),
        solver: crate::SOLVER_NAME.to_string(),
        solve_seconds: shard_seconds,
        files,
        sharding: Some(ShardingRecord {
            shards: plan.cubes.len(),
            tree: plan.tree.clone(),
        }),
    };
    written.extend(write_manifest_and_guide(out_dir, &manifest)?);
    if certify {
        let stop = std::sync::atomic::AtomicBool::new(false);
        written.extend(certify_premises(
            &manifest.premises,
            encoding.symmetry(),
            out_dir,
            &RefuteOptions::default(),
            &stop,
        )?);
        write_guide(out_dir, &manifest)?;
    }
    Ok(MergeReport {
        files: written,
        shard_seconds,
        trace_bytes,
        composed_trace,
    })
}
