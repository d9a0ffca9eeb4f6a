//! The certificate bundle written by `ramsift refute`: the exact CNF that was solved,
//! the DRAT trace, `manifest.json` (what is claimed, how, and the SHA-256 of every
//! file) and `REFEREE.txt`, a plain-language guide for checking it.

use std::io::{self, Read};
use std::path::{Path, PathBuf};

use serde::Serialize;
use sha2::{Digest, Sha256};

use ramsift_encoder::atomic_file::write_atomically;
use ramsift_encoder::CliqueEncoding;

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

/// The claim part of a manifest.
pub fn claim_of(encoding: &CliqueEncoding) -> Claim {
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
        clique_sizes: spec.clique_sizes_if_cliques(),
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

pub fn encoding_record(encoding: &CliqueEncoding) -> EncodingRecord {
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
    }
}

/// Premises that need a citation (those holding by definition are not listed).
pub fn premise_records(encoding: &CliqueEncoding) -> Vec<PremiseRecord> {
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

/// The referee's guide, in words.
pub fn guide_text(manifest: &Manifest, proof_name: &str) -> String {
    let premises = if manifest.premises.is_empty() {
        "The claim rests on no other Ramsey value.".to_string()
    } else {
        let list: Vec<String> = manifest
            .premises
            .iter()
            .map(|p| format!("  - {} ({})", p.statement, p.source))
            .collect();
        format!(
            "The claim assumes these published values (used to bound vertex degrees):\n{}\n\
             Bundles in the premises/ folder (written by `ramsift refute` unless --assume-premises) are checked\n\
             and used automatically; another bundle can be given to the checker with --premise DIR.",
            list.join("\n")
        )
    };
    let symmetry = if manifest.encoding.symmetry.is_empty() {
        "No symmetry breaking was used: the formula says exactly that a colouring exists."
            .to_string()
    } else {
        let list: Vec<String> = manifest
            .encoding
            .justifications
            .iter()
            .map(|s| format!("  - {}: {}", s.scheme, s.justification))
            .collect();
        format!(
            "The formula adds symmetry-breaking constraints. Each keeps at least one copy of every \
             colouring up to relabelling, so the formula is satisfiable exactly when a colouring exists:\n{}",
            list.join("\n")
        )
    };
    format!(
        "What is claimed\n\
         ---------------\n\
         {statement}: {meaning}.\n\n\
         {premises}\n\n\
         How it is shown\n\
         ---------------\n\
         {formula} is a CNF formula that is satisfiable exactly when some colouring avoids every\n\
         forbidden graph (its header states the variable map). {proof} is a DRAT refutation of it\n\
         produced by {solver}.\n\n\
         {symmetry}\n\n\
         How to check it\n\
         ---------------\n\
         1. With ramsift's standalone checker, which regenerates the formula from the claim with its own\n\
            code, compares it with {formula} as a set of clauses, verifies every SHA-256 in\n\
            {manifest}, and checks the proof:\n\
                ramsift-check bundle .\n\
         2. With any DRAT checker (decompress the formula first):\n\
                gunzip -k {formula}\n\
                <your DRAT checker> formula.cnf {proof}\n\
         3. For a formally verified LRAT checker, convert the proof first:\n\
                ramsift-check drat formula.cnf {proof} --emit-lrat proof.lrat\n",
        statement = manifest.claim.statement,
        meaning = manifest.claim.meaning,
        formula = FORMULA_FILE,
        proof = proof_name,
        solver = manifest.solver,
        manifest = MANIFEST_FILE,
    )
}

/// Writes the manifest and the guide.
pub fn write_manifest_and_guide(
    dir: &Path,
    manifest: &Manifest,
    proof_name: &str,
) -> io::Result<Vec<PathBuf>> {
    let manifest_path = dir.join(MANIFEST_FILE);
    let json = serde_json::to_string_pretty(manifest).map_err(io::Error::other)?;
    write_atomically(&manifest_path, |w| {
        w.write_all(json.as_bytes())
            .and_then(|_| w.write_all(b"\n"))
    })?;
    let guide_path = dir.join(GUIDE_FILE);
    let guide = guide_text(manifest, proof_name);
    write_atomically(&guide_path, |w| w.write_all(guide.as_bytes()))?;
    Ok(vec![manifest_path, guide_path])
}
