//! Witness output: the colouring in ramsift's text format and, for two colours,
//! the colour-1 graph in graph6, written into an output directory.
//!
//! The colouring format (read back by `ramsift-check colouring`):
//!
//! ```text
//! # comment lines
//! ramsift-colouring spec=4,4 order=17
//! . 1 2 …     (row i: colour of edge {i, j} for each j; '.' on the diagonal)
//! ```

use std::io;
use std::path::{Path, PathBuf};

use ramsift_encoder::atomic_file::{ensure_dir, write_atomically};
use ramsift_encoder::{Colouring, Instance};

use crate::output::graph6::colour_one_graph6;

/// File names written into an output directory.
pub const COLOURING_FILE: &str = "witness.colouring";
pub const GRAPH6_FILE: &str = "witness-colour1.g6";
/// The keyword that starts a colouring file's header.
pub const COLOURING_MAGIC: &str = "ramsift-colouring";

/// The colouring in ramsift's text format.
pub fn colouring_text(instance: &Instance, colouring: &Colouring, comments: &[String]) -> String {
    let n = colouring.order();
    let mut text = String::new();
    for line in comments {
        text.push_str("# ");
        text.push_str(line);
        text.push('\n');
    }
    text.push_str(&format!(
        "{COLOURING_MAGIC} spec={} order={}\n",
        instance.spec(),
        n
    ));
    for i in 0..n {
        let row: Vec<String> = (0..n)
            .map(|j| {
                if i == j {
                    ".".to_string()
                } else {
                    colouring.colour(i, j).to_string()
                }
            })
            .collect();
        text.push_str(&row.join(" "));
        text.push('\n');
    }
    text
}

/// Splits a stream of colouring files (as `enumerate` writes for three or more
/// colours) into one text per colouring; each starts at its header line, and
/// comment lines go with the colouring they precede.
pub fn split_colouring_stream(text: &str) -> Vec<String> {
    let mut parts: Vec<String> = Vec::new();
    let mut current = String::new();
    let mut has_header = false;
    for line in text.lines() {
        if line.trim_start().starts_with(COLOURING_MAGIC) {
            if has_header {
                parts.push(std::mem::take(&mut current));
            }
            has_header = true;
        }
        current.push_str(line);
        current.push('\n');
    }
    if has_header {
        parts.push(current);
    }
    parts
}

/// Writes the witness files (and, when given, the summary) into `dir`.
/// Returns the paths written. Every file is written atomically.
pub fn write_witness_files(
    dir: &Path,
    instance: &Instance,
    colouring: &Colouring,
    comments: &[String],
) -> io::Result<Vec<PathBuf>> {
    ensure_dir(dir)?;
    let mut written = Vec::new();
    let path = dir.join(COLOURING_FILE);
    let made = crate::certify::provenance::Provenance::of_this_run().line();
    let comments: Vec<String> = comments.iter().cloned().chain([made]).collect();
    let text = colouring_text(instance, colouring, &comments);
    write_atomically(&path, |w| w.write_all(text.as_bytes()))?;
    written.push(path);
    if instance.colours() == 2 {
        let path = dir.join(GRAPH6_FILE);
        let line = colour_one_graph6(colouring) + "\n";
        write_atomically(&path, |w| w.write_all(line.as_bytes()))?;
        written.push(path);
    }
    Ok(written)
}
