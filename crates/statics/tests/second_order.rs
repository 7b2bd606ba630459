//! The rib's in-plane stability in sizing (`arch::second_order`): alpha_cr of the
//! governing placements, the buckling length from it, the amplification of the rib's
//! moments, the least alpha_cr and the first-order option.

use springline_statics::arch::design::Design;
use springline_statics::arch::massing::massing_loop;
use springline_statics::arch::second_order::{amplification, LEAST_AMPLIFIED, LEAST_FIRST_ORDER};
use springline_statics::arch::sizing::{size_of, GroupOutcome, SizeReport};
use springline_statics::arch::stability::arch_stability;
use springline_statics::sizing::materials::material_preset;
use springline_statics::sizing::resistance::{check, Demand, Mode};
use springline_statics::sizing::sections::Family;
use springline_statics::ValidDesign;

fn sized(d: &Design) -> SizeReport {
    size_of(d).unwrap_or_else(|e| panic!("{}: {e}", d.name))
}

fn rib_i(r: &SizeReport) -> f64 {
    match &r.sizing.groups[0].outcome {
        GroupOutcome::Sized { props, .. } => props.i,
        other => panic!("rib not sized: {other:?}"),
    }
}

/// The demo with every group as typed (checked, not sized).
fn demo_as_typed() -> Design {
    let mut d = Design::demo();
    for g in [
        &mut d.sizing.rib,
        &mut d.sizing.deck,
        &mut d.sizing.posts,
        &mut d.sizing.piers,
        &mut d.sizing.bracing,
    ] {
        g.family = None;
    }
    d
}

/// Linear buckling scales with the load: the factored dead load alone (gamma_G = 1.35,
/// EN 1990 Table A2.4(B)) buckles at the dead load's alpha_cr over 1.35 (the geometric
/// stiffness is linear in the axial forces; any text on linear buckling, e.g. Bazant and
/// Cedolin, Stability of Structures, ch. 1). Every governing placement adds traffic, so
/// none has a higher alpha_cr than the dead load alone, and the least is the report's.
#[test]
fn the_factored_dead_load_buckles_at_the_dead_loads_alpha_over_gamma_g() {
    let d = Design::demo();
    let r = sized(&d);
    let st = r.sizing.rib_stability.as_ref().expect("analysed");
    let valid = ValidDesign::new(&d).expect("valid");
    let dead = arch_stability(&valid, 3).expect("buckles");
    let gamma = d.traffic.combinations[0].permanent_unfavourable;
    assert_eq!(gamma, 1.35);
    let factored = st.cases[0].arch.alpha_cr;
    assert!(st.cases[0].arch.mode.is_some(), "the arch's mode is found");
    assert!(
        (factored * gamma / dead.arch.alpha_cr - 1.0).abs() < 1e-6,
        "{factored} x {gamma} vs {}",
        dead.arch.alpha_cr
    );
    assert!(st.cases.len() > 3, "{} cases", st.cases.len());
    for c in &st.cases[1..] {
        assert!(
            c.arch.alpha_cr < factored,
            "{}: {} above the dead load's {factored}",
            c.placement,
            c.arch.alpha_cr
        );
    }
    let least = st.cases.iter().map(|c| c.arch.alpha_cr).fold(f64::INFINITY, f64::min);
    assert_eq!(st.alpha_cr, least);
    assert_eq!(st.least, LEAST_AMPLIFIED);
}

/// The rib's in-plane check takes lambda_bar = sqrt(N_Rk / (alpha_cr N_Ed)) (EN 1993-1-1
/// 6.3.1.2 with N_cr = alpha_cr N_Ed): for the typed rib the buckling length the sizing
/// uses gives back N_cr = alpha_cr N_Ed of the member's compression case, per rib line;
/// the moments are those of the envelope times 1 / (1 - 1/alpha_cr) of the moment case
/// (EN 1993-1-1 5.2.2, from memory); and the arch-stability mode is 3 / alpha_cr.
#[test]
fn a_typed_steel_rib_is_checked_with_its_alpha_cr() {
    let d = demo_as_typed();
    let r = sized(&d);
    let st = r.sizing.rib_stability.as_ref().expect("analysed");
    let rib = d.groups.rib;
    let ribs = d.deck.ribs as f64;
    let mut checked = 0;
    for (m, s) in r.sizing.members.iter().filter(|m| m.group == "rib").zip(&st.members) {
        assert_eq!(m.member, s.member);
        let case = &st.cases[s.compression_case.expect("compressed")];
        let k = r.sizing.members.iter().position(|x| x.member == m.member).expect("member");
        let n_ed = -case.member_axial[k] / ribs;
        assert!((n_ed / s.n_ed - 1.0).abs() < 1e-12);
        // the envelope's compression is the case's (the placement reproduces the extreme)
        assert!(
            (m.demand.compression / n_ed - 1.0).abs() < 0.03,
            "{}: {} vs {n_ed}",
            m.member,
            m.demand.compression
        );
        let l = m.lengths.in_plane;
        assert!((s.length.expect("a length") / l - 1.0).abs() < 1e-12);
        let n_cr = std::f64::consts::PI.powi(2) * rib.e * rib.i / (l * l);
        assert!((n_cr / (case.arch.alpha_cr * n_ed) - 1.0).abs() < 1e-9, "{}", m.member);
        let trial = m.second_order.expect("second order");
        assert!((trial.amplification - 1.0 / (1.0 - 1.0 / s.alpha_moment)).abs() < 1e-12);
        assert!(trial.amplification > 1.0);
        checked += 1;
    }
    assert_eq!(checked, d.panels);
    // the amplified moment is what the check used: one member by hand
    let m = r.sizing.members.iter().find(|m| m.group == "rib").expect("a rib member");
    let trial = m.second_order.expect("second order");
    let material = material_preset("s355").expect("preset");
    let family = Family::WeldedBox { width_over_depth: 1.0, flange_ratio: 30.0, web_ratio: 30.0 };
    let props = springline_statics::sizing::sections::SectionProps {
        size: rib.depth,
        depth: rib.depth,
        width: rib.depth,
        thickness: None,
        a: rib.a,
        i: rib.i,
        i_out: rib.i,
        w_el: 2.0 * rib.i / rib.depth,
        radius_in: (rib.i / rib.a).sqrt(),
        radius_out: (rib.i / rib.a).sqrt(),
        steel_area_rebar: None,
    };
    let amplified = Demand { moment: m.demand.moment * trial.amplification, ..m.demand };
    let c = check(&material, &family, &props, &amplified, &m.lengths).expect("checks");
    let stability = LEAST_AMPLIFIED / trial.alpha_cr;
    // the second-order route with the arch's imperfection, by hand: a typed welded box
    // takes curve b, e0 = s / 250 (EN 1993-2 Table D.8, from memory), f_y 355 MPa (no
    // plate thickness: Table 3.1's lower value is not taken), gamma_M0 1.0
    let s_half = st.half_length;
    let e0 = trial.imperfection.expect("a steel rib");
    assert!((e0 - s_half / 250.0).abs() < 1e-12, "{e0} vs {}", s_half / 250.0);
    let n = m.demand.compression;
    let m_ii = m.demand.moment * trial.amplification + n * e0 / (1.0 - 1.0 / trial.alpha_compression);
    let fy = 355_000.0;
    let w_el = 2.0 * rib.i / rib.depth;
    let second_order = n / (rib.a * fy) + m_ii / (w_el * fy);
    let u = m.utilisation.expect("checked");
    assert!(
        (u - c.utilisation.max(stability).max(second_order)).abs() < 1e-9,
        "{u} vs {}, {stability}, {second_order}",
        c.utilisation
    );
    // the half length is half the rib's length along its axis
    let valid = ValidDesign::new(&d).expect("valid");
    let rib_nodes = &valid.form().rib;
    let length: f64 = rib_nodes.windows(2).map(|w| (w[1].x - w[0].x).hypot(w[1].y - w[0].y)).sum();
    assert!((s_half - length / 2.0).abs() < 1e-9);
}

/// A rib a twentieth as stiff: its alpha_cr falls below 3 and the rib fails its
/// arch-stability mode (too slender for amplified first-order moments, EN 1993-1-1
/// 5.2.2, from memory), utilisation 3 / alpha_cr.
#[test]
fn a_slender_typed_rib_fails_its_arch_stability() {
    let mut d = demo_as_typed();
    d.groups.rib.i /= 20.0;
    let r = sized(&d);
    let st = r.sizing.rib_stability.as_ref().expect("analysed");
    assert!(st.alpha_cr < LEAST_AMPLIFIED, "alpha_cr {}", st.alpha_cr);
    for m in r.sizing.members.iter().filter(|m| m.group == "rib") {
        let u = m.utilisation.expect("checked");
        assert!(u >= LEAST_AMPLIFIED / st.alpha_cr - 1e-12 && u > 1.0, "{}: {u}", m.member);
        assert!(
            matches!(m.governs, Some(Mode::ArchStability | Mode::SecondOrder | Mode::Interaction)),
            "{}: {:?}",
            m.member,
            m.governs
        );
    }
    assert!(r.sizing.groups[0].utilisation.is_some_and(|u| u > 1.0));
}

/// The first-order option sizes the rib for alpha_cr >= 10 (EN 1993-1-1 5.2.1(3)): on the
/// demo without its bracing (whose rib alone carries the arch's stability: alpha_cr
/// below 10 without the option), a stiffer rib than without it, estimated at 10 or more
/// with its section; and once the massing loop has settled (every size adopted and
/// analysed again), the analysed alpha_cr of the settled design is at least 10.
#[test]
fn the_first_order_option_sizes_the_rib_for_alpha_cr_10() {
    let mut unbraced = Design::demo();
    unbraced.bracing = springline_statics::arch::design::Bracing::None;
    let plain = sized(&unbraced);
    let mut d = unbraced.clone();
    d.sizing.rib_for_first_order = true;
    let first = sized(&d);
    let st = first.sizing.rib_stability.as_ref().expect("analysed");
    assert_eq!(st.least, LEAST_FIRST_ORDER);
    assert!(first.sizing.rib_alpha_cr.expect("estimated") >= LEAST_FIRST_ORDER);
    assert!(plain.sizing.rib_alpha_cr.expect("estimated") < LEAST_FIRST_ORDER);
    assert!(rib_i(&first) > rib_i(&plain), "{} vs {}", rib_i(&first), rib_i(&plain));
    let settled = massing_loop(&d, 12).expect("loops");
    assert!(settled.converged, "{}", settled.last_change);
    let again = sized(&settled.design);
    let analysed = again.sizing.rib_stability.as_ref().expect("analysed").alpha_cr;
    assert!(analysed >= LEAST_FIRST_ORDER, "analysed alpha_cr {analysed}");
}

/// A concrete rib's second order is its nominal curvature's (EN 1992-1-1 5.8.8), with the
/// buckling length from alpha_cr (5.8.3.2(6)): no amplification on top.
#[test]
fn a_concrete_rib_is_not_amplified_twice() {
    let mut d = Design::demo();
    let preset = Family::family_presets().into_iter().find(|(k, _)| *k == "concrete-box").map(|(_, f)| f);
    d.sizing.rib = springline_statics::arch::sizing::GroupSizing::sized(
        preset.expect("preset"),
        material_preset("c50-60").expect("preset"),
    );
    let r = sized(&d);
    for m in r.sizing.members.iter().filter(|m| m.group == "rib") {
        assert_eq!(m.second_order.expect("second order").amplification, 1.0, "{}", m.member);
    }
    assert!((amplification(4.0) - 4.0 / 3.0).abs() < 1e-15);
    assert!((amplification(2.0) - 1.5).abs() < 1e-15, "held at alpha_cr = 3 below it");
}

/// The subspace iteration agrees with nalgebra's dense symmetric eigen-decomposition
/// (`EigenSolver::Dense`, the oracle) on the demo's arch model (posts and diagonals kept
/// whole, two elements per member) under the factored dead load and the first governing
/// placement: every mode's alpha_cr to 1e-6 relative.
#[test]
fn the_arch_modes_agree_with_the_dense_oracle() {
    use springline_statics::arch::generate::frame_model;
    use springline_statics::arch::stability::{arch_only, ARCH_MODES, ARCH_SETTINGS};
    use springline_statics::frame::stability::{EigenSolver, Stability, StabilitySettings};
    let d = Design::demo();
    let valid = ValidDesign::new(&d).expect("valid");
    let generated = frame_model(&valid);
    let r = sized(&d);
    let st = r.sizing.rib_stability.as_ref().expect("analysed");
    let model = arch_only(&generated);
    let subspace = Stability::new(&model, ARCH_SETTINGS).expect("prepares");
    let dense = Stability::new(&model, StabilitySettings { solver: EigenSolver::Dense, ..ARCH_SETTINGS })
        .expect("prepares");
    let uls = &d.traffic.combinations[0];
    let dead = springline_statics::arch::stability::factored_dead(&generated, uls).expect("a dead case");
    // the largest compression of the rib's first member, under ULS gr1a
    let traffic = springline_statics::arch::sizing::frame_traffic(&valid).expect("traffic");
    let k = springline_statics::arch::second_order::rib_members(&generated)[0];
    let line = springline_statics::arch::influence::ArchLine::Axial(k).name(&generated);
    let envelope = traffic.line(&line).expect("the rib's axial line");
    let placed =
        springline_statics::arch::stability::factored_placement(&valid, &generated, envelope, false, uls)
            .expect("a placement case");
    for (i, case) in [dead, placed].into_iter().enumerate() {
        let a = subspace.buckling(&case, ARCH_MODES).expect("buckles");
        let b = dense.buckling(&case, ARCH_MODES).expect("buckles");
        assert_eq!(a.modes.len(), b.modes.len());
        for (x, y) in a.modes.iter().zip(&b.modes) {
            assert!(
                (x.load_factor / y.load_factor - 1.0).abs() < 1e-6,
                "{} vs {}",
                x.load_factor,
                y.load_factor
            );
        }
        // the sizing's first case is the factored dead load
        if i == 0 {
            assert!((st.cases[0].arch.alpha_cr / a.modes[0].load_factor - 1.0).abs() < 1e-6);
        }
    }
}

/// One placement is buckled once, even when two envelope lines find it with their zero
/// crossings differing in the last bits (measured on the demo as typed at 16 panels:
/// three such pairs, 1e-16 to 6e-15 of the largest load apart, were three cases more). So no two
/// cases of the demo's rib stability have the same placement in words and the same
/// alpha_cr to 1e-9; `same_placement` takes loads equal to rounding as one and tells
/// apart a load moved by a millimetre or changed by a part in a million.
#[test]
fn a_placement_found_twice_is_buckled_once() {
    use springline_statics::arch::second_order::same_placement;
    use springline_statics::frame::model::{LoadCase, LoadDirection, MemberLoad, NodalLoad};
    let r = sized(&Design::demo());
    let cases = &r.sizing.rib_stability.as_ref().expect("analysed").cases;
    assert!(cases.len() > 10, "{}", cases.len());
    for (i, a) in cases.iter().enumerate() {
        for b in &cases[i + 1..] {
            let twin = a.placement == b.placement && (a.alpha_cr / b.alpha_cr - 1.0).abs() < 1e-9;
            assert!(!twin, "'{}' buckled twice (alpha_cr {} and {})", a.placement, a.alpha_cr, b.alpha_cr);
        }
    }
    let case = |fy: f64, a: f64, member: usize| LoadCase {
        name: "placement".into(),
        nodal: vec![NodalLoad { node: 3, fx: 0.0, fy, mz: 0.0 }],
        member: vec![
            MemberLoad::Uniform { member: 2, w: -27.0, direction: LoadDirection::GlobalY, projected: true },
            MemberLoad::Point { member, p: -150.0, a, direction: LoadDirection::GlobalY },
        ],
        ..Default::default()
    };
    let base = case(-2131.665, 4.2, 5);
    assert!(same_placement(&base, &case(-2131.665 * (1.0 + 4e-16), 4.2 + 1e-15, 5)));
    assert!(!same_placement(&base, &case(-2131.665 * (1.0 + 1e-6), 4.2, 5)));
    assert!(!same_placement(&base, &case(-2131.665, 4.201, 5)));
    assert!(!same_placement(&base, &case(-2131.665, 4.2, 6)));
    let mut longer = base.clone();
    longer.nodal.push(NodalLoad { node: 4, fx: 0.0, fy: -1.0, mz: 0.0 });
    assert!(!same_placement(&base, &longer));
}

/// Each placement is buckled for its lowest mode first, and again for `ARCH_MODES` modes
/// only when that mode is not the arch's: the lowest alpha_cr, the arch's alpha_cr,
/// which mode is the arch's and the first mode's words are then what `ARCH_MODES` modes
/// from the start give (to 1e-9, the eigen solution's tolerance). On the demo the lowest
/// mode is the arch's in every case; on the fixed, cross-braced fixture with piers on
/// one side only a pier buckles first in every case, so each is buckled again.
#[test]
fn one_mode_first_gives_what_three_modes_give() {
    use springline_statics::arch::design_file::read_design_json;
    use springline_statics::arch::generate::frame_model;
    use springline_statics::arch::influence::ArchLine;
    use springline_statics::arch::second_order::rib_members;
    use springline_statics::arch::sizing::{frame_traffic, is_ultimate};
    use springline_statics::arch::stability::{
        arch_mode, arch_only, factored_dead, factored_placement, mode_words, placement_stability,
        FactoredCase, ARCH_MODES, ARCH_SETTINGS,
    };
    use springline_statics::frame::stability::Stability;
    let fixed = read_design_json(include_str!("../../../tests/fixtures/designs/v2-fixed-crossed.json"))
        .expect("the fixture reads");
    for (d, arch_first) in [(Design::demo(), true), (fixed, false)] {
        let valid = ValidDesign::new(&d).expect("valid");
        let generated = frame_model(&valid);
        let report = frame_traffic(&valid).expect("traffic");
        let uls = d.traffic.combinations.iter().find(|c| is_ultimate(c)).expect("an ultimate combination");
        let mut cases = vec![FactoredCase {
            combination: uls.name.clone(),
            placement: "dead load alone".into(),
            case: factored_dead(&generated, uls).expect("dead"),
        }];
        for k in rib_members(&generated).into_iter().step_by(3) {
            let line = report.line(&ArchLine::Axial(k).name(&generated)).expect("the rib member's line");
            let case = factored_placement(&valid, &generated, line, false, uls).expect("placed");
            cases.push(FactoredCase {
                combination: uls.name.clone(),
                placement: format!("member {k}"),
                case,
            });
        }
        let found = placement_stability(&generated, &cases).expect("prepared");
        let prepared = Stability::new(&arch_only(&generated), ARCH_SETTINGS).expect("prepared");
        for (f, c) in found.iter().zip(&cases) {
            let f = f.as_ref().expect("buckles");
            let three = prepared.buckling(&c.case, ARCH_MODES).expect("buckles");
            let arch = arch_mode(&generated, &three).expect("modes");
            let close = |a: f64, b: f64| (a / b - 1.0).abs() < 1e-9;
            let lowest = three.critical().expect("a mode");
            assert!(close(f.alpha_cr, lowest), "{}: {} vs {lowest}", d.name, f.alpha_cr);
            assert!(
                close(f.arch.alpha_cr, arch.alpha_cr),
                "{}: {} vs {}",
                d.name,
                f.arch.alpha_cr,
                arch.alpha_cr
            );
            assert_eq!(f.arch.mode, arch.mode, "{}", d.name);
            assert_eq!(f.first_mode, mode_words(&generated, &three.modes[0]), "{}", d.name);
            assert_eq!(arch.mode == Some(0), arch_first, "{}: the arch's mode is {:?}", d.name, arch.mode);
        }
    }
}
