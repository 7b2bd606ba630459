//! Stability and frequencies of the deck arch's frame model (`arch::stability`): the
//! dead load's alpha_cr by the iterative solver equals the dense solver's, the verdict
//! and the footbridge flag follow the stated limits, and the frequencies scale with the
//! masses as the square root of their inverse (any dynamics text: omega^2 = k / m).

use springline_statics::arch::design::Design;
use springline_statics::arch::generate::{frame_model, DEAD};
use springline_statics::arch::stability::{arch_stability, footbridge_flag, verdict};
use springline_statics::frame::stability::{EigenSolver, Stability, StabilitySettings};
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;
use springline_statics::ValidDesign;

#[test]
fn the_demo_buckles_and_vibrates_the_same_by_either_solver() {
    let valid = ValidDesign::new(&Design::demo()).expect("valid");
    let s = arch_stability(&valid, 3).expect("stability");
    assert!(s.alpha_cr.is_finite() && s.alpha_cr > 1.0, "{}", s.alpha_cr);
    assert!(s.notes.iter().any(|n| n.contains("out-of-plane")));
    assert!(s.footbridge.is_none(), "road traffic has no footbridge flag");
    let model = frame_model(&valid).model;
    let dense =
        Stability::new(&model, StabilitySettings { parts: 4, solver: EigenSolver::Dense }).expect("dense");
    let dead = model.load_cases.iter().find(|c| c.name == DEAD).expect("dead");
    let b = dense.buckling(dead, 3).expect("buckles");
    for (a, d) in s.dead.modes.iter().zip(&b.modes) {
        assert!(
            (a.load_factor - d.load_factor).abs() < 1e-6 * d.load_factor,
            "{} vs {}",
            a.load_factor,
            d.load_factor
        );
    }
    let v = dense.frequencies(dead, 3).expect("vibrates");
    for (a, d) in s.vibration.modes.iter().zip(&v.modes) {
        assert!((a.frequency - d.frequency).abs() < 1e-6 * d.frequency);
    }
    // every mass doubled (every unit weight and deck load doubled, stiffness kept):
    // frequencies fall by sqrt(2), alpha_cr halves (axial forces double)
    let mut heavy = Design::demo();
    heavy.deck.dead_load *= 2.0;
    heavy.deck.surfacing *= 2.0;
    for g in [
        &mut heavy.groups.rib,
        &mut heavy.groups.deck,
        &mut heavy.groups.posts,
        &mut heavy.groups.piers,
        &mut heavy.groups.bracing,
    ] {
        g.unit_weight *= 2.0;
    }
    let h = arch_stability(&ValidDesign::new(&heavy).expect("valid"), 3).expect("stability");
    let f0 = s.vibration.modes[0].frequency;
    assert!((h.vibration.modes[0].frequency - f0 / 2f64.sqrt()).abs() < 1e-3 * f0);
    assert!((h.alpha_cr - s.alpha_cr / 2.0).abs() < 1e-3 * s.alpha_cr, "{} vs {}", h.alpha_cr, s.alpha_cr);
}

/// The verdict's limits (EN 1993-1-1 5.2.1(3) and 5.2.2) and the footbridge flag's
/// (EN 1990 A2.4.3.2, from memory; the walking range, common practice).
#[test]
fn verdicts_and_flags_follow_their_limits() {
    assert!(verdict(12.0).contains("first-order analysis is acceptable"));
    let v = verdict(5.0);
    assert!(v.contains("1.25"), "{v}"); // 1 / (1 - 1/5)
    assert!(verdict(2.0).contains("too slender"));
    assert!(footbridge_flag(2.0).contains("walking range"));
    assert!(footbridge_flag(3.0).contains("comfort check is required"));
    assert!(footbridge_flag(6.0).contains("no comfort check needed"));
    // a footbridge crowd on the demo's deck: the flag is given, with the frequency found
    let mut d = Design::demo();
    d.traffic = TrafficDesign::preset(ModelFamily::Crowd, d.deck.width);
    let s = arch_stability(&ValidDesign::new(&d).expect("valid"), 4).expect("stability");
    let flag = s.footbridge.expect("a footbridge flag");
    let f = s.first_vertical_hz.expect("a vertical mode");
    assert!(flag.contains(&format!("{f:.2} Hz")), "{flag}");
}
