//! Stopping a varisat solve from outside.
//!
//! varisat 0.2.2 has no interrupt, conflict limit or time limit. It does stop, with
//! an error, as soon as writing its proof fails. So every solver gets a proof target
//! ([`InterruptSink`]) that discards the bytes (or passes them on to a real trace),
//! counts them, and fails once the global stop flag is set, the deadline has passed
//! or the attempt's byte budget is spent. varisat buffers 8 KiB of proof before each
//! write, so the check runs every few hundred conflicts. Bytes of proof are a
//! deterministic measure of work, so byte budgets keep runs reproducible.

use std::cell::Cell;
use std::io::{self, Write};
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::time::Instant;

/// Set once the process receives SIGINT, SIGTERM or SIGHUP (Ctrl-C, or a batch
/// system's wall-time limit): every solve and search then stops as at a timeout,
/// so commands write their summary, remove their temporary files and exit 1.
pub static INTERRUPTED: AtomicBool = AtomicBool::new(false);

/// Whether an interrupting signal has arrived.
pub fn interrupted() -> bool {
    INTERRUPTED.load(Ordering::Relaxed)
}

/// Whether the caller's `stop` flag is raised or an interrupting signal has arrived.
pub fn stop_requested(stop: &AtomicBool) -> bool {
    stop.load(Ordering::Relaxed) || interrupted()
}

/// [`stop_requested`], or the `deadline` has passed.
pub fn should_stop(stop: &AtomicBool, deadline: Option<Instant>) -> bool {
    stop_requested(stop) || deadline.is_some_and(|d| Instant::now() >= d)
}

/// Why a run ended without an answer, in words: interrupted or out of time.
pub fn stopped_because() -> &'static str {
    if interrupted() {
        "before the run was interrupted by a signal"
    } else {
        "within the time limit"
    }
}

/// Installs the handler that sets [`INTERRUPTED`]; a second signal ends the
/// process at once with exit code 130.
pub fn install_signal_handler() -> Result<(), String> {
    ctrlc::set_handler(|| {
        if INTERRUPTED.swap(true, Ordering::SeqCst) {
            std::process::exit(130);
        }
    })
    .map_err(|e| e.to_string())
}

/// Why a solve was stopped.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StopReason {
    /// Another worker answered, or the user asked to stop.
    Stopped,
    /// The run's deadline passed.
    Deadline,
    /// This attempt's work budget was spent.
    Budget,
}

/// Limits that end a solve.
#[derive(Clone, Copy, Debug)]
pub struct Limits<'a> {
    pub stop: &'a AtomicBool,
    pub deadline: Option<Instant>,
    /// Proof bytes this attempt may produce (None: unlimited).
    pub budget_bytes: Option<u64>,
    /// A counter of proof bytes that others may read while the solve runs.
    pub bytes_seen: Option<&'a AtomicU64>,
}

/// What a sink saw, readable after the solver that owns the sink is gone.
#[derive(Debug, Default)]
pub struct SinkReport {
    pub bytes: Cell<u64>,
    pub reason: Cell<Option<StopReason>>,
}

/// A proof target that enforces [`Limits`], optionally forwarding to a real writer.
pub struct InterruptSink<'a, W: Write> {
    limits: Limits<'a>,
    inner: Option<W>,
    report: &'a SinkReport,
}

impl<'a, W: Write> InterruptSink<'a, W> {
    pub fn new(limits: Limits<'a>, inner: Option<W>, report: &'a SinkReport) -> Self {
        InterruptSink {
            limits,
            inner,
            report,
        }
    }

    fn check(&self) -> Option<StopReason> {
        if stop_requested(self.limits.stop) {
            return Some(StopReason::Stopped);
        }
        if self.limits.deadline.is_some_and(|d| Instant::now() >= d) {
            return Some(StopReason::Deadline);
        }
        if self
            .limits
            .budget_bytes
            .is_some_and(|b| self.report.bytes.get() >= b)
        {
            return Some(StopReason::Budget);
        }
        None
    }
}

impl<W: Write> Write for InterruptSink<'_, W> {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        if let Some(reason) = self.check() {
            self.report.reason.set(Some(reason));
            return Err(io::Error::other(format!("solve interrupted: {reason:?}")));
        }
        if let Some(inner) = &mut self.inner {
            inner.write_all(buf)?;
        }
        self.report
            .bytes
            .set(self.report.bytes.get() + buf.len() as u64);
        if let Some(seen) = self.limits.bytes_seen {
            seen.fetch_add(buf.len() as u64, Ordering::Relaxed);
        }
        Ok(buf.len())
    }

    fn flush(&mut self) -> io::Result<()> {
        match &mut self.inner {
            Some(inner) => inner.flush(),
            None => Ok(()),
        }
    }
}

/// A varisat solver whose proof output is discarded and only enforces `limits`:
/// how searches without a trace get a deadline and the stop flag. varisat's own
/// proof format is used, since (unlike DRAT) it allows clauses added between
/// solves, as blocking clauses are.
pub fn limited_solver<'a>(
    stop: &'a AtomicBool,
    deadline: Option<Instant>,
    report: &'a SinkReport,
) -> varisat::Solver<'a> {
    let limits = Limits {
        stop,
        deadline,
        budget_bytes: None,
        bytes_seen: None,
    };
    let mut solver = varisat::Solver::new();
    solver.write_proof(
        InterruptSink::<io::Sink>::new(limits, None, report),
        varisat::ProofFormat::Varisat,
    );
    solver
}
