//! Influence lines of a deck arch's generated models: a unit load (1 kN down) marching
//! along the deck, carried as each model's deck carries it (see `frame::influence`).
//!
//! The load path of the frame model is the deck from seat to seat (approach spans and
//! the deck over the arch; a three-hinged drop-in span, which is no member, shares the
//! load between its ends by the lever rule); of the truss idealisation the deck chord
//! over the arch; of the bare rib its rib nodes.
//!
//! Quantities, per unit load: springing thrust H, vertical V and moment M in the sense
//! of `arch::summary::SpringingForce` (H positive when the rib pushes outward, V
//! positive when it pushes down, M the moment on the abutment, anticlockwise), kN per kN
//! and kNm per kN; member axial force N (tension positive) and end moments (solver sign
//! convention), for the whole cross-section (every rib line together).

use crate::arch::generate::{model_of, Generated, MemberRole, ModelKind};
use crate::arch::summary::SpringingForce;
use crate::arch::validate::ValidDesign;
use crate::error::{Location, Problem, StaticsError};
pub use crate::frame::influence::MemberEnd;
use crate::frame::influence::{influence_lines, InfluenceLines, Quantity, Stepping};
use crate::frame::model::{Dof, MemberKind};

/// Left or right springing.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    /// The left springing (smaller x).
    Left,
    /// The right springing.
    Right,
}

/// One influence line of an arch model.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ArchLine {
    /// Springing thrust H, kN per kN, positive when the rib pushes outward.
    Thrust(Side),
    /// Springing vertical force V, kN per kN, positive when the rib pushes down.
    Vertical(Side),
    /// Springing moment on the abutment, kNm per kN, anticlockwise (fixed rib only;
    /// zero at a hinged springing).
    SpringingMoment(Side),
    /// Axial force of a member at its start, kN per kN, tension positive.
    Axial(usize),
    /// Bending moment of a frame member at one end, kNm per kN.
    Moment(usize, MemberEnd),
    /// Bending moment of a frame member carrying the deck at mid-length, kNm per kN (the
    /// span moment of a deck member between posts or of an approach span).
    MidMoment(usize),
}

impl ArchLine {
    /// The line a user names: `thrust` (left springing H), `thrust-right`, `v-left`,
    /// `v-right`, `m-left`, `m-right` (springing moments), a member's name as the model
    /// gives it (its axial force), or a frame member's name followed by `/m-start` or
    /// `/m-end` (its end moment).
    ///
    /// Errors: `Invalid`, listing every accepted name, when `name` is none of these.
    pub fn parse(name: &str, generated: &Generated) -> Result<ArchLine, StaticsError> {
        let line = match name {
            "thrust" | "thrust-left" => Some(ArchLine::Thrust(Side::Left)),
            "thrust-right" => Some(ArchLine::Thrust(Side::Right)),
            "v-left" => Some(ArchLine::Vertical(Side::Left)),
            "v-right" => Some(ArchLine::Vertical(Side::Right)),
            "m-left" => Some(ArchLine::SpringingMoment(Side::Left)),
            "m-right" => Some(ArchLine::SpringingMoment(Side::Right)),
            _ => {
                let members = &generated.model.members;
                let by_name = |n: &str| members.iter().position(|m| m.name == n);
                if let Some(k) = by_name(name) {
                    Some(ArchLine::Axial(k))
                } else if let Some((member, end)) = name.rsplit_once('/') {
                    let frame_member = by_name(member)
                        .filter(|&k| members.get(k).is_some_and(|m| m.kind == MemberKind::Frame));
                    match (frame_member, end) {
                        (Some(k), "m-start") => Some(ArchLine::Moment(k, MemberEnd::Start)),
                        (Some(k), "m-end") => Some(ArchLine::Moment(k, MemberEnd::End)),
                        (Some(k), "m-mid") => Some(ArchLine::MidMoment(k)),
                        _ => None,
                    }
                } else {
                    None
                }
            }
        };
        line.ok_or_else(|| {
            let names: Vec<String> = generated.model.members.iter().map(|m| format!("'{}'", m.name)).collect();
            let problem = Problem::new(
                Location::Part("influence line".into()),
                format!(
                    "'{name}' names no influence line of the {}; give thrust, thrust-right, v-left, v-right, m-left, \
                     m-right, a member's name for its axial force, or a frame member's name with /m-start or /m-end \
                     for its end moment (/m-mid: at mid-length). Members: {}",
                    generated.kind,
                    names.join(", ")
                ),
            );
            StaticsError::Invalid(vec![problem])
        })
    }

    /// The name [`ArchLine::parse`] reads back: `thrust`, `thrust-right`, `v-left`,
    /// `v-right`, `m-left`, `m-right`, a member's name, or a member's name with `/m-start`
    /// or `/m-end`.
    pub fn name(&self, generated: &Generated) -> String {
        let member = |k: &usize| generated.model.member_label(*k);
        match self {
            ArchLine::Thrust(Side::Left) => "thrust".into(),
            ArchLine::Thrust(Side::Right) => "thrust-right".into(),
            ArchLine::Vertical(Side::Left) => "v-left".into(),
            ArchLine::Vertical(Side::Right) => "v-right".into(),
            ArchLine::SpringingMoment(Side::Left) => "m-left".into(),
            ArchLine::SpringingMoment(Side::Right) => "m-right".into(),
            ArchLine::Axial(k) => member(k),
            ArchLine::Moment(k, MemberEnd::Start) => format!("{}/m-start", member(k)),
            ArchLine::Moment(k, MemberEnd::End) => format!("{}/m-end", member(k)),
            ArchLine::MidMoment(k) => format!("{}/m-mid", member(k)),
        }
    }

    /// Every line of a model: H and V at both springings, the springing moments where
    /// the springings are fixed, every member's axial force, both end moments of every
    /// frame member at each end it does not release, and the mid-length moment of every
    /// frame member carrying the deck (deck and approach spans).
    pub fn every(generated: &Generated) -> Vec<ArchLine> {
        let model = &generated.model;
        let mut lines = Vec::new();
        for side in [Side::Left, Side::Right] {
            lines.push(ArchLine::Thrust(side));
            lines.push(ArchLine::Vertical(side));
        }
        for (side, node) in [Side::Left, Side::Right].into_iter().zip(generated.map.springings) {
            if model.supports.iter().any(|s| s.node == node && s.rz) {
                lines.push(ArchLine::SpringingMoment(side));
            }
        }
        for (k, m) in model.members.iter().enumerate() {
            lines.push(ArchLine::Axial(k));
            if !m.pinned_at_start() {
                lines.push(ArchLine::Moment(k, MemberEnd::Start));
            }
            if !m.pinned_at_end() {
                lines.push(ArchLine::Moment(k, MemberEnd::End));
            }
            let carries_deck =
                matches!(generated.map.roles.get(k), Some(MemberRole::Deck | MemberRole::Approach));
            if carries_deck && m.kind == MemberKind::Frame {
                lines.push(ArchLine::MidMoment(k));
            }
        }
        lines
    }

    /// The line's name, sign and units for a table header, without commas (a CSV
    /// column title), e.g. `left springing thrust H; outward push positive (kN per kN)`.
    pub fn header(&self, generated: &Generated) -> String {
        let side = |s: &Side| match s {
            Side::Left => "left",
            Side::Right => "right",
        };
        let member = |k: &usize| generated.model.member_label(*k);
        match self {
            ArchLine::Thrust(s) => {
                format!("{} springing thrust H; outward push positive (kN per kN)", side(s))
            }
            ArchLine::Vertical(s) => {
                format!("{} springing vertical V; downward push positive (kN per kN)", side(s))
            }
            ArchLine::SpringingMoment(s) => {
                format!("{} springing moment on the abutment; anticlockwise positive (kNm per kN)", side(s))
            }
            ArchLine::Axial(k) => format!("{} axial force N; tension positive (kN per kN)", member(k)),
            ArchLine::MidMoment(k) => format!("{} moment at mid-length (kNm per kN)", member(k)),
            ArchLine::Moment(k, end) => format!(
                "{} moment at its {} (kNm per kN)",
                member(k),
                if *end == MemberEnd::Start { "start" } else { "end" }
            ),
        }
    }
}

/// The influence lines of one generated model of a design.
#[derive(Debug, Clone, PartialEq)]
pub struct ArchInfluence {
    /// The model, with its map.
    pub generated: Generated,
    /// The load path: model nodes from left to right.
    pub path: Vec<usize>,
    /// Positions and per-position results.
    pub lines: InfluenceLines,
}

impl ArchInfluence {
    /// The ordinates of `line`, one per position in `lines.positions` (units and signs in
    /// [`ArchLine`]).
    ///
    /// Errors: `Invalid` when the line names a member the model does not have.
    pub fn ordinates(&self, line: &ArchLine) -> Result<Vec<f64>, StaticsError> {
        values_of(&self.generated, &self.lines, line)
    }
}

/// The values of `line` in every case of `lines` (one per position of an influence
/// line, or the cases of any solution of the same model wrapped the same way), units and
/// signs in [`ArchLine`].
///
/// Errors: `Invalid` when the line names a member the model does not have.
pub fn values_of(
    generated: &Generated,
    lines: &InfluenceLines,
    line: &ArchLine,
) -> Result<Vec<f64>, StaticsError> {
    let springing = |side: &Side| {
        let [left, right] = generated.map.springings;
        let node = if *side == Side::Left { left } else { right };
        let reaction = |dof| lines.ordinates(Quantity::Reaction { node, dof });
        let (fx, fy, mz) = (reaction(Dof::X)?, reaction(Dof::Y)?, reaction(Dof::Rz)?);
        // one value per case in each
        Ok::<Vec<SpringingForce>, StaticsError>(
            fx.iter()
                .zip(&fy)
                .zip(&mz)
                .map(|((&fx, &fy), &mz)| SpringingForce::from_reaction(fx, fy, mz, *side == Side::Left))
                .collect(),
        )
    };
    match line {
        ArchLine::Thrust(s) => Ok(springing(s)?.iter().map(|f| f.thrust).collect()),
        ArchLine::Vertical(s) => Ok(springing(s)?.iter().map(|f| f.vertical).collect()),
        ArchLine::SpringingMoment(s) => Ok(springing(s)?.iter().map(|f| f.moment).collect()),
        ArchLine::Axial(k) => lines.ordinates(Quantity::Axial { member: *k, end: MemberEnd::Start }),
        ArchLine::Moment(k, end) => lines.ordinates(Quantity::Moment { member: *k, end: *end }),
        ArchLine::MidMoment(k) => lines.ordinates(Quantity::MidMoment { member: *k }),
    }
}

/// The load path of a generated model: the deck from seat to seat for the frame model,
/// the deck chord for the truss idealisation, the rib nodes for the bare rib; nodes
/// sorted by x. Two nodes at the same x would make no chain along the span:
/// `frame::influence::influence_lines` refuses such a path.
pub fn load_path(generated: &Generated) -> Vec<usize> {
    let model = &generated.model;
    let mut nodes: Vec<usize> = if generated.kind == ModelKind::BareRib {
        generated.map.rib_nodes.clone()
    } else {
        let on_deck = |r: &MemberRole| matches!(r, MemberRole::Deck | MemberRole::Approach);
        let mut n: Vec<usize> = model
            .members
            .iter()
            .zip(&generated.map.roles)
            .filter(|(_, r)| on_deck(r))
            .flat_map(|(m, _)| [m.start, m.end])
            .collect();
        n.sort_unstable();
        n.dedup();
        n
    };
    let x = |node: &usize| model.nodes.get(*node).map_or(f64::NAN, |n| n.x);
    crate::order::sort_by(&mut nodes, |a, b| x(a).total_cmp(&x(b)));
    nodes
}

/// The influence lines of `kind` (frame model, truss idealisation or bare rib) of a
/// design, with the unit load every `step` m along the load path and at its nodes
/// (`None`: at the path's nodes only).
///
/// Ok(None) for the truss idealisation of an unbraced design (it has none). Errors: those
/// of `frame::influence::influence_lines` (a bad step, a model that cannot be solved).
pub fn arch_influence(
    valid: &ValidDesign,
    kind: ModelKind,
    step: Option<f64>,
) -> Result<Option<ArchInfluence>, StaticsError> {
    model_of(valid, kind).map(|generated| influence_of(generated, step)).transpose()
}

/// The influence lines of a generated model along its [`load_path`], the unit load every
/// `step` m and at the path's nodes (`None`: at the nodes only). Errors: those of
/// `frame::influence::influence_lines`.
pub fn influence_of(generated: Generated, step: Option<f64>) -> Result<ArchInfluence, StaticsError> {
    let path = load_path(&generated);
    let stepping = step.map_or(Stepping::NodesOnly, Stepping::Every);
    let lines = influence_lines(&generated.model, &path, stepping)?;
    Ok(ArchInfluence { generated, path, lines })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::{Bracing, Design, GroundPoint, RibSystem};
    use crate::arch::generate::frame_model;
    use crate::frame::model::{frame, Model, Support};

    /// Springing H and V of a three-pinned arch for a unit load at x, by statics alone
    /// (no solver). Springings A = (xa, ya), B = (xb, yb), crown hinge C = (xc, yc); the
    /// reactions on the arch are (Hx, V_A) at A and (-Hx, V_B) at B (no horizontal load),
    /// so Hx is the thrust (outward push) at both ends.
    ///
    /// Load on the left half (x <= xc): the right half is unloaded, moments about C:
    ///   V_B (xb - xc) + Hx (yb - yc) = 0, so V_B = Hx (yc - yb) / (xb - xc);
    /// moments of the whole about A: V_B (xb - xa) + Hx (yb - ya) = x - xa, so
    ///   Hx = (x - xa) / [ (yc - yb)(xb - xa) / (xb - xc) + (yb - ya) ].
    /// Load on the right half (x >= xc), by the same steps from the left half about C:
    ///   V_A = Hx (yc - ya) / (xc - xa),
    ///   Hx = (xb - x) / [ (yc - ya)(xb - xa) / (xc - xa) - (yb - ya) ].
    /// Then V_A + V_B = 1. With ya = yb and f = yc - ya this gives Hx = (x - xa)(xb - xc) /
    /// (f L), L/(4 f) at a mid-span crown: the three-hinged arch of any statics text
    /// (Timoshenko & Young, Theory of Structures, three-hinged arches; from memory).
    /// Returns (H, V_A, V_B).
    fn three_pinned(a: (f64, f64), b: (f64, f64), c: (f64, f64), x: f64) -> (f64, f64, f64) {
        let ((xa, ya), (xb, yb), (xc, yc)) = (a, b, c);
        if x <= xc {
            let h = (x - xa) / ((yc - yb) * (xb - xa) / (xb - xc) + (yb - ya));
            let vb = h * (yc - yb) / (xb - xc);
            (h, 1.0 - vb, vb)
        } else {
            let h = (xb - x) / ((yc - ya) * (xb - xa) / (xc - xa) - (yb - ya));
            let va = h * (yc - ya) / (xc - xa);
            (h, va, 1.0 - va)
        }
    }

    fn point(g: &Generated, node: usize) -> (f64, f64) {
        (g.model.nodes[node].x, g.model.nodes[node].y)
    }

    /// Checks H and V on both sides against the three-pinned statics at every position
    /// `keep` accepts; returns how many positions were checked.
    fn check_three_pinned(inf: &ArchInfluence, keep: impl Fn(f64) -> bool) -> usize {
        let g = &inf.generated;
        let (a, b, c) = (point(g, g.map.springings[0]), point(g, g.map.springings[1]), point(g, g.map.crown));
        let line = |l: ArchLine| inf.ordinates(&l).expect("line");
        let (hl, hr) = (line(ArchLine::Thrust(Side::Left)), line(ArchLine::Thrust(Side::Right)));
        let (vl, vr) = (line(ArchLine::Vertical(Side::Left)), line(ArchLine::Vertical(Side::Right)));
        let mut checked = 0;
        for (k, &x) in inf.lines.positions.iter().enumerate() {
            if !keep(x) {
                continue;
            }
            let (h, va, vb) = three_pinned(a, b, c, x);
            for (got, want, what) in
                [(hl[k], h, "H left"), (hr[k], h, "H right"), (vl[k], va, "V left"), (vr[k], vb, "V right")]
            {
                assert!((got - want).abs() < 1e-6, "{} {what} at x = {x}: {got} vs {want}", g.kind);
            }
            checked += 1;
        }
        checked
    }

    /// Braced three-hinged demo, frame model and truss idealisation: springing H and V
    /// equal the three-pinned statics for the unit load anywhere on the deck over the arch
    /// off the drop-in span (there the load reaches both halves, by the lever rule).
    #[test]
    fn three_hinged_braced_demo_matches_three_pinned_statics() {
        let d = Design::demo();
        assert_eq!(d.rib_system, RibSystem::ThreeHinged);
        assert!(d.bracing.is_braced());
        let v = ValidDesign::new(&d).expect("valid");
        for kind in [ModelKind::Frame, ModelKind::Truss] {
            let inf = arch_influence(&v, kind, Some(0.5)).expect("solves").expect("braced");
            let g = &inf.generated;
            let x_of = |n: usize| g.model.nodes[n].x;
            let deck: Vec<usize> = g.map.deck_nodes.iter().flatten().copied().collect();
            let (x_first, x_last) = (x_of(deck[0]), x_of(deck[deck.len() - 1]));
            // the drop-in span: the gap between deck nodes that no deck member joins
            let gap = inf.path.windows(2).find(|w| {
                !g.model
                    .members
                    .iter()
                    .any(|m| (m.start == w[0] && m.end == w[1]) || (m.start == w[1] && m.end == w[0]))
            });
            let (gap_from, gap_to) = gap.map_or((f64::NAN, f64::NAN), |w| (x_of(w[0]), x_of(w[1])));
            let on_arch_off_gap = |x: f64| x >= x_first && x <= x_last && !(x > gap_from && x < gap_to);
            let checked = check_three_pinned(&inf, on_arch_off_gap);
            assert!(checked > 100, "{kind}: {checked} positions");
        }
    }

    /// Bare three-hinged rib of the demo, the unit load at its rib nodes.
    #[test]
    fn bare_three_hinged_rib_matches_three_pinned_statics() {
        let v = ValidDesign::new(&Design::demo()).expect("valid");
        let inf = arch_influence(&v, ModelKind::BareRib, None).expect("solves").expect("rib");
        assert_eq!(inf.lines.positions.len(), inf.generated.map.rib_nodes.len());
        assert_eq!(check_three_pinned(&inf, |_| true), inf.lines.positions.len());
    }

    /// A two-hinged parabolic rib y = 4 f x (L - x) / L^2 in `n` chords, pinned at both
    /// ends, I = I_c sec(theta) per chord (theta its slope) and area `area`.
    fn parabolic_rib(span: f64, rise: f64, n: usize, i_crown: f64, area: f64) -> Model {
        let mut m = Model::default();
        for k in 0..=n {
            let x = span * k as f64 / n as f64;
            m.add_node(format!("r{k}"), x, 4.0 * rise * x * (span - x) / (span * span));
        }
        for k in 0..n {
            let (a, b) = (&m.nodes[k], &m.nodes[k + 1]);
            let sec = (b.x - a.x).hypot(b.y - a.y) / (b.x - a.x);
            m.add_member(frame(&format!("rib {k}"), "rib", k, k + 1, 2.1e8, area, i_crown * sec));
        }
        m.supports = vec![Support::pinned(0), Support::pinned(n)];
        m
    }

    /// Two-hinged parabolic rib with I = I_c sec(theta), unit load at the rib nodes.
    ///
    /// Handbook closed form for A very large (rib shortening neglected), by Castigliano
    /// with ds / I = dx / I_c: H(a) = 5 a (L - a)(L^2 + a L - a^2) / (8 f L^3); at the
    /// crown 25 L / (128 f); its area L^2 / (8 f), the thrust of a uniform load over the
    /// span, whose funicular the parabola is (Timoshenko & Young, Theory of Structures,
    /// two-hinged arches; Roark's Formulas for Stress and Strain, circular and parabolic
    /// arches; both from memory).
    ///
    /// Tolerance: the chords cut the parabola; the chord polygon's bending integral
    /// differs from the curve's by O(1/n^2) (the sagitta of a chord is f / n^2), about
    /// 2.4e-4 of the rise for n = 64, so 1e-3 relative leaves room. The area is
    /// summed by the trapezoid rule over the nodes, which is what the discretised rib
    /// carries under a uniform load lumped at its nodes, so the same tolerance holds.
    #[test]
    fn two_hinged_parabolic_rib_matches_the_handbook() {
        let (span, rise, n, i_crown) = (60.0, 12.0, 64, 0.02);
        let line = |area: f64| {
            let m = parabolic_rib(span, rise, n, i_crown, area);
            let path: Vec<usize> = (0..=n).collect();
            let lines = influence_lines(&m, &path, Stepping::NodesOnly).expect("solves");
            let fx = lines.ordinates(Quantity::Reaction { node: 0, dof: Dof::X }).expect("supported");
            (lines.positions, fx)
        };
        let (x, h) = line(1.0e4);
        let crown = h[n / 2];
        let expected_crown = 25.0 * span / (128.0 * rise); // 0.9766
        assert!((crown / expected_crown - 1.0).abs() < 1e-3, "crown {crown} vs {expected_crown}");
        let area: f64 =
            x.windows(2).zip(h.windows(2)).map(|(x, h)| 0.5 * (h[0] + h[1]) * (x[1] - x[0])).sum();
        let expected_area = span * span / (8.0 * rise); // 37.5 m
        assert!((area / expected_area - 1.0).abs() < 1e-3, "area {area} vs {expected_area}");

        // A realistic area, A = 0.6 m2 with I_c = 0.02 m4 (radius of gyration 0.18 m):
        // rib shortening lowers the thrust. The handbook factor for a parabolic rib is
        // 1 / (1 + nu), nu = 15 I_c / (8 A f^2) (same sources, from memory):
        // nu = 15 * 0.02 / (8 * 0.6 * 144) = 4.34e-4, so the area drops by about 0.043 %.
        // That factor takes the axial force of the redundant H = 1 as 1 along the rib and
        // leaves out the axial force the vertical load itself causes in the released
        // rib; the solver keeps both, and with A constant (not A_c sec(theta)) the ribs
        // near the springings shorten more. Computed here: a drop of 4.77e-4 (0.048 %),
        // 1.10 nu; the check allows 0.9 to 1.25 nu.
        let (xr, hr) = line(0.6);
        let area_real: f64 =
            xr.windows(2).zip(hr.windows(2)).map(|(x, h)| 0.5 * (h[0] + h[1]) * (x[1] - x[0])).sum();
        let drop = 1.0 - area_real / area;
        let nu = 15.0 * i_crown / (8.0 * 0.6 * rise * rise);
        assert!(drop > 0.9 * nu && drop < 1.25 * nu, "area drops by {drop}, nu = {nu}");
    }

    /// Fixed parabolic rib, I = I_c sec(theta), A very large, unit load at the rib nodes:
    /// H(a) = 15 a^2 b^2 / (4 f L^3) with b = L - a, 15 L / (64 f) at the crown (the
    /// hingeless parabolic arch by the elastic centre, Timoshenko & Young, Theory of
    /// Structures, fixed arches; from memory). Tolerance as for the two-hinged rib: 1e-3 of
    /// the crown ordinate.
    #[test]
    fn fixed_parabolic_rib_matches_the_handbook() {
        let (span, rise, n) = (60.0, 12.0, 64);
        let mut m = parabolic_rib(span, rise, n, 0.02, 1.0e4);
        m.supports = vec![Support::fixed(0), Support::fixed(n)];
        let path: Vec<usize> = (0..=n).collect();
        let lines = influence_lines(&m, &path, Stepping::NodesOnly).expect("solves");
        let h = lines.ordinates(Quantity::Reaction { node: 0, dof: Dof::X }).expect("supported");
        let crown = 15.0 * span / (64.0 * rise); // 1.1719
        for (k, &a) in lines.positions.iter().enumerate() {
            let b = span - a;
            let expected = 15.0 * a * a * b * b / (4.0 * rise * span.powi(3));
            assert!((h[k] - expected).abs() < 1e-3 * crown, "a = {a}: {} vs {expected}", h[k]);
        }
    }

    /// A design symmetric about mid-span with symmetric restraint gives mirrored lines:
    /// H left at x equals H right at the mirror of x, likewise V; a member's N equals its
    /// mirror member's N at the mirror position.
    #[test]
    fn symmetric_design_gives_mirrored_lines() {
        let mut d = Design::demo();
        let mid = 84.0;
        // the demo's valley left of x = 80 m, mirrored about x = 84 m
        let left: Vec<GroundPoint> = d.valley.iter().copied().filter(|p| p.x <= 80.0).collect();
        let mut valley = left.clone();
        valley.extend(left.iter().rev().map(|p| GroundPoint { x: 2.0 * mid - p.x, y: p.y }));
        d.valley = valley;
        (d.deck.left_seat_x, d.deck.right_seat_x) = (2.0, 2.0 * mid - 2.0);
        (d.springing_left_level, d.springing_right_level) = (76.0, 76.0);
        for (system, bracing) in [
            (RibSystem::ThreeHinged, Bracing::Crossed),
            (RibSystem::TwoHinged, Bracing::None),
            (RibSystem::Fixed, Bracing::None),
        ] {
            (d.rib_system, d.bracing) = (system, bracing);
            let v = ValidDesign::new(&d).expect("valid");
            let inf = arch_influence(&v, ModelKind::Frame, None).expect("solves").expect("frame");
            let x = &inf.lines.positions;
            let line = |l: ArchLine| inf.ordinates(&l).expect("line");
            let (hl, hr) = (line(ArchLine::Thrust(Side::Left)), line(ArchLine::Thrust(Side::Right)));
            let (vl, vr) = (line(ArchLine::Vertical(Side::Left)), line(ArchLine::Vertical(Side::Right)));
            let (ml, mr) =
                (line(ArchLine::SpringingMoment(Side::Left)), line(ArchLine::SpringingMoment(Side::Right)));
            let scale = hl.iter().fold(0.0f64, |a, h| a.max(h.abs()));
            assert!(scale > 0.1, "{system:?}: thrust ordinates {scale}");
            let rib = &inf.generated.map.rib_members;
            let (first, last) = (line(ArchLine::Axial(rib[0])), line(ArchLine::Axial(rib[rib.len() - 1])));
            let count = x.len();
            for k in 0..count {
                let m = count - 1 - k;
                assert!((x[k] + x[m] - 2.0 * mid).abs() < 1e-9, "positions mirror: {} {}", x[k], x[m]);
                let tol = 1e-9 * scale.max(1.0);
                assert!((hl[k] - hr[m]).abs() < tol, "{system:?} H at {}: {} vs {}", x[k], hl[k], hr[m]);
                assert!((vl[k] - vr[m]).abs() < tol, "{system:?} V at {}: {} vs {}", x[k], vl[k], vr[m]);
                // a mirror turns an anticlockwise moment clockwise
                assert!((ml[k] + mr[m]).abs() < 1e-6, "{system:?} M at {}: {} vs {}", x[k], ml[k], mr[m]);
                assert!((first[k] - last[m]).abs() < 1e-6 * scale.max(1.0), "{system:?} rib N at {}", x[k]);
            }
        }
    }

    /// Every line of every model of the demo can be read, and the springings' vertical
    /// lines add up to the unit load wherever it stands on the truss idealisation (the
    /// springings are its only supports: vertical equilibrium).
    #[test]
    fn every_line_reads_and_the_truss_verticals_add_up() {
        let v = ValidDesign::new(&Design::demo()).expect("valid");
        for kind in [ModelKind::Frame, ModelKind::Truss, ModelKind::BareRib] {
            let inf = arch_influence(&v, kind, Some(2.0)).expect("solves").expect("braced");
            let lines = ArchLine::every(&inf.generated);
            assert!(lines.len() > inf.generated.model.members.len(), "{kind}");
            for line in &lines {
                let values = inf.ordinates(line).expect("every listed line reads");
                assert_eq!(values.len(), inf.lines.positions.len());
                assert!(values.iter().all(|v| v.is_finite()), "{kind} {line:?}");
            }
        }
        let inf = arch_influence(&v, ModelKind::Truss, Some(0.5)).expect("solves").expect("braced");
        let vl = inf.ordinates(&ArchLine::Vertical(Side::Left)).expect("left");
        let vr = inf.ordinates(&ArchLine::Vertical(Side::Right)).expect("right");
        for (k, x) in inf.lines.positions.iter().enumerate() {
            assert!((vl[k] + vr[k] - 1.0).abs() < 1e-9, "x = {x}: {} + {}", vl[k], vr[k]);
        }
    }

    /// Braced three-hinged demo, truss idealisation: the bracing diagonals carry nothing
    /// under the form-finding load (the dead case of the analysis: the rib is its
    /// funicular and the truss is determinate, so the deck and posts alone carry it to
    /// the rib), yet under traffic on part of the span they work both ways: the envelope
    /// of a uniform traffic load (where each diagonal's line is adverse) has max > 0 > min,
    /// and the analysis's half-span case loads them.
    #[test]
    fn braced_three_hinged_diagonals_are_idle_under_dead_load_but_not_under_traffic() {
        use crate::arch::analysis::analyze;
        use crate::arch::cases::HALF_SPAN;
        use crate::frame::envelope::{envelope, Traffic};
        let d = Design::demo();
        let analysis = analyze(&d).expect("demo analyses");
        let truss = analysis.truss.expect("braced demo has a truss idealisation");
        let solution = truss.solution.expect("truss solves");
        let diagonals: Vec<usize> = truss.map.members_with(MemberRole::Bracing).collect();
        assert!(!diagonals.is_empty());
        let largest_of = |case: usize| {
            solution.cases[case]
                .members
                .iter()
                .map(|m| m.start.n.abs().max(m.end.n.abs()))
                .fold(0.0, f64::max)
        };
        let diagonal_of = |case: usize| {
            diagonals.iter().map(|&k| solution.cases[case].members[k].start.n.abs()).fold(0.0, f64::max)
        };
        // dead case first: zero within 1e-9 of the largest force (the acceptance)
        assert!(diagonal_of(0) <= 1e-9 * largest_of(0), "{} of {}", diagonal_of(0), largest_of(0));
        let half = solution.cases.iter().position(|c| c.name == HALF_SPAN).expect("half-span case");
        assert!(diagonal_of(half) > 1e-3 * largest_of(half), "{} of {}", diagonal_of(half), largest_of(half));

        let v = ValidDesign::new(&d).expect("valid");
        let inf = arch_influence(&v, ModelKind::Truss, Some(0.5)).expect("solves").expect("braced");
        assert_eq!(inf.generated.map.members_with(MemberRole::Bracing).collect::<Vec<_>>(), diagonals);
        // 9.3 kN/m: a lane load of the order of HL-93's (AASHTO LRFD 3.6.1.2.4; from
        // memory); the signs do not depend on its value
        let traffic = Traffic { uniform: 9.3, axles: None };
        for &k in &diagonals {
            let eta = inf.ordinates(&ArchLine::Axial(k)).expect("line");
            let e = envelope(&inf.lines.positions, &eta, &traffic).expect("valid line");
            let name = &inf.generated.model.members[k].name;
            assert!(
                e.max.value > 0.0 && e.min.value < 0.0,
                "{name}: max {} min {}",
                e.max.value,
                e.min.value
            );
            // scale: the envelope is far from rounding noise of the dead case
            assert!(e.max.value.min(-e.min.value) > 1e-6 * largest_of(0), "{name}");
        }
    }

    /// A name the model does not have is refused with the accepted names; the member
    /// names and the springing names are accepted.
    #[test]
    fn names_of_lines() {
        let v = ValidDesign::new(&Design::demo()).expect("valid");
        let g = frame_model(&v);
        assert_eq!(ArchLine::parse("thrust", &g).expect("ok"), ArchLine::Thrust(Side::Left));
        assert_eq!(ArchLine::parse("v-right", &g).expect("ok"), ArchLine::Vertical(Side::Right));
        let k = g.map.rib_members[0];
        assert_eq!(ArchLine::parse(&g.model.members[k].name, &g).expect("ok"), ArchLine::Axial(k));
        let with_end = format!("{}/m-end", g.model.members[k].name);
        assert_eq!(ArchLine::parse(&with_end, &g).expect("ok"), ArchLine::Moment(k, MemberEnd::End));
        let err = ArchLine::parse("nothing here", &g).expect_err("unknown").to_string();
        assert!(err.contains("thrust-right") && err.contains("'rib 0-1'"), "{err}");
        // every line's name reads back as the same line
        for line in ArchLine::every(&g) {
            assert_eq!(ArchLine::parse(&line.name(&g), &g).expect("its own name"), line);
        }
    }
}
