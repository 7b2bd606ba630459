//! The key numbers of an analysed design, in one place: what `springline analyze` prints
//! first, what the app's results table shows and what the link fixtures store, so the
//! three cannot drift apart.
//!
//! # Words for thrust (used the same way everywhere)
//!
//! - **form thrust** H_form: the horizontal thrust of the funicular found for the dead
//!   load (form finding); the pole distance of the dead-load force diagram. kN.
//! - **springing thrust** H: the horizontal force a springing takes from the rib in one
//!   load case of the frame model, per side (left, right); positive when the rib pushes
//!   outward on its abutment (compression). kN.
//! - **thrust range**: the least and greatest springing thrust over every load case and
//!   side reported. kN. (A traffic envelope will widen it.)
//!
//! Units kN, m, kNm, degrees (angles only here, at the edge of the engine).

use crate::arch::actions::is_action_case;
use crate::arch::analysis::{ModelResult, RibMoments, TrussResult};
use crate::arch::design::{Design, RibSystem};
use crate::arch::form::{ArchReaction, Basis, Form};
use crate::arch::generate::{DeckHold, MemberRole, Restraint, DEAD};
use crate::frame::determinacy::Determinacy;
use crate::tolerance::ZERO_FORCE;
use serde::Serialize;

/// The force a springing takes from the rib in one load case.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SpringingForce {
    /// Springing thrust H: horizontal, kN, positive when the rib pushes outward.
    pub thrust: f64,
    /// Vertical, kN, positive when the rib pushes down.
    pub vertical: f64,
    /// Angle of the resultant below the horizontal, degrees (atan2(vertical, thrust)).
    pub angle_deg: f64,
    /// Moment the rib applies to its abutment, kNm, anticlockwise positive (0 at a
    /// hinged springing; a fixed rib's springing moment).
    pub moment: f64,
}

impl SpringingForce {
    /// From the support reaction on the rib (fx, fy in kN, mz in kNm; x right, y up,
    /// anticlockwise positive) at the left (`left` true) or right springing: the rib
    /// pushes on the abutment with the opposite force, so the outward horizontal push is
    /// fx at the left and -fx at the right, and the moment on the abutment is -mz.
    pub fn from_reaction(fx: f64, fy: f64, mz: f64, left: bool) -> SpringingForce {
        let thrust = if left { fx } else { -fx };
        SpringingForce { thrust, vertical: fy, angle_deg: fy.atan2(thrust).to_degrees(), moment: -mz }
    }
}

/// Relative difference above which the form thrust, the springing thrusts and a pole
/// distance count as different, so that a screen explains them (0.1 %: four shown
/// figures tell them apart).
pub const THRUSTS_DIFFER: f64 = 1e-3;

/// The springing forces of one load case of the frame model, and what the other
/// supports (deck seats, approach piers) take in it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CaseSpringings {
    /// Load case name.
    pub case: String,
    /// Left springing.
    pub left: SpringingForce,
    /// Right springing.
    pub right: SpringingForce,
    /// Horizontal reactions of the deck seats and approach piers together (every support
    /// but the springings), kN, positive in +x (to the right): the sign of the left
    /// springing's H, which is its reaction's x component. Horizontal equilibrium of the
    /// frame model: `left.thrust - right.thrust + seats_piers_horizontal` = the sum of
    /// the horizontal loads (0 under gravity loads). Below the solver's zero it is 0.
    pub seats_piers_horizontal: f64,
    /// Vertical reactions of the deck seats and approach piers together, kN, positive up
    /// (the load they carry; the sign of the springings' V). Below the solver's zero it
    /// is 0.
    pub seats_piers_vertical: f64,
    /// Relative spread of the form thrust and this case's two springing thrusts:
    /// (greatest - least) / greatest magnitude; 0 when all are 0. Above
    /// [`THRUSTS_DIFFER`] they differ on screen.
    pub thrust_spread: f64,
}

/// The largest axial force of the members of one role, frame model, dead load.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct RoleForce {
    /// The members' role.
    pub role: MemberRole,
    /// The axial force of largest magnitude, kN (tension positive).
    pub n: f64,
}

/// The key numbers of an analysed design.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Summary {
    /// Name of the design.
    pub design: String,
    /// Span between the springings, m.
    pub span: f64,
    /// Rise above the springing chord at the crown, m.
    pub rise: f64,
    /// Rise over span.
    pub rise_over_span: f64,
    /// Load basis of the form.
    pub form_basis: Basis,
    /// Funicular constructions made in form finding.
    pub form_iterations: usize,
    /// Largest change of a rib node level in the last iteration, m.
    pub form_final_change: f64,
    /// Form thrust H_form, kN.
    pub form_thrust: f64,
    /// Reactions of the form at the left and right springing, kN.
    pub form_reactions: [ArchReaction; 2],
    /// Springing forces of the frame model, per load case ("dead" first).
    pub springings: Vec<CaseSpringings>,
    /// Least and greatest springing thrust over the cases and sides, kN.
    pub thrust_range: [f64; 2],
    /// Largest axial force per member role, frame model, dead load (roles the model has).
    pub largest_axial: Vec<RoleForce>,
    /// Largest |M| along the rib of the frame model, dead load, kNm.
    pub residual_rib_moment: f64,
    /// Who holds the deck longitudinally.
    pub deck_held_by: DeckHold,
    /// Determinacy of the truss idealisation (`None` when unbraced).
    pub truss: Option<Determinacy>,
    /// Equilibrium residual of the frame model's dead load, relative to the largest force.
    pub equilibrium: f64,
    /// Frame model support reactions under dead load: (node, fx kN, fy kN, mz kNm).
    pub frame_reactions: Vec<(usize, f64, f64, f64)>,
    /// The rib is fixed at its springings (it has springing moments to show).
    pub fixed_rib: bool,
}

/// (greatest - least) / greatest magnitude of `values`; 0 when all are 0 or there are none.
fn relative_spread(values: &[f64]) -> f64 {
    let largest = values.iter().fold(0.0f64, |m, v| m.max(v.abs()));
    if largest == 0.0 {
        return 0.0;
    }
    let hi = values.iter().fold(f64::NEG_INFINITY, |m, v| m.max(*v));
    let lo = values.iter().fold(f64::INFINITY, |m, v| m.min(*v));
    (hi - lo) / largest
}

impl Summary {
    /// The summary of an analysis's parts (see `analysis::analyze_valid`).
    pub fn new(
        design: &Design,
        form: &Form,
        restraint: &Restraint,
        frame: &ModelResult,
        truss: Option<&TrussResult>,
        rib_moments: &RibMoments,
    ) -> Summary {
        let [left, right] = frame.map.springings;
        let springings: Vec<CaseSpringings> = frame
            .solution
            .cases
            .iter()
            .filter_map(|c| {
                let (l, r) = (c.reaction(left)?, c.reaction(right)?);
                let (l, r) = (
                    SpringingForce::from_reaction(l.fx, l.fy, l.mz, true),
                    SpringingForce::from_reaction(r.fx, r.fy, r.mz, false),
                );
                // the deck seats and approach piers: every other support
                let others = c.reactions.iter().filter(|x| x.node != left && x.node != right);
                let (fx, fy) = others.fold((0.0, 0.0), |(x, y), q| (x + q.fx, y + q.fy));
                let zero = |v: f64| if v.abs() <= ZERO_FORCE * c.equilibrium.reference { 0.0 } else { v };
                Some(CaseSpringings {
                    case: c.name.clone(),
                    left: l,
                    right: r,
                    seats_piers_horizontal: zero(fx),
                    seats_piers_vertical: zero(fy),
                    thrust_spread: relative_spread(&[form.thrust, l.thrust, r.thrust]),
                })
            })
            .collect();
        // an action alone (temperature, braking, ...) is no thrust the arch carries: the
        // range is over the cases with the dead load
        let thrusts = springings
            .iter()
            .filter(|s| !is_action_case(&s.case))
            .flat_map(|s| [s.left.thrust, s.right.thrust]);
        let thrust_range =
            thrusts.fold([f64::INFINITY, f64::NEG_INFINITY], |[lo, hi], h| [lo.min(h), hi.max(h)]);
        let dead = frame.solution.case(DEAD).or(frame.solution.cases.first());
        // forces below the solver's zero (a fraction of the largest force of the case) are
        // rounding, shown as 0 rather than as 3.6e-15
        let largest = dead.map_or(0.0, |c| c.equilibrium.reference);
        let clean = |n: f64| if n.abs() <= ZERO_FORCE * largest { 0.0 } else { n };
        let largest_axial = [MemberRole::Rib, MemberRole::Post, MemberRole::Bracing, MemberRole::Deck]
            .into_iter()
            .filter_map(|role| {
                let case = dead?;
                let n = frame
                    .map
                    .members_with(role)
                    .filter_map(|k| case.members.get(k))
                    .flat_map(|m| [m.start.n, m.end.n])
                    .max_by(|x, y| x.abs().total_cmp(&y.abs()))?;
                Some(RoleForce { role, n: clean(n) })
            })
            .collect();
        Summary {
            design: design.name.clone(),
            span: form.span,
            rise: form.rise,
            rise_over_span: form.rise / form.span,
            form_basis: form.basis,
            form_iterations: form.iterations,
            form_final_change: form.final_change,
            form_thrust: form.thrust,
            form_reactions: [form.reaction_left, form.reaction_right],
            springings,
            thrust_range,
            largest_axial,
            residual_rib_moment: rib_moments.max_abs,
            deck_held_by: restraint.held_by,
            truss: truss.map(|t| t.determinacy.determinacy.clone()),
            equilibrium: dead.map_or(f64::NAN, |c| c.equilibrium.relative),
            frame_reactions: dead
                .map(|c| c.reactions.iter().map(|r| (r.node, r.fx, r.fy, r.mz)).collect())
                .unwrap_or_default(),
            fixed_rib: design.rib_system == RibSystem::Fixed,
        }
    }

    /// The largest axial force of the members of `role`, kN, if the frame model has any.
    pub fn largest_axial(&self, role: MemberRole) -> Option<f64> {
        self.largest_axial.iter().find(|r| r.role == role).map(|r| r.n)
    }

    /// The springing forces of load case `case`.
    pub fn springings_of(&self, case: &str) -> Option<&CaseSpringings> {
        self.springings.iter().find(|s| s.case == case)
    }

    /// Whether the form thrust, the springing thrusts of load case `case` and, when
    /// given, a pole distance `pole` (kN; the bare rib's force diagram) differ by more
    /// than [`THRUSTS_DIFFER`] relative to the largest of them, so a screen should say
    /// why. `false` for a case the summary does not have.
    pub fn thrusts_differ(&self, case: &str, pole: Option<f64>) -> bool {
        self.springings_of(case).is_some_and(|s| {
            let mut values = vec![self.form_thrust, s.left.thrust, s.right.thrust];
            values.extend(pole);
            relative_spread(&values) > THRUSTS_DIFFER
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::analyze;

    #[test]
    fn springing_force_points_outward_and_down_for_an_arch() {
        // reactions on an arch in compression: left pushes right and up, right pushes
        // left and up; the rib pushes its abutments outward and down
        let l = SpringingForce::from_reaction(100.0, 100.0, 0.0, true);
        let r = SpringingForce::from_reaction(-100.0, 50.0, 30.0, false);
        assert_eq!((l.thrust, r.thrust), (100.0, 100.0));
        assert_eq!((l.moment, r.moment), (0.0, -30.0));
        assert!((l.angle_deg - 45.0).abs() < 1e-12);
        assert!((r.angle_deg - 26.565_051_177_077_99).abs() < 1e-9, "atan(0.5) in degrees");
    }

    #[test]
    fn demo_summary_agrees_with_the_analysis_it_summarises() {
        let a = analyze(&Design::demo()).expect("demo");
        let s = &a.summary;
        // three-hinged and determinate: the frame's dead-load springing thrust is the
        // form thrust (the frame carries the same loads as the funicular up to the deck's
        // member loads, which a three-hinged rib cannot redistribute)
        let dead = s.springings_of("dead").expect("dead case");
        assert!((dead.left.thrust - s.form_thrust).abs() < 1e-6 * s.form_thrust, "{dead:?}");
        assert!(s.thrust_range[0] <= dead.left.thrust && dead.left.thrust <= s.thrust_range[1]);
        assert_eq!(s.springings.len(), 3);
        assert!(s.largest_axial(MemberRole::Rib).is_some_and(|n| n < 0.0), "rib in compression");
        assert!(s.largest_axial(MemberRole::Post).is_some_and(|n| n < 0.0), "posts in compression");
        assert_eq!(s.truss, Some(Determinacy::Determinate));
        assert!(s.equilibrium < 1e-9);
    }

    /// Horizontal equilibrium of the frame model (a statics law, any textbook): under
    /// gravity loads the springings' and the seats' and piers' horizontal reactions sum
    /// to 0, i.e. H_left - H_right + seats/piers = 0, in every case; and a two-hinged rib
    /// with crossed bracing makes the thrusts differ where the three-hinged demo's dead
    /// case does not.
    #[test]
    fn seats_and_piers_close_the_horizontal_balance_and_the_thrusts_differ_where_they_should() {
        let a = analyze(&Design::demo()).expect("demo");
        let s = &a.summary;
        for c in &s.springings {
            let reference = a.frame.solution.case(&c.case).expect("solved").equilibrium.reference;
            let sum = c.left.thrust - c.right.thrust + c.seats_piers_horizontal;
            assert!(sum.abs() <= 1e-9 * reference, "{}: {sum} of {reference}", c.case);
            // the same sum read straight from the solution's reactions
            let solved = a.frame.solution.case(&c.case).expect("solved");
            let all_fx: f64 = solved.reactions.iter().map(|r| r.fx).sum();
            assert!(all_fx.abs() <= 1e-9 * reference, "{}: {all_fx}", c.case);
        }
        // three-hinged demo, dead load: springing thrust = form thrust (see above)
        let dead = s.springings_of("dead").expect("dead");
        assert!(dead.thrust_spread < 1e-6, "{}", dead.thrust_spread);
        assert!(!s.thrusts_differ("dead", None));
        assert!(!s.fixed_rib);
        // a pole distance 1 % away from the rest makes them differ
        assert!(s.thrusts_differ("dead", Some(1.01 * s.form_thrust)));
        assert!(!s.thrusts_differ("no such case", Some(0.0)));

        let mut d = Design::demo();
        d.rib_system = RibSystem::TwoHinged;
        d.bracing = crate::arch::design::Bracing::Crossed;
        let a = analyze(&d).expect("two-hinged, crossed");
        let dead = a.summary.springings_of("dead").expect("dead");
        assert!(dead.thrust_spread > THRUSTS_DIFFER, "{dead:?}");
        assert!(a.summary.thrusts_differ("dead", None));
        // the deck seats take part of the thrust here: the balance holds with them
        let reference = a.frame.solution.cases[0].equilibrium.reference;
        assert!(dead.seats_piers_horizontal.abs() > 1.0, "{dead:?}");
        let sum = dead.left.thrust - dead.right.thrust + dead.seats_piers_horizontal;
        assert!(sum.abs() <= 1e-9 * reference, "{sum}");
        // the seats and piers carry the approach spans' and deck ends' load: upward
        assert!(dead.seats_piers_vertical > 0.0, "{dead:?}");
    }

    #[test]
    fn a_fixed_rib_reports_its_springing_moments_and_rounding_shows_as_zero() {
        let mut d = Design::demo();
        d.rib_system = crate::arch::design::RibSystem::Fixed;
        let a = analyze(&d).expect("fixed");
        assert!(a.summary.fixed_rib);
        let dead = a.summary.springings_of("dead").expect("dead");
        let [left, right] = a.frame.map.springings;
        let case = &a.frame.solution.cases[0];
        // the moment on the abutment is the reaction moment on the rib turned round
        assert_eq!(dead.left.moment, -case.reaction(left).expect("left").mz);
        assert_eq!(dead.right.moment, -case.reaction(right).expect("right").mz);
        assert!(dead.left.moment.abs() > 1.0, "a fixed rib carries moment into its abutment");
        // hinged springings take none
        let demo = analyze(&Design::demo()).expect("demo");
        let hinged = demo.summary.springings_of("dead").expect("dead");
        assert_eq!((hinged.left.moment, hinged.right.moment), (0.0, 0.0));
        // no largest force is left as rounding noise: each is 0 or above the solver's zero
        let reference = demo.frame.solution.cases[0].equilibrium.reference;
        for r in &demo.summary.largest_axial {
            assert!(r.n == 0.0 || r.n.abs() > ZERO_FORCE * reference, "{r:?}");
        }
    }
}
