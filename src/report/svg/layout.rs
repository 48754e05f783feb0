//! Labels laid out so that none overlaps another label, an arrow or a
//! symbol: a simple collision pass. Every text's box is estimated from its
//! font size and number of characters (`text_width`, 0.56 × size a
//! character; ascent 0.78 × size, descent 0.22 × size), turned with the
//! text; arrows and symbols are registered as obstacles first; each label
//! then takes the first of its candidate places that is free.

use super::{esc, px, text_width, Svg};
use std::fmt::Write;

/// A convex quadrilateral (corners in order), page px.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Quad(pub [(f64, f64); 4]);

impl Quad {
    /// An axis-aligned box.
    pub fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Quad {
        let (a, b) = (x0.min(x1), x0.max(x1));
        let (c, d) = (y0.min(y1), y0.max(y1));
        Quad([(a, c), (b, c), (b, d), (a, d)])
    }

    /// The band of half-width `hw` around the segment `a`–`b` (1 px past
    /// its ends).
    pub fn segment(a: (f64, f64), b: (f64, f64), hw: f64) -> Quad {
        let (dx, dy) = (b.0 - a.0, b.1 - a.1);
        let l = dx.hypot(dy).max(1e-9);
        let (nx, ny) = (-dy / l * hw, dx / l * hw);
        let (ex, ey) = (dx / l, dy / l);
        Quad([
            (a.0 + nx - ex, a.1 + ny - ey),
            (b.0 + nx + ex, b.1 + ny + ey),
            (b.0 - nx + ex, b.1 - ny + ey),
            (a.0 - nx - ex, a.1 - ny - ey),
        ])
    }

    /// The box of `text` at `size` placed as `c` says.
    pub fn text(c: &Candidate, size: f64, text: &str) -> Quad {
        let w = text_width(text, size);
        let (x0, x1) = match c.anchor {
            "start" => (0.0, w),
            "end" => (-w, 0.0),
            _ => (-w / 2.0, w / 2.0),
        };
        let (y0, y1) = (c.dy - 0.78 * size, c.dy + 0.22 * size);
        let (sn, cs) = c.rotate.to_radians().sin_cos();
        let t = |(x, y): (f64, f64)| (c.at.0 + x * cs - y * sn, c.at.1 + x * sn + y * cs);
        Quad([t((x0, y0)), t((x1, y0)), t((x1, y1)), t((x0, y1))])
    }

    /// Whether the two convex quads overlap (separating-axis test; touching
    /// edges do not count).
    pub fn intersects(&self, o: &Quad) -> bool {
        for q in [self, o] {
            for i in 0..4 {
                let (a, b) = (q.0[i], q.0[(i + 1) % 4]);
                let (nx, ny) = (-(b.1 - a.1), b.0 - a.0);
                let proj = |p: &Quad| {
                    p.0.iter()
                        .map(|v| v.0 * nx + v.1 * ny)
                        .fold((f64::MAX, f64::MIN), |(lo, hi), d| (lo.min(d), hi.max(d)))
                };
                let (a0, a1) = proj(self);
                let (b0, b1) = proj(o);
                let eps = 1e-9 * (nx.abs() + ny.abs()).max(1.0);
                if a1 <= b0 + eps || b1 <= a0 + eps {
                    return false;
                }
            }
        }
        true
    }
}

/// A place for a label: the text's origin `at` (page px), its anchor, a
/// rotation in degrees about `at`, and a baseline offset `dy` in the
/// turned frame.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Candidate {
    pub at: (f64, f64),
    pub anchor: &'static str,
    pub rotate: f64,
    pub dy: f64,
}

impl Candidate {
    pub fn flat(at: (f64, f64), anchor: &'static str) -> Candidate {
        Candidate {
            at,
            anchor,
            rotate: 0.0,
            dy: 0.0,
        }
    }
}

/// Obstacles and the labels placed so far.
#[derive(Default)]
pub struct Layout {
    taken: Vec<Quad>,
    /// Member lines: node, load and reaction labels keep clear of them;
    /// member labels, which sit along their own member, need not.
    lines: Vec<Quad>,
    /// Labels that found no free place and were left out.
    pub dropped: usize,
}

impl Layout {
    /// Something labels must keep clear of (an arrow, a symbol).
    pub fn obstacle(&mut self, q: Quad) {
        self.taken.push(q);
    }

    /// A member line, as a band `hw` wide each side.
    pub fn line(&mut self, a: (f64, f64), b: (f64, f64), hw: f64) {
        self.lines.push(Quad::segment(a, b, hw));
    }

    fn free(&self, q: &Quad, lines: bool) -> bool {
        let blocked = self.taken.iter().any(|t| t.intersects(q))
            || (lines && self.lines.iter().any(|t| t.intersects(q)));
        !blocked
    }

    /// Write `text` at the first free candidate (for a `must` label, one off
    /// the member lines first). When none is free: with
    /// `must`, the text goes to the free place nearest the first candidate
    /// found by stepping away from it (it carries a value that must show);
    /// else it is left out and counted in `dropped`. Returns whether it was
    /// written.
    pub fn place(
        &mut self,
        svg: &mut Svg,
        candidates: &[Candidate],
        size: f64,
        text: &str,
        attrs: &str,
        must: bool,
    ) -> bool {
        // Off the member lines where a candidate allows, else anywhere free.
        let mut chosen = candidates
            .iter()
            .find(|c| self.free(&Quad::text(c, size, text), must))
            .or_else(|| {
                candidates
                    .iter()
                    .find(|c| self.free(&Quad::text(c, size, text), false))
            })
            .copied();
        if chosen.is_none() && must {
            if let Some(first) = candidates.first() {
                'search: for ring in 1..40 {
                    let r = ring as f64 * 0.6 * size;
                    for k in 0..16 {
                        let a = std::f64::consts::TAU * k as f64 / 16.0;
                        let c = Candidate {
                            at: (first.at.0 + r * a.cos(), first.at.1 + r * a.sin()),
                            ..*first
                        };
                        if self.free(&Quad::text(&c, size, text), false) {
                            chosen = Some(c);
                            break 'search;
                        }
                    }
                }
            }
        }
        let Some(c) = chosen else {
            self.dropped += 1;
            return false;
        };
        self.taken.push(Quad::text(&c, size, text));
        if c.rotate == 0.0 {
            let _ = writeln!(
                svg.out,
                r#"<text x="{}" y="{}" font-size="{}" text-anchor="{}" {attrs}>{}</text>"#,
                px(c.at.0),
                px(c.at.1 + c.dy),
                px(size),
                c.anchor,
                esc(text)
            );
        } else {
            let _ = writeln!(
                svg.out,
                r#"<text transform="translate({} {}) rotate({})" y="{}" font-size="{}" text-anchor="{}" {attrs}>{}</text>"#,
                px(c.at.0),
                px(c.at.1),
                px(c.rotate),
                px(c.dy),
                px(size),
                c.anchor,
                esc(text)
            );
        }
        true
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn boxes_overlap_only_when_they_do() {
        let a = Quad::rect(0.0, 0.0, 10.0, 10.0);
        assert!(a.intersects(&Quad::rect(5.0, 5.0, 15.0, 15.0)));
        assert!(
            !a.intersects(&Quad::rect(10.0, 0.0, 20.0, 10.0)),
            "touching"
        );
        // A 45° band passing the box's corner at a distance.
        let band = Quad::segment((12.0, 30.0), (30.0, 12.0), 1.0);
        assert!(!a.intersects(&band));
        assert!(a.intersects(&Quad::segment((0.0, 20.0), (20.0, 0.0), 1.0)));
    }

    #[test]
    fn second_label_moves_to_a_free_place() {
        let mut l = Layout::default();
        let mut svg = Svg::default();
        let c = [
            Candidate::flat((100.0, 100.0), "middle"),
            Candidate::flat((100.0, 120.0), "middle"),
        ];
        assert!(l.place(&mut svg, &c, 11.0, "5.80 kip", "", true));
        assert!(l.place(&mut svg, &c, 11.0, "1.20 kip", "", true));
        assert!(svg.out.contains(r#"y="120""#), "{}", svg.out);
        // A third, optional label has no free candidate and is left out.
        assert!(!l.place(&mut svg, &c, 11.0, "x", "", false));
        assert_eq!(l.dropped, 1);
    }
}
