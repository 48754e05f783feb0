//! How text reports meet the terminal: whether to colour (only on a
//! terminal, never when NO_COLOR is set to a non-empty value, never for
//! TERM=dumb) and how wide a table may be (COLUMNS when set, else the
//! terminal's own size; no limit when writing to a pipe or file).

use std::io::IsTerminal;

/// Emphasis of a table row or a phrase.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum Mark {
    #[default]
    Plain,
    /// Bold: the controlling line.
    Strong,
    /// Bold red: over capacity (bold too, so it reads without colour).
    Fail,
}

/// Where a text report is going.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub struct Term {
    /// Write ANSI colour and bold sequences.
    pub colour: bool,
    /// Fit tables to this many columns.
    pub width: Option<usize>,
}

impl Term {
    /// No colour, no width limit: files, pipes, tests.
    pub fn plain() -> Term {
        Term::default()
    }

    /// Standard output as it is now.
    pub fn stdout() -> Term {
        let tty = std::io::stdout().is_terminal();
        Term::decide(
            tty,
            std::env::var_os("NO_COLOR").is_some_and(|v| !v.is_empty()),
            std::env::var("TERM").is_ok_and(|t| t == "dumb"),
            std::env::var("COLUMNS").ok().as_deref(),
            || terminal_size::terminal_size().map(|(w, _)| w.0 as usize),
        )
    }

    /// The decision, from its inputs (so it can be tested).
    pub fn decide(
        tty: bool,
        no_color: bool,
        dumb: bool,
        columns: Option<&str>,
        query: impl FnOnce() -> Option<usize>,
    ) -> Term {
        let from_env = columns
            .and_then(|c| c.trim().parse::<usize>().ok())
            .filter(|&c| c >= 20);
        let width = match from_env {
            Some(c) => Some(c),
            None if tty => query().filter(|&c| c >= 20),
            None => None,
        };
        Term {
            colour: tty && !no_color && !dumb,
            width,
        }
    }

    /// `s` with the emphasis of `mark` when colour is on.
    pub fn paint(&self, s: &str, mark: Mark) -> String {
        if !self.colour {
            return s.to_string();
        }
        match mark {
            Mark::Plain => s.to_string(),
            Mark::Strong => format!("\x1b[1m{s}\x1b[0m"),
            Mark::Fail => format!("\x1b[1;31m{s}\x1b[0m"),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn colour_only_on_a_terminal_without_no_color() {
        // no-color.org: any non-empty NO_COLOR disables colour.
        assert!(Term::decide(true, false, false, None, || None).colour);
        assert!(!Term::decide(true, true, false, None, || None).colour);
        assert!(!Term::decide(false, false, false, None, || None).colour);
        assert!(!Term::decide(true, false, true, None, || None).colour);
    }

    #[test]
    fn width_from_columns_then_the_terminal() {
        assert_eq!(
            Term::decide(false, false, false, Some("90"), || Some(200)).width,
            Some(90)
        );
        assert_eq!(
            Term::decide(true, false, false, None, || Some(132)).width,
            Some(132)
        );
        assert_eq!(
            Term::decide(false, false, false, None, || Some(132)).width,
            None
        );
        assert_eq!(
            Term::decide(true, false, false, Some("x"), || None).width,
            None
        );
    }

    #[test]
    fn paint_is_plain_without_colour() {
        assert_eq!(Term::plain().paint("1.2", Mark::Fail), "1.2");
        let t = Term {
            colour: true,
            width: None,
        };
        assert_eq!(t.paint("1.2", Mark::Fail), "\x1b[1;31m1.2\x1b[0m");
    }
}
