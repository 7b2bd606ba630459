//! From a design to an analysed deck arch: validation, form finding, the generated models
//! and their solutions for the dead load and the standard extra cases
//! (`cases::standard_cases`), and per load case the force diagram of the truss
//! idealisation, the pole construction of the rib and the thrust line of the frame
//! model's rib, in one serialisable result.
//!
//! Results are for concept design only; local codes and a licensed engineer govern.

use crate::arch::cases::{add_cases, standard_cases};
use crate::arch::design::{Design, RibSystem, Warning};
use crate::arch::form::{checked_form, Form};
use crate::arch::generate::{bare_rib_model, frame_model, restraint, truss_model, Restraint, DEAD};
use crate::error::StaticsError;
use crate::frame::determinacy::{truss_determinacy, Determinacy, DeterminacyReport};
use crate::frame::model::Model;
use crate::frame::solver::{solve, Solution};
use crate::graphic::funicular::{rib_funicular, RibFunicular};
use crate::graphic::reciprocal::{force_diagram, ForceDiagram};
use crate::graphic::thrust_line::{rib_chain, thrust_line, ThrustLine};
use serde::Serialize;

/// Units of every number in an `Analysis`.
pub const UNITS: &str = "SI: lengths m, forces kN, moments kNm, loads kN/m and kN/m2, E kN/m2, areas m2, \
second moments of area m4, unit weights kN/m3, rotations rad";
/// Sign conventions of every number in an `Analysis`.
pub const SIGN_CONVENTION: &str = "axes x right, y up; loads and reactions as force components (gravity \
negative); axial force N tension positive, compression negative; bending moment M positive when it puts \
the right-hand fibre (looking from a member's start node to its end node) in tension, i.e. sagging for \
rib and deck members, which run left to right; form-finding loads on rib nodes are positive downward; \
thrust H is the horizontal compression of the rib, positive";
/// The caution shown with every result.
pub const CAUTION: &str = "concept-design results; local codes and a licensed engineer govern";

/// One generated model with its solutions.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModelResult {
    /// Which model this is ("frame model", "truss idealisation", "bare rib").
    pub name: String,
    /// The generated model (its title says which model it is).
    pub model: Model,
    /// Solution of every load case of `model`: "dead" first, then the standard extra
    /// cases in the order of `Analysis::load_cases`.
    pub solution: Solution,
    /// Notes for the screen (restraint, drop-in, what is left out).
    pub notes: Vec<String>,
}

/// The truss idealisation with its degree of indeterminacy.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TrussResult {
    /// "truss idealisation".
    pub name: String,
    /// The generated model.
    pub model: Model,
    /// Degree of static indeterminacy from the rank of the equilibrium matrix.
    pub determinacy: DeterminacyReport,
    /// The determinacy in words.
    pub determinacy_text: String,
    /// Solution of every load case, "dead" first (`None` when the truss is a mechanism).
    pub solution: Option<Solution>,
    /// Largest |N| of a bracing diagonal over the largest |N| of any member under dead
    /// load (0 on the funicular of a determinate layout).
    pub bracing_ratio: Option<f64>,
    /// Notes for the screen.
    pub notes: Vec<String>,
}

/// Bending moment of the rib at one rib node, frame model, dead load.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct RibMoment {
    /// Position, m.
    pub x: f64,
    /// Position, m.
    pub y: f64,
    /// Bending moment, kNm (sagging positive).
    pub m: f64,
}

/// The residual rib moments: how far the frame's rib departs from the funicular state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RibMoments {
    /// The model they come from.
    pub model: String,
    /// The load case.
    pub case: String,
    /// Moment at every rib node, left to right.
    pub nodes: Vec<RibMoment>,
    /// Largest |M| anywhere along the rib (nodes and member stations), kNm.
    pub max_abs: f64,
    /// H times the rise, kNm (the scale of the arch action).
    pub thrust_times_rise: f64,
    /// `max_abs` / `thrust_times_rise`.
    pub relative: f64,
}

/// Everything `springline analyze` reports for a design.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Analysis {
    /// Name of the design.
    pub design: String,
    /// Units of every number.
    pub units: String,
    /// Sign conventions.
    pub sign_convention: String,
    /// Caution.
    pub caution: String,
    /// Warnings from validation.
    pub warnings: Vec<Warning>,
    /// The form (basis, rib nodes, thrust, reactions, iterations, final change).
    pub form: Form,
    /// Longitudinal restraint of the deck in the frame model.
    pub restraint: Restraint,
    /// The frame model.
    pub frame: ModelResult,
    /// The truss idealisation (braced spandrels only).
    pub truss: Option<TrussResult>,
    /// The bare rib.
    pub bare_rib: ModelResult,
    /// Residual rib moments of the frame model under dead load.
    pub residual_rib_moments: RibMoments,
    /// Per load case ("dead" first, then the standard extra cases): the force diagram,
    /// the rib's pole construction and the thrust line.
    pub load_cases: Vec<CaseFigures>,
}

/// The figures of one load case, each from the model it is exact for.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CaseFigures {
    /// Load case name (the same in every model).
    pub case: String,
    /// What the case is.
    pub description: String,
    /// Reciprocal figure of the truss idealisation (braced designs; `None` otherwise or
    /// when it cannot be drawn, with the reason in `notes`).
    pub force_diagram: Option<ForceDiagram>,
    /// Pole and funicular of the bare rib under this case's loads carried down to the rib
    /// nodes: the three-point construction for a three-hinged rib, the pole from the
    /// solved reactions otherwise.
    pub rib_funicular: Option<RibFunicular>,
    /// Thrust line of the frame model's rib (checked with the rib section depth).
    pub thrust_line: Option<ThrustLine>,
    /// Which model each figure belongs to, and why a figure is missing.
    pub notes: Vec<String>,
}

/// Validates the design, finds its form on the "panel loads" basis, generates the frame
/// model, the truss idealisation (when braced) and the bare rib, and solves each for the
/// dead load.
///
/// Errors: `Invalid` with every problem of the design; `Mechanism` if a generated frame
/// or rib model cannot stand (a bug or an extreme design: the message names the node).
pub fn analyze(design: &Design) -> Result<Analysis, StaticsError> {
    let (warnings, form) = checked_form(design)?;
    let rs = restraint(design, &form);
    let specs = standard_cases(design)?;
    let mut frame = frame_model(design, &form)?;
    add_cases(design, &form, &mut frame, &specs)?;
    let frame_solution = solve(&frame)?;
    let mut frame_notes = vec![format!("longitudinal restraint: {}", rs.description)];
    if design.rib_system == crate::arch::design::RibSystem::ThreeHinged {
        frame_notes.push(
            "three-hinged: the halves meet only at the crown rib node; the drop-in deck span over the crown \
             ties nothing and its reactions are loads on the neighbouring deck nodes"
                .into(),
        );
    }
    frame_notes.push(format!("form basis: {}", form.basis));
    let residual = rib_moments(&frame, &frame_solution, &form);
    let mut rib = bare_rib_model(design, &form)?;
    add_cases(design, &form, &mut rib, &specs)?;
    let rib_solution = solve(&rib)?;
    let truss = if design.bracing.is_braced() {
        let mut model = truss_model(design, &form)?;
        add_cases(design, &form, &mut model, &specs)?;
        let determinacy = truss_determinacy(&model)?;
        let (solution, bracing_ratio) = if matches!(determinacy.determinacy, Determinacy::Mechanism { .. }) {
            (None, None)
        } else {
            let s = solve(&model)?;
            let ratio = bracing_ratio(&model, &s);
            (Some(s), ratio)
        };
        let mut notes =
            vec!["approach spans and drop-in spans left out; their reactions are loads".to_string()];
        notes.push(match determinacy.determinacy {
            Determinacy::Determinate => {
                "determinate: on the dead-load funicular the bracing carries nothing".to_string()
            }
            Determinacy::Indeterminate { .. } => {
                "indeterminate: rib shortening sends some dead load into deck and bracing".to_string()
            }
            Determinacy::Mechanism { .. } => "a mechanism: not solved".to_string(),
        });
        Some(TrussResult {
            name: "truss idealisation".into(),
            model,
            determinacy_text: determinacy.describe(),
            determinacy,
            solution,
            bracing_ratio,
            notes,
        })
    } else {
        None
    };
    let mut descriptions = vec![(
        DEAD.to_string(),
        "dead load: deck, surfacing and self-weight (the form-finding load)".to_string(),
    )];
    descriptions.extend(specs.iter().map(|s| (s.name.clone(), s.description.clone())));
    let truss_parts = truss.as_ref().and_then(|t| t.solution.as_ref().map(|s| (&t.model, s)));
    let load_cases = descriptions
        .into_iter()
        .map(|(name, description)| {
            case_figures(
                design,
                &form,
                &name,
                description,
                &frame,
                &frame_solution,
                truss_parts,
                &rib,
                &rib_solution,
            )
        })
        .collect();
    Ok(Analysis {
        design: design.name.clone(),
        units: UNITS.into(),
        sign_convention: SIGN_CONVENTION.into(),
        caution: CAUTION.into(),
        warnings,
        form,
        restraint: rs,
        frame: ModelResult {
            name: "frame model".into(),
            model: frame,
            solution: frame_solution,
            notes: frame_notes,
        },
        truss,
        bare_rib: ModelResult {
            name: "bare rib".into(),
            model: rib,
            solution: rib_solution,
            notes: vec![
                "the rib alone, form-finding loads at its nodes (erection stage and closed-form checks)"
                    .into(),
            ],
        },
        residual_rib_moments: residual,
        load_cases,
    })
}

/// The figures of load case `name` from the solved models of an analysis.
#[allow(clippy::too_many_arguments)]
fn case_figures(
    design: &Design,
    form: &Form,
    name: &str,
    description: String,
    frame: &Model,
    frame_solution: &Solution,
    truss: Option<(&Model, &Solution)>,
    rib: &Model,
    rib_solution: &Solution,
) -> CaseFigures {
    let mut notes = Vec::new();
    let force_diagram = match truss {
        None if !design.bracing.is_braced() => {
            notes.push(
                "no force diagram: the spandrels are not braced, so there is no truss idealisation".into(),
            );
            None
        }
        None => {
            notes.push("no force diagram: the truss idealisation is a mechanism".into());
            None
        }
        Some((model, solution)) => match solution.case(name).map(|c| force_diagram(model, c)) {
            Some(Ok(fd)) => {
                notes.push(
                    "force diagram: reciprocal figure of the truss idealisation (every joint pinned), exact for \
                     that model; the frame model's rib bends, so read it with the thrust line"
                        .into(),
                );
                Some(fd)
            }
            Some(Err(e)) => {
                notes.push(format!("no force diagram: {e}"));
                None
            }
            None => None,
        },
    };
    let ends = |model: &Model| -> Option<(usize, usize)> {
        let chain = rib_chain(model, &rib_members_by_group(model)).ok()?;
        let first = chain.first()?;
        let last = chain.last()?;
        let node = |(k, fwd): (usize, bool), start: bool| {
            let m = &model.members[k];
            if fwd == start {
                m.start
            } else {
                m.end
            }
        };
        Some((node(*first, true), node(*last, false)))
    };
    let rib_funicular = match (rib_solution.case(name), ends(rib)) {
        (Some(case), Some((left, right))) => {
            let crown = if design.rib_system == RibSystem::ThreeHinged {
                rib.nodes.iter().position(|n| {
                    (n.x - form.crown.x).abs() <= 1e-9 * form.span
                        && (n.y - form.crown.y).abs() <= 1e-9 * form.span
                })
            } else {
                None
            };
            match rib_funicular(rib, case, left, right, crown) {
                Ok(f) => {
                    notes.push(if crown.is_some() {
                        "rib funicular: three-point construction through both springings and the crown hinge \
                     (statics alone), bare rib loads"
                            .into()
                    } else {
                        "rib funicular: pole from the bare rib's solved springing reactions (the rib is not \
                     three-hinged, so no three-point construction holds)"
                            .into()
                    });
                    Some(f)
                }
                Err(e) => {
                    notes.push(format!("no rib funicular: {e}"));
                    None
                }
            }
        }
        _ => None,
    };
    let thrust = match (frame_solution.case(name), rib_chain(frame, &rib_members_by_group(frame))) {
        (Some(case), Ok(chain)) => match thrust_line(frame, case, &chain, design.groups.rib.depth) {
            Ok(t) => {
                notes.push(format!(
                    "thrust line: from the forces the frame model's rib receives and its springing reactions; \
                     checked at the rib nodes with the rib depth {} m",
                    design.groups.rib.depth
                ));
                Some(t)
            }
            Err(e) => {
                notes.push(format!("no thrust line: {e}"));
                None
            }
        },
        _ => None,
    };
    CaseFigures {
        case: name.to_string(),
        description,
        force_diagram,
        rib_funicular,
        thrust_line: thrust,
        notes,
    }
}

/// Largest |N| of the "bracing" members over the largest |N| of any member, first load
/// case; `None` without bracing members or forces.
pub fn bracing_ratio(model: &Model, solution: &Solution) -> Option<f64> {
    let case = solution.cases.first()?;
    let mut largest: f64 = 0.0;
    let mut brace: Option<f64> = None;
    for mf in &case.members {
        let n = mf.start.n.abs().max(mf.end.n.abs());
        largest = largest.max(n);
        if model.members.get(mf.member).is_some_and(|m| m.group == "bracing") {
            brace = Some(brace.unwrap_or(0.0).max(n));
        }
    }
    match brace {
        Some(b) if largest > 0.0 => Some(b / largest),
        _ => None,
    }
}

/// Residual rib moments of a solved frame model: the moment at every rib node (left to
/// right, from the "rib" members, which run left to right) and the largest along the rib.
pub fn rib_moments(model: &Model, solution: &Solution, form: &Form) -> RibMoments {
    let mut nodes = Vec::new();
    let mut max_abs: f64 = 0.0;
    let case = solution.case(DEAD).or(solution.cases.first());
    if let Some(case) = case {
        let rib: Vec<usize> = (0..model.members.len()).filter(|&k| model.members[k].group == "rib").collect();
        for (n, &k) in rib.iter().enumerate() {
            let mf = &case.members[k];
            let m = &model.members[k];
            if n == 0 {
                let p = &model.nodes[m.start];
                nodes.push(RibMoment { x: p.x, y: p.y, m: mf.start.m });
            }
            let q = &model.nodes[m.end];
            nodes.push(RibMoment { x: q.x, y: q.y, m: mf.end.m });
            max_abs = max_abs.max(mf.max_abs_moment()).max(mf.start.m.abs()).max(mf.end.m.abs());
        }
    }
    let hf = form.thrust * form.rise;
    RibMoments {
        model: "frame model".into(),
        case: DEAD.into(),
        nodes,
        max_abs,
        thrust_times_rise: hf,
        relative: if hf > 0.0 { max_abs / hf } else { 0.0 },
    }
}

/// The members of group "rib": which members form the rib, for `rib_chain` (the graphic
/// layer takes them from the caller and knows no groups).
fn rib_members_by_group(model: &Model) -> Vec<usize> {
    (0..model.members.len()).filter(|&k| model.members[k].group == "rib").collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::RibSystem;

    #[test]
    fn demo_analysis_reports_every_model() {
        let a = analyze(&Design::demo()).expect("demo");
        assert_eq!(a.form.basis, "panel loads");
        assert!(a.form.iterations >= 2 && a.form.final_change <= a.form.tolerance * a.form.rise);
        let t = a.truss.as_ref().expect("braced");
        assert_eq!(t.determinacy.determinacy, Determinacy::Determinate);
        assert!(t.bracing_ratio.is_some_and(|r| r < 1e-9));
        // the frame's rib departs from the funicular (continuous deck, member loads), but
        // only a little; rib moments are reported at every rib node
        assert_eq!(a.residual_rib_moments.nodes.len(), a.form.rib.len());
        assert!(a.residual_rib_moments.relative > 0.0 && a.residual_rib_moments.relative < 0.05);
        // three hinges: zero moment at the crown hinge and the springings
        let m = &a.residual_rib_moments.nodes;
        for k in [0, a.form.crown_node, m.len() - 1] {
            assert!(m[k].m.abs() < 1e-9 * a.residual_rib_moments.thrust_times_rise);
        }
    }

    #[test]
    fn two_hinged_crown_shared_frees_both_seats() {
        let mut d = Design::demo();
        d.rib_system = RibSystem::TwoHinged;
        d.crown = crate::arch::design::Crown::Level { level: 99.5 }; // 0.5 m under the deck: shared
        let a = analyze(&d).expect("valid");
        assert!(a.form.rib[a.form.crown_node].shared_with_deck);
        assert!(!a.restraint.left_seat_fixed && !a.restraint.right_seat_fixed);
        d.crown = crate::arch::design::Crown::Level { level: 96.0 };
        let a = analyze(&d).expect("valid");
        assert!(a.restraint.left_seat_fixed && !a.restraint.right_seat_fixed);
    }
}
