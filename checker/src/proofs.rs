//! The `drat`, `lrat` and `bundle` subcommands of `ramsift-check`.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::time::Instant;

use ramsift_checker::bundle::check_bundle;
use ramsift_checker::cnf::parse_cnf;
use ramsift_checker::drat_check::check_drat;
use ramsift_checker::drat_parse::{is_binary, parse_drat};
use ramsift_checker::input::read_input;
use ramsift_checker::lrat::{check_lrat, parse_lrat, write_lrat};

use crate::unreadable;

fn load_cnf(path: &Path) -> Result<ramsift_checker::cnf::Cnf, ExitCode> {
    let bytes = read_input(path).map_err(unreadable)?;
    parse_cnf(&path.display().to_string(), &bytes).map_err(unreadable)
}

pub fn run_drat(
    cnf_path: &Path,
    proof_path: &Path,
    emit_lrat: Option<&Path>,
    json: bool,
) -> ExitCode {
    let started = Instant::now();
    let cnf = match load_cnf(cnf_path) {
        Ok(c) => c,
        Err(code) => return code,
    };
    let bytes = match read_input(proof_path) {
        Ok(b) => b,
        Err(e) => return unreadable(e),
    };
    let binary = is_binary(&bytes);
    let steps = match parse_drat(&proof_path.display().to_string(), &bytes) {
        Ok(s) => s,
        Err(e) => return unreadable(e),
    };
    match check_drat(&cnf, &steps, emit_lrat.is_some()) {
        Ok((report, lrat)) => {
            if let (Some(path), Some(lemmas)) = (emit_lrat, lrat) {
                if let Err(e) = write_file_atomically(path, write_lrat(&lemmas).as_bytes()) {
                    return unreadable(format!(
                        "{}: cannot write the LRAT proof: {e}",
                        path.display()
                    ));
                }
            }
            let seconds = started.elapsed().as_secs_f64();
            if json {
                println!(
                    "{{\"verified\":true,\"format\":\"{}\",\"original_clauses\":{},\"lemmas\":{},\"deletions\":{},\"checked_lemmas\":{},\"rat_lemmas\":{},\"core_original_clauses\":{},\"ignored_unit_deletions\":{},\"deletions_of_absent_clauses\":{},\"seconds\":{seconds:.3}}}",
                    if binary { "binary DRAT" } else { "text DRAT" },
                    report.original_clauses,
                    report.lemmas,
                    report.deletions,
                    report.checked_lemmas,
                    report.rat_lemmas,
                    report.core_original_clauses,
                    report.ignored_unit_deletions,
                    report.deletions_of_absent_clauses
                );
            } else {
                println!(
                    "VERIFIED: {} refutes {} ({} DRAT): {} lemmas, {} checked ({} by RAT), core of {} of {} original clauses, {:.2}s",
                    proof_path.display(),
                    cnf_path.display(),
                    if binary { "binary" } else { "text" },
                    report.lemmas,
                    report.checked_lemmas,
                    report.rat_lemmas,
                    report.core_original_clauses,
                    report.original_clauses,
                    seconds
                );
                if report.ignored_unit_deletions > 0 || report.deletions_of_absent_clauses > 0 {
                    println!(
                        "note: ignored {} deletions of unit clauses and {} deletions of clauses not present",
                        report.ignored_unit_deletions, report.deletions_of_absent_clauses
                    );
                }
                if let Some(path) = emit_lrat {
                    println!("wrote LRAT proof {}", path.display());
                }
            }
            ExitCode::SUCCESS
        }
        Err(failure) => {
            if json {
                println!(
                    "{{\"verified\":false,\"reason\":{:?}}}",
                    failure.to_string()
                );
            } else {
                println!("REJECTED: {}: {failure}", proof_path.display());
            }
            ExitCode::from(1)
        }
    }
}

pub fn run_lrat(cnf_path: &Path, proof_path: &Path, json: bool) -> ExitCode {
    let started = Instant::now();
    let cnf = match load_cnf(cnf_path) {
        Ok(c) => c,
        Err(code) => return code,
    };
    let lines = match read_input(proof_path)
        .and_then(|b| parse_lrat(&proof_path.display().to_string(), &b))
    {
        Ok(l) => l,
        Err(e) => return unreadable(e),
    };
    match check_lrat(&cnf, &lines) {
        Ok(report) => {
            let seconds = started.elapsed().as_secs_f64();
            if json {
                println!(
                    "{{\"verified\":true,\"lemmas\":{},\"rat_lemmas\":{},\"deletions\":{},\"seconds\":{seconds:.3}}}",
                    report.lemmas, report.rat_lemmas, report.deletions
                );
            } else {
                println!(
                    "VERIFIED: {} refutes {} (LRAT): {} lemmas ({} by RAT), {:.2}s",
                    proof_path.display(),
                    cnf_path.display(),
                    report.lemmas,
                    report.rat_lemmas,
                    seconds
                );
            }
            ExitCode::SUCCESS
        }
        Err(reason) => {
            if json {
                println!("{{\"verified\":false,\"reason\":{reason:?}}}");
            } else {
                println!("REJECTED: {}: {reason}", proof_path.display());
            }
            ExitCode::from(1)
        }
    }
}

/// Writes under a temporary name in the same directory, then renames.
fn write_file_atomically(path: &Path, content: &[u8]) -> std::io::Result<()> {
    let file_name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
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

pub fn run_bundle(dir: &Path, premise_dirs: &[PathBuf], json: bool) -> ExitCode {
    let started = Instant::now();
    let verdict = match check_bundle(dir, premise_dirs) {
        Ok(v) => v,
        Err(e) => return unreadable(e),
    };
    let seconds = started.elapsed().as_secs_f64();
    if json {
        let premises: Vec<serde_json::Value> = verdict
            .premises
            .iter()
            .map(|p| {
                serde_json::json!({
                    "statement": p.statement,
                    "source": p.source,
                    "certified_by": p.certified_by,
                })
            })
            .collect();
        println!(
            "{}",
            serde_json::json!({
                "pass": verdict.passed(),
                "claim": verdict.claim,
                "unconditional": verdict.unconditional(),
                "symmetry": verdict.symmetry,
                "premises": premises,
                "checks": verdict.passed,
                "failure": verdict.failure,
                "seconds": seconds,
            })
        );
    } else {
        println!("bundle {}", dir.display());
        println!("claim: {}", verdict.claim);
        let symmetry = if verdict.symmetry.is_empty() {
            "none".to_string()
        } else {
            verdict.symmetry.join(", ")
        };
        println!("symmetry breaking: {symmetry}");
        for step in &verdict.passed {
            println!("  ok: {step}");
        }
        for p in &verdict.premises {
            match &p.certified_by {
                Some(by) => println!(
                    "  premise {}: certified by bundle {}",
                    p.statement,
                    by.display()
                ),
                None => println!("  premise {}: ASSUMED ({})", p.statement, p.source),
            }
        }
        match &verdict.failure {
            Some(why) => println!("FAIL: {why}"),
            None if verdict.unconditional() => println!("PASS: {} ({seconds:.2}s)", verdict.claim),
            None => {
                let assumed: Vec<&str> = verdict
                    .premises
                    .iter()
                    .filter(|p| p.certified_by.is_none())
                    .map(|p| p.statement.as_str())
                    .collect();
                println!(
                    "PASS: {}, assuming {} ({seconds:.2}s)",
                    verdict.claim,
                    assumed.join(" and ")
                );
            }
        }
    }
    if verdict.passed() {
        ExitCode::SUCCESS
    } else {
        ExitCode::from(1)
    }
}
