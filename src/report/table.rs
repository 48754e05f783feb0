//! Plain-text tables with aligned columns, for terminal reports.

/// A table: header row, then data rows; numeric columns right-aligned.
pub struct Table {
    pub headers: Vec<String>,
    pub rows: Vec<Vec<String>>,
}

impl Table {
    pub fn new(headers: &[&str]) -> Table {
        Table {
            headers: headers.iter().map(|h| h.to_string()).collect(),
            rows: Vec::new(),
        }
    }

    pub fn row(&mut self, cells: Vec<String>) {
        self.rows.push(cells);
    }

    pub fn render(&self) -> String {
        let n = self.headers.len();
        let mut width: Vec<usize> = self.headers.iter().map(|h| h.chars().count()).collect();
        for r in &self.rows {
            for (i, c) in r.iter().enumerate().take(n) {
                width[i] = width[i].max(c.chars().count());
            }
        }
        let numeric: Vec<bool> = (0..n)
            .map(|i| {
                self.rows.iter().all(|r| {
                    r.get(i).is_none_or(|c| {
                        c.is_empty()
                            || c == "-"
                            || c.trim_start_matches(['-', '+'])
                                .starts_with(|ch: char| ch.is_ascii_digit())
                    })
                }) && !self.rows.is_empty()
            })
            .collect();
        let mut out = String::new();
        let line = |cells: &[String], out: &mut String| {
            let mut s = String::new();
            for i in 0..n {
                let c = cells.get(i).map(String::as_str).unwrap_or("");
                let pad = width[i] - c.chars().count();
                if i > 0 {
                    s.push_str("  ");
                }
                if numeric[i] {
                    s.push_str(&" ".repeat(pad));
                    s.push_str(c);
                } else {
                    s.push_str(c);
                    s.push_str(&" ".repeat(pad));
                }
            }
            out.push_str(s.trim_end());
            out.push('\n');
        };
        line(&self.headers, &mut out);
        let rule: Vec<String> = width.iter().map(|&w| "-".repeat(w)).collect();
        out.push_str(&rule.join("  "));
        out.push('\n');
        for r in &self.rows {
            line(r, &mut out);
        }
        out
    }
}

/// A number to about `sig` significant figures, fixed-point when readable.
pub fn sig(v: f64, sig: usize) -> String {
    if !v.is_finite() {
        return "-".into();
    }
    if v == 0.0 {
        return "0".into();
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-4..9).contains(&mag) {
        return format!("{:.*e}", sig.saturating_sub(1), v);
    }
    let decimals = (sig as i32 - 1 - mag).max(0) as usize;
    let s = format!("{v:.decimals$}");
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        "0".into()
    } else {
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn formats_and_aligns() {
        assert_eq!(sig(15.1878, 4), "15.19");
        assert_eq!(sig(-0.05921, 3), "-0.0592");
        assert_eq!(sig(1234567.0, 4), "1234567");
        assert_eq!(sig(1e-9, 3), "1.00e-9");
        let mut t = Table::new(&["id", "force kip"]);
        t.row(vec!["A".into(), "1.5".into()]);
        t.row(vec!["BB".into(), "-10.25".into()]);
        let s = t.render();
        // Numbers right-aligned under a wider header, text left-aligned.
        assert!(s.contains("\nA         1.5\n"), "{s}");
        assert!(s.contains("\nBB     -10.25\n"), "{s}");
    }
}
