//! Reading a file argument of the binary, where `-` names standard input.

use std::path::Path;

use anyhow::{Context, Result};

/// The bytes of `path`, or of standard input for `-`.
pub fn read_file_or_stdin(path: &Path) -> Result<Vec<u8>> {
    if path.as_os_str() == "-" {
        let mut bytes = Vec::new();
        std::io::Read::read_to_end(&mut std::io::stdin(), &mut bytes)
            .context("reading standard input")?;
        return Ok(bytes);
    }
    std::fs::read(path).with_context(|| format!("reading {}", path.display()))
}

/// The first colouring of a file argument: a ramsift colouring file (of a stream
/// of them, as `enumerate` writes, the first) or graph6 (the first line; edges
/// colour 1, non-edges colour 2).
pub struct FirstColouring {
    pub matrix: ramsift_checker::ColourMatrix,
    /// The specification named by a colouring file's header (graph6 names none).
    pub claim: Option<ramsift_checker::Claim>,
    /// How many colourings the file holds (for colouring files).
    pub in_file: usize,
}

/// Reads the first colouring of `path` (`-`: standard input).
pub fn read_first_colouring(path: &Path) -> Result<FirstColouring> {
    let name = path.display().to_string();
    let content = read_file_or_stdin(path)?;
    let is_colouring_file = content
        .split(|&b| b == b'\n')
        .map(|l| l.trim_ascii())
        .find(|l| !l.is_empty() && !l.starts_with(b"#"))
        .is_some_and(|l| {
            l.starts_with(ramsift_driver::output::witness::COLOURING_MAGIC.as_bytes())
        });
    if !is_colouring_file {
        let mut graphs = ramsift_checker::graph6::decode_graph6_file(&name, &content)?;
        anyhow::ensure!(!graphs.is_empty(), "{name}: no graph6 line found");
        return Ok(FirstColouring {
            matrix: graphs.swap_remove(0),
            claim: None,
            in_file: 1,
        });
    }
    let text = String::from_utf8(content).map_err(|e| {
        anyhow::anyhow!(
            "{name}: not UTF-8 text at byte {}",
            e.utf8_error().valid_up_to()
        )
    })?;
    let parts = ramsift_driver::output::witness::split_colouring_stream(&text);
    let file = ramsift_checker::colouring_file::parse_colouring_file(
        &name,
        parts.first().map_or(text.as_str(), String::as_str),
    )?;
    Ok(FirstColouring {
        matrix: file.matrix,
        claim: Some(file.claim),
        in_file: parts.len(),
    })
}
