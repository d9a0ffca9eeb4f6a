//! The bundle manifest (`manifest.json`) as the checker reads it, with serde. Only
//! the fields the checks use are read; the rest (prose for people, timings) is
//! ignored. Cheap facts are checked here, before any expensive work: the format
//! tag, the order against [`MAX_ORDER`], the forbidden graphs against the order.

use std::path::Path;

use serde::Deserialize;

use crate::claim::Claim;
use crate::input::require_regular_file;
use crate::input_error::InputError;

/// The bundle layout this checker understands.
pub const BUNDLE_FORMAT: &str = "ramsift-bundle 1";
/// The largest order a bundle may claim (the formula is regenerated in memory).
pub const MAX_ORDER: usize = 1_000;
/// The largest manifest read.
pub const MAX_MANIFEST_BYTES: u64 = 16 << 20;

#[derive(Clone, Debug, Deserialize)]
pub struct Manifest {
    pub bundle_format: String,
    pub claim: ClaimRecord,
    pub encoding: EncodingRecord,
    #[serde(default)]
    pub premises: Vec<PremiseRecord>,
    pub files: Vec<FileRecord>,
    #[serde(default)]
    pub sharding: Option<Sharding>,
}

#[derive(Clone, Debug, Deserialize)]
pub struct ClaimRecord {
    pub statement: String,
    pub order: usize,
    /// Present for clique claims.
    pub clique_sizes: Option<Vec<usize>>,
    /// The specification's entries, present when a colour forbids another graph.
    pub forbidden: Option<Vec<String>>,
}

#[derive(Clone, Debug, Deserialize)]
pub struct EncodingRecord {
    pub symmetry: Vec<String>,
    /// With the minimality scheme: the order its clauses decrease in.
    #[serde(default)]
    pub minimality_order: Option<String>,
}

#[derive(Clone, Debug, Deserialize)]
pub struct PremiseRecord {
    pub clique_sizes: Vec<usize>,
    pub upper_bound: usize,
    #[serde(default)]
    pub source: String,
}

#[derive(Clone, Debug, Deserialize)]
pub struct FileRecord {
    pub name: String,
    pub role: String,
    pub sha256: String,
    /// For a shard's trace: its index and cube.
    pub shard: Option<usize>,
    pub cube: Option<Vec<i32>>,
}

#[derive(Clone, Debug, Deserialize)]
pub struct Sharding {
    pub shards: usize,
    pub tree: CoverTree,
}

/// The coverage tree of a sharded refutation: splits down to shard leaves.
#[derive(Clone, Debug, Deserialize)]
#[serde(untagged)]
pub enum CoverTree {
    Leaf { leaf: usize },
    Split { split: i32, positive: Box<CoverTree>, negative: Box<CoverTree> },
}

/// Reads `dir/manifest.json` (a regular file of at most [`MAX_MANIFEST_BYTES`]).
pub fn read_manifest(dir: &Path) -> Result<Manifest, InputError> {
    let path = dir.join("manifest.json");
    let name = path.display().to_string();
    if require_regular_file(&path)?.len() > MAX_MANIFEST_BYTES {
        return Err(InputError::whole(&name, format!("larger than {MAX_MANIFEST_BYTES} bytes")));
    }
    let text = std::fs::read(&path).map_err(|e| InputError::whole(&name, format!("cannot read: {e}")))?;
    let not_manifest =
        |e: serde_json::Error| InputError::at_line(&name, e.line(), format!("not a ramsift bundle manifest: {e}"));
    #[derive(Deserialize)]
    struct FormatTag {
        bundle_format: Option<String>,
    }
    let tag: FormatTag = serde_json::from_slice(&text).map_err(not_manifest)?;
    if tag.bundle_format.as_deref() != Some(BUNDLE_FORMAT) {
        return Err(InputError::whole(
            &name,
            format!("bundle_format is {:?}, expected {BUNDLE_FORMAT:?}", tag.bundle_format),
        ));
    }
    serde_json::from_slice(&text).map_err(not_manifest)
}

impl Manifest {
    /// The claim's forbidden graphs, read with the checker's own parser, checked
    /// against the order before anything is regenerated.
    pub fn claim(&self, name: &str) -> Result<Claim, InputError> {
        let bad = |why: String| InputError::whole(name, why);
        let claim = match (&self.claim.forbidden, &self.claim.clique_sizes) {
            (Some(entries), sizes) => {
                let parsed = Claim::parse(&entries.join(",")).map_err(|e| bad(format!("claim.forbidden: {e}")))?;
                if sizes.is_some() && parsed.clique_sizes() != *sizes {
                    return Err(bad("claim.forbidden and claim.clique_sizes disagree".into()));
                }
                parsed
            }
            (None, Some(sizes)) => {
                let text: Vec<String> = sizes.iter().map(|k| k.to_string()).collect();
                Claim::parse(&text.join(",")).map_err(|e| bad(format!("claim.clique_sizes: {e}")))?
            }
            (None, None) => return Err(bad("claim has neither forbidden nor clique_sizes".into())),
        };
        let order = self.claim.order;
        if order > MAX_ORDER || claim.forbidden.iter().any(|g| g.vertices() > order) {
            return Err(bad(format!(
                "claim R({claim}) <= {order} is not a question this checker accepts (orders up to {MAX_ORDER}, each forbidden graph fitting in K_order)"
            )));
        }
        Ok(claim)
    }
}
