//! One test per fixed bug; each doc comment says what broke.

use springline_statics::arch::design::{Crown, RibSystem};
use springline_statics::error::Location;
use springline_statics::{
    analyze, frame, rib_chain, solve, truss, validate, validate_design, Design, Dof, LoadCase, Member, Model,
    NodalLoad, PrescribedDisplacement, StaticsError, Support,
};

/// A two-hinged rib with its crown exactly at deck level and a shortest post of 0 m passed
/// validation (so its link opened) but generated a zero-length crown post, and analysis
/// failed with a message about a member the user never made.
#[test]
fn crown_at_deck_level_with_zero_minimum_post_shares_the_node() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    d.crown = Crown::Level { level: d.deck.level };
    d.min_post_length = 0.0;
    validate_design(&d).expect("valid");
    let a = analyze(&d).expect("analyses: rib and deck share the crown node");
    assert!(a.form.rib[a.form.crown_node].shared_with_deck);
    // and just under the deck (1e-9 m) as well
    d.crown = Crown::Level { level: d.deck.level - 1e-9 };
    analyze(&d).expect("a post of a nanometre is no post either");
}

/// A prescribed rotation at a node where every member is pinned was silently dropped.
#[test]
fn prescribed_rotation_at_a_pin_is_refused() {
    let mut m = Model::default();
    for (x, y) in [(0.0, 0.0), (4.0, 3.0), (8.0, 0.0)] {
        m.add_node("", x, y);
    }
    for (a, b) in [(0, 1), (1, 2), (0, 2)] {
        m.add_member(truss("", "", a, b, 2.1e8, 0.01));
    }
    m.supports = vec![Support::fixed(0), Support::roller_along_x(2)];
    m.load_cases = vec![LoadCase {
        name: "turn".into(),
        prescribed: vec![PrescribedDisplacement { node: 0, dof: Dof::Rz, value: 0.05 }],
        ..Default::default()
    }];
    match solve(&m) {
        Err(StaticsError::Invalid(p)) => {
            assert!(p.iter().any(|p| p.message.contains("no rotation")), "{p:?}")
        }
        other => panic!("expected a refusal, got {:?}", other.map(|_| ())),
    }
}

/// `Model::member_length` indexed the member list directly and panicked on a missing
/// member although its doc promises 0.
#[test]
fn length_of_a_missing_member_is_zero() {
    let mut m = Model::default();
    m.add_node("", 0.0, 0.0);
    m.add_node("", 3.0, 4.0);
    m.add_member(truss("", "", 0, 1, 2.1e8, 0.01));
    m.add_member(truss("", "", 0, 9, 2.1e8, 0.01));
    assert_eq!(m.member_length(0), 5.0); // 3-4-5 triangle
    assert_eq!(m.member_length(1), 0.0); // its end node is missing
    assert_eq!(m.member_length(2), 0.0); // no such member
    assert_eq!(m.member_length(usize::MAX), 0.0);
}

/// A cantilever tip on a horizontal bar from (0, 0) to (`length`, 0) with a unit load,
/// fixed at the left: the members below replace its section.
fn cantilever(member: Member, length: f64) -> Model {
    let mut m = Model::default();
    m.add_node("root", 0.0, 0.0);
    m.add_node("tip", length, 0.0);
    m.add_member(member);
    m.supports = vec![Support::fixed(0)];
    m.load_cases = vec![LoadCase {
        name: "p".into(),
        nodal: vec![NodalLoad { node: 1, fx: 1.0, fy: -1.0, mz: 0.0 }],
        ..Default::default()
    }];
    m
}

/// The `OutOfRange` error of `solve`, or a panic naming what came instead.
fn out_of_range(model: &Model) -> (Location, String) {
    match solve(model) {
        Err(StaticsError::OutOfRange { location, message }) => (location, message),
        other => panic!("expected OutOfRange, got {:?}", other.map(|_| ())),
    }
}

/// E = 1e300 and A = 1e300 overflow E A to infinity; the zero pivot that followed was
/// reported as a mechanism ("node ... can move without resistance") instead of a number
/// out of range. Now validation names the member and says to check the units; E A
/// underflowing to zero is caught the same way.
#[test]
fn overflowing_axial_stiffness_is_out_of_range_not_a_mechanism() {
    let model = cantilever(frame("girder", "", 0, 1, 1e300, 1e300, 1.0), 4.0);
    let (location, message) = out_of_range(&model);
    assert_eq!(location, Location::Member { index: 0, name: "girder".into() });
    assert!(message.starts_with("E A = 1e300 kN/m2 x 1e300 m2 exceeds"), "{message}");
    assert!(message.contains("check the units"), "{message}");
    // validate alone says the same
    assert!(matches!(validate(&model), Err(StaticsError::OutOfRange { .. })));
    // and a product below the smallest number
    let (_, message) = out_of_range(&cantilever(truss("bar", "", 0, 1, 1e-300, 1e-300), 4.0));
    assert!(message.contains("falls below"), "{message}");
}

/// E I overflowing, and 12 E I / L^3 overflowing with E I finite (a very short stiff
/// member), were also reported as mechanisms.
#[test]
fn overflowing_bending_stiffness_terms_are_out_of_range() {
    let (location, message) = out_of_range(&cantilever(frame("stub", "", 0, 1, 1e300, 1.0, 1e10), 4.0));
    assert_eq!(location, Location::Member { index: 0, name: "stub".into() });
    assert!(message.starts_with("E I = 1e300 kN/m2 x 1e10 m4 exceeds"), "{message}");
    // E A = 1e290, E A / L = 1e293 and E I = 1e300 are finite; 12 E I / L^3 = 1.2e309 is not
    let (location, message) = out_of_range(&cantilever(frame("", "", 0, 1, 1e300, 1e-10, 1.0), 1e-3));
    assert_eq!(location, Location::Member { index: 0, name: "#0".into() });
    assert!(message.contains("L = 1e-3 m"), "{message}");
}

/// Two bars of E A / L = 1e308 kN/m each are in range, but at the node where they meet
/// their stiffness adds up to infinity: that was a mechanism too. Now the node is named.
#[test]
fn stiffness_adding_up_beyond_range_at_a_node_is_out_of_range() {
    let mut m = Model::default();
    for x in [0.0, 1.0, 2.0] {
        m.add_node("", x, 0.0);
    }
    m.nodes[1].name = "middle".into();
    m.add_member(truss("", "", 0, 1, 1e308, 1.0));
    m.add_member(truss("", "", 1, 2, 1e308, 1.0));
    m.supports = vec![Support::pinned(0), Support::pinned(2)];
    m.load_cases = vec![LoadCase {
        name: "p".into(),
        nodal: vec![NodalLoad { node: 1, fx: 1.0, fy: 0.0, mz: 0.0 }],
        ..Default::default()
    }];
    validate(&m).expect("each member is in range");
    let (location, message) = out_of_range(&m);
    assert_eq!(location, Location::Node { index: 1, name: "middle".into() });
    assert!(message.contains("adds up beyond the range"), "{message}");
}

/// `rib_chain` looked up the x of every rib end node without checking it exists, so a
/// rib member naming a missing node panicked (index out of bounds). Now it is an error at
/// that member; so is a rib member index that names no member.
#[test]
fn rib_member_naming_a_missing_node_is_an_error() {
    let mut m = Model::default();
    m.add_node("", 0.0, 0.0);
    m.add_node("", 5.0, 2.0);
    m.add_member(frame("r0", "", 0, 1, 2.1e8, 0.1, 0.01));
    m.add_member(frame("r1", "", 1, 7, 2.1e8, 0.1, 0.01));
    match rib_chain(&m, &[0, 1]) {
        Err(StaticsError::Invalid(p)) => {
            assert_eq!(p.len(), 1);
            assert_eq!(p[0].location, Location::Member { index: 1, name: "r1".into() });
            assert!(p[0].message.contains("end node 7 does not exist"), "{}", p[0].message);
        }
        other => panic!("expected an error, got {other:?}"),
    }
    assert!(matches!(rib_chain(&m, &[0, 5]), Err(StaticsError::Invalid(_))));
    assert!(matches!(rib_chain(&m, &[0, 0]), Err(StaticsError::Invalid(_))));
    assert!(matches!(rib_chain(&m, &[]), Err(StaticsError::Invalid(_))));
    // the valid member alone is a chain of one, run forwards from the left end
    assert_eq!(rib_chain(&m, &[0]), Ok(vec![(0, true)]));
}

/// An axle group whose spacings are each finite but sum beyond floating point (1e308 +
/// 1e308) passed the envelope's checks, placed an axle at NaN and indexed an influence
/// line before its start: a panic. Now such an axle reads a zero ordinate.
#[test]
fn axle_spacings_that_overflow_do_not_panic_the_envelope() {
    use springline_statics::frame::envelope::{envelope, AxleGroup, Traffic};
    let x = [0.0, 5.0, 10.0];
    let eta = [0.0, 1.0, 0.0];
    let axles = AxleGroup {
        loads: vec![100.0, 100.0, 100.0],
        spacings: vec![1e308, 1e308],
        variable: None,
        neglect_relieving: false,
    };
    let traffic = Traffic { uniform: 1.0, axles: Some(axles) };
    if let Ok(e) = envelope(&x, &eta, &traffic) {
        let text = format!("{e:?}");
        assert!(!text.contains("NaN"), "{text}");
    }
}

/// A load path through a node whose y is not a number panicked in `f64::clamp` (NaN
/// bound) while the unit load cases were built, before validation could refuse it.
#[test]
fn an_influence_path_through_a_nan_node_is_refused_not_a_panic() {
    use springline_statics::frame::influence::{influence_lines, Stepping};
    let mut m = Model::default();
    let a = m.add_node("A", 0.0, 0.0);
    let b = m.add_node("B", 4.0, f64::NAN);
    let c = m.add_node("C", 10.0, 0.0);
    m.add_member(frame("AB", "deck", a, b, 2.0e8, 0.01, 1.0e-3));
    m.add_member(frame("BC", "deck", b, c, 2.0e8, 0.01, 1.0e-3));
    m.supports = vec![Support::pinned(a), Support::roller_along_x(c)];
    let refused = influence_lines(&m, &[a, b, c], Stepping::Every(0.5)).expect_err("a NaN node is refused");
    assert!(refused.to_string().contains("B"), "{refused}");
}
