//! `ramsift-check drat` and `ramsift-check lrat`: a refutation proof of a DIMACS
//! formula (optionally under a cube), and LRAT output from a checked DRAT proof.

use std::io::{Read, Write};
use std::path::Path;
use std::time::Instant;

use ramsift_checker::cnf::{parse_cnf, Cnf};
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::{is_binary, parse_drat};
use ramsift_checker::input::read_input;
use ramsift_checker::lrat::{check_lrat, parse_lrat, write_lrat};

use super::verdict::{Outcome, Report};

/// Reads a file argument; `-` is standard input (gzip allowed there too).
fn read_arg(path: &Path) -> Result<Vec<u8>, String> {
    if path.as_os_str() != "-" {
        return read_input(path).map_err(|e| e.to_string());
    }
    let mut raw = Vec::new();
    std::io::stdin().read_to_end(&mut raw).map_err(|e| format!("standard input: {e}"))?;
    ramsift_checker::input::expand_gzip("standard input", raw).map_err(|e| e.to_string())
}

fn load_cnf(path: &Path) -> Result<Cnf, String> {
    let bytes = read_arg(path)?;
    parse_cnf(&path.display().to_string(), &bytes).map_err(|e| e.to_string())
}

/// Reads `--cube` ("5,-12" or "5 -12"): literals of the formula's variables.
fn parse_cube(text: &str, variables: usize) -> Result<Vec<i32>, String> {
    text.split(|c: char| c == ',' || c.is_whitespace())
        .filter(|t| !t.is_empty())
        .map(|t| {
            t.parse::<i32>()
                .ok()
                .filter(|&l| l != 0 && l != i32::MIN && l.unsigned_abs() as usize <= variables)
                .ok_or_else(|| format!("--cube: {t:?} is not a literal of the formula's {variables} variables"))
        })
        .collect()
}

pub fn run_drat(cnf_path: &Path, proof_path: &Path, cube: Option<&str>, emit_lrat: Option<&Path>) -> Report {
    let started = Instant::now();
    let mut cnf = match load_cnf(cnf_path) {
        Ok(c) => c,
        Err(e) => return Report::unreadable(e),
    };
    let cube = match cube.map(|c| parse_cube(c, cnf.variables)).transpose() {
        Ok(c) => c.unwrap_or_default(),
        Err(e) => return Report::unreadable(e),
    };
    cube.iter().for_each(|&l| cnf.push(&[l]));
    if cnf_path.as_os_str() == "-" && proof_path.as_os_str() == "-" {
        return Report::unreadable("only one of the formula and the proof can be read from standard input (-)");
    }
    super::progress::reading(proof_path);
    let bytes = match read_arg(proof_path) {
        Ok(b) => b,
        Err(e) => return Report::unreadable(e),
    };
    let format = if is_binary(&bytes) { "binary DRAT" } else { "text DRAT" };
    let steps = match parse_drat(&proof_path.display().to_string(), &bytes) {
        Ok(s) => s,
        Err(e) => return Report::unreadable(e),
    };
    drop(bytes);
    let total = steps.len();
    let checked = super::progress::while_checking(Some(total), || check_drat(&cnf, &steps, emit_lrat.is_some()));
    let (report, lemmas) = match checked {
        Ok(done) => done,
        Err(failure) => {
            let hint = minimality_hint(proof_path).unwrap_or_default();
            return Report::new(Outcome::Fail, format!("{}: {failure}{hint}", proof_path.display()));
        }
    };
    let mut lines = Vec::new();
    if let (Some(path), Some(lemmas)) = (emit_lrat, lemmas) {
        if let Err(e) = write_file_atomically(path, write_lrat(&lemmas).as_bytes()) {
            return Report::unreadable(format!("{}: cannot write the LRAT proof: {e}", path.display()));
        }
        lines.push(format!("wrote LRAT proof {}", path.display()));
    }
    if report.ignored_unit_deletions > 0 || report.deletions_of_absent_clauses > 0 {
        lines.push(format!(
            "note: ignored {} deletions of unit clauses and {} deletions of clauses not present",
            report.ignored_unit_deletions, report.deletions_of_absent_clauses
        ));
    }
    let under = if cube.is_empty() { String::new() } else { format!(" under the cube {cube:?}") };
    let seconds = started.elapsed().as_secs_f64();
    let mut out = Report::new(
        Outcome::Pass,
        format!(
            "{} refutes {}{under} ({format}): {} lemmas, {} checked ({} by RAT), core of {} of {} original clauses, {seconds:.2}s",
            proof_path.display(),
            cnf_path.display(),
            report.lemmas,
            report.checked_lemmas,
            report.rat_lemmas,
            report.core_original_clauses,
            report.original_clauses,
        ),
    )
    .field("format", format)
    .field("cube", cube)
    .field("original_clauses", report.original_clauses)
    .field("lemmas", report.lemmas)
    .field("deletions", report.deletions)
    .field("checked_lemmas", report.checked_lemmas)
    .field("rat_lemmas", report.rat_lemmas)
    .field("core_original_clauses", report.core_original_clauses)
    .field("ignored_unit_deletions", report.ignored_unit_deletions)
    .field("deletions_of_absent_clauses", report.deletions_of_absent_clauses)
    .field("seconds", seconds);
    out.lines = lines;
    out
}

/// When the proof sits in a bundle that uses the minimality scheme, a failed
/// plain check says what is missing: the trace refutes the formula together with
/// the clauses of minimality.txt, which only `ramsift-check bundle` verifies.
fn minimality_hint(proof_path: &Path) -> Option<String> {
    let dir = proof_path.parent().filter(|d| !d.as_os_str().is_empty()).unwrap_or(Path::new("."));
    let text = std::fs::read_to_string(dir.join("manifest.json")).ok()?;
    text.contains("\"minimality-clauses\"").then(|| {
        format!(
            " (this bundle uses the minimality scheme: its trace refutes the formula together with the clauses of {}, which only `ramsift-check bundle {}` verifies)",
            dir.join("minimality.txt").display(),
            dir.display()
        )
    })
}

pub fn run_lrat(cnf_path: &Path, proof_path: &Path) -> Report {
    let started = Instant::now();
    let cnf = match load_cnf(cnf_path) {
        Ok(c) => c,
        Err(e) => return Report::unreadable(e),
    };
    super::progress::reading(proof_path);
    let lines = match read_arg(proof_path)
        .and_then(|b| parse_lrat(&proof_path.display().to_string(), &b).map_err(|e| e.to_string()))
    {
        Ok(l) => l,
        Err(e) => return Report::unreadable(e),
    };
    match check_lrat(&cnf, &lines) {
        Ok(report) => {
            let seconds = started.elapsed().as_secs_f64();
            Report::new(
                Outcome::Pass,
                format!(
                    "{} refutes {} (LRAT): {} lemmas ({} by RAT), {seconds:.2}s",
                    proof_path.display(),
                    cnf_path.display(),
                    report.lemmas,
                    report.rat_lemmas
                ),
            )
            .field("lemmas", report.lemmas)
            .field("rat_lemmas", report.rat_lemmas)
            .field("deletions", report.deletions)
            .field("seconds", seconds)
        }
        Err(reason) => Report::new(Outcome::Fail, format!("{}: {reason}", proof_path.display())),
    }
}

/// Writes under a temporary name in the same directory, then renames.
fn write_file_atomically(path: &Path, content: &[u8]) -> std::io::Result<()> {
    let file_name = path.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let temp = path.with_file_name(format!(".{file_name}.{}.tmp", std::process::id()));
    let result = (|| {
        let mut file = std::fs::File::create(&temp)?;
        file.write_all(content)?;
        file.sync_all()?;
        std::fs::rename(&temp, path)
    })();
    if result.is_err() {
        let _ = std::fs::remove_file(&temp);
    }
    result
}
