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

/// The folder inside a bundle that certifies a premise: `premises/R3-4-9`.
pub fn premise_folder(premise: &PremiseRecord) -> String {
    let sizes: Vec<String> = premise.clique_sizes.iter().map(|k| k.to_string()).collect();
    format!("premises/R{}-{}", sizes.join("-"), premise.upper_bound)
}

/// What the claim rests on, exactly: each premise certified by a bundle present
/// in `dir/premises/`, or assumed.
fn premises_text(dir: &Path, manifest: &Manifest) -> String {
    if manifest.premises.is_empty() {
        return "The claim rests on no other Ramsey value: nothing is assumed.".to_string();
    }
    let mut assumed = false;
    let list: Vec<String> = manifest
        .premises
        .iter()
        .map(|p| {
            let folder = premise_folder(p);
            if dir.join(&folder).join(MANIFEST_FILE).is_file() {
                format!(
                    "  - {} ({}): CERTIFIED by the bundle {folder}/, which step 1 checks in full.",
                    p.statement, p.source
                )
            } else {
                assumed = true;
                format!(
                    "  - {} ({}): ASSUMED. No bundle here certifies it.",
                    p.statement, p.source
                )
            }
        })
        .collect();
    let consequence = if assumed {
        "\nBecause of the assumed premise(s), step 1 ends with CONDITIONAL (exit code 3), not PASS;\n\
         give a bundle that certifies a premise with --premise DIR to make the check unconditional."
    } else {
        ""
    };
    format!(
        "The formula bounds vertex degrees with these smaller Ramsey values:\n{}{consequence}",
        list.join("\n")
    )
}

/// The referee's guide, in words. Every line that starts with `$ ` is a command
/// that succeeds when run as written in the bundle's directory.
pub fn guide_text(dir: &Path, manifest: &Manifest) -> String {
    let single = manifest.files.iter().find(|f| f.role == "drat-proof");
    let shards: Vec<&FileRecord> = manifest
        .files
        .iter()
        .filter(|f| f.role == "shard-proof")
        .collect();
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
    let proof = match single {
        Some(p) if shards.is_empty() => format!("{} is a DRAT refutation of it, produced by {}.", p.name, manifest.solver),
        Some(p) => format!(
            "{} is one DRAT refutation of it, composed from {} shard traces (shards/), produced by {}.",
            p.name,
            shards.len(),
            manifest.solver
        ),
        None => format!(
            "The refutation is split into {} shards (shards/): each trace refutes the formula together\n\
             with its cube (a few literals added as unit clauses), and the cubes cover every assignment\n\
             (the coverage tree in {MANIFEST_FILE}). Produced by {}.",
            shards.len(),
            manifest.solver
        ),
    };
    let mut steps: Vec<String> = [
        "Each line that starts with \"$ \" is a command to run in this directory, exactly as written.",
        "",
        "1. Everything at once, with ramsift's standalone checker. It regenerates the formula from the",
        "   claim with its own code, compares it with the bundled formula as a set of clauses, verifies",
        "   every SHA-256 in the manifest, checks the proof, the coverage of the shards if any, and",
        "   every premise bundle; the last line says PASS, CONDITIONAL or FAIL:",
        "     $ ramsift-check bundle .",
    ]
    .map(String::from)
    .to_vec();
    match single {
        Some(p) => {
            let proof = &p.name;
            steps.extend([
                "2. The proof alone against the formula (the checker reads gzip directly):".to_string(),
                format!("     $ ramsift-check drat {FORMULA_FILE} {proof}"),
                format!("   Any other DRAT checker takes the decompressed formula, formula.cnf, with {proof}:"),
                format!("     $ gunzip -kf {FORMULA_FILE}"),
                "3. For a formally verified LRAT checker, convert the proof, then check the conversion:".to_string(),
                format!("     $ ramsift-check drat {FORMULA_FILE} {proof} --emit-lrat proof.lrat"),
                format!("     $ ramsift-check lrat {FORMULA_FILE} proof.lrat"),
            ]);
        }
        None => {
            steps.push("2. Each shard's trace alone refutes the formula under its cube (not the formula alone);".into());
            steps.push("   that the cubes cover every case is checked by step 1:".into());
            for shard in &shards {
                let cube: Vec<String> =
                    shard.cube.iter().flatten().map(|l| l.to_string()).collect();
                steps.push(format!(
                    "     $ ramsift-check drat {FORMULA_FILE} {} --cube={}",
                    shard.name,
                    cube.join(",")
                ));
            }
        }
    }
    let steps = steps.join("\n") + "\n";
    format!(
        "What is claimed\n\
         ---------------\n\
         {statement}: {meaning}.\n\n\
         {premises}\n\n\
         How it is shown\n\
         ---------------\n\
         {FORMULA_FILE} is a CNF formula that is satisfiable exactly when some colouring avoids every\n\
         forbidden graph (its header states the variable map). {proof}\n\n\
         {symmetry}\n\n\
         How to check it\n\
         ---------------\n\
         {steps}",
        statement = manifest.claim.statement,
        meaning = manifest.claim.meaning,
        premises = premises_text(dir, manifest),
    )
}

/// Writes the manifest and the guide.
pub fn write_manifest_and_guide(dir: &Path, manifest: &Manifest) -> io::Result<Vec<PathBuf>> {
    let manifest_path = dir.join(MANIFEST_FILE);
    let json = serde_json::to_string_pretty(manifest).map_err(io::Error::other)?;
    write_atomically(&manifest_path, |w| {
        w.write_all(json.as_bytes())
            .and_then(|_| w.write_all(b"\n"))
    })?;
    Ok(vec![manifest_path, write_guide(dir, manifest)?])
}

/// Writes (or rewrites, once premise bundles exist) the guide.
pub fn write_guide(dir: &Path, manifest: &Manifest) -> io::Result<PathBuf> {
    let guide_path = dir.join(GUIDE_FILE);
    let guide = guide_text(dir, manifest);
    write_atomically(&guide_path, |w| w.write_all(guide.as_bytes()))?;
    Ok(guide_path)
}
