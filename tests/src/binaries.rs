//! Locating the workspace's binaries (`ramsift`, `ramsift-check`) from a test of
//! this crate: they sit beside the `deps/` folder that holds the test executable.
//! `cargo test --workspace` builds them before any test runs; if one is missing
//! (a test of this crate run alone), it is built with the same profile.

use std::path::PathBuf;
use std::process::Command;

/// The path of a workspace binary, built if needed.
pub fn workspace_binary(name: &str) -> PathBuf {
    let exe = std::env::current_exe().expect("the test knows its own path");
    let profile_dir = exe
        .parent()
        .and_then(|deps| deps.parent())
        .expect("test executables live in target/PROFILE/deps")
        .to_path_buf();
    let path = profile_dir.join(name);
    if !path.is_file() {
        let package = if name == "ramsift-check" {
            "ramsift-checker"
        } else {
            "ramsift-driver"
        };
        let mut build = Command::new(env!("CARGO"));
        build.args(["build", "-p", package, "--bin", name]);
        if profile_dir.ends_with("release") {
            build.arg("--release");
        }
        let status = build.status().expect("cargo runs");
        assert!(status.success(), "building {name} failed");
    }
    path
}
