//! Helpers shared by the benchmark examples: timing child processes with a cap,
//! medians, and the location of the built binaries.

// Each benchmark uses only some of these helpers.
#![allow(dead_code)]

use std::path::PathBuf;
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

/// Runs a command, killing it at `cap` seconds; returns (seconds, exit code).
pub fn timed(mut cmd: Command, cap: f64) -> (f64, Option<i32>) {
    let started = Instant::now();
    let mut child = cmd
        .stdout(Stdio::null())
        .stderr(Stdio::null())
        .spawn()
        .expect("the benchmark can start its command");
    loop {
        if let Some(status) = child.try_wait().expect("waiting for the child") {
            return (started.elapsed().as_secs_f64(), status.code());
        }
        if started.elapsed() > Duration::from_secs_f64(cap) {
            let _ = child.kill();
            let _ = child.wait();
            return (cap, None);
        }
        std::thread::sleep(Duration::from_millis(2));
    }
}

/// The median (upper median for even counts).
pub fn median(values: &mut [f64]) -> f64 {
    values.sort_by(|a, b| a.partial_cmp(b).expect("no NaN timings"));
    values[values.len() / 2]
}

/// `target/release`, where the benchmark's sibling binaries live.
pub fn release_dir() -> PathBuf {
    let exe = std::env::current_exe().expect("own path");
    exe.parent()
        .and_then(|p| p.parent())
        .expect("target/release/examples/…")
        .to_path_buf()
}
