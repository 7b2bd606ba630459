//! Label placement: a greedy, collision-avoiding pass. Each label tries a few positions
//! around the point it names (nearest first); when all are taken it searches outward on a
//! ring of positions and draws a leader back to the point; a label that still finds no
//! room is shortened (if the caller gave a short form) or left out, and the caller is
//! told. Nothing is ever clipped: a placed label lies wholly inside the frame and covers
//! no other placed label or reserved area.
//!
//! Text widths are estimated from character classes of a sans-serif face, on the generous
//! side, so the box holds the text as any browser measures it (a browser test compares
//! the estimate with the canvas's measured width of every label).

use super::{Ink, Label, Px, Rect, TextSize};

/// Horizontal padding inside a label's box, each side, CSS pixels.
pub const PAD_X: f64 = 3.0;

/// Estimated advance width of `text` at `size`, CSS pixels: an upper bound for common
/// system sans-serif faces (per-character widths as fractions of the em, from the widest
/// of their classes; common practice for layout without font metrics). The classes cover
/// DejaVu Sans, the widest common face and Debian's system-ui (its advance widths, book
/// and bold, from memory, checked by the browser test that measures every label), so
/// narrower faces (Liberation Sans, Arial, Helvetica) fit with room to spare.
pub fn text_width(text: &str, size: TextSize) -> f64 {
    let em = size.px();
    let bold = matches!(size, TextSize::Title);
    let w: f64 = text
        .chars()
        .map(|c| match c {
            'i' | 'j' | 'l' | '\'' | '|' | '.' | ',' | ':' | ';' | '!' | '\u{2009}' | '\u{202f}' => 0.34,
            'f' | 't' | 'r' | 'I' | '(' | ')' | '[' | ']' | ' ' | '\u{a0}' | '-' | '·' => 0.44,
            'm' | 'w' | 'M' | 'W' | '—' | '%' | '@' | '…' => 1.0,
            '–' | '−' | '=' | '+' | '×' | '∝' | '≤' | '≥' | '→' | '←' => 0.86,
            c if c.is_ascii_digit() => 0.64,
            c if c.is_ascii_uppercase() => 0.80,
            c if c.is_ascii_lowercase() => 0.64,
            _ => 0.80,
        })
        .sum();
    // semibold titles: DejaVu's bold runs up to about 1.13 times the book width
    em * w * if bold { 1.14 } else { 1.0 }
}

/// The box of `text` at `size` with its left edge at `x` and its middle at `y`.
pub fn text_box(text: &str, size: TextSize, x: f64, y: f64) -> Rect {
    let h = size.box_height();
    Rect::new(x, y - h / 2.0, text_width(text, size) + 2.0 * PAD_X, h)
}

/// Where a label would like to sit relative to its point, in order of preference.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    /// Box to the right of the point, vertically centred.
    Right,
    /// Box to the left, vertically centred.
    Left,
    /// Box above, horizontally centred.
    Above,
    /// Box below, horizontally centred.
    Below,
    /// Box above and to the right.
    AboveRight,
    /// Box above and to the left.
    AboveLeft,
    /// Box below and to the right.
    BelowRight,
    /// Box below and to the left.
    BelowLeft,
    /// Box centred on the point.
    Centre,
}

impl Side {
    /// All eight sides around a point, right first (the usual reading place).
    pub const AROUND: [Side; 8] = [
        Side::Right,
        Side::AboveRight,
        Side::BelowRight,
        Side::Above,
        Side::Below,
        Side::Left,
        Side::AboveLeft,
        Side::BelowLeft,
    ];

    /// Top-left corner of a `w` x `h` box on this side of `at`, `gap` pixels away.
    pub(crate) fn corner(self, at: Px, w: f64, h: f64, gap: f64) -> (f64, f64) {
        match self {
            Side::Right => (at.x + gap, at.y - h / 2.0),
            Side::Left => (at.x - gap - w, at.y - h / 2.0),
            Side::Above => (at.x - w / 2.0, at.y - gap - h),
            Side::Below => (at.x - w / 2.0, at.y + gap),
            Side::AboveRight => (at.x + gap * 0.7, at.y - gap * 0.7 - h),
            Side::AboveLeft => (at.x - gap * 0.7 - w, at.y - gap * 0.7 - h),
            Side::BelowRight => (at.x + gap * 0.7, at.y + gap * 0.7),
            Side::BelowLeft => (at.x - gap * 0.7 - w, at.y + gap * 0.7),
            Side::Centre => (at.x - w / 2.0, at.y - h / 2.0),
        }
    }
}

/// A label to place: its text, a shorter form to fall back on, and where it wants to be.
#[derive(Debug, Clone, PartialEq)]
pub struct Request {
    /// Full text.
    pub text: String,
    /// Shorter text to try when the full one finds no room (e.g. "B–F +3" for a list).
    pub short: Option<String>,
    /// Size.
    pub size: TextSize,
    /// Colour.
    pub ink: Ink,
    /// The point the text speaks of.
    pub at: Px,
    /// Preferred sides, tried in order before any leader.
    pub sides: Vec<Side>,
    /// Distance from the point to the box, pixels.
    pub gap: f64,
    /// Whether a leader may be drawn (otherwise only `sides` are tried).
    pub leader: bool,
    /// A light box under the text.
    pub boxed: bool,
    /// More text on hover.
    pub detail: Option<String>,
}

impl Request {
    /// A boxed label at `at`, preferring the eight sides around it, leader allowed.
    pub fn new(text: impl Into<String>, size: TextSize, ink: Ink, at: Px) -> Request {
        Request {
            text: text.into(),
            short: None,
            size,
            ink,
            at,
            sides: Side::AROUND.to_vec(),
            gap: 6.0,
            leader: true,
            boxed: true,
            detail: None,
        }
    }
    /// With preferred sides.
    pub fn sides(mut self, sides: &[Side]) -> Request {
        self.sides = sides.to_vec();
        self
    }
    /// With a gap between point and box.
    pub fn gap(mut self, gap: f64) -> Request {
        self.gap = gap;
        self
    }
    /// With a short form.
    pub fn short(mut self, short: impl Into<String>) -> Request {
        self.short = Some(short.into());
        self
    }
    /// Without a leader (the label stays beside its point or is not placed).
    pub fn no_leader(mut self) -> Request {
        self.leader = false;
        self
    }
    /// Without the light box.
    pub fn unboxed(mut self) -> Request {
        self.boxed = false;
        self
    }
    /// With hover detail.
    pub fn detail(mut self, detail: impl Into<String>) -> Request {
        self.detail = Some(detail.into());
        self
    }
}

/// Places labels one by one inside a frame, never over a reserved area or an earlier label.
#[derive(Debug, Clone)]
pub struct Placer {
    frame: Rect,
    taken: Vec<Rect>,
    placed: Vec<Label>,
    dropped: Vec<String>,
}

/// Extra clearance kept between label boxes, pixels.
const CLEARANCE: f64 = 1.0;

impl Placer {
    /// A placer for labels inside `frame`.
    pub fn new(frame: Rect) -> Placer {
        Placer { frame, taken: Vec::new(), placed: Vec::new(), dropped: Vec::new() }
    }

    /// Keeps `rect` free of labels (a legend, a title block, a handle).
    pub fn reserve(&mut self, rect: Rect) {
        self.taken.push(rect);
    }

    /// Whether a box fits: inside the frame and clear of everything taken.
    pub fn is_free(&self, r: &Rect) -> bool {
        self.frame.contains(r) && !self.taken.iter().any(|t| t.grown(CLEARANCE).overlaps(r))
    }

    /// Places `req`; returns the index of the placed label, or `None` when neither its
    /// text nor its short form found room (the text is then listed by [`Placer::dropped`]).
    pub fn place(&mut self, req: Request) -> Option<usize> {
        let texts: Vec<&str> = std::iter::once(req.text.as_str()).chain(req.short.as_deref()).collect();
        for text in texts {
            let w = text_width(text, req.size) + 2.0 * PAD_X;
            let h = req.size.box_height();
            if let Some((rect, leader)) = self.find(&req, w, h) {
                let detail = if text != req.text { Some(req.text.clone()) } else { req.detail.clone() };
                return Some(self.put(Label {
                    text: text.to_string(),
                    size: req.size,
                    ink: req.ink,
                    rect,
                    boxed: req.boxed,
                    leader,
                    detail,
                }));
            }
        }
        self.dropped.push(req.text);
        None
    }

    /// Places a label at exactly `rect` when it is free (titles, keys laid out by the
    /// caller); `None` when it is not.
    pub fn place_at(
        &mut self,
        text: impl Into<String>,
        size: TextSize,
        ink: Ink,
        rect: Rect,
    ) -> Option<usize> {
        if !self.is_free(&rect) {
            return None;
        }
        Some(self.put(Label { text: text.into(), size, ink, rect, boxed: false, leader: None, detail: None }))
    }

    fn put(&mut self, label: Label) -> usize {
        self.taken.push(label.rect);
        self.placed.push(label);
        self.placed.len() - 1
    }

    fn find(&self, req: &Request, w: f64, h: f64) -> Option<(Rect, Option<Px>)> {
        for side in &req.sides {
            let (x, y) = side.corner(req.at, w, h, req.gap);
            let r = Rect::new(x, y, w, h);
            if self.is_free(&r) {
                return Some((r, None));
            }
        }
        if !req.leader {
            return None;
        }
        // rings of growing radius around the point, 16 directions each; the first free box
        // gets a leader back to the point
        let step = h.max(12.0);
        // the directions once, not per ring: the sines were most of a drawing's placing
        let directions: [(f64, f64); 16] = std::array::from_fn(|k| {
            let angle = std::f64::consts::TAU * k as f64 / 16.0;
            (angle.cos(), angle.sin())
        });
        for ring in 1..=12 {
            let radius = req.gap + step * ring as f64;
            for (cos, sin) in directions {
                let c = Px::new(req.at.x + radius * cos, req.at.y - radius * sin);
                let r = Rect::new(c.x - w / 2.0, c.y - h / 2.0, w, h);
                if self.is_free(&r) {
                    return Some((r, Some(req.at)));
                }
            }
        }
        None
    }

    /// Texts that found no room.
    pub fn dropped(&self) -> &[String] {
        &self.dropped
    }

    /// The placed labels, in placing order.
    pub fn finish(self) -> Vec<Label> {
        self.placed
    }
}

/// Lays out `items` (text, size, ink) as lines from the top-left of `area`, wrapping to a
/// new line when the next item does not fit the width; returns the boxes used, in order,
/// and the bottom of the last line. Titles and keys use this so they get their own lines
/// at narrow widths instead of running into each other.
pub fn flow(items: &[(String, TextSize)], area: Rect, gap: f64) -> (Vec<Rect>, f64) {
    let mut boxes = Vec::new();
    let (mut x, mut y) = (area.x, area.y);
    let mut line_h: f64 = 0.0;
    for (text, size) in items {
        let w = (text_width(text, *size) + 2.0 * PAD_X).min(area.w);
        let h = size.box_height();
        if x > area.x && x + w > area.right() {
            x = area.x;
            y += line_h;
            line_h = 0.0;
        }
        boxes.push(Rect::new(x, y, w, h));
        x += w + gap;
        line_h = line_h.max(h);
    }
    (boxes, y + line_h)
}

/// `text` shortened to fit `width` pixels at `size`, ending in "…" when cut (titles that
/// must stay on one line). Never cuts inside a number: it cuts at the last space.
pub fn fit_text(text: &str, size: TextSize, width: f64) -> String {
    if text_width(text, size) + 2.0 * PAD_X <= width {
        return text.to_string();
    }
    let words: Vec<&str> = text.split(' ').collect();
    for n in (1..words.len()).rev() {
        let kept = words.iter().take(n).copied().collect::<Vec<_>>().join(" ");
        let candidate = format!("{}…", kept.trim_end_matches([' ', '·', ',']));
        if text_width(&candidate, size) + 2.0 * PAD_X <= width {
            return candidate;
        }
    }
    "…".to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn frame() -> Rect {
        Rect::new(0.0, 0.0, 300.0, 200.0)
    }

    #[test]
    fn labels_at_one_point_spread_out_without_overlap() {
        let mut p = Placer::new(frame());
        let at = Px::new(150.0, 100.0);
        for k in 0..12 {
            let placed = p.place(Request::new(format!("label {k}"), TextSize::Body, Ink::Text, at));
            assert!(placed.is_some(), "label {k} found room");
        }
        let labels = p.finish();
        for i in 0..labels.len() {
            assert!(frame().contains(&labels[i].rect));
            for j in i + 1..labels.len() {
                assert!(!labels[i].rect.overlaps(&labels[j].rect), "{i} and {j} overlap");
            }
        }
        // the first takes the preferred side and needs no leader; later ones need leaders
        assert_eq!(labels[0].leader, None);
        assert!(labels[0].rect.x > at.x);
        assert!(labels.iter().any(|l| l.leader == Some(at)));
    }

    #[test]
    fn a_label_at_the_edge_moves_inside_rather_than_being_clipped() {
        let mut p = Placer::new(frame());
        let i =
            p.place(Request::new("reaction 8 140 kN", TextSize::Body, Ink::Reaction, Px::new(298.0, 100.0)));
        let labels = p.finish();
        let r = labels[i.expect("placed")].rect;
        assert!(frame().contains(&r), "{r:?}");
        assert!(r.right() <= 298.0, "to the left of a point at the right edge");
    }

    #[test]
    fn a_label_without_room_falls_back_to_its_short_form_then_is_reported() {
        let mut p = Placer::new(Rect::new(0.0, 0.0, 60.0, 20.0));
        let long = "A, B, C, D, E, F, G, H";
        let i = p.place(
            Request::new(long, TextSize::Small, Ink::Text, Px::new(30.0, 10.0))
                .short("A–H")
                .sides(&[Side::Centre]),
        );
        let labels = p.finish();
        let l = &labels[i.expect("short form placed")];
        assert_eq!(l.text, "A–H");
        assert_eq!(l.detail.as_deref(), Some(long), "the full list stays for hover");

        let mut p = Placer::new(Rect::new(0.0, 0.0, 10.0, 10.0));
        assert_eq!(p.place(Request::new("too long", TextSize::Body, Ink::Text, Px::new(5.0, 5.0))), None);
        assert_eq!(p.dropped(), ["too long".to_string()]);
    }

    #[test]
    fn reserved_areas_stay_free() {
        let mut p = Placer::new(frame());
        p.reserve(Rect::new(0.0, 0.0, 300.0, 40.0));
        let i =
            p.place(Request::new("crown", TextSize::Body, Ink::Text, Px::new(150.0, 30.0))).expect("placed");
        assert!(p.clone().finish()[i].rect.y >= 40.0);
    }

    #[test]
    fn flow_wraps_items_that_do_not_fit_the_line() {
        let items = vec![
            ("Elevation · frame model".to_string(), TextSize::Title),
            ("tension".to_string(), TextSize::Small),
            ("compression".to_string(), TextSize::Small),
        ];
        let (wide, _) = flow(&items, Rect::new(0.0, 0.0, 1000.0, 100.0), 8.0);
        assert!(wide.iter().all(|b| b.y == 0.0), "one line when wide");
        let (narrow, bottom) = flow(&items, Rect::new(0.0, 0.0, 180.0, 100.0), 8.0);
        assert!(narrow[1].y > 0.0, "the key wraps below the title");
        assert!(bottom > narrow[0].bottom());
        for i in 0..narrow.len() {
            for j in i + 1..narrow.len() {
                assert!(!narrow[i].overlaps(&narrow[j]));
            }
        }
    }

    #[test]
    fn fitted_text_cuts_at_a_space_never_inside_a_number() {
        let t = "Thrust 41.71° from horizontal at the left springing";
        let cut = fit_text(t, TextSize::Body, 120.0);
        assert!(cut.ends_with('…'), "{cut}");
        assert!(text_width(&cut, TextSize::Body) + 2.0 * PAD_X <= 120.0);
        assert!(t.starts_with(cut.trim_end_matches('…')));
        assert_eq!(fit_text("short", TextSize::Body, 120.0), "short");
    }
}
