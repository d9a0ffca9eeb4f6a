//! A progress line on stderr while a check runs, shown only when stderr is a
//! terminal: what is being read (with its size), then how many lemmas have been
//! checked, so that a multi-gigabyte trace is never checked in silence.

use std::io::{IsTerminal, Write};
use std::sync::atomic::{AtomicBool, Ordering};
use std::time::{Duration, Instant};

use ramsift_checker::drat_check::CHECKED_LEMMAS;

/// Says what is being read, e.g. `reading proof.drat (225.1 MB)`.
pub fn reading(path: &std::path::Path) {
    if std::io::stderr().is_terminal() {
        let size = std::fs::metadata(path).map(|m| m.len()).unwrap_or(0);
        eprint!("\r\x1b[2Kreading {} ({:.1} MB)", path.display(), size as f64 / 1e6);
    }
}

/// Runs `work` while a line shows the lemmas checked so far (of `total`, if known).
pub fn while_checking<T: Send>(total: Option<usize>, work: impl FnOnce() -> T + Send) -> T {
    if !std::io::stderr().is_terminal() {
        return work();
    }
    let done = AtomicBool::new(false);
    let started = Instant::now();
    let result = std::thread::scope(|scope| {
        scope.spawn(|| {
            while !done.load(Ordering::Relaxed) {
                let checked = CHECKED_LEMMAS.load(Ordering::Relaxed);
                let of = total.map(|t| format!(" ({t} proof steps)")).unwrap_or_default();
                eprint!("\r\x1b[2Kchecking: {checked} lemmas checked{of}, {:.1}s", started.elapsed().as_secs_f64());
                let _ = std::io::stderr().flush();
                std::thread::sleep(Duration::from_millis(200));
            }
        });
        let result = work();
        done.store(true, Ordering::Relaxed);
        result
    });
    eprint!("\r\x1b[2K");
    result
}
