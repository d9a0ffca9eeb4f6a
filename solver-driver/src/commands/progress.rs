//! The progress line on stderr: shown only when stderr is a terminal and the user
//! did not ask for quiet.

use std::io::IsTerminal;
use std::time::{Duration, Instant};

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

/// A spinner with a message, or nothing.
pub struct ProgressLine {
    bar: Option<ProgressBar>,
}

impl ProgressLine {
    pub fn new(quiet: bool) -> Self {
        let bar = (!quiet && std::io::stderr().is_terminal()).then(|| {
            let bar = ProgressBar::with_draw_target(None, ProgressDrawTarget::stderr());
            bar.set_style(ProgressStyle::with_template("{spinner} {msg}").expect("valid template"));
            bar
        });
        ProgressLine { bar }
    }

    pub fn update(&self, message: impl FnOnce() -> String) {
        if let Some(bar) = &self.bar {
            bar.set_message(message());
            bar.tick();
        }
    }

    /// Runs `work` on a thread of its own while the line shows `message(elapsed)`,
    /// refreshed every 100 ms (the end of the work is noticed within 5 ms), and
    /// clears the line afterwards.
    pub fn run_while<T: Send>(
        &self,
        work: impl FnOnce() -> T + Send,
        message: impl Fn(Duration) -> String,
    ) -> T {
        let started = Instant::now();
        let result = std::thread::scope(|scope| {
            let worker = scope.spawn(work);
            let mut polls = 0u32;
            while !worker.is_finished() {
                std::thread::sleep(Duration::from_millis(5));
                polls += 1;
                if polls % 20 == 0 {
                    self.update(|| message(started.elapsed()));
                }
            }
            worker.join().expect("the worker thread does not panic")
        });
        self.finish();
        result
    }

    pub fn finish(&self) {
        if let Some(bar) = &self.bar {
            bar.finish_and_clear();
        }
    }
}

/// Seconds with one decimal, for progress lines.
pub fn seconds(elapsed: Duration) -> String {
    format!("{:.1}s", elapsed.as_secs_f64())
}
