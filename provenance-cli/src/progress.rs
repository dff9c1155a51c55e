//! Progress on standard error for long runs: a bar over the samples for a step that counts
//! them, a spinner otherwise. Drawn only when standard error is a terminal, never with
//! `--quiet`.

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use provenance_core::report::Observer;
use std::io::IsTerminal;
use std::time::Duration;

/// The current step and, when it counts samples, how many are done; or nothing.
pub struct Progress(ProgressBar);

const SPINNER: &str = "{spinner} {msg} ({elapsed})";
const BAR: &str = "{msg} [{bar:30}] {pos}/{len} samples ({elapsed}, about {eta} left)";

impl Progress {
    /// Start; hidden when `quiet` or when standard error is not a terminal.
    pub fn start(quiet: bool, first: &str) -> Progress {
        let bar = if quiet || !std::io::stderr().is_terminal() {
            ProgressBar::with_draw_target(None, ProgressDrawTarget::hidden())
        } else {
            let b = ProgressBar::new_spinner();
            b.enable_steady_tick(Duration::from_millis(120));
            b
        };
        let p = Progress(bar);
        p.step(first, 0);
        p
    }

    /// Remove the bar.
    pub fn finish(self) {
        self.0.finish_and_clear();
    }
}

impl Observer for Progress {
    fn step(&self, name: &str, total: u64) {
        let (template, fallback) = if total > 0 {
            (BAR, ProgressStyle::default_bar())
        } else {
            (SPINNER, ProgressStyle::default_spinner())
        };
        self.0.set_style(
            ProgressStyle::with_template(template)
                .map(|s| s.progress_chars("=> "))
                .unwrap_or(fallback),
        );
        self.0.set_length(total);
        self.0.set_position(0);
        self.0.set_message(name.to_string());
    }

    fn advance(&self, n: u64) {
        self.0.inc(n);
    }
}
