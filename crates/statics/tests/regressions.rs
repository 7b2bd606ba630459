//! One test per fixed bug; each doc comment says what broke.

use springline_statics::arch::design::{Crown, RibSystem};
use springline_statics::{
    analyze, solve, truss, validate_design, Design, Dof, LoadCase, Model, PrescribedDisplacement,
    StaticsError, Support,
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
