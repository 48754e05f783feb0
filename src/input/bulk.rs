//! A fast reader for the two long lists of a large model file, `nodes` and
//! `members`, when they are written in the plain form panelpoint itself
//! writes: `(id: "n1", x: 0.0, y: 4.5)` rows of ASCII field names, plain
//! decimal numbers and strings without escapes, blanks and `//` comments.
//!
//! Why: the general RON parser reads a million-member model at about
//! 50 MB/s, slower than the sparse factorization of the same truss; this
//! reader is several times faster and splits a list into pieces read on
//! all cores. It never changes what a file means: on anything outside its
//! plain form (escapes, block comments, `Some(..)`, named rows, unknown or
//! repeated fields, unusual number forms ...) it gives the list up and the
//! RON parser reads it as before, errors and all. A list it did read is
//! blanked out of the text handed to the RON parser, keeping every line
//! break and the column of the closing bracket, so the line and column of
//! any error elsewhere are the same as in the file. Tests compare the two
//! readers on every model in the repository and on many altered rows.

use super::quantity::Quantity;
use super::schema::{Id, MemberFile, NodeFile};
use rayon::prelude::*;

/// What the fast reader took from the text.
pub(super) struct Bulk {
    pub nodes: Option<Vec<NodeFile>>,
    pub members: Option<Vec<MemberFile>>,
    /// The text with the lists read here blanked out; `None` if none was.
    pub rest: Option<String>,
}

/// Files shorter than this are left to the RON parser: they cost it
/// nothing, and the fast reader's set-up would be wasted.
const MIN_FILE_BYTES: usize = 1 << 16;

/// Bytes of list text per piece read by one task.
const PIECE_BYTES: usize = 1 << 22;

/// Read the `nodes` and `members` lists of `text` where they are in the
/// plain form; see the module comment.
pub(super) fn read(text: &str) -> Bulk {
    read_with(text, MIN_FILE_BYTES, PIECE_BYTES)
}

/// [`read`] with the size thresholds given, so tests can drive the fast
/// path and the splitting on small files.
pub(super) fn read_with(text: &str, min_bytes: usize, piece_bytes: usize) -> Bulk {
    let mut bulk = Bulk {
        nodes: None,
        members: None,
        rest: None,
    };
    if text.len() < min_bytes {
        return bulk;
    }
    let mut blank = Vec::new();
    let found = crate::timing::stage("parse: plain lists", || {
        top_level_lists(text, |list, open| {
            let close = match list {
                List::Nodes => read_list(text, open, piece_bytes, node).map(|(v, close)| {
                    bulk.nodes = Some(v);
                    close
                }),
                List::Members => read_list(text, open, piece_bytes, member).map(|(v, close)| {
                    bulk.members = Some(v);
                    close
                }),
            };
            if let Some(close) = close {
                blank.push((open + 1, close));
            }
            close
        })
    });
    if found.is_none() {
        // The scan lost its place: nothing read here is used.
        return Bulk {
            nodes: None,
            members: None,
            rest: None,
        };
    }
    if !blank.is_empty() {
        bulk.rest = Some(blanked(text, &blank));
    }
    bulk
}

#[derive(Clone, Copy, PartialEq, Debug)]
enum List {
    Nodes,
    Members,
}

/// `text` with each span replaced by its line breaks, then as many spaces
/// as the last line of the span had characters, so positions after it are
/// unchanged in line and column.
fn blanked(text: &str, spans: &[(usize, usize)]) -> String {
    let mut out = String::with_capacity(text.len() / 8);
    let mut at = 0;
    for &(a, b) in spans {
        out.push_str(&text[at..a]);
        let inner = &text[a..b];
        // A list of 10⁶ rows is 200 MB of text: counted on all cores.
        let breaks: usize = inner
            .as_bytes()
            .par_chunks(1 << 20)
            .map(|c| c.iter().filter(|&&c| c == b'\n').count())
            .sum();
        out.extend(std::iter::repeat_n('\n', breaks));
        let tail = inner.rfind('\n').map_or(inner, |p| &inner[p + 1..]);
        out.extend(std::iter::repeat_n(' ', tail.chars().count()));
        at = b;
    }
    out.push_str(&text[at..]);
    out
}

// ------------------------------------------------------------ the top level

/// Scan the top level of `text` and, at each `nodes: [` or `members: [`
/// of the outermost struct, call `read(list, position of '[')`, which
/// returns the position of the closing `]` if it read the list (the scan
/// goes on after it) or `None` (the scan goes on inside the list). Gives
/// `None` if the file starts with an attribute (`#![enable(..)]` may change
/// how everything reads) or holds a block comment, raw string or character
/// literal outside a string, where this simple scan could lose its place.
fn top_level_lists(text: &str, mut read: impl FnMut(List, usize) -> Option<usize>) -> Option<()> {
    let b = text.as_bytes();
    let mut s = Scan { b, i: 0 };
    s.blanks()?;
    if b.get(s.i) == Some(&b'#') {
        return None;
    }
    let mut depth = 0usize;
    while s.i < b.len() {
        let c = b[s.i];
        match c {
            b'(' | b'[' | b'{' => {
                depth += 1;
                s.i += 1;
            }
            b')' | b']' | b'}' => {
                depth = depth.saturating_sub(1);
                s.i += 1;
            }
            b'"' => s.skip_string()?,
            b'/' => s.blanks()?,
            b'\'' => return None,
            c if c.is_ascii_alphabetic() || c == b'_' => {
                let start = s.i;
                while s.i < b.len() && (b[s.i].is_ascii_alphanumeric() || b[s.i] == b'_') {
                    s.i += 1;
                }
                let word = &b[start..s.i];
                if b.get(s.i) == Some(&b'"') || b.get(s.i) == Some(&b'#') {
                    // r"..", r#".."#, b"..": leave the whole file to RON.
                    return None;
                }
                if depth != 1 {
                    continue;
                }
                let list = match word {
                    b"nodes" => List::Nodes,
                    b"members" => List::Members,
                    _ => continue,
                };
                s.blanks()?;
                if b.get(s.i) != Some(&b':') {
                    continue;
                }
                s.i += 1;
                s.blanks()?;
                if b.get(s.i) != Some(&b'[') {
                    continue;
                }
                if let Some(close) = read(list, s.i) {
                    s.i = close + 1;
                }
            }
            _ => s.i += 1,
        }
    }
    Some(())
}

/// The first position at or after `i` that is not an ASCII blank or inside
/// a `//` comment.
fn skip_blanks(b: &[u8], mut i: usize) -> usize {
    while i < b.len() {
        match b[i] {
            b' ' | b'\t' | b'\n' | b'\r' => i += 1,
            b'/' if b.get(i + 1) == Some(&b'/') => {
                while i < b.len() && b[i] != b'\n' {
                    i += 1;
                }
            }
            _ => break,
        }
    }
    i
}

/// A cursor over the bytes of the text.
struct Scan<'a> {
    b: &'a [u8],
    i: usize,
}

impl Scan<'_> {
    /// Skip blanks and `//` comments; `None` at any other `/` (a block
    /// comment), where this scan could lose its place.
    fn blanks(&mut self) -> Option<()> {
        self.i = skip_blanks(self.b, self.i);
        (self.b.get(self.i) != Some(&b'/')).then_some(())
    }

    /// Past a `"` string (escapes skipped); `None` if it never closes.
    fn skip_string(&mut self) -> Option<()> {
        let b = self.b;
        self.i += 1;
        while self.i < b.len() {
            match b[self.i] {
                b'"' => {
                    self.i += 1;
                    return Some(());
                }
                b'\\' => self.i += 2,
                _ => self.i += 1,
            }
        }
        None
    }
}

// ------------------------------------------------------------------ lists

/// Read the list whose `[` is at `open`, with `row`, in pieces on all
/// cores: the pieces are cut from the rest of the file (its end is not
/// known yet), the first piece to meet the closing `]` ends the list and
/// the pieces after it are dropped (each fails at its first foreign row).
/// The rows and the position of the `]`, or `None` if any piece before the
/// end is not in the plain form.
fn read_list<T: Send>(
    text: &str,
    open: usize,
    piece_bytes: usize,
    row: fn(&mut Row) -> Option<T>,
) -> Option<(Vec<T>, usize)> {
    let from = open + 1;
    let b = &text.as_bytes()[from..];
    let cuts = cuts(b, piece_bytes);
    let pieces: Vec<Piece<T>> = cuts
        .par_windows(2)
        .map(|w| read_piece(&b[w[0]..w[1]], row))
        .collect();
    let mut parts = Vec::new();
    for (p, w) in pieces.into_iter().zip(cuts.windows(2)) {
        match p {
            Piece::Through(v) => parts.push(v),
            Piece::Ended(v, at) => {
                parts.push(v);
                return Some((concat(parts), from + w[0] + at));
            }
            Piece::Failed => return None,
        }
    }
    None
}

/// The pieces' rows in order in one vector, moved on all cores: at 10⁶ DOF
/// the member rows fill about 430 MB, and the first write to each of its
/// pages costs more than the copy, so the pages are written in parallel
/// rather than by one growing `extend`.
fn concat<T: Send>(parts: Vec<Vec<T>>) -> Vec<T> {
    let total = parts.iter().map(Vec::len).sum();
    let mut all: Vec<T> = Vec::with_capacity(total);
    let mut spare = &mut all.spare_capacity_mut()[..total];
    let mut slots = Vec::with_capacity(parts.len());
    for p in &parts {
        let (slot, rest) = std::mem::take(&mut spare).split_at_mut(p.len());
        slots.push(slot);
        spare = rest;
    }
    slots.into_par_iter().zip(parts).for_each(|(slot, part)| {
        for (s, v) in slot.iter_mut().zip(part) {
            s.write(v);
        }
    });
    // SAFETY: the slots cover the first `total` elements exactly once and
    // each slot has as many elements as its part, every one written above.
    unsafe { all.set_len(total) };
    all
}

/// How one piece of a list read.
enum Piece<T> {
    /// Its rows, each followed by a comma, up to the piece's end.
    Through(Vec<T>),
    /// Its rows up to the list's closing `]`, at this offset in the piece.
    Ended(Vec<T>, usize),
    /// Something outside the plain form.
    Failed,
}

/// Piece boundaries: 0, then about every `piece_bytes` the start of a line
/// whose first non-blank is `(` and whose previous non-blank is `,`, then
/// the end. A cut that is not really between rows makes a piece fail (a
/// row there would have to hold a line break in a string or a comment,
/// neither of which a piece accepts across a line start), so a wrong guess
/// costs the fast path, never the meaning.
fn cuts(b: &[u8], piece_bytes: usize) -> Vec<usize> {
    let mut out = vec![0];
    let mut at = piece_bytes.max(1);
    while at < b.len() {
        let Some(nl) = b[at..].iter().position(|&c| c == b'\n') else {
            break;
        };
        let line = at + nl + 1;
        let first = line
            + b[line..]
                .iter()
                .take_while(|c| matches!(c, b' ' | b'\t'))
                .count();
        let before = b[..at + nl]
            .iter()
            .rev()
            .find(|c| !matches!(c, b' ' | b'\t' | b'\r'));
        if b.get(first) == Some(&b'(') && before == Some(&b',') {
            out.push(first);
            at = first + piece_bytes;
        } else {
            at = line;
        }
    }
    out.push(b.len());
    out
}

/// Rows of one piece: `row, row, ..., row,` to its end, or up to the
/// list's `]` (after a row or a comma).
fn read_piece<T>(b: &[u8], row: fn(&mut Row) -> Option<T>) -> Piece<T> {
    let mut r = Row { b, i: 0 };
    let mut out = Vec::with_capacity(b.len() / 64);
    loop {
        r.blanks();
        match b.get(r.i) {
            None => return Piece::Through(out),
            Some(b']') => return Piece::Ended(out, r.i),
            Some(b'(') => r.i += 1,
            Some(_) => return Piece::Failed,
        }
        match row(&mut r) {
            Some(v) => out.push(v),
            None => return Piece::Failed,
        }
        r.blanks();
        match b.get(r.i) {
            Some(b',') => r.i += 1,
            Some(b']') => return Piece::Ended(out, r.i),
            _ => return Piece::Failed,
        }
    }
}

/// A cursor inside one row, reading the plain form only.
pub(super) struct Row<'a> {
    b: &'a [u8],
    i: usize,
}

impl<'a> Row<'a> {
    fn blanks(&mut self) {
        self.i = skip_blanks(self.b, self.i);
    }

    /// Each `name: value` of the row after its `(`, through its `)`:
    /// `value` reads the value of `name` (`None` for a name it does not
    /// know or a value outside the plain form).
    fn fields(&mut self, mut value: impl FnMut(&mut Self, &[u8]) -> Option<()>) -> Option<()> {
        while let Some(name) = self.field()? {
            value(self, name)?;
            self.after_value()?;
        }
        Some(())
    }

    fn expect(&mut self, c: u8) -> Option<()> {
        (self.b.get(self.i) == Some(&c)).then(|| self.i += 1)
    }

    /// The next field name and its colon; `None` at the row's `)`.
    fn field(&mut self) -> Option<Option<&'a [u8]>> {
        self.blanks();
        if self.b.get(self.i) == Some(&b')') {
            self.i += 1;
            return Some(None);
        }
        let start = self.i;
        while self.i < self.b.len()
            && (self.b[self.i].is_ascii_lowercase() || self.b[self.i] == b'_')
        {
            self.i += 1;
        }
        if self.i == start {
            return None;
        }
        let name = &self.b[start..self.i];
        self.blanks();
        self.expect(b':')?;
        self.blanks();
        Some(Some(name))
    }

    /// After a value: a comma, or the row's closing parenthesis (kept).
    fn after_value(&mut self) -> Option<()> {
        self.blanks();
        match self.b.get(self.i) {
            Some(b',') => {
                self.i += 1;
                Some(())
            }
            Some(b')') => Some(()),
            _ => None,
        }
    }

    /// A string without escapes or control characters.
    fn string(&mut self) -> Option<String> {
        self.text().map(str::to_owned)
    }

    /// An id: as [`Row::string`], kept inline when short.
    fn id(&mut self) -> Option<Id> {
        self.text().map(Id::new)
    }

    /// The text of a string without escapes or control characters.
    fn text(&mut self) -> Option<&'a str> {
        self.expect(b'"')?;
        let start = self.i;
        loop {
            match *self.b.get(self.i)? {
                b'"' => break,
                b'\\' => return None,
                c if c < 0x20 => return None,
                _ => self.i += 1,
            }
        }
        let s = std::str::from_utf8(&self.b[start..self.i]).ok()?;
        self.i += 1;
        Some(s)
    }

    /// A plain decimal number, `-?d+(.d+)?([eE][+-]?d+)?`, read as the RON
    /// parser reads it. For a field of any number type (`any`, a
    /// quantity) an integer is read as an integer (at most 15 digits, so
    /// exact; `-0` is +0) and anything else by `f64::from_str`; for an `f64`
    /// field everything goes through `f64::from_str` (`-0` is -0).
    fn number(&mut self, any: bool) -> Option<f64> {
        let b = self.b;
        let start = self.i;
        let digits = |i: &mut usize| {
            let s = *i;
            while *i < b.len() && b[*i].is_ascii_digit() {
                *i += 1;
            }
            *i - s
        };
        let mut i = self.i;
        if b.get(i) == Some(&b'-') {
            i += 1;
        }
        let whole = digits(&mut i);
        if whole == 0 || (whole > 1 && b[i - whole] == b'0') {
            return None;
        }
        let mut float = false;
        if b.get(i) == Some(&b'.') {
            i += 1;
            if digits(&mut i) == 0 {
                return None;
            }
            float = true;
        }
        if matches!(b.get(i), Some(b'e' | b'E')) {
            i += 1;
            if matches!(b.get(i), Some(b'+' | b'-')) {
                i += 1;
            }
            if digits(&mut i) == 0 {
                return None;
            }
            float = true;
        }
        // A number must end at a blank, comma, parenthesis or comment.
        if !matches!(
            b.get(i),
            Some(b' ' | b'\t' | b'\n' | b'\r' | b',' | b')' | b'/')
        ) {
            return None;
        }
        let t = std::str::from_utf8(&b[start..i]).ok()?;
        self.i = i;
        if float || !any {
            t.parse().ok()
        } else if whole <= 15 {
            t.parse::<i64>().ok().map(|v| v as f64)
        } else {
            None
        }
    }

    /// `true` or `false`, ending at a blank, comma, parenthesis or comment.
    fn boolean(&mut self) -> Option<bool> {
        let rest = &self.b[self.i..];
        let (v, n) = if rest.starts_with(b"true") {
            (true, 4)
        } else if rest.starts_with(b"false") {
            (false, 5)
        } else {
            return None;
        };
        if !matches!(
            rest.get(n),
            Some(b' ' | b'\t' | b'\n' | b'\r' | b',' | b')' | b'/')
        ) {
            return None;
        }
        self.i += n;
        Some(v)
    }

    /// A bare number or a string with its unit.
    fn quantity(&mut self) -> Option<Quantity> {
        if self.b.get(self.i) == Some(&b'"') {
            self.string().map(Quantity::Text)
        } else {
            self.number(true).map(Quantity::Number)
        }
    }
}

/// Set a field once; a repeated field is left to the RON parser's error.
fn once<T>(slot: &mut Option<T>, v: Option<T>) -> Option<()> {
    if slot.is_some() {
        return None;
    }
    *slot = Some(v?);
    Some(())
}

/// `(id: "..", x: .., y: ..)` after its `(`.
fn node(r: &mut Row) -> Option<NodeFile> {
    let (mut id, mut x, mut y) = (None, None, None);
    r.fields(|r, name| match name {
        b"id" => once(&mut id, r.id()),
        b"x" => once(&mut x, r.quantity()),
        b"y" => once(&mut y, r.quantity()),
        _ => None,
    })?;
    Some(NodeFile {
        id: id?,
        x: x?,
        y: y?,
    })
}

/// `(id: .., start: .., end: .., section: .., material: .., ..)` after its `(`.
fn member(r: &mut Row) -> Option<MemberFile> {
    let (mut id, mut start, mut end, mut section, mut material) = (None, None, None, None, None);
    let (mut k_in, mut k_out, mut unbraced_in, mut unbraced_out) = (None, None, None, None);
    let (mut detail, mut tension_only, mut slack, mut bars) = (None, None, None, None);
    r.fields(|r, name| match name {
        b"id" => once(&mut id, r.id()),
        b"start" => once(&mut start, r.id()),
        b"end" => once(&mut end, r.id()),
        b"section" => once(&mut section, r.id()),
        b"material" => once(&mut material, r.id()),
        b"k_in" => once(&mut k_in, r.number(false)),
        b"k_out" => once(&mut k_out, r.number(false)),
        b"unbraced_in" => once(&mut unbraced_in, r.quantity()),
        b"unbraced_out" => once(&mut unbraced_out, r.quantity()),
        b"detail" => once(&mut detail, r.string()),
        b"tension_only" => once(&mut tension_only, r.boolean()),
        b"slack" => once(&mut slack, r.quantity()),
        b"bars" => once(&mut bars, r.number(false).and_then(count)),
        _ => None,
    })?;
    Some(MemberFile {
        id: id?,
        start: start?,
        end: end?,
        section: section?,
        material: material?,
        k_in,
        k_out,
        unbraced_in,
        unbraced_out,
        detail,
        tension_only: tension_only.unwrap_or(false),
        slack,
        bars,
    })
}

/// A whole number that fits a u32 (anything else goes to the RON parser).
fn count(v: f64) -> Option<u32> {
    (v.fract() == 0.0 && (0.0..=u32::MAX as f64).contains(&v)).then_some(v as u32)
}

#[cfg(test)]
mod tests {
    use super::concat;

    /// Against `Iterator::flatten`, with empty parts and owned values (a
    /// slot written twice or not at all would show as a wrong string or a
    /// double free under the test allocator).
    #[test]
    fn concat_keeps_order_and_every_value() {
        let parts: Vec<Vec<String>> = [0usize, 3, 0, 1, 5, 0]
            .iter()
            .enumerate()
            .map(|(p, &n)| (0..n).map(|i| format!("{p}.{i}")).collect())
            .collect();
        let expected: Vec<String> = parts.iter().flatten().cloned().collect();
        assert_eq!(concat(parts), expected);
        assert!(concat(Vec::<Vec<u8>>::new()).is_empty());
    }

    /// The fatigue `detail` field is read by the fast reader itself (the
    /// list is taken, not handed back to the RON parser).
    #[test]
    fn reads_the_detail_field() {
        let text = r#"(members: [
            (id: "a", start: "A", end: "B", section: "s", material: "m", detail: "D 71"),
            (id: "b", start: "B", end: "C", section: "s", material: "m"),
        ])"#;
        let b = super::read_with(text, 0, 64);
        let members = b.members.expect("the fast reader took the list");
        assert_eq!(members[0].detail.as_deref(), Some("D 71"));
        assert_eq!(members[1].detail, None);
    }
}
