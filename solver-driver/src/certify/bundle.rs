//! The certificate bundle written by `ramsift refute` and `ramsift shard merge`:
//! the exact CNF that was solved, the DRAT trace(s), and `manifest.json` (what is
//! claimed, how, and the SHA-256 of every file), built by the one constructor
//! [`Manifest::new`]; `REFEREE.txt` is written by [`super::referee_guide`].

use std::io::{self, Read};
use std::path::{Path, PathBuf};

use serde::Serialize;
use sha2::{Digest, Sha256};

use crate::output::json_file::write_json;
use ramsift_encoder::RamseyEncoding;

pub const MANIFEST_FILE: &str = "manifest.json";
pub const GUIDE_FILE: &str = "REFEREE.txt";
pub const FORMULA_FILE: &str = "formula.cnf.gz";
/// The identifier of this bundle layout, checked by `ramsift-check bundle`.
pub const BUNDLE_FORMAT: &str = "ramsift-bundle 1";

#[derive(Clone, Debug, Serialize)]
pub struct Manifest {
    pub bundle_format: String,
    pub claim: Claim,
    pub encoding: EncodingRecord,
    pub premises: Vec<PremiseRecord>,
    pub tool: String,
    pub solver: String,
    pub solve_seconds: f64,
    /// The command, version, revision, date and machine of the run that wrote it.
    pub provenance: super::provenance::Provenance,
    pub files: Vec<FileRecord>,
    /// For a sharded refutation: the coverage tree of the cubes.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sharding: Option<ShardingRecord>,
}

#[derive(Clone, Debug, Serialize)]
pub struct ShardingRecord {
    pub shards: usize,
    /// Splits `{"split": v, "positive": …, "negative": …}` down to `{"leaf": i}`.
    pub tree: crate::shard::PlanTree,
}

#[derive(Clone, Debug, Serialize)]
pub struct Claim {
    /// `R(4,4) <= 18`
    pub statement: String,
    pub spec: String,
    /// Present when every colour forbids a clique.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub clique_sizes: Option<Vec<usize>>,
    /// The specification's entries, present when a colour forbids another graph
    /// (`["C4", "4"]`); the checker reads them with its own parser.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub forbidden: Option<Vec<String>>,
    pub order: usize,
    pub meaning: String,
}

#[derive(Clone, Debug, Serialize)]
pub struct EncodingRecord {
    pub variables: usize,
    pub clauses: u64,
    pub symmetry: Vec<String>,
    pub justifications: Vec<SchemeRecord>,
    /// With the minimality scheme: the order its clauses decrease in.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub minimality_order: Option<String>,
}

#[derive(Clone, Debug, Serialize)]
pub struct SchemeRecord {
    pub scheme: String,
    pub justification: String,
}

#[derive(Clone, Debug, Serialize)]
pub struct PremiseRecord {
    pub statement: String,
    pub clique_sizes: Vec<usize>,
    pub upper_bound: usize,
    pub source: String,
}

#[derive(Clone, Debug, Serialize)]
pub struct FileRecord {
    pub name: String,
    pub role: String,
    pub format: String,
    pub bytes: u64,
    pub sha256: String,
    /// For a shard's trace: the shard's index and cube.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub shard: Option<usize>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub cube: Option<Vec<i32>>,
}

impl FileRecord {
    /// A record of a file whose content is `content` (already in memory).
    pub fn of_bytes(name: &str, role: &str, format: &str, content: &[u8]) -> Self {
        FileRecord {
            name: name.to_string(),
            role: role.to_string(),
            format: format.to_string(),
            bytes: content.len() as u64,
            sha256: sha256_hex(content),
            shard: None,
            cube: None,
        }
    }

    /// A record of a file in `dir`, hashing it.
    pub fn of(dir: &Path, name: &str, role: &str, format: &str) -> io::Result<Self> {
        let (sha256, bytes) = hash_file(&dir.join(name))?;
        Ok(FileRecord {
            name: name.to_string(),
            role: role.to_string(),
            format: format.to_string(),
            bytes,
            sha256,
            shard: None,
            cube: None,
        })
    }
}

/// SHA-256 of bytes, as lowercase hex.
pub fn sha256_hex(bytes: &[u8]) -> String {
    Sha256::digest(bytes)
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// SHA-256 of a file, as lowercase hex, and its size.
pub fn hash_file(path: &Path) -> io::Result<(String, u64)> {
    let mut file = std::fs::File::open(path)?;
    let mut hasher = Sha256::new();
    let mut buffer = vec![0u8; 1 << 16];
    let mut total = 0u64;
    loop {
        let n = file.read(&mut buffer)?;
        if n == 0 {
            break;
        }
        hasher.update(&buffer[..n]);
        total += n as u64;
    }
    let hex: String = hasher
        .finalize()
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect();
    Ok((hex, total))
}

/// A bundle's fingerprint: the SHA-256 of its manifest.json, which lists the
/// SHA-256 of every other file (the one number an author quotes).
pub fn fingerprint(dir: &Path) -> io::Result<String> {
    Ok(hash_file(&dir.join("manifest.json"))?.0)
}

impl Manifest {
    /// The manifest of a refutation of `encoding` by the proof files `files`
    /// (the formula first), found in `solve_seconds` (summed over shards, if sharded).
    pub fn new(
        encoding: &RamseyEncoding,
        files: Vec<FileRecord>,
        solve_seconds: f64,
        sharding: Option<ShardingRecord>,
    ) -> Self {
        Manifest {
            bundle_format: BUNDLE_FORMAT.to_string(),
            claim: claim_of(encoding),
            encoding: encoding_record(encoding),
            premises: premise_records(encoding),
            tool: format!("ramsift {}", env!("CARGO_PKG_VERSION")),
            // The refutation runs the hooked solver exactly when the minimality
            // scheme is used (certify::refute, shard::run), varisat otherwise.
            solver: if encoding
                .symmetry()
                .contains(ramsift_encoder::Scheme::Minimality)
            {
                crate::HOOKED_SOLVER_NAME
            } else {
                crate::SOLVER_NAME
            }
            .to_string(),
            solve_seconds,
            provenance: super::provenance::Provenance::of_this_run(),
            files,
            sharding,
        }
    }
}

/// The claim part of a manifest.
pub fn claim_of(encoding: &RamseyEncoding) -> Claim {
    let instance = encoding.instance();
    let spec = instance.spec();
    let colours: Vec<String> = spec
        .forbidden()
        .iter()
        .enumerate()
        .map(|(i, g)| format!("a colour-{} {g}", i + 1))
        .collect();
    let entries: Vec<String> = spec.to_string().split(',').map(String::from).collect();
    Claim {
        statement: format!("R({}) <= {}", instance.spec(), instance.order()),
        spec: instance.spec().to_string(),
        clique_sizes: spec.clique_sizes(),
        forbidden: (!spec.is_cliques()).then_some(entries),
        order: instance.order(),
        meaning: format!(
            "every {}-colouring of the edges of K_{} contains {}",
            instance.colours(),
            instance.order(),
            colours.join(" or ")
        ),
    }
}

pub fn encoding_record(encoding: &RamseyEncoding) -> EncodingRecord {
    EncodingRecord {
        variables: encoding.variable_count(),
        clauses: encoding.clause_count(),
        symmetry: encoding
            .symmetry()
            .schemes()
            .iter()
            .map(|s| s.name().to_string())
            .collect(),
        justifications: encoding
            .symmetry()
            .schemes()
            .iter()
            .map(|s| SchemeRecord {
                scheme: s.name().to_string(),
                justification: s.justification().to_string(),
            })
            .collect(),
        minimality_order: encoding
            .symmetry()
            .contains(ramsift_encoder::Scheme::Minimality)
            .then(|| crate::minimality::certificate::MATRIX_ORDER.to_string()),
    }
}

/// Premises that need a citation (those holding by definition are not listed).
pub fn premise_records(encoding: &RamseyEncoding) -> Vec<PremiseRecord> {
    encoding
        .symmetry_clauses()
        .premises
        .iter()
        .filter_map(|p| {
            p.source.as_ref().map(|source| PremiseRecord {
                statement: p.statement(),
                clique_sizes: p.cliques.clone(),
                upper_bound: p.upper_bound,
                source: source.clone(),
            })
        })
        .collect()
}

/// The folder inside a bundle that certifies a premise: `premises/R3-4-9`.
pub fn premise_folder(premise: &PremiseRecord) -> String {
    let sizes: Vec<String> = premise.clique_sizes.iter().map(|k| k.to_string()).collect();
    format!("premises/R{}-{}", sizes.join("-"), premise.upper_bound)
}

/// Writes the manifest and the guide.
pub fn write_manifest_and_guide(dir: &Path, manifest: &Manifest) -> io::Result<Vec<PathBuf>> {
    let manifest_path = dir.join(MANIFEST_FILE);
    write_json(&manifest_path, manifest)?;
    Ok(vec![
        manifest_path,
        super::referee_guide::write_guide(dir, manifest)?,
    ])
}
