//! Memory estimates for work that holds a whole formula, and the `--max-memory`
//! limit that refuses such work before it starts (a formula that outgrows memory
//! gets a process killed with nothing written).
//!
//! The estimate is per literal and per clause: the collected formula holds 4 bytes
//! per literal and 8 per clause; each varisat solver about 8 bytes per literal and
//! 40 per clause (clause storage, watch lists, proof bookkeeping), plus 64 MiB of
//! base. Calibrated on (4,6;34) (20.4 M literals, 1.39 M clauses): 288 MB peak with
//! one solver, 432 MB with two, against estimates of 376 and 595 MB
//! (`/usr/bin/time -f %M ramsift find 4,6 34 --method sat --threads T --timeout 8`).

use thiserror::Error;

const BASE: u64 = 64 << 20;

/// Bytes needed to hold a formula of `literals` and `clauses` in `solvers` solvers.
pub fn formula_bytes(literals: u128, clauses: u64, solvers: usize) -> u128 {
    let clauses = clauses as u128;
    let per_solver = literals * 8 + clauses * 40;
    BASE as u128 + literals * 4 + clauses * 8 + per_solver * solvers.max(1) as u128
}

/// The default limit: three quarters of the machine's memory (`MemTotal` of
/// /proc/meminfo), or 8 GiB where that cannot be read.
pub fn default_limit() -> u64 {
    let total_kib = std::fs::read_to_string("/proc/meminfo")
        .ok()
        .and_then(|text| {
            let line = text.lines().find(|l| l.starts_with("MemTotal:"))?;
            line.split_whitespace().nth(1)?.parse::<u64>().ok()
        });
    total_kib.map_or(8 << 30, |kib| kib * 1024 / 4 * 3)
}

/// A size such as `512M`, `16G`, `2.5G` or a plain number of bytes.
pub fn parse_size(text: &str) -> Result<u64, String> {
    let text = text.trim();
    let (number, unit) = match text.find(|c: char| c.is_ascii_alphabetic()) {
        Some(at) => text.split_at(at),
        None => (text, ""),
    };
    let factor: u64 = match unit
        .to_ascii_uppercase()
        .trim_end_matches("IB")
        .trim_end_matches('B')
    {
        "" => 1,
        "K" => 1 << 10,
        "M" => 1 << 20,
        "G" => 1 << 30,
        "T" => 1 << 40,
        _ => return Err(format!("{text:?}: expected a size such as 512M or 16G")),
    };
    match number.trim().parse::<f64>() {
        Ok(v) if v.is_finite() && v > 0.0 => Ok((v * factor as f64) as u64),
        _ => Err(format!(
            "{text:?}: expected a positive size such as 512M or 16G"
        )),
    }
}

/// Work refused because its estimate exceeds the limit.
#[derive(Debug, Error, PartialEq, Eq)]
#[error("{what} needs about {} of memory ({literals} literals in {clauses} clauses, {solvers} solver(s)), over the --max-memory limit of {}; raise the limit if this machine can hold it", human(*.estimate), human(*.limit))]
pub struct OverMemory {
    pub what: String,
    pub estimate: u128,
    pub limit: u64,
    pub literals: u128,
    pub clauses: u64,
    pub solvers: usize,
}

/// Checks the estimate for `what` against `limit`.
pub fn check(
    what: &str,
    literals: u128,
    clauses: u64,
    solvers: usize,
    limit: u64,
) -> Result<(), OverMemory> {
    let estimate = formula_bytes(literals, clauses, solvers);
    if estimate <= limit as u128 {
        return Ok(());
    }
    Err(OverMemory {
        what: what.to_string(),
        estimate,
        limit,
        literals,
        clauses,
        solvers,
    })
}

/// Bytes as MiB or GiB with one decimal.
pub fn human(bytes: impl Into<u128>) -> String {
    let bytes = bytes.into() as f64;
    if bytes >= (1u64 << 30) as f64 {
        format!("{:.1} GiB", bytes / (1u64 << 30) as f64)
    } else {
        format!("{:.1} MiB", bytes / (1u64 << 20) as f64)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sizes_read_with_binary_units() {
        assert_eq!(parse_size("512M"), Ok(512 << 20));
        assert_eq!(parse_size("16G"), Ok(16 << 30));
        assert_eq!(parse_size("2.5GiB"), Ok(5 << 29));
        assert_eq!(parse_size("4096"), Ok(4096));
        assert_eq!(parse_size("1kb"), Ok(1024));
        for bad in ["", "G", "-1G", "12Q", "nanG", "0"] {
            assert!(parse_size(bad).is_err(), "{bad:?}");
        }
    }

    #[test]
    fn the_estimate_covers_the_calibration_runs() {
        // (4,6;34): C(34,4)·6 + C(34,6)·15 literals in C(34,4) + C(34,6) clauses
        // (binomials by hand), measured at 288 MB (one solver) and 432 MB (two).
        let (literals, clauses) = (46_376 * 6 + 1_344_904 * 15, 46_376 + 1_344_904);
        assert!(formula_bytes(literals, clauses, 1) > 288_000_000);
        assert!(formula_bytes(literals, clauses, 2) > 432_000_000);
        assert!(check("x", literals, clauses, 2, 300 << 20).is_err());
        assert!(check("x", literals, clauses, 2, 1 << 30).is_ok());
    }
}
