//! A spinner on standard error for long runs: drawn only when standard error is a terminal,
//! never with `--quiet`.

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use std::io::IsTerminal;
use std::time::Duration;

/// A spinner that shows the current step, or nothing.
pub struct Progress(ProgressBar);

impl Progress {
    /// Start; hidden when `quiet` or when standard error is not a terminal.
    pub fn start(quiet: bool, first: &str) -> Progress {
        let bar = if quiet || !std::io::stderr().is_terminal() {
            ProgressBar::with_draw_target(None, ProgressDrawTarget::hidden())
        } else {
            let b = ProgressBar::new_spinner();
            b.set_style(
                ProgressStyle::with_template("{spinner} {msg} ({elapsed})")
                    .unwrap_or_else(|_| ProgressStyle::default_spinner()),
            );
            b.enable_steady_tick(Duration::from_millis(120));
            b
        };
        bar.set_message(first.to_string());
        Progress(bar)
    }

    /// Show the next step.
    pub fn step(&self, message: &str) {
        self.0.set_message(message.to_string());
    }

    /// Remove the spinner.
    pub fn finish(self) {
        self.0.finish_and_clear();
    }
}
