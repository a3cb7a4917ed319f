//! A progress bar for `bake` on a terminal (stderr); nothing otherwise, where
//! the one summary line `bake` prints is all a build log needs.

use std::io::{IsTerminal, Write};
use std::path::Path;

pub struct Progress {
    total: usize,
    done: usize,
    on: bool,
}

impl Progress {
    pub fn new(total: usize) -> Progress {
        Progress { total, done: 0, on: std::io::stderr().is_terminal() && total > 0 }
    }

    /// Starting the next page.
    pub fn step(&mut self, page: &Path) {
        if !self.on {
            return;
        }
        const WIDTH: usize = 30;
        let filled = WIDTH * self.done / self.total;
        let name = page.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
        let name: String = name.chars().take(40).collect();
        let mut e = std::io::stderr();
        let _ = write!(e, "\r\x1b[2K[{}{}] {}/{} {name}", "#".repeat(filled), " ".repeat(WIDTH - filled), self.done, self.total);
        let _ = e.flush();
        self.done += 1;
    }

    /// Clear the bar before the summary line.
    pub fn finish(&mut self) {
        if self.on {
            let _ = write!(std::io::stderr(), "\r\x1b[2K");
        }
    }
}
