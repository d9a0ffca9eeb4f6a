//! Making and editing bundles on disk for mutation tests: refuting, copying,
//! changing a manifest, and writing a changed file's new SHA-256 into it, so that
//! a mutant reaches the check it is meant to meet instead of failing at the hash.

use std::path::Path;
use std::sync::atomic::{AtomicBool, AtomicU64};

use ramsift_driver::certify::refute::{refute, RefuteOptions, RefuteResult};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};

/// Refutes `spec` at `order` with `symmetry` into `dir` (premises assumed),
/// asserting that it is refuted.
pub fn make_bundle(spec: &str, order: usize, symmetry: &str, dir: &Path) {
    let instance = Instance::new(spec.parse::<RamseySpec>().unwrap(), order).unwrap();
    let set: SymmetrySet = symmetry.parse().unwrap();
    let encoding =
        RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
    let report = refute(
        &encoding,
        dir,
        &RefuteOptions::default(),
        &AtomicBool::new(false),
        &AtomicU64::new(0),
    )
    .unwrap();
    assert!(
        matches!(report.result, RefuteResult::Refuted { .. }),
        "{spec} order {order} [{symmetry}]"
    );
}

/// Copies the regular files of `from` (not subdirectories) into `to`.
pub fn copy_dir(from: &Path, to: &Path) {
    std::fs::create_dir_all(to).unwrap();
    for entry in std::fs::read_dir(from).unwrap() {
        let entry = entry.unwrap();
        if entry.path().is_file() {
            std::fs::copy(entry.path(), to.join(entry.file_name())).unwrap();
        }
    }
}

pub fn sha256_of(path: &Path) -> String {
    ramsift_driver::certify::bundle::hash_file(path).unwrap().0
}

/// Edits the manifest JSON with `edit`, writing it back.
pub fn edit_manifest(dir: &Path, edit: impl FnOnce(&mut serde_json::Value)) {
    let path = dir.join("manifest.json");
    let mut value: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    edit(&mut value);
    std::fs::write(&path, serde_json::to_string_pretty(&value).unwrap()).unwrap();
}

/// Whether the bundle's own proof passes the checker (premises may be assumed);
/// a bundle it cannot read does not pass.
pub fn passes(dir: &Path) -> bool {
    ramsift_checker::bundle::check_bundle(dir, &[])
        .map(|v| v.passed())
        .unwrap_or(false)
}

/// Removes every file of `role` from the manifest's list (the files stay on disk).
pub fn unlist_role(dir: &Path, role: &str) {
    edit_manifest(dir, |m| {
        m["files"]
            .as_array_mut()
            .unwrap()
            .retain(|f| f["role"] != role)
    });
}

/// Records the current SHA-256 of `file` in the manifest.
pub fn set_hash(dir: &Path, file: &str) {
    let hash = sha256_of(&dir.join(file));
    edit_manifest(dir, |m| {
        for f in m["files"].as_array_mut().unwrap() {
            if f["name"] == file {
                f["sha256"] = serde_json::Value::String(hash.clone());
            }
        }
    });
}
