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

use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};

use ramsift_checker::drat_parse::{parse_drat, StepKind};
use ramsift_encoder::atomic_file::{ensure_dir, persist_finished, temporary_in, write_atomically};
use ramsift_encoder::dimacs::write_encoding_to;

use super::error::ShardError;
use super::plan::{plan_sha256, Cube, Plan, PlanTree};
use super::result::{recorded_result, witness_path, ShardResult};
use super::status::{array_list, classify_shards};
use super::{shard_dir, PLAN_FILE, SHARD_PROOF_FILE};
use crate::certify::bundle::{
    sha256_hex, write_manifest_and_guide, FileRecord, Manifest, ShardingRecord, FORMULA_FILE,
};
use crate::certify::drat_write::write_addition;
use crate::certify::referee_guide::write_guide;
use crate::certify::refute::{certify_premises, RefuteOptions};
use crate::minimality::certificate::{CertificateWriter, CERTIFICATE_FILE, CERTIFICATE_FORMAT};
use ramsift_encoder::Scheme;

/// What the merge wrote.
#[derive(Clone, Debug)]
pub struct MergeReport {
    pub files: Vec<PathBuf>,
    pub shard_seconds: f64,
    pub trace_bytes: u64,
    pub composed_trace: Option<PathBuf>,
}

/// The name of the composed trace in a sharded bundle.
const COMPOSED_FILE: &str = "proof.drat";

fn with_negated_cube(lemma: &[i32], cube: &[i32]) -> Vec<i32> {
    let mut clause = lemma.to_vec();
    for &c in cube {
        if !clause.contains(&-c) {
            clause.push(-c);
        }
    }
    clause
}

/// Appends shard `cube`'s part of the composed trace: each added lemma with the
/// cube negated, then the negated cube itself.
fn compose_shard(cube: &Cube, trace: &[u8], out: &mut dyn Write) -> Result<(), ShardError> {
    let steps = parse_drat(&format!("shard {}", cube.index), trace).map_err(|e| {
        ShardError::TraceUnreadable {
            index: cube.index,
            message: e.to_string(),
        }
    })?;
    let io = |e| ShardError::io(COMPOSED_FILE)(e);
    for (_, literals, _) in steps.iter().filter(|(kind, _, _)| *kind == StepKind::Add) {
        write_addition(out, &with_negated_cube(literals, &cube.literals)).map_err(io)?;
    }
    write_addition(out, &with_negated_cube(&[], &cube.literals)).map_err(io)
}

/// Appends the coverage tree's lemmas, leaves up: ¬P for each split node with path P.
fn compose_tree(tree: &PlanTree, path: &mut Vec<i32>, out: &mut dyn Write) -> std::io::Result<()> {
    if let PlanTree::Split {
        split,
        positive,
        negative,
    } = tree
    {
        path.push(*split);
        compose_tree(positive, path, out)?;
        path.pop();
        path.push(-split);
        compose_tree(negative, path, out)?;
        path.pop();
        write_addition(out, &with_negated_cube(&[], path))?;
    }
    Ok(())
}

/// Merges the plan in `plan_dir` into a bundle in `out_dir`.
pub fn merge(
    plan_dir: &Path,
    out_dir: &Path,
    single_trace: bool,
    certify: bool,
) -> Result<MergeReport, ShardError> {
    merge_counted(
        plan_dir,
        out_dir,
        single_trace,
        certify,
        &AtomicUsize::new(0),
    )
}

/// Every shard's result record, once all are there and refuted: a shard that
/// found a colouring makes the claim false, and missing or damaged records are
/// listed for resubmission.
fn finished_results(
    plan_dir: &Path,
    plan: &Plan,
    plan_sha256: &str,
) -> Result<Vec<ShardResult>, ShardError> {
    // The records alone: each trace is hashed once, when it is taken in.
    let read = |index| recorded_result(plan_dir, index, plan_sha256);
    let (status, results) = classify_shards(plan_dir, plan.cubes.len(), read);
    if let Some(&index) = status.found.first() {
        return Err(ShardError::ClaimFalse {
            index,
            order: plan.order,
            spec: plan.spec.clone(),
            witness: witness_path(plan_dir, index),
        });
    }
    let pending = status.to_resubmit();
    if pending.is_empty() {
        return Ok(results);
    }
    Err(ShardError::NotDone {
        pending: pending.len(),
        shards: plan.cubes.len(),
        damaged: status.damaged.len(),
        missing: status.missing.len(),
        array: array_list(&pending),
        plan_dir: plan_dir.to_path_buf(),
    })
}

/// [`merge`], counting in `shards_copied` the shard traces taken in (for progress).
/// Each trace is read once: hashed against its result record, copied into the
/// bundle, and (with `single_trace`) composed.
pub fn merge_counted(
    plan_dir: &Path,
    out_dir: &Path,
    single_trace: bool,
    certify: bool,
    shards_copied: &AtomicUsize,
) -> Result<MergeReport, ShardError> {
    let plan = Plan::read(plan_dir)?;
    let plan_sha256 = plan_sha256(plan_dir).ok_or_else(|| ShardError::NotAPlan {
        path: plan_dir.join(PLAN_FILE),
        message: "it cannot be read to be hashed".into(),
    })?;
    let results = finished_results(plan_dir, &plan, &plan_sha256)?;
    let encoding = plan.encoding()?;
    ensure_dir(&out_dir.join("shards")).map_err(ShardError::io(out_dir))?;
    let formula_path = out_dir.join(FORMULA_FILE);
    write_encoding_to(&encoding, &formula_path).map_err(ShardError::io(&formula_path))?;
    let mut files = vec![
        FileRecord::of(out_dir, FORMULA_FILE, "formula", "DIMACS CNF, gzip")
            .map_err(ShardError::io(&formula_path))?,
    ];
    let mut composer = single_trace.then(|| Composer::start(out_dir)).transpose()?;
    let (mut shard_seconds, mut trace_bytes) = (0.0, 0);
    let mut minimality = encoding
        .symmetry()
        .contains(Scheme::Minimality)
        .then(|| MinimalityMerger::new(plan.order, encoding.instance().colours()));
    for (cube, result) in plan.cubes.iter().zip(&results) {
        shard_seconds += result.seconds;
        if let Some(merger) = &mut minimality {
            merger.take_in(plan_dir, cube.index, result)?;
        }
        let out = composer.as_mut().map(|c| &mut c.writer as &mut dyn Write);
        let record = take_in_shard(plan_dir, out_dir, cube, result, out)?;
        trace_bytes += record.bytes;
        files.push(record);
        shards_copied.fetch_add(1, Ordering::Relaxed);
    }
    files.push(copy_plan(plan_dir, out_dir)?);
    if let Some(merger) = minimality {
        files.push(merger.write(out_dir)?);
    }
    if let Some(composer) = composer {
        files.push(composer.finish(&plan.tree, out_dir)?);
    }
    let composed_trace = single_trace.then(|| out_dir.join(COMPOSED_FILE));
    let mut written: Vec<PathBuf> = files.iter().map(|f| out_dir.join(&f.name)).collect();
    let sharding = ShardingRecord {
        shards: plan.cubes.len(),
        tree: plan.tree.clone(),
    };
    let manifest = Manifest::new(&encoding, files, shard_seconds, Some(sharding));
    written.extend(write_manifest_and_guide(out_dir, &manifest).map_err(ShardError::io(out_dir))?);
    if certify {
        let (options, stop) = (RefuteOptions::default(), AtomicBool::new(false));
        written.extend(certify_premises(
            &manifest.premises,
            encoding.symmetry(),
            out_dir,
            &options,
            &stop,
        )?);
        write_guide(out_dir, &manifest).map_err(ShardError::io(out_dir))?;
    }
    Ok(MergeReport {
        files: written,
        shard_seconds,
        trace_bytes,
        composed_trace,
    })
}

/// Copies plan.json into the bundle.
fn copy_plan(plan_dir: &Path, out_dir: &Path) -> Result<FileRecord, ShardError> {
    let plan_path = plan_dir.join(PLAN_FILE);
    let plan_copy = std::fs::read(&plan_path).map_err(ShardError::io(&plan_path))?;
    let plan_out = out_dir.join(PLAN_FILE);
    write_atomically(&plan_out, |w| w.write_all(&plan_copy)).map_err(ShardError::io(&plan_out))?;
    Ok(FileRecord::of_bytes(
        PLAN_FILE,
        "plan",
        "ramsift plan (JSON)",
        &plan_copy,
    ))
}

/// The composed single trace, written to a temporary file in the bundle while the
/// shards are taken in, and renamed into place when complete.
struct Composer {
    file: tempfile::NamedTempFile,
    writer: BufWriter<std::fs::File>,
}

impl Composer {
    fn start(out_dir: &Path) -> Result<Composer, ShardError> {
        let file = temporary_in(out_dir, ".proof.").map_err(ShardError::io(out_dir))?;
        let handle = file
            .as_file()
            .try_clone()
            .map_err(ShardError::io(out_dir))?;
        Ok(Composer {
            file,
            writer: BufWriter::with_capacity(1 << 20, handle),
        })
    }

    /// Appends the coverage tree's lemmas and puts the trace in place.
    fn finish(mut self, tree: &PlanTree, out_dir: &Path) -> Result<FileRecord, ShardError> {
        let path = out_dir.join(COMPOSED_FILE);
        compose_tree(tree, &mut Vec::new(), &mut self.writer).map_err(ShardError::io(&path))?;
        self.writer.flush().map_err(ShardError::io(&path))?;
        drop(self.writer);
        persist_finished(self.file, &path).map_err(ShardError::io(&path))?;
        FileRecord::of(
            out_dir,
            COMPOSED_FILE,
            "drat-proof",
            "binary DRAT, composed from the shards",
        )
        .map_err(ShardError::io(&path))
    }
}

/// The union of the shards' minimality clauses, each valid on its own (its
/// witness does not depend on the cube), as one file for the bundle.
struct MinimalityMerger {
    text: String,
}

impl MinimalityMerger {
    fn new(order: usize, colours: usize) -> Self {
        let header = CertificateWriter::new(Vec::new(), order, colours)
            .and_then(|w| w.finish())
            .expect("writing to memory cannot fail");
        MinimalityMerger {
            text: String::from_utf8(header).expect("the header is text"),
        }
    }

    /// Appends shard `index`'s clause lines, after checking their recorded hash.
    fn take_in(
        &mut self,
        plan_dir: &Path,
        index: usize,
        result: &ShardResult,
    ) -> Result<(), ShardError> {
        let path = shard_dir(plan_dir, index).join(CERTIFICATE_FILE);
        let content = std::fs::read_to_string(&path).map_err(ShardError::io(&path))?;
        if result.minimality_sha256.as_deref() != Some(sha256_hex(content.as_bytes()).as_str()) {
            return Err(ShardError::TraceChanged { index });
        }
        for line in content.lines().skip(2) {
            self.text.push_str(line);
            self.text.push('\n');
        }
        Ok(())
    }

    fn write(self, out_dir: &Path) -> Result<FileRecord, ShardError> {
        let path = out_dir.join(CERTIFICATE_FILE);
        write_atomically(&path, |w| w.write_all(self.text.as_bytes()))
            .map_err(ShardError::io(&path))?;
        Ok(FileRecord::of_bytes(
            CERTIFICATE_FILE,
            "minimality-clauses",
            CERTIFICATE_FORMAT,
            self.text.as_bytes(),
        ))
    }
}

/// Reads shard `cube`'s trace once: checks it against its result record, copies
/// it into the bundle and, when composing, appends its part of the single trace.
fn take_in_shard(
    plan_dir: &Path,
    out_dir: &Path,
    cube: &Cube,
    result: &ShardResult,
    composer: Option<&mut dyn Write>,
) -> Result<FileRecord, ShardError> {
    let source = shard_dir(plan_dir, cube.index)
        .join(result.proof_file.as_deref().unwrap_or(SHARD_PROOF_FILE));
    let content = std::fs::read(&source).map_err(ShardError::io(&source))?;
    if Some(sha256_hex(&content)) != result.proof_sha256 {
        return Err(ShardError::TraceChanged { index: cube.index });
    }
    let name = format!("shards/{:05}.drat", cube.index);
    let target = out_dir.join(&name);
    write_atomically(&target, |w| w.write_all(&content)).map_err(ShardError::io(&target))?;
    if let Some(out) = composer {
        compose_shard(cube, &content, out)?;
    }
    let mut record = FileRecord::of_bytes(
        &name,
        "shard-proof",
        "binary DRAT of formula and cube",
        &content,
    );
    record.shard = Some(cube.index);
    record.cube = Some(cube.literals.clone());
    Ok(record)
}
