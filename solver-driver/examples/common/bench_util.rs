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

/// A benchmark's command line: `--cap SECONDS`, `--repeats R`, other `--name value`
/// options, and instances (the defaults when none are given).
pub struct BenchArgs {
    pub cap: f64,
    pub repeats: usize,
    pub options: Vec<(String, String)>,
    pub instances: Vec<String>,
}

impl BenchArgs {
    /// Reads the process's arguments, with these defaults.
    pub fn read(cap: f64, repeats: usize, defaults: &[&str]) -> BenchArgs {
        let mut args = BenchArgs {
            cap,
            repeats,
            options: Vec::new(),
            instances: Vec::new(),
        };
        let mut it = std::env::args().skip(1);
        while let Some(a) = it.next() {
            match a.strip_prefix("--") {
                Some(name) => {
                    let value = it
                        .next()
                        .unwrap_or_else(|| panic!("--{name} needs a value"));
                    match name {
                        "cap" => args.cap = value.parse().expect("--cap SECONDS"),
                        "repeats" => args.repeats = value.parse().expect("--repeats COUNT"),
                        _ => args.options.push((name.to_string(), value)),
                    }
                }
                None => args.instances.push(a),
            }
        }
        if args.instances.is_empty() {
            args.instances = defaults.iter().map(|s| s.to_string()).collect();
        }
        args
    }

    /// The value of `--name`, if given.
    pub fn option(&self, name: &str) -> Option<&str> {
        self.options
            .iter()
            .find(|(n, _)| n == name)
            .map(|(_, v)| v.as_str())
    }
}

/// `ramsift refute SPEC N --symmetry S --assume-premises -q --out DIR` (premises
/// assumed, so that only the instance itself is timed).
pub fn refute_command(spec: &str, n: &str, symmetry: &str, out: &std::path::Path) -> Command {
    let mut cmd = Command::new(release_dir().join("ramsift"));
    cmd.args([
        "refute",
        spec,
        n,
        "--symmetry",
        symmetry,
        "--assume-premises",
        "-q",
        "--out",
    ])
    .arg(out);
    cmd
}
