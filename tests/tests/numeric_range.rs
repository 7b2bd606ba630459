//! The whole numeric range of the demo's family: spans from a 12 m footbridge to a 400 m
//! road arch, rise/span 0.05 to 0.6, 2 to 200 panels, 1 to 8 ribs, every rib system and
//! bracing. Each sampled design is analysed, checked for stability, sized and massed:
//! every output finite, equilibrium within its bound in every case, the massing loop
//! converged or stopped with its reason, and any ill-conditioning reported as a warning.

use proptest::prelude::*;
use springline_statics::arch::design::{Bracing, RibSystem};
use springline_statics::arch::massing::massing_loop;
use springline_statics::{analyze, Design};
use springline_tests::family::family;
use springline_tests::outputs::{analysis_and_stability, assert_finite, everything};

/// Largest equilibrium residual of a solved case over its reference force: the solver's
/// own rounding is near 1e-13 on every test model (frame::solver's tests); 1e-8 leaves
/// five orders for ill-conditioned members before the check fails.
const EQUILIBRIUM_BOUND: f64 = 1e-8;

fn systems() -> impl Strategy<Value = RibSystem> {
    prop_oneof![Just(RibSystem::ThreeHinged), Just(RibSystem::TwoHinged), Just(RibSystem::Fixed)]
}

fn bracings() -> impl Strategy<Value = Bracing> {
    prop_oneof![Just(Bracing::None), Just(Bracing::Single { flipped: false }), Just(Bracing::Crossed)]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 12, ..ProptestConfig::default() })]

    /// Sampled over the range: every output finite, equilibrium within its bound (or an
    /// ill-conditioning warning), the massing loop converged or stopped with its reason.

    #[test]
    fn the_demo_family_over_the_whole_range_gives_finite_balanced_results(
        log_span in (12f64).ln()..(400f64).ln(),
        ratio in 0.05f64..0.6,
        // up to 64 panels: sizing at 200 takes about a minute in a test build (the
        // corners below take 200 panels through analysis and stability)
        log_panels in (2f64).ln()..(64f64).ln(),
        ribs in 1usize..=8,
        system in systems(),
        bracing in bracings(),
    ) {
        let panels = log_panels.exp().round() as usize;
        let d = family(log_span.exp(), ratio, panels, ribs, system, bracing);
        let what = format!("span {:.1} m, rise/span {ratio:.3}, {panels} panels, {ribs} ribs, {system:?}, {bracing:?}", log_span.exp());
        let outputs = match everything(&d) {
            Ok(outputs) => outputs,
            Err(e) => {
                // refused: only with a message a user can act on
                let message = e.to_string();
                prop_assert!(message.len() > 20, "{what}: {message}");
                return Ok(());
            }
        };
        assert_finite(&d, &outputs);
        let analysis = analyze(&d).expect("a design that validates analyses");
        let ill_conditioned = analysis.warnings.iter().any(|w| w.message.contains("ill-conditioned"));
        for case in analysis.frame.solution.cases.iter().chain(analysis.bare_rib.solution.cases.iter()) {
            let residual = case.equilibrium.relative;
            prop_assert!(residual.is_finite(), "{what}: residual {residual}");
            prop_assert!(residual < EQUILIBRIUM_BOUND || ill_conditioned, "{what}: residual {residual:e} without a warning");
        }
        let massing = massing_loop(&d, 2);
        match massing {
            Ok(report) => prop_assert!(report.converged || !report.last_change.is_empty(), "{what}: stopped without a reason"),
            Err(e) => prop_assert!(e.to_string().len() > 20, "{what}: {e}"),
        }
    }
}

/// The corners of the range, each of which must be accepted (so the property above is
/// not met by refusals): the smallest and largest span, rise/span, panels and ribs. At
/// 200 panels the analysis and stability only: sizing under traffic takes about a
/// minute there in a test build (README, Performance).
#[test]
fn the_corners_of_the_range_are_accepted_with_finite_results() {
    let corners = [
        (12.0, 0.05, 2, 1, RibSystem::ThreeHinged, Bracing::None),
        (12.0, 0.6, 200, 8, RibSystem::Fixed, Bracing::Crossed),
        (400.0, 0.05, 200, 1, RibSystem::TwoHinged, Bracing::Single { flipped: false }),
        (400.0, 0.6, 2, 8, RibSystem::ThreeHinged, Bracing::None),
        (400.0, 0.2, 64, 4, RibSystem::Fixed, Bracing::Single { flipped: false }),
        (12.0, 0.2, 8, 2, RibSystem::TwoHinged, Bracing::Crossed),
    ];
    let mut refused = Vec::new();
    for (span, ratio, panels, ribs, system, bracing) in corners {
        let d = family(span, ratio, panels, ribs, system, bracing);
        let result = if panels > 64 { analysis_and_stability(&d) } else { everything(&d) };
        match result {
            Ok(outputs) => assert_finite(&d, &outputs),
            Err(e) => refused.push(format!("{span} m, {ratio}, {panels} panels, {ribs} ribs: {e}")),
        }
    }
    assert!(refused.is_empty(), "refused:\n{}", refused.join("\n"));
}

/// Stiffnesses many orders apart are reported as ill-conditioning with their cause,
/// beside the softest section: a warning while the model still solves (equilibrium then
/// still holds to rounding, the results are finite), a refusal naming the contrast when
/// it makes the structure a mechanism to the solver.
#[test]
fn ill_conditioning_is_reported_with_its_cause() {
    let contrast = |posts_a: f64, deck_i: f64| {
        let mut d = Design::demo();
        d.groups.rib.e = 1e10;
        d.groups.rib.a = 100.0;
        d.groups.rib.i = 1e4;
        d.groups.deck.i = deck_i;
        d.groups.posts.a = posts_a;
        d.groups.bracing.a = posts_a;
        d
    };
    // rib E A 1e12 kN, posts 2.1e8 * 1e-4 = 2.1e4 kN: 4.8e7 apart, still solvable
    let d = contrast(1e-4, 1e-7);
    let analysis = analyze(&d).expect("solvable");
    let warned = analysis.warnings.iter().find(|w| w.message.contains("ill-conditioned")).expect("a warning");
    assert_eq!(warned.location.path(), "groups.posts.a", "{warned:?}");
    assert!(
        warned.message.contains("rib section's E A (1.00e12 kN) is 4.8e7 times the posts"),
        "{}",
        warned.message
    );
    let worst = analysis.frame.solution.cases.iter().map(|c| c.equilibrium.relative).fold(0.0f64, f64::max);
    assert!(worst < EQUILIBRIUM_BOUND, "{worst:e}");
    assert_finite(&d, &everything(&d).expect("accepted"));
    // posts of 1e-6 m2: the solver meets a pivot that vanished
    let refused = analyze(&contrast(1e-6, 1e-9)).expect_err("a near-mechanism");
    let message = refused.to_string();
    assert!(message.contains("ill-conditioned") && message.contains("mechanism"), "{message}");
    assert!(
        matches!(&refused, springline_statics::StaticsError::Invalid(p) if p[0].location.path() == "groups.posts.a"),
        "{refused:?}"
    );
}
