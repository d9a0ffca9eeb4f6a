//! Where and how a certificate or witness was made: the command line, the
//! version and source revision of ramsift, the date (UTC), the processor and its
//! core count. Every manifest, summary.json and witness file carries it.

use serde::Serialize;

/// The provenance of one run.
#[derive(Clone, Debug, Serialize)]
pub struct Provenance {
    pub command_line: Vec<String>,
    pub version: String,
    pub source_revision: String,
    /// ISO 8601, UTC, to the second.
    pub date_utc: String,
    pub cpu: String,
    pub cores: usize,
}

impl Provenance {
    /// The provenance of the running process.
    pub fn of_this_run() -> Self {
        Provenance {
            command_line: std::env::args().collect(),
            version: env!("CARGO_PKG_VERSION").to_string(),
            source_revision: option_env!("RAMSIFT_SOURCE_REVISION")
                .unwrap_or("unknown")
                .to_string(),
            date_utc: utc_now(),
            cpu: cpu_model(),
            cores: std::thread::available_parallelism().map_or(1, |n| n.get()),
        }
    }

    /// One line for a comment in a text file.
    pub fn line(&self) -> String {
        format!(
            "made by ramsift {} (revision {}) on {}, {} ({} cores): {}",
            self.version,
            self.source_revision,
            self.date_utc,
            self.cpu,
            self.cores,
            self.command_line.join(" ")
        )
    }
}

/// The processor's model name from /proc/cpuinfo, or "unknown".
fn cpu_model() -> String {
    let info = std::fs::read_to_string("/proc/cpuinfo").unwrap_or_default();
    let model = info.lines().find_map(|l| {
        l.strip_prefix("model name")?
            .split_once(':')
            .map(|(_, m)| m.trim())
    });
    model.unwrap_or("unknown").to_string()
}

/// Now, as YYYY-MM-DDTHH:MM:SSZ (days to a civil date by Hinnant's algorithm,
/// "chrono-Compatible Low-Level Date Algorithms", 2013).
fn utc_now() -> String {
    utc(std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_secs()))
}

/// Seconds since the Unix epoch as YYYY-MM-DDTHH:MM:SSZ.
fn utc(secs: u64) -> String {
    let (days, rest) = ((secs / 86_400) as i64, secs % 86_400);
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z - era * 146_097;
    let yoe = (doe - doe / 1_460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let day = doy - (153 * mp + 2) / 5 + 1;
    let month = if mp < 10 { mp + 3 } else { mp - 9 };
    let year = yoe + era * 400 + (month <= 2) as i64;
    format!(
        "{year:04}-{month:02}-{day:02}T{:02}:{:02}:{:02}Z",
        rest / 3_600,
        rest % 3_600 / 60,
        rest % 60
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_date_is_iso_8601_and_the_run_is_described() {
        let p = Provenance::of_this_run();
        let d = p.date_utc.as_bytes();
        assert_eq!(d.len(), 20, "{}", p.date_utc);
        assert!(p.date_utc.starts_with("20") && d[4] == b'-' && d[10] == b'T' && d[19] == b'Z');
        assert!(p.cores >= 1 && !p.source_revision.is_empty() && !p.command_line.is_empty());
        assert!(p.line().contains(&p.date_utc));
    }

    #[test]
    fn known_instants_convert() {
        // POSIX time: the epoch, a leap day, and the last second of 2024 (common practice).
        assert_eq!(utc(0), "1970-01-01T00:00:00Z");
        assert_eq!(utc(951_782_400), "2000-02-29T00:00:00Z");
        assert_eq!(utc(1_735_689_599), "2024-12-31T23:59:59Z");
    }
}
