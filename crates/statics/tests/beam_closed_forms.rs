//! Moments and shears between member ends (the stations `solve` reports along each
//! member) against the closed forms of single-span beams.
//!
//! One horizontal frame member of span L from node 0 (x = 0) to node 1 (x = L), loads
//! downwards, so the engine's moment convention (right-hand fibre in tension) is sagging
//! positive and V = dM/dx. Sources: Hibbeler, Structural Analysis, the fixed-end moment
//! table (inside back cover), and Roark's Formulas for Stress and Strain, table 8.1 (end
//! moments and reactions of single-span beams), both from memory; each moment law below
//! follows from those end moments and reactions by statics, derived in its comment.

use springline_statics::frame::results::Station;
use springline_statics::{frame, solve, LoadCase, LoadDirection, MemberLoad, Model, Support};

const E: f64 = 2.1e8; // kN/m2, steel (EN 1993-1-1 3.2.6)
const AREA: f64 = 0.012; // m2
const INERTIA: f64 = 4e-4; // m4
const SPAN: f64 = 8.0; // m
const W: f64 = 15.0; // kN/m, downwards
const P: f64 = 120.0; // kN, downwards

#[derive(Clone, Copy, Debug)]
enum Ends {
    /// Pin at x = 0, roller at x = L.
    Simple,
    /// Fixed at x = 0, roller at x = L.
    FixedPropped,
    /// Roller at x = 0, fixed at x = L (the propped cantilever drawn the other way).
    ProppedFixed,
    /// Fixed at both ends.
    Fixed,
}

/// The beam with `ends` and one member load; its stations from `solve`.
fn stations(ends: Ends, load: MemberLoad) -> Vec<Station> {
    let mut m = Model { title: format!("{ends:?} beam"), ..Default::default() };
    m.add_node("A", 0.0, 0.0);
    m.add_node("B", SPAN, 0.0);
    m.add_member(frame("beam", "", 0, 1, E, AREA, INERTIA));
    m.supports = match ends {
        Ends::Simple => vec![Support::pinned(0), Support::roller_along_x(1)],
        Ends::FixedPropped => vec![Support::fixed(0), Support::roller_along_x(1)],
        Ends::ProppedFixed => vec![Support::roller_along_x(0), Support::fixed(1)],
        Ends::Fixed => vec![Support::fixed(0), Support::fixed(1)],
    };
    m.load_cases = vec![LoadCase { name: "load".into(), member: vec![load], ..Default::default() }];
    let solution = solve(&m).unwrap_or_else(|e| panic!("{ends:?} beam: {e}"));
    solution.cases[0].members[0].stations.clone()
}

fn uniform() -> MemberLoad {
    MemberLoad::Uniform { member: 0, w: -W, direction: LoadDirection::GlobalY, projected: false }
}

fn point(a: f64) -> MemberLoad {
    MemberLoad::Point { member: 0, p: -P, a, direction: LoadDirection::GlobalY }
}

/// Checks every station against the closed forms M(x) and V(x): equal to 1e-9 of
/// `scale_m` (kNm) and `scale_v` (kN); the element is exact for these loads, so only
/// rounding separates them. Returns how many stations lie strictly between the ends.
fn check(what: &str, stations: &[Station], moment: impl Fn(f64) -> f64, shear: impl Fn(f64) -> f64) -> usize {
    let scale_m = W * SPAN * SPAN / 8.0 + P * SPAN / 4.0;
    let scale_v = W * SPAN + P;
    for st in stations {
        let (m, v) = (st.forces.m, st.forces.v);
        assert!(
            (m - moment(st.s)).abs() < 1e-9 * scale_m,
            "{what}: M({:.3}) = {m:.6} kNm, closed form {:.6}",
            st.s,
            moment(st.s)
        );
        assert!(
            (v - shear(st.s)).abs() < 1e-9 * scale_v,
            "{what}: V({:.3}) = {v:.6} kN, closed form {:.6}",
            st.s,
            shear(st.s)
        );
    }
    stations.iter().filter(|s| s.s > 1e-9 && s.s < SPAN - 1e-9).count()
}

/// Simply supported, uniform load w: reactions w L / 2, M(x) = w x (L - x) / 2, w L^2 / 8
/// at mid-span, 3 w L^2 / 32 at the quarter points; V(x) = w (L / 2 - x).
#[test]
fn simple_span_under_uniform_load() {
    let (w, l) = (W, SPAN);
    let st = stations(Ends::Simple, uniform());
    let inside = check("simple span, uniform", &st, |x| w * x * (l - x) / 2.0, |x| w * (l / 2.0 - x));
    assert_eq!(inside, 9, "stations at tenths of the span");
    let at = |x: f64| st.iter().find(|s| (s.s - x).abs() < 1e-9).map(|s| s.forces.m);
    assert_eq!(at(l / 2.0).map(|m| (m - w * l * l / 8.0).abs() < 1e-9 * w * l * l), Some(true));
    // the greatest moment is the mid-span one, w L^2 / 8 = 120 kNm
    let largest = st.iter().map(|s| s.forces.m).fold(f64::MIN, f64::max);
    assert!((largest - 120.0).abs() < 1e-9 * 120.0, "{largest}");
}

/// Propped cantilever, fixed at x = 0, uniform load w: fixed-end moment w L^2 / 8
/// (hogging), reaction at the fixed end 5 w L / 8, so
/// M(x) = -w L^2 / 8 + 5 w L x / 8 - w x^2 / 2: zero at x = L / 4, greatest sagging
/// 9 w L^2 / 128 at x = 5 L / 8 from the fixed end (dM/dx = 0 there), zero again at the
/// prop. Drawn the other way (fixed
/// at x = L) the law is mirrored: M(x) = M_fixed_at_0(L - x), V(x) = -V_fixed_at_0(L - x).
#[test]
fn propped_cantilever_under_uniform_load_both_ways() {
    let (w, l) = (W, SPAN);
    let moment = move |x: f64| -w * l * l / 8.0 + 5.0 * w * l * x / 8.0 - w * x * x / 2.0;
    let shear = move |x: f64| 5.0 * w * l / 8.0 - w * x;
    let st = stations(Ends::FixedPropped, uniform());
    check("propped cantilever fixed at the start", &st, moment, shear);
    assert!(
        (st[0].forces.m + w * l * l / 8.0).abs() < 1e-9 * w * l * l,
        "fixed-end moment {}",
        st[0].forces.m
    );
    // the closed form's own landmarks, so the law above is the textbook one
    assert!(moment(l / 4.0).abs() < 1e-12 * w * l * l);
    assert!((moment(5.0 * l / 8.0) - 9.0 * w * l * l / 128.0).abs() < 1e-12 * w * l * l);
    assert!(shear(5.0 * l / 8.0).abs() < 1e-12 * w * l);
    // no station exceeds the greatest sagging moment 9 w L^2 / 128 = 67.5 kNm
    let largest = st.iter().map(|s| s.forces.m).fold(f64::MIN, f64::max);
    assert!(largest <= 67.5 * (1.0 + 1e-9) && largest > 0.95 * 67.5, "{largest}");

    let mirrored = stations(Ends::ProppedFixed, uniform());
    check("propped cantilever fixed at the end", &mirrored, |x| moment(l - x), |x| -shear(l - x));
}

/// Fixed at both ends, uniform load w: end moments w L^2 / 12 (hogging), reactions
/// w L / 2, M(x) = -w L^2 / 12 + w x (L - x) / 2: w L^2 / 24 at mid-span,
/// w L^2 / 96 at the quarter points.
#[test]
fn fixed_ended_beam_under_uniform_load() {
    let (w, l) = (W, SPAN);
    let moment = move |x: f64| -w * l * l / 12.0 + w * x * (l - x) / 2.0;
    let st = stations(Ends::Fixed, uniform());
    check("fixed-ended, uniform", &st, moment, |x| w * (l / 2.0 - x));
    assert!((moment(l / 2.0) - w * l * l / 24.0).abs() < 1e-12 * w * l * l);
    assert!((moment(l / 4.0) - w * l * l / 96.0).abs() < 1e-12 * w * l * l);
    let end = st.last().map(|s| s.forces.m).unwrap_or(f64::NAN);
    assert!((end + w * l * l / 12.0).abs() < 1e-9 * w * l * l, "end moment {end}");
}

/// Point load P at a from the start (b = L - a). Simply supported: M(x) = P b x / L up
/// to the load and P a (L - x) / L after it, P a b / L under it. Fixed at both ends:
/// end moments P a b^2 / L^2 and P a^2 b / L^2 (hogging), reaction at the start
/// P b^2 (3 a + b) / L^3, so M under the load is 2 P a^2 b^2 / L^3. The load sits at
/// a = 3 m, between stations (tenths of 8 m), so it adds a station of its own.
#[test]
fn point_load_on_simple_and_fixed_ended_beams() {
    let (p, l, a) = (P, SPAN, 3.0);
    let b = l - a;
    let simple = stations(Ends::Simple, point(a));
    let inside = check(
        "simple span, point load",
        &simple,
        |x| if x <= a { p * b * x / l } else { p * a * (l - x) / l },
        // stations report forces just before s: at the load the shear is still P b / L
        |x| if x <= a { p * b / l } else { -p * a / l },
    );
    assert_eq!(inside, 10, "nine tenths and the load point");
    let under = simple.iter().find(|s| (s.s - a).abs() < 1e-12).map(|s| s.forces.m);
    assert_eq!(under.map(|m| (m - p * a * b / l).abs() < 1e-9 * p * l), Some(true), "{under:?}");

    let start_reaction = p * b * b * (3.0 * a + b) / (l * l * l);
    let fixed_moment = p * a * b * b / (l * l);
    let fixed = stations(Ends::Fixed, point(a));
    check(
        "fixed-ended, point load",
        &fixed,
        |x| -fixed_moment + start_reaction * x - if x > a { p * (x - a) } else { 0.0 },
        |x| start_reaction - if x > a { p } else { 0.0 },
    );
    let under = fixed.iter().find(|s| (s.s - a).abs() < 1e-12).map(|s| s.forces.m).unwrap_or(f64::NAN);
    assert!((under - 2.0 * p * a * a * b * b / (l * l * l)).abs() < 1e-9 * p * l, "{under}");
    let end = fixed.last().map(|s| s.forces.m).unwrap_or(f64::NAN);
    assert!((end + p * a * a * b / (l * l)).abs() < 1e-9 * p * l, "end moment {end}");
}
