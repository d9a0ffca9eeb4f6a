//! The progress line on stderr: shown only when stderr is a terminal and the user
//! did not ask for quiet.

use std::io::IsTerminal;
use std::time::Duration;

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
