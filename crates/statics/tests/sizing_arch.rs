//! Sizing a whole deck arch: the demo's thrust blocks worked by hand, the group sizes
//! minimal and every member within its resistance, typed groups checked, sizes adopted,
//! the deck weight counted once, and a group that cannot be sized reported with its
//! reason.

use springline_statics::arch::design::{Design, RibSystem};
use springline_statics::arch::generate::ModelKind;
use springline_statics::arch::sizing::{
    adopt_sizes, arch_buckling, size_design, DeckWeight, GroupOutcome, SizeReport,
};
use springline_statics::arch::traffic::{traffic_envelopes, TrafficReport};
use springline_statics::sizing::resistance::check;
use springline_statics::{analyze, ValidDesign};

fn report_of(design: &Design) -> (ValidDesign, TrafficReport, SizeReport) {
    let valid = ValidDesign::new(design).expect("valid");
    let traffic = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame report");
    let size = size_design(&valid, &traffic).expect("sizes");
    (valid, traffic, size)
}

fn group<'a>(r: &'a SizeReport, name: &str) -> &'a springline_statics::arch::sizing::GroupReport {
    r.sizing.groups.iter().find(|g| g.group == name).expect("group")
}

/// The demo's left thrust block by hand, from its characteristic demand.
///
/// Demand (whole cross-section, SLS characteristic combination of EN 1990 A2.4.1):
/// H_k = 12 718.9 kN, V_k = 11 314.0 kN (the engine's envelope values, pinned here to
/// 0.1 %). A hand estimate of H_k: the dead-load thrust 8 140.5 kN (the form thrust of
/// the three-hinged rib) plus Load Model 1 at the crown: the thrust influence line of a
/// three-hinged arch peaks at the crown at (a b / L) / f = (53.21 x 53.21 / 106.43) /
/// 19.5 = 1.364 kN/kN (any structural analysis text), a triangle of area 0.5 x 106.43 x
/// 1.364 = 72.6 m; lanes 9 x 3 + 2.5 x 3 + 2.5 x 1.5 = 38.25 kN/m (EN 1991-2 Table 4.2)
/// give 2 777 kN, the two tandems 1 000 kN near the crown about 1 334 kN: 12 252 kN
/// before the footways' 3 kN/m2 (EN 1991-2 5.3.2.1, gr1a combination value), which may
/// add up to 10.5 kN/m x 72.6 m = 762 kN: H_k lies within 12 252 to 13 014 kN.
///
/// Block: R_k = sqrt(12 718.9^2 + 11 314.0^2) = 17 022.9 kN at atan(11 314.0 / 12 718.9)
/// = 41.65 degrees below the horizontal; bearing area A = R_k / q_allow = 17 022.9 / 1
/// 000 = 17.02 m2; across the deck width B = 11.0 m, along the arch L = 17.02 / 11.0 =
/// 1.548 m (hinged springing, no eccentricity; above the sized rib depth 1.15 m);
/// thickness: along the arch L - d = 0.398 m, across B / ribs - w = 11.0 / 2 - 0.69 =
/// 4.81 m (each of the two ribs, a box 690 mm wide, spreads its load over half the face:
/// EN 1992-1-1 6.7(3), h >= b2 - b1), so 4.81 m; volume 11.0 x 1.548 x 4.81 = 81.9 m3.
#[test]
fn the_demo_thrust_block_worked_by_hand() {
    let (_, _, r) = report_of(&Design::demo());
    let left = &r.foundations.springings[0];
    assert_eq!(left.side, "left");
    assert_eq!(r.foundations.characteristic, "SLS characteristic");
    let near = |got: f64, want: f64, tol: f64, what: &str| {
        assert!((got - want).abs() <= tol * want.abs(), "{what}: {got} against {want}");
    };
    near(left.thrust, 12_718.9, 1e-3, "H_k");
    near(left.vertical, 11_314.0, 1e-3, "V_k");
    assert!((12_252.0..=13_014.0).contains(&left.thrust), "H_k {} outside the hand bracket", left.thrust);
    near(left.dead_thrust, 8_140.5, 1e-4, "dead-load thrust");
    near(left.resultant, 17_022.9, 1e-3, "R_k");
    near(left.angle, 41.65, 1e-3, "angle");
    let b = &left.block;
    near(b.bearing_area, 17.02, 2e-3, "bearing area");
    near(b.width, 11.0, 1e-12, "width");
    near(b.length, 1.548, 1e-3, "length");
    assert_eq!(b.eccentricity, 0.0);
    near(b.thickness, 4.81, 1e-12, "thickness");
    near(b.volume, 81.91, 2e-3, "volume");
    assert!(left.fixed_moment.is_none(), "a hinged springing has no moment");
    // the angle ranges over every combination around the dead-load angle
    assert!(left.angle_range.min < left.dead_angle && left.dead_angle < left.angle_range.max);
    assert!(r.caution.contains("licensed engineer"));
    assert!(r.foundations.basis.contains("EN 1992-1-1 6.7(3)"));
}

/// A fixed rib's springing moment lengthens its block by 2 e, e = M_k / R_k.
#[test]
fn a_fixed_rib_block_takes_its_moment_as_an_eccentricity() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::Fixed;
    let (_, _, r) = report_of(&d);
    for s in &r.foundations.springings {
        let m = s.fixed_moment.expect("a fixed springing has a moment");
        assert!(m > 0.0);
        // with the dead-load resultant, the smallest the moment may meet
        let e = m / s.dead_thrust.hypot(s.dead_vertical);
        assert!((s.block.eccentricity - e).abs() <= 1e-9 * e.max(1.0));
        let want = (s.block.bearing_area / s.block.width + 2.0 * e).max(group_depth(&r, "rib"));
        assert!((s.block.length - want).abs() <= 1e-9 * want, "{} against {want}", s.block.length);
    }
}

fn group_depth(r: &SizeReport, name: &str) -> f64 {
    group(r, name).section.expect("a section").depth
}

/// Every sized group: each member within its resistance at the group's section, the
/// governing one above it at the next size down (the smallest size that works), and
/// the group's utilisation the largest of its members'.
#[test]
fn each_group_is_the_smallest_section_every_member_passes() {
    let design = Design::demo();
    let (_, _, r) = report_of(&design);
    for g in &r.sizing.groups {
        let GroupOutcome::Sized { size, props, .. } = &g.outcome else {
            panic!("{} not sized: {g:?}", g.group)
        };
        let sizing = match g.group.as_str() {
            "rib" => &design.sizing.rib,
            "deck" => &design.sizing.deck,
            "posts" => &design.sizing.posts,
            "piers" => &design.sizing.piers,
            _ => &design.sizing.bracing,
        };
        let family = sizing.family.expect("a family");
        let members: Vec<_> = r.sizing.members.iter().filter(|m| m.group == g.group).collect();
        assert_eq!(members.len(), g.members);
        // a rib member's check takes its amplified moment and the arch's stability
        // (`arch::second_order`), with the section's E I
        let rib = r.sizing.rib_stability.as_ref().filter(|_| g.group == "rib");
        let check_at = |props: &springline_statics::sizing::sections::SectionProps, i: usize| {
            let m = members[i];
            match rib {
                Some(st) => {
                    let section = springline_statics::arch::second_order::RibSection {
                        material: &sizing.material,
                        family: &family,
                        props,
                        ei: sizing.material.e() * props.i,
                    };
                    st.check(&st.members[i], &section, &m.demand, &m.lengths)
                }
                None => check(&sizing.material, &family, props, &m.demand, &m.lengths),
            }
        };
        let mut worst: f64 = 0.0;
        for (i, m) in members.iter().enumerate() {
            let c = check_at(props, i).expect("checks");
            assert!(c.utilisation <= 1.0, "{}: {}", m.member, c.utilisation);
            assert_eq!(Some(c.utilisation), m.utilisation, "{}", m.member);
            worst = worst.max(c.utilisation);
        }
        assert_eq!(g.utilisation, Some(worst), "{}", g.group);
        let (_, _, step) = family.sizes();
        let smaller = family.props(size - step);
        let fails = (0..members.len()).any(|i| check_at(&smaller, i).map_or(true, |c| c.utilisation > 1.0));
        assert!(fails, "{}: the next size down passes too", g.group);
    }
}

/// A group kept as typed is checked with its typed section, and keeps it.
#[test]
fn a_typed_group_is_checked_not_sized() {
    let mut d = Design::demo();
    d.sizing.rib.family = None;
    let (_, _, r) = report_of(&d);
    let g = group(&r, "rib");
    assert_eq!(g.outcome, GroupOutcome::AsTyped);
    assert_eq!(g.section, Some(d.groups.rib));
    // the demo's typed rib (A 0.060 m2, I 0.0135 m4) is far too light for its envelope at
    // S355 with the arch's buckling length: its utilisation says so
    assert!(g.utilisation.expect("checked") > 1.0, "{g:?}");
    assert_eq!(adopt_sizes(&d, &r.sizing).groups.rib, d.groups.rib);
}

/// Adopting the sizes puts each sized section into the design; the adopted design
/// analyses and its rib weighs what the sized section weighs.
#[test]
fn adopted_sizes_become_the_typed_sections() {
    let d = Design::demo();
    let (_, _, r) = report_of(&d);
    let adopted = adopt_sizes(&d, &r.sizing);
    let GroupOutcome::Sized { props, .. } = &group(&r, "rib").outcome else { panic!("rib sized") };
    assert_eq!(adopted.groups.rib.a, props.a);
    assert_eq!(adopted.groups.rib.i, props.i);
    assert_eq!(adopted.groups.rib.depth, props.depth);
    assert_eq!(adopted.groups.rib.unit_weight, d.sizing.rib.material.unit_weight());
    assert_eq!(adopted.sizing, d.sizing);
    analyze(&adopted).expect("the adopted design analyses");
}

/// The deck's cross-section replaces the typed dead load only when chosen: the form
/// thrust follows the deck load (the same rib form: thrust proportional to the load on a
/// funicular of the same shape is only approximate here, so the test compares the deck
/// line loads and the thrust's direction of change).
#[test]
fn the_deck_weight_counts_once() {
    let typed = Design::demo();
    let mut cross = typed.clone();
    cross.sizing.deck_section.weight = DeckWeight::CrossSection;
    // 0.25 m x 25 kN/m3 of slab + 0.012 m2 x 77 kN/m3 every 4 m + 1.0 kN/m2 other: 7.481
    // kN/m2 against the typed 6.25 kN/m2
    assert!((cross.deck_dead_load() - (0.25 * 25.0 + 0.012 * 77.0 / 4.0 + 1.0)).abs() < 1e-12);
    assert_eq!(typed.deck_dead_load(), 6.25);
    let more = (cross.deck_dead_load() - 6.25) * cross.deck.width;
    assert!((cross.deck_line_load() - typed.deck_line_load() - more).abs() < 1e-9);
    let h0 = analyze(&typed).expect("typed").summary.form_thrust;
    let h1 = analyze(&cross).expect("cross-section").summary.form_thrust;
    assert!(h1 > h0, "{h1} against {h0}");
    // the quantities say which counts
    let (_, _, r) = report_of(&cross);
    assert!(r.quantities.deck_weight.contains("counts the cross-section"), "{}", r.quantities.deck_weight);
}

/// A group whose family cannot carry its members is reported with the member and the
/// reason, not hidden; the other groups are still sized.
#[test]
fn a_group_that_cannot_be_sized_says_why() {
    let mut d = Design::demo();
    // square hollow sections stop at 500 mm: a deck twenty times heavier crushes the
    // 24 m end posts
    d.deck.dead_load = 120.0;
    let (_, _, r) = report_of(&d);
    let posts = group(&r, "posts");
    let GroupOutcome::NotSized { reason } = &posts.outcome else { panic!("{posts:?}") };
    assert!(reason.contains("member ") && reason.contains("largest"), "{reason}");
    assert!(posts.section.is_none() && posts.utilisation.is_none());
    assert!(matches!(group(&r, "rib").outcome, GroupOutcome::Sized { .. } | GroupOutcome::NotSized { .. }));
}

/// Without an ultimate combination there is nothing to size with: a clear refusal.
#[test]
fn sizing_needs_an_ultimate_combination() {
    let mut d = Design::demo();
    d.traffic.combinations.retain(|c| c.permanent_unfavourable <= 1.0);
    let valid = ValidDesign::new(&d).expect("valid");
    let traffic = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("report");
    let e = size_design(&valid, &traffic).expect_err("refused").to_string();
    assert!(e.contains("no ultimate combination"), "{e}");
}

/// The rib's in-plane buckling length against the coefficients it is built from: a
/// two-hinged parabolic rib at rise / span 0.2 has q_cr = 45.4 EI / L^3 (Timoshenko and
/// Gere, arch tables, from memory), so N_cr at the quarter point = 45.4 / (8 x 0.2) x
/// sqrt(1 + 0.4^2) EI / L^2 = 30.56 EI / L^2 and l = pi L / sqrt(30.56) = 0.5683 L.
#[test]
fn the_arch_buckling_length_follows_its_coefficients() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    let valid = ValidDesign::new(&d).expect("valid");
    let form = valid.form();
    // set the rise to exactly 0.2 of the span
    d.set_rise(0.2 * form.span);
    let valid = ValidDesign::new(&d).expect("valid");
    let b = arch_buckling(&valid);
    assert!((b.rise / b.span - 0.2).abs() < 1e-9);
    assert!((b.coefficient - 45.4).abs() < 1e-9);
    let want = std::f64::consts::PI * b.span / (45.4 / 1.6 * (1.0_f64 + 0.16).sqrt()).sqrt();
    assert!((b.length - want).abs() < 1e-9 * want, "{} against {want}", b.length);
    assert!((b.length / b.span - 0.5683).abs() < 5e-4);
    // beta near 1 for a two-hinged rib (EN 1993-2 Annex D.3 gives about 1.0 to 1.1 at
    // this rise, from memory)
    assert!((1.0..1.1).contains(&b.beta), "{}", b.beta);
}

/// A design without bracing or approach piers has no members in those groups: they say
/// so and weigh nothing.
#[test]
fn groups_without_members_say_so() {
    let mut d = Design::demo();
    d.bracing = springline_statics::arch::design::Bracing::None;
    d.approach_piers_left = 0;
    d.approach_piers_right = 0;
    let (_, _, r) = report_of(&d);
    for name in ["bracing", "piers"] {
        let g = group(&r, name);
        assert_eq!(g.outcome, GroupOutcome::NoMembers, "{name}");
        assert_eq!(g.members, 0);
        let line = r.quantities.lines.iter().find(|l| l.item == name).expect("a line");
        assert_eq!((line.length, line.mass), (0.0, 0.0), "{name}");
    }
    assert!(matches!(group(&r, "rib").outcome, GroupOutcome::Sized { .. }));
}

/// The deck's span moments are checked, not only its end moments: an approach span
/// (simply supported, released at both ends) has no end moment, but at mid-length the
/// dead load alone gives w L^2 / 8 per rib line (any statics text), w = (6.25 + 2.4) x
/// 11 + 78.5 x 0.050 x 2 = 103.0 kN/m over the two ribs; its traffic adds to that, and the
/// sizing takes the envelope's design value.
#[test]
fn approach_spans_are_checked_at_mid_length() {
    let d = Design::demo();
    let (valid, traffic, r) = report_of(&d);
    let generated = springline_statics::frame_model(&valid);
    let k = generated.model.members.iter().position(|m| m.name == "approach R1").expect("member");
    let m = &generated.model.members[k];
    let (a, b) = (&generated.model.nodes[m.start], &generated.model.nodes[m.end]);
    let span = (b.x - a.x).hypot(b.y - a.y);
    let w = d.deck_line_load() / d.deck.ribs as f64;
    assert!((w - 51.5).abs() < 0.01, "{w}");
    let line = traffic.line("approach R1/m-mid").expect("a mid-length line");
    let hand = w * span * span / 8.0;
    assert!((line.permanent - hand).abs() < 1e-6 * hand, "{} against {hand}", line.permanent);
    assert!(line.traffic_max.value > 0.0);
    assert!(traffic.line("approach R1/m-start").is_none(), "released ends carry no moment line");
    let member = r.sizing.members.iter().find(|x| x.member == "approach R1").expect("sized");
    let largest = line.design.iter().map(|x| x.max.abs().max(x.min.abs())).fold(0.0, f64::max);
    let ultimate_largest = line
        .design
        .iter()
        .filter(|x| x.combination.starts_with("ULS"))
        .map(|x| x.max.abs().max(x.min.abs()))
        .fold(0.0, f64::max);
    assert!(member.demand.moment >= ultimate_largest - 1e-9 && member.demand.moment <= largest + 1e-9);
    assert!(member.demand.moment > 1.35 * hand, "{}", member.demand.moment);
}

/// A flat arch below the table (rise / span 0.07) keeps the beta of rise / span 0.1
/// rather than the coefficient (which falls away for flat arches): its length is that
/// beta times its own half length. At 0.1, two-hinged: q_cr = 28.5 EI / L^3, N_cr =
/// 28.5 / 0.8 x sqrt(1.04) EI / L^2 = 36.33 EI / L^2, l = pi L / 6.027 = 0.5212 L, and the
/// parabola's half length is 0.5127 L, so beta = 1.017.
#[test]
fn a_flat_arch_holds_beta_at_the_tables_end() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    let valid = ValidDesign::new(&d).expect("valid");
    let span = valid.form().span;
    d.set_rise(0.07 * span);
    let valid = ValidDesign::new(&d).expect("a flat arch validates, with a warning");
    let b = arch_buckling(&valid);
    assert!((b.rise / b.span - 0.07).abs() < 1e-9);
    assert!((b.beta - 1.017).abs() < 2e-3, "{}", b.beta);
    assert!((b.length - b.beta * b.half_length).abs() < 1e-9);
    assert!(b.basis.contains("held at the table's end"), "{}", b.basis);
}

/// The massing loop on the demo settles: the sized rib is heavier than the typed one, its
/// weight raises the thrust, the rib grows once more and then stays; the settled
/// design's own sizing adopts exactly its sections. Capped at one pass it stops and says
/// why.
#[test]
fn the_massing_loop_settles_on_the_demo_and_stops_at_its_cap() {
    use springline_statics::arch::massing::massing_loop;
    let d = Design::demo();
    let m = massing_loop(&d, 12).expect("loops");
    assert!(m.converged, "{}", m.last_change);
    assert!((2..=6).contains(&m.passes), "{} passes", m.passes);
    assert_eq!(m.history.len(), m.passes);
    assert_eq!(m.history.last().map(|h| h.changed.as_str()), Some("nothing"));
    // the weight of the sized sections raises the form thrust pass by pass
    assert!(m.history[1].form_thrust > m.history[0].form_thrust);
    // settled: sizing the settled design adopts its own sections
    let (_, _, again) = report_of(&m.design);
    assert_eq!(adopt_sizes(&m.design, &again.sizing).groups, m.design.groups);
    // one pass only: not settled, and the message says so
    let capped = massing_loop(&d, 1).expect("one pass");
    assert!(!capped.converged);
    assert_eq!(capped.passes, 1);
    assert!(capped.last_change.contains("not settled after 1 passes (the cap)"), "{}", capped.last_change);
}
