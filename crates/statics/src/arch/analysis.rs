//! From a design to an analysed deck arch: validation (once), the generated models and
//! their solutions for the dead load and the standard extra cases
//! (`cases::standard_cases`), and per load case the force diagram of the truss
//! idealisation, the pole construction of the rib and the thrust line of the frame
//! model's rib, in one serialisable result with its [`Summary`].
//!
//! Results are for concept design only; local codes and a licensed engineer govern.

use crate::arch::actions::{
    action_cases, action_results, actions_report, braking, specs_in, ActionsReport, ERECTION,
};
use crate::arch::cases::{add_cases, standard_cases, CaseKind, CaseSpec};
use crate::arch::design::{Design, RibSystem, Warning};
use crate::arch::form::{Basis, Form};
use crate::arch::generate::{
    bare_rib_model, frame_model, restraint, truss_model, DeckHold, Generated, MemberRole, ModelKind,
    ModelMap, Restraint, DEAD,
};
use crate::arch::summary::{SpringingForce, Summary};
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use crate::error::{Field, GroupName, Location, Problem, SectionProperty};
use crate::frame::determinacy::{truss_determinacy, Determinacy, DeterminacyReport};
use crate::frame::model::Model;
use crate::frame::results::CaseResult;
use crate::frame::solver::{solve, Solution};
use crate::graphic::funicular::{rib_funicular, RibFunicular};
use crate::graphic::reciprocal::{ForceDiagram, FormMap};
use crate::graphic::thrust_line::{thrust_line, ThrustLine};
use crate::tolerance::{ILL_CONDITIONED, STIFFNESS_CONTRAST, ZERO_FORCE};
use serde::Serialize;
use std::fmt;

/// Units of every number in an `Analysis`.
pub const UNITS: &str = "SI: lengths m, forces kN, moments kNm, loads kN/m and kN/m2, E kN/m2, areas m2, \
second moments of area m4, unit weights kN/m3, rotations rad";
/// Sign conventions of every number in an `Analysis`.
pub const SIGN_CONVENTION: &str = "axes x right, y up; loads and reactions as force components (gravity \
negative); axial force N tension positive, compression negative; bending moment M positive when it puts \
the right-hand fibre (looking from a member's start node to its end node) in tension, i.e. sagging for \
rib and deck members, which run left to right; form-finding loads on rib nodes are positive downward; \
form thrust and springing thrust are horizontal compressions of the rib, positive";
/// The caution shown with every result.
pub const CAUTION: &str = "concept-design results; local codes and a licensed engineer govern";

/// A note on a generated model, for the screen.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "note", rename_all = "snake_case")]
pub enum ModelNote {
    /// Who holds the deck longitudinally.
    Restraint {
        /// Who.
        held_by: DeckHold,
    },
    /// Three-hinged: the halves meet only at the crown node; the drop-in span ties nothing.
    DropIn,
    /// The load basis of the form.
    FormBasis {
        /// Which.
        basis: Basis,
    },
    /// The truss idealisation is determinate, but the form was found as built: its
    /// bracing carries what the frame's forces on the rib differ from its joint loads.
    DeterminateAsBuilt,
    /// The truss idealisation leaves out the approach and drop-in spans.
    SpansLeftOut,
    /// The truss idealisation is determinate: no bracing force on the funicular.
    Determinate,
    /// The truss idealisation is indeterminate: rib shortening loads deck and bracing.
    Indeterminate,
    /// The truss idealisation is a mechanism and is not solved.
    Mechanism,
    /// What the bare rib is for.
    BareRib,
}

impl fmt::Display for ModelNote {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ModelNote::Restraint { held_by } => write!(f, "longitudinal restraint: {held_by}"),
            ModelNote::DropIn => f.write_str(
                "three-hinged: the halves meet only at the crown rib node; the drop-in deck span over the crown \
                 ties nothing and its reactions are loads on the neighbouring deck nodes",
            ),
            ModelNote::FormBasis { basis: Basis::PanelLoads } => f.write_str("form basis: panel loads"),
            ModelNote::FormBasis { basis } => write!(f, "form basis: {basis} ({})", basis.describe()),
            ModelNote::DeterminateAsBuilt => f.write_str(
                "determinate; the form was found as built (for the frame's forces on the rib), not for these \
                 joint loads, so the bracing carries the difference",
            ),
            ModelNote::SpansLeftOut => {
                f.write_str("approach spans and drop-in spans left out; their reactions are loads")
            }
            ModelNote::Determinate => {
                f.write_str("determinate: on the dead-load funicular the bracing carries nothing")
            }
            ModelNote::Indeterminate => {
                f.write_str("indeterminate: rib shortening sends some dead load into deck and bracing")
            }
            ModelNote::Mechanism => f.write_str("a mechanism: not solved"),
            ModelNote::BareRib => f.write_str(
                "the rib alone, form-finding loads at its nodes (erection stage and closed-form checks)",
            ),
        }
    }
}

/// A note on the figures of a load case: which model each belongs to, or why one is
/// missing.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "note", rename_all = "snake_case")]
pub enum FigureNote {
    /// No force diagram: the spandrels are not braced.
    NotBraced,
    /// No force diagram: the truss idealisation is a mechanism.
    TrussIsMechanism,
    /// The force diagram is the reciprocal figure of the truss idealisation.
    ForceDiagram,
    /// The force diagram could not be drawn.
    NoForceDiagram {
        /// Why.
        reason: String,
    },
    /// The rib funicular is the three-point construction (three-hinged rib).
    ThreePoint,
    /// The rib funicular's pole comes from the solved reactions.
    PoleFromReactions,
    /// The rib funicular could not be drawn.
    NoRibFunicular {
        /// Why.
        reason: String,
    },
    /// The thrust line of the frame model's rib, checked with the rib depth.
    ThrustLine {
        /// Rib depth, m.
        depth: f64,
    },
    /// The thrust line could not be drawn.
    NoThrustLine {
        /// Why.
        reason: String,
    },
    /// No figures: the analysis was worked out for the drawings of another case alone
    /// ([`Extent::Drawing`], [`Extent::Screen`]).
    NotDrawn,
}

/// How much of an analysis [`analyze_to`] works out beyond the solved models.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Extent {
    /// Everything: every case's figures and the other actions' report.
    Whole,
    /// What the drawings of one case need, for a drag that redraws on every pointer move:
    /// the figures of load case `shown` (index into `Analysis::load_cases`) alone, every
    /// other case's marked [`FigureNote::NotDrawn`], and the actions report without its
    /// cases (`ActionsReport::cases` empty; the action cases are solved apart, about a
    /// fifth of an analysis). Every model is solved for every case as in `Whole`.
    Drawing {
        /// The case drawn; past the last case, the dead load (the first), as the
        /// elevation draws then.
        shown: usize,
    },
    /// What a page shows after an edit: as [`Extent::Whole`] (every model solved for
    /// every case, the action cases and their report, what the panels read) but the
    /// figures of load case `shown` alone, every other case's marked
    /// [`FigureNote::NotDrawn`]: only the shown case is drawn, and the other cases'
    /// figures were about a seventh of an edit's analysis. [`figures_of`] works out
    /// another case's when it is shown.
    Screen {
        /// The case drawn; past the last case, the dead load (the first).
        shown: usize,
    },
}

impl Extent {
    /// Whether the figures of the case at `index` are worked out.
    fn draws(self, index: usize) -> bool {
        match self {
            Extent::Whole => true,
            Extent::Drawing { shown } | Extent::Screen { shown } => shown == index,
        }
    }
    /// Whether the action cases are solved and reported.
    fn solves_actions(self) -> bool {
        !matches!(self, Extent::Drawing { .. })
    }
}

impl fmt::Display for FigureNote {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FigureNote::NotBraced => {
                f.write_str("no force diagram: the spandrels are not braced, so there is no truss idealisation")
            }
            FigureNote::TrussIsMechanism => f.write_str("no force diagram: the truss idealisation is a mechanism"),
            FigureNote::ForceDiagram => f.write_str(
                "force diagram: reciprocal figure of the truss idealisation (every joint pinned), exact for that \
                 model; the frame model's rib bends, so read it with the thrust line",
            ),
            FigureNote::NoForceDiagram { reason } => write!(f, "no force diagram: {reason}"),
            FigureNote::ThreePoint => f.write_str(
                "rib funicular: three-point construction through both springings and the crown hinge (statics \
                 alone), bare rib loads",
            ),
            FigureNote::PoleFromReactions => f.write_str(
                "rib funicular: pole from the bare rib's solved springing reactions (the rib is not three-hinged, \
                 so no three-point construction holds)",
            ),
            FigureNote::NoRibFunicular { reason } => write!(f, "no rib funicular: {reason}"),
            FigureNote::ThrustLine { depth } => write!(
                f,
                "thrust line: from the forces the frame model's rib receives and its springing reactions; checked \
                 at the rib nodes with the rib depth {depth} m"
            ),
            FigureNote::NoThrustLine { reason } => write!(f, "no thrust line: {reason}"),
            FigureNote::NotDrawn => f.write_str("no figures: only the case on screen was drawn"),
        }
    }
}

/// One generated model with its solutions.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModelResult {
    /// Which model this is.
    pub kind: ModelKind,
    /// The generated model (its title says which model it is).
    pub model: Model,
    /// Roles of its members and the nodes of the layout's joints.
    pub map: ModelMap,
    /// Solution of every load case of `model`: "dead" first, then the standard extra
    /// cases in the order of `Analysis::load_cases`.
    pub solution: Solution,
    /// Notes for the screen (restraint, drop-in, what is left out).
    pub notes: Vec<ModelNote>,
}

/// The truss idealisation with its degree of indeterminacy.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TrussResult {
    /// The generated model.
    pub model: Model,
    /// Roles of its members and the nodes of the layout's joints.
    pub map: ModelMap,
    /// Degree of static indeterminacy from the rank of the equilibrium matrix.
    pub determinacy: DeterminacyReport,
    /// Solution of every load case, "dead" first (`None` when the truss is a mechanism).
    pub solution: Option<Solution>,
    /// Largest |N| of a bracing diagonal over the largest |N| of any member under dead
    /// load (0 on the funicular of a determinate layout).
    pub bracing_ratio: Option<f64>,
    /// Notes for the screen.
    pub notes: Vec<ModelNote>,
}

/// Bending moment of the rib at one rib node, frame model, dead load.
///
/// Where a member joins the rib with a moment (the deck at a node rib and deck share) the
/// moment jumps: `left` and `right` are the moments just left and just right of the node,
/// and `m` is the one of larger magnitude. Every output that reports one moment per rib
/// node (residual moments, thrust-line checks, the summary) uses `m`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct RibMoment {
    /// Position, m.
    pub x: f64,
    /// Position, m.
    pub y: f64,
    /// Moment just left of the node, kNm (sagging positive; `None` at the left springing).
    pub left: Option<f64>,
    /// Moment just right of the node, kNm (`None` at the right springing).
    pub right: Option<f64>,
    /// The side of larger magnitude, kNm.
    pub m: f64,
}

/// The residual rib moments: how far the frame's rib departs from the funicular state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RibMoments {
    /// The model they come from.
    pub model: ModelKind,
    /// The load case.
    pub case: String,
    /// Moment at every rib node, left to right.
    pub nodes: Vec<RibMoment>,
    /// Largest |M| anywhere along the rib (nodes and member stations), kNm.
    pub max_abs: f64,
    /// Form thrust times the rise, kNm (the scale of the arch action).
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
    /// The key numbers: what the CLI prints first, the app's results table shows and the
    /// link fixtures store.
    pub summary: Summary,
    /// Warnings from validation.
    pub warnings: Vec<Warning>,
    /// The form (basis, rib nodes, form thrust, reactions, iterations, final change).
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
    /// The other actions, each alone (temperature, springing movement, braking in the
    /// frame model; erection in the bare rib).
    pub actions: ActionsReport,
}

/// The figures of one load case, each from the model it is exact for.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CaseFigures {
    /// Load case name (the same in every model).
    pub case: String,
    /// What the case is.
    pub description: CaseKind,
    /// Reciprocal figure of the truss idealisation (braced designs; `None` otherwise or
    /// when it cannot be drawn, with the reason in `notes`).
    pub force_diagram: Option<ForceDiagram>,
    /// Pole and funicular of the bare rib under this case's loads carried down to the rib
    /// nodes: the three-point construction for a three-hinged rib, the pole from the
    /// solved reactions otherwise.
    pub rib_funicular: Option<RibFunicular>,
    /// For a rib that is not three-hinged, whose `rib_funicular` takes its pole from the
    /// solved reactions: the pole of the three-point construction through the crown under
    /// the same loads, kN (the form's pole: its distance from the load line is the form
    /// thrust, what dragging the pole sets). `None` for a three-hinged rib (the two are
    /// one) or when it cannot be drawn.
    pub form_pole: Option<crate::geom::Point>,
    /// Thrust line of the frame model's rib (checked with the rib section depth).
    pub thrust_line: Option<ThrustLine>,
    /// Which model each figure belongs to, and why a figure is missing.
    pub notes: Vec<FigureNote>,
}

/// Validates the design (once) and analyses it: see [`analyze_valid`].
///
/// Errors: `Invalid` with every problem of the design; `NoConvergence` when form finding
/// does not settle; `Mechanism` if a generated frame or rib model cannot stand (a bug or
/// an extreme design: the message names the node).
pub fn analyze(design: &Design) -> Result<Analysis, StaticsError> {
    analyze_valid(&ValidDesign::new(design)?)
}

/// The generated models of a validated design with the standard cases added and solved.
struct Solved {
    frame: Generated,
    frame_solution: Solution,
    rib: Generated,
    rib_solution: Solution,
    truss: Option<(Generated, DeterminacyReport, Option<Solution>)>,
    /// The action cases' report, when they were asked for.
    actions: Option<ActionsReport>,
}

/// `previous`: an analysis whose load cases, where the same model has them with the same
/// loads, keep their results (`solve_reusing`). `actions`: the action cases
/// (`arch::actions::action_cases`), solved with the standard cases in one factorisation
/// of each model and reported apart (the models and solutions keep the standard cases).
fn solve_models(
    valid: &ValidDesign,
    specs: &[CaseSpec],
    actions: Option<&[CaseSpec]>,
    previous: Option<&Analysis>,
) -> Result<Solved, StaticsError> {
    let mut frame = frame_model(valid);
    let (frame_solution, frame_actions, frame_action_results) = solve_with_actions(
        valid,
        &mut frame,
        specs,
        actions,
        previous.map(|p| (&p.frame.model, &p.frame.solution)),
    )?;
    let mut rib = bare_rib_model(valid);
    let (rib_solution, rib_actions, rib_action_results) = solve_with_actions(
        valid,
        &mut rib,
        specs,
        actions,
        previous.map(|p| (&p.bare_rib.model, &p.bare_rib.solution)),
    )?;
    let actions = actions.map(|_| {
        actions_report(
            valid.design(),
            [
                (ModelKind::Frame, &frame.map, frame_actions.as_slice(), frame_action_results.as_slice()),
                (ModelKind::BareRib, &rib.map, rib_actions.as_slice(), rib_action_results.as_slice()),
            ],
        )
    });
    let truss = match truss_model(valid) {
        Some(mut truss) => {
            add_cases(valid, &mut truss, specs)?;
            let determinacy = truss_determinacy(&truss.model)?;
            let solution = match determinacy.determinacy {
                Determinacy::Mechanism { .. } => None,
                _ => {
                    let old = previous
                        .and_then(|p| p.truss.as_ref())
                        .and_then(|t| t.solution.as_ref().map(|s| (&t.model, s)));
                    Some(solve_reusing(&truss.model, old)?)
                }
            };
            Some((truss, determinacy, solution))
        }
        None => None,
    };
    Ok(Solved { frame, frame_solution, rib, rib_solution, truss, actions })
}

/// Adds `specs` to `generated` and solves them with the action cases this model takes
/// (`arch::actions::specs_in`) added after them, in one factorisation (`solve_reusing`),
/// then takes the action cases out of the model again: the solution of its own cases,
/// the action cases it took and their results, in that order. An action case the model
/// already has (one picked to be shown, an extra case of the analysis) is not added
/// again: its result is the model's own.
fn solve_with_actions(
    valid: &ValidDesign,
    generated: &mut Generated,
    specs: &[CaseSpec],
    actions: Option<&[CaseSpec]>,
    previous: Option<(&Model, &Solution)>,
) -> Result<(Solution, Vec<CaseSpec>, Vec<CaseResult>), StaticsError> {
    add_cases(valid, generated, specs)?;
    let actions = actions.map(|a| specs_in(a, generated.kind)).unwrap_or_default();
    let own = generated.model.load_cases.len();
    let new: Vec<CaseSpec> = actions
        .iter()
        .filter(|a| !generated.model.load_cases.iter().any(|c| c.name == a.name))
        .cloned()
        .collect();
    add_cases(valid, generated, &new)?;
    let solved = solve_reusing(&generated.model, previous);
    generated.model.load_cases.truncate(own);
    let mut solution = solved?;
    let added = solution.cases.split_off(own.min(solution.cases.len()));
    let action_results = actions
        .iter()
        .filter_map(|a| added.iter().chain(&solution.cases).find(|c| c.name == a.name).cloned())
        .collect();
    Ok((solution, actions, action_results))
}

/// Solves `model`, taking the result of each load case that `previous` (a model and its
/// solution) solved with the same loads on the same nodes, members and supports, so only
/// the cases that changed are solved (a vehicle moved along the deck: its case alone).
/// The solution equals `solve(model)`'s: each case is solved on its own.
fn solve_reusing(model: &Model, previous: Option<(&Model, &Solution)>) -> Result<Solution, StaticsError> {
    let Some((old_model, old)) = previous.filter(|(m, _)| {
        m.nodes == model.nodes && m.members == model.members && m.supports == model.supports
    }) else {
        return solve(model);
    };
    let kept: Vec<Option<&CaseResult>> = model
        .load_cases
        .iter()
        .map(|c| old_model.load_cases.iter().any(|o| o == c).then(|| old.case(&c.name)).flatten())
        .collect();
    let mut fresh_model = model.clone();
    fresh_model.load_cases =
        model.load_cases.iter().zip(&kept).filter(|(_, k)| k.is_none()).map(|(c, _)| c.clone()).collect();
    if fresh_model.load_cases.is_empty() {
        let cases = kept.into_iter().flatten().cloned().collect();
        return Ok(Solution { cases, free_dofs: old.free_dofs, bandwidth: old.bandwidth });
    }
    let fresh = solve(&fresh_model)?;
    let cases = model
        .load_cases
        .iter()
        .zip(kept)
        .map(|(c, k)| k.or_else(|| fresh.case(&c.name)).cloned())
        .collect::<Option<Vec<_>>>();
    match cases {
        Some(cases) => Ok(Solution { cases, free_dofs: fresh.free_dofs, bandwidth: fresh.bandwidth }),
        // two cases of one name: solve the whole model as it is
        None => solve(model),
    }
}

/// Generates the frame model, the truss idealisation (when braced) and the bare rib of a
/// validated design, solves each for the dead load and the standard extra cases, and draws
/// the figures of every case.
///
/// Errors: `Mechanism` if a generated frame or rib model cannot stand (the message names
/// the node); `OutOfRange` for numbers beyond floating point.
pub fn analyze_valid(valid: &ValidDesign) -> Result<Analysis, StaticsError> {
    analyze_with(valid, &[])
}

/// [`analyze_valid`] with extra load cases after the standard ones (named patterns,
/// a vehicle, the placement that governs an envelope: `arch::cases::pattern_case`,
/// `arch::traffic::placement_case`), each solved in every model and drawn like the
/// standard cases.
///
/// Errors: those of [`analyze_valid`], and an extra case that cannot be built (a panel
/// point that does not exist, a load that is not finite).
pub fn analyze_with(valid: &ValidDesign, extra: &[CaseSpec]) -> Result<Analysis, StaticsError> {
    analyze_reusing(valid, extra, None)
}

/// [`analyze_with`], taking the figures (force diagram, rib funicular, thrust line) of a
/// case from `previous` instead of drawing them again when `previous` has a case of the
/// same name and kind whose solved forces are the same in every model. `previous` should
/// be an analysis of the same validated design (a vehicle moved along the deck keeps
/// every other case): an analysis of another design is detected by its models and not
/// used. The result equals [`analyze_with`]'s.
///
/// Errors: those of [`analyze_with`].
pub fn analyze_reusing(
    valid: &ValidDesign,
    extra: &[CaseSpec],
    previous: Option<&Analysis>,
) -> Result<Analysis, StaticsError> {
    analyze_to(valid, extra, previous, Extent::Whole)
}

/// [`analyze_reusing`] worked out to `extent`: with [`Extent::Whole`] the same; with
/// [`Extent::Drawing`] the figures of the shown case alone and no action cases (what a
/// drag redraws on every pointer move; the panels read a whole analysis). Figures marked
/// [`FigureNote::NotDrawn`] in `previous` are never reused.
///
/// Errors: those of [`analyze_with`]. With `Whole` the action cases are solved with the
/// standard ones (one factorisation per model) unless `valid` already holds their report,
/// so a problem in one of them (a load that is not finite) is reported with the standard
/// cases' problems; with `Drawing` they are not solved and never fail.
pub fn analyze_to(
    valid: &ValidDesign,
    extra: &[CaseSpec],
    previous: Option<&Analysis>,
    extent: Extent,
) -> Result<Analysis, StaticsError> {
    let design = valid.design();
    let form = valid.form();
    let rs = restraint(valid);
    // the standard cases once (they share the traffic across the deck), then the extra
    let specs: Vec<CaseSpec> = standard_cases(valid).into_iter().chain(extra.iter().cloned()).collect();
    let contrast = stiffness_contrast(design);
    // the action cases with the standard ones, unless this validated design has them
    let action_specs =
        (extent.solves_actions() && valid.actions_known().is_none()).then(|| action_cases(design));
    let Solved { frame, frame_solution, rib, rib_solution, truss, actions } =
        solve_models(valid, &specs, action_specs.as_deref(), previous).map_err(|e| {
            match (&e, &contrast) {
                // a near-mechanism caused by the contrast: say so beside the sections
                (StaticsError::Mechanism { .. }, Some(problem)) => StaticsError::Invalid(vec![Problem {
                    message: format!("{}; the frame model cannot be solved ({e})", problem.message),
                    ..problem.clone()
                }]),
                _ => e,
            }
        })?;
    let mut frame_notes = vec![ModelNote::Restraint { held_by: rs.held_by }];
    if design.rib_system == RibSystem::ThreeHinged {
        frame_notes.push(ModelNote::DropIn);
    }
    frame_notes.push(ModelNote::FormBasis { basis: form.basis });
    let residual = rib_moments(&frame.model, &frame.map, &frame_solution, form);
    let truss = truss.map(|(generated, determinacy, solution)| {
        let bracing_ratio = solution.as_ref().and_then(|s| bracing_ratio(&generated.map, s));
        let verdict = match determinacy.determinacy {
            Determinacy::Determinate if form.basis == Basis::AsBuilt => ModelNote::DeterminateAsBuilt,
            Determinacy::Determinate => ModelNote::Determinate,
            Determinacy::Indeterminate { .. } => ModelNote::Indeterminate,
            Determinacy::Mechanism { .. } => ModelNote::Mechanism,
        };
        TrussResult {
            model: generated.model,
            map: generated.map,
            determinacy,
            solution,
            bracing_ratio,
            notes: vec![ModelNote::SpansLeftOut, verdict],
        }
    });
    let mut cases = vec![(DEAD.to_string(), CaseKind::Dead)];
    cases.extend(specs.into_iter().map(|s| (s.name, s.kind)));
    let figures = Figures {
        frame: (&frame.model, &frame.map, &frame_solution),
        truss: truss.as_ref().map(|t| (&t.model, t.solution.as_ref(), FormMap::new(&t.model))),
        rib: (&rib.model, &rib.map, &rib_solution),
    };
    let previous = previous.filter(|p| same_models(p, &figures));
    // a case index past the cases (extra cases not built for a dragged design) draws the
    // dead load, as the elevation does
    let case_count = cases.len();
    let extent = match extent {
        Extent::Drawing { shown } => Extent::Drawing { shown: drawn_case(shown, case_count) },
        Extent::Screen { shown } => Extent::Screen { shown: drawn_case(shown, case_count) },
        Extent::Whole => Extent::Whole,
    };
    let load_cases = cases
        .into_iter()
        .enumerate()
        .map(|(index, (name, kind))| {
            if !extent.draws(index) {
                return CaseFigures {
                    case: name,
                    description: kind,
                    force_diagram: None,
                    rib_funicular: None,
                    form_pole: None,
                    thrust_line: None,
                    notes: vec![FigureNote::NotDrawn],
                };
            }
            let kept = previous.and_then(|p| {
                let old = p.load_cases.iter().find(|c| c.case == name && c.description == kind)?;
                if old.notes.contains(&FigureNote::NotDrawn) {
                    return None;
                }
                // the thrust line is drawn against the rib's depth, which no model holds
                let depth_alike = old.notes.iter().all(|n| match n {
                    FigureNote::ThrustLine { depth } => *depth == design.groups.rib.depth,
                    _ => true,
                });
                (depth_alike && same_case(p, &figures, &name)).then(|| old.clone())
            });
            kept.unwrap_or_else(|| case_figures(design, &figures, &name, kind))
        })
        .collect();
    let frame = ModelResult {
        kind: ModelKind::Frame,
        model: frame.model,
        map: frame.map,
        solution: frame_solution,
        notes: frame_notes,
    };
    let bare_rib = ModelResult {
        kind: ModelKind::BareRib,
        model: rib.model,
        map: rib.map,
        solution: rib_solution,
        notes: vec![ModelNote::BareRib],
    };
    let mut summary = Summary::new(design, form, &rs, &frame, truss.as_ref(), &residual);
    // the erection stage is the bare rib's (the frame model has nothing to take it): its
    // springing forces are the bare rib's
    for s in summary.springings.iter_mut().filter(|s| s.case == ERECTION) {
        if let Some(c) = bare_rib.solution.case(ERECTION) {
            let [l, r] = bare_rib.map.springings;
            let side = |node: usize, left: bool| {
                c.reaction(node).map(|q| SpringingForce::from_reaction(q.fx, q.fy, q.mz, left))
            };
            if let (Some(left), Some(right)) = (side(l, true), side(r, false)) {
                s.left = left;
                s.right = right;
            }
        }
    }
    Ok(Analysis {
        design: design.name.clone(),
        units: UNITS.into(),
        sign_convention: SIGN_CONVENTION.into(),
        caution: CAUTION.into(),
        summary,
        warnings: valid
            .warnings()
            .iter()
            .cloned()
            .chain(contrast)
            .chain([&frame, &bare_rib].into_iter().filter_map(conditioning_warning))
            .collect(),
        form: form.clone(),
        restraint: rs,
        frame,
        truss,
        bare_rib,
        residual_rib_moments: residual,
        load_cases,
        actions: match (actions, extent) {
            // kept with the validated design, as `action_results` would
            (Some(report), _) => valid.actions_or_init(|| Ok(report)).clone()?,
            (None, Extent::Whole | Extent::Screen { .. }) => action_results(valid)?,
            (None, Extent::Drawing { .. }) => ActionsReport {
                temperature: design.actions.temperature.clone(),
                braking: braking(design),
                cases: Vec::new(),
            },
        },
    })
}

/// The index of the load case the drawings show when case `shown` is chosen from
/// `case_count` cases: `shown` itself, or past the last case the dead load (index 0).
/// A case index can outlive its case: extra cases are built for one design, and a drag
/// or an edit may change it before they are built again. `case_count` 0 gives 0.
pub fn drawn_case(shown: usize, case_count: usize) -> usize {
    if shown < case_count {
        shown
    } else {
        0
    }
}

/// The figures of the load case at `index` of `analysis` (an index into
/// `Analysis::load_cases`), worked out from its solved models: what
/// [`Extent::Whole`] would have put there, for a case an analysis to
/// [`Extent::Screen`] or [`Extent::Drawing`] left undrawn ([`FigureNote::NotDrawn`]).
/// `design` is the design analysed (its rib system and rib depth). `None` past the last
/// case.
pub fn figures_of(analysis: &Analysis, design: &Design, index: usize) -> Option<CaseFigures> {
    let case = analysis.load_cases.get(index)?;
    let figures = Figures {
        frame: (&analysis.frame.model, &analysis.frame.map, &analysis.frame.solution),
        truss: analysis.truss.as_ref().map(|t| (&t.model, t.solution.as_ref(), FormMap::new(&t.model))),
        rib: (&analysis.bare_rib.model, &analysis.bare_rib.map, &analysis.bare_rib.solution),
    };
    Some(case_figures(design, &figures, &case.case, case.description))
}

/// The solved models a case's figures are drawn from.
struct Figures<'a> {
    frame: (&'a Model, &'a ModelMap, &'a Solution),
    /// The truss idealisation: its model, solution and form diagram (shared by its cases).
    truss: Option<(&'a Model, Option<&'a Solution>, FormMap<'a>)>,
    rib: (&'a Model, &'a ModelMap, &'a Solution),
}

/// Whether `previous` was solved on the same models (nodes, members, supports) as
/// `figures`: the condition for taking figures from it.
fn same_models(previous: &Analysis, figures: &Figures) -> bool {
    let same =
        |a: &Model, b: &Model| a.nodes == b.nodes && a.members == b.members && a.supports == b.supports;
    let truss_same = match (&previous.truss, &figures.truss) {
        (None, None) => true,
        (Some(t), Some((model, ..))) => same(&t.model, model),
        _ => false,
    };
    same(&previous.frame.model, figures.frame.0)
        && same(&previous.bare_rib.model, figures.rib.0)
        && truss_same
}

/// Whether case `name` has the same results in `previous` as in `figures`, model by
/// model (a case the truss idealisation or its solution lacks in both counts as alike).
fn same_case(previous: &Analysis, figures: &Figures, name: &str) -> bool {
    let frame = previous.frame.solution.case(name) == figures.frame.2.case(name);
    let rib = previous.bare_rib.solution.case(name) == figures.rib.2.case(name);
    let old_truss = previous.truss.as_ref().and_then(|t| t.solution.as_ref()).map(|s| s.case(name));
    let new_truss = figures.truss.as_ref().and_then(|(_, s, _)| *s).map(|s| s.case(name));
    // the idle test scales by the dead case: it must be alike too
    let old_dead = previous.truss.as_ref().and_then(|t| t.solution.as_ref()).map(|s| s.case(DEAD));
    let new_dead = figures.truss.as_ref().and_then(|(_, s, _)| *s).map(|s| s.case(DEAD));
    frame && rib && old_truss == new_truss && old_dead == new_dead
}

/// Whether case `name` of `solution` leaves every member without force: all below
/// `ZERO_FORCE` of the largest force of the dead case (the scale of the structure).
fn idle(solution: &Solution, name: &str) -> bool {
    let largest = |c: &crate::frame::results::CaseResult| {
        c.members.iter().flat_map(|m| [m.start.n.abs(), m.end.n.abs()]).fold(0.0, f64::max)
    };
    let scale = solution.case(DEAD).map_or(0.0, largest);
    solution.case(name).is_some_and(|c| name != DEAD && largest(c) <= ZERO_FORCE * scale)
}

/// The figures of load case `name` from the solved models of an analysis.
fn case_figures(design: &Design, models: &Figures, name: &str, kind: CaseKind) -> CaseFigures {
    let mut notes = Vec::new();
    let force_diagram = match &models.truss {
        None => {
            notes.push(FigureNote::NotBraced);
            None
        }
        Some((_, None, _)) => {
            notes.push(FigureNote::TrussIsMechanism);
            None
        }
        // an action that leaves the truss idealisation unstressed (a determinate truss
        // moved by a temperature or its supports, the bare rib's erection): no figure
        Some((_, Some(solution), _)) if idle(solution, name) => {
            notes.push(FigureNote::NoForceDiagram {
                reason: "nothing stresses the truss idealisation in this case (it moves freely, or the case is the \
                         bare rib's)"
                    .into(),
            });
            None
        }
        Some((_, Some(solution), form)) => match solution.case(name).map(|c| form.force_diagram(c)) {
            Some(Ok(fd)) => {
                notes.push(FigureNote::ForceDiagram);
                Some(fd)
            }
            Some(Err(e)) => {
                notes.push(FigureNote::NoForceDiagram { reason: e.to_string() });
                None
            }
            None => None,
        },
    };
    let (rib, rib_map, rib_solution) = models.rib;
    let three_hinged = design.rib_system == RibSystem::ThreeHinged;
    let rib_funicular = rib_solution.case(name).and_then(|case| {
        let [left, right] = rib_map.springings;
        let crown = three_hinged.then_some(rib_map.crown);
        match rib_funicular(rib, case, left, right, crown) {
            Ok(f) => {
                notes.push(if three_hinged { FigureNote::ThreePoint } else { FigureNote::PoleFromReactions });
                Some(f)
            }
            Err(e) => {
                notes.push(FigureNote::NoRibFunicular { reason: e.to_string() });
                None
            }
        }
    });
    let form_pole = (!three_hinged)
        .then(|| {
            let case = rib_solution.case(name)?;
            let [left, right] = rib_map.springings;
            crate::graphic::funicular::rib_funicular(rib, case, left, right, Some(rib_map.crown))
                .ok()
                .map(|f| f.construction.pole)
        })
        .flatten();
    let (frame, frame_map, frame_solution) = models.frame;
    let depth = design.groups.rib.depth;
    let thrust = frame_solution.case(name).and_then(|case| {
        match thrust_line(frame, case, &frame_map.rib_chain(), depth) {
            Ok(t) => {
                notes.push(FigureNote::ThrustLine { depth });
                Some(t)
            }
            Err(e) => {
                notes.push(FigureNote::NoThrustLine { reason: e.to_string() });
                None
            }
        }
    });
    CaseFigures {
        case: name.to_string(),
        description: kind,
        force_diagram,
        rib_funicular,
        form_pole,
        thrust_line: thrust,
        notes,
    }
}

/// Largest |N| of the bracing members over the largest |N| of any member, first load
/// case; `None` without bracing members or forces.
pub fn bracing_ratio(map: &ModelMap, solution: &Solution) -> Option<f64> {
    let case = solution.cases.first()?;
    let mut largest: f64 = 0.0;
    let mut brace: Option<f64> = None;
    for mf in &case.members {
        let n = mf.start.n.abs().max(mf.end.n.abs());
        largest = largest.max(n);
        if map.roles.get(mf.member) == Some(&MemberRole::Bracing) {
            brace = Some(brace.unwrap_or(0.0).max(n));
        }
    }
    match brace {
        Some(b) if largest > 0.0 => Some(b / largest),
        _ => None,
    }
}

/// The larger in magnitude of two moments (the first on a tie).
fn governing(a: f64, b: f64) -> f64 {
    if b.abs() > a.abs() {
        b
    } else {
        a
    }
}

/// Residual rib moments of a solved frame model under dead load: the moment on both sides
/// of every rib node (left to right, from the rib members of `map`, which run left to
/// right) and the largest along the rib.
pub fn rib_moments(model: &Model, map: &ModelMap, solution: &Solution, form: &Form) -> RibMoments {
    let mut nodes = Vec::new();
    let mut max_abs: f64 = 0.0;
    let case = solution.case(DEAD).or(solution.cases.first());
    if let Some(case) = case {
        let rib = &map.rib_members;
        for (r, &node) in map.rib_nodes.iter().enumerate() {
            // member r - 1 ends at rib node r, member r starts there
            let member = |k: Option<&usize>| k.and_then(|&k| case.members.get(k));
            let left = member(r.checked_sub(1).and_then(|k| rib.get(k))).map(|m| m.end.m);
            let right = member(rib.get(r)).map(|m| m.start.m);
            let Some(p) = model.nodes.get(node) else { continue };
            let m = governing(left.unwrap_or(0.0), right.unwrap_or(0.0));
            nodes.push(RibMoment { x: p.x, y: p.y, left, right, m });
        }
        for mf in rib.iter().filter_map(|&k| case.members.get(k)) {
            max_abs = max_abs.max(mf.max_abs_moment()).max(mf.start.m.abs()).max(mf.end.m.abs());
        }
    }
    let hf = form.thrust * form.rise;
    RibMoments {
        model: ModelKind::Frame,
        case: DEAD.into(),
        nodes,
        max_abs,
        thrust_times_rise: hf,
        relative: if hf > 0.0 { max_abs / hf } else { 0.0 },
    }
}

/// A warning when a case of `result` balances only loosely (equilibrium residual above
/// [`ILL_CONDITIONED`] of its reference force), with its cause: the stiffest and the
/// softest member stiffness terms of the model (E A / L, and 12 E I / L^3 of members
/// that bend; stiffness method, any structural analysis text) and their ratio. `None`
/// when every case balances to rounding.
fn conditioning_warning(result: &ModelResult) -> Option<Warning> {
    // a residual that is not a number counts as the worst
    let loose = |r: f64| if r.is_nan() { f64::INFINITY } else { r };
    let worst = result
        .solution
        .cases
        .iter()
        .max_by(|a, b| loose(a.equilibrium.relative).total_cmp(&loose(b.equilibrium.relative)))?;
    let residual = worst.equilibrium.relative;
    if residual.is_finite() && residual <= ILL_CONDITIONED {
        return None;
    }
    let mut terms: Vec<(f64, &str, String)> = Vec::new();
    for (k, member) in result.model.members.iter().enumerate() {
        let Some((a, b)) = result.model.ends(member) else { continue };
        let length = (b.x - a.x).hypot(b.y - a.y);
        if length > 0.0 {
            terms.push((member.e * member.a / length, "E A / L", result.model.member_label(k)));
            if member.i > 0.0 && !(member.release_start && member.release_end) {
                terms.push((
                    12.0 * member.e * member.i / length.powi(3),
                    "12 E I / L^3",
                    result.model.member_label(k),
                ));
            }
        }
    }
    let stiffest = terms.iter().max_by(|a, b| a.0.total_cmp(&b.0))?;
    let softest = terms.iter().min_by(|a, b| a.0.total_cmp(&b.0))?;
    Some(Problem::new(
        Location::Part(result.kind.to_string()),
        format!(
            "the {} is ill-conditioned: in case '{}' equilibrium holds only to {residual:.1e} of the \
             loads; its stiffest term ({} of {}, {:.2e} kN/m) is {:.1e} times its softest ({} of {}, {:.2e} \
             kN/m); bring the sections' stiffnesses closer together",
            result.kind,
            worst.name,
            stiffest.1,
            stiffest.2,
            stiffest.0,
            stiffest.0 / softest.0,
            softest.1,
            softest.2,
            softest.0,
        ),
    ))
}

/// A warning when the axial stiffnesses E A of the design's member groups (those the
/// design uses: bracing when braced, piers when there are approach piers) lie more than
/// [`STIFFNESS_CONTRAST`] apart, naming the stiffest and the softest group: the model is
/// ill-conditioned. It stands beside the softest group's E and A.
fn stiffness_contrast(design: &Design) -> Option<Warning> {
    let g = &design.groups;
    let used = [
        (GroupName::Rib, &g.rib, true),
        (GroupName::Deck, &g.deck, true),
        (GroupName::Posts, &g.posts, true),
        (GroupName::Piers, &g.piers, design.approach_piers_left + design.approach_piers_right > 0),
        (GroupName::Bracing, &g.bracing, design.bracing.is_braced()),
    ];
    let axial: Vec<(GroupName, f64)> =
        used.iter().filter(|(_, _, used)| *used).map(|(name, s, _)| (*name, s.e * s.a)).collect();
    let (stiff, high) = axial.iter().copied().max_by(|a, b| a.1.total_cmp(&b.1))?;
    let (soft, low) = axial.iter().copied().min_by(|a, b| a.1.total_cmp(&b.1))?;
    (low > 0.0 && high / low > STIFFNESS_CONTRAST).then(|| {
        Problem::new(
            Field::Section(soft, SectionProperty::A),
            format!(
                "the model is ill-conditioned: the {} section's E A ({high:.2e} kN) is {:.1e} times the {} \
                 section's ({low:.2e} kN), beyond {STIFFNESS_CONTRAST:.0e}; results lose digits and the \
                 structure nears a mechanism: bring the sections' stiffnesses closer together",
                stiff.key(),
                high / low,
                soft.key(),
            ),
        )
        .involving([Field::Section(soft, SectionProperty::E), Field::Section(stiff, SectionProperty::A)])
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A case that balances only loosely (or not at all: NaN) is reported with the
    /// model's stiffest and softest terms; the demo's own cases balance to rounding.
    #[test]
    fn a_loose_equilibrium_is_reported_with_its_cause() {
        let analysis = analyze(&Design::demo()).expect("the demo analyses");
        assert_eq!(conditioning_warning(&analysis.frame), None);
        for residual in [1e-6, f64::NAN] {
            let mut frame = analysis.frame.clone();
            if let Some(case) = frame.solution.cases.get_mut(1) {
                case.equilibrium.relative = residual;
            }
            let warned = conditioning_warning(&frame).expect("a warning");
            assert_eq!(warned.location.path(), "frame model");
            let m = &warned.message;
            assert!(m.starts_with("the frame model is ill-conditioned: in case '"), "{m}");
            assert!(m.contains(&format!("holds only to {residual:.1e} of the loads")), "{m}");
            // the rib's E A / L is the stiffest term; the softest is a bending term
            assert!(
                m.contains("its stiffest term (E A / L of rib") && m.contains("softest (12 E I / L^3 of"),
                "{m}"
            );
        }
    }
    use crate::arch::design::{Bracing, Crown, RibSystem};
    use crate::arch::validate::VALIDATIONS;
    use crate::frame::model::{LoadDirection, MemberLoad};

    /// Results and figures taken from a previous analysis are exactly those computed
    /// afresh: a vehicle moved along the deck (its case solved and drawn anew, the others
    /// kept), and a previous analysis of another design (other panels, another rib depth,
    /// another rib system, the same models under other loads), whose results must not be
    /// taken.
    #[test]
    fn reusing_figures_changes_nothing() {
        use crate::arch::cases::{pattern_case, Pattern};
        let demo = Design::demo();
        let valid = ValidDesign::new(&demo).expect("demo");
        let at = |v: &ValidDesign, x: f64| pattern_case(v, Pattern::Vehicle(x)).expect("on the deck");
        let before = analyze_with(&valid, &[at(&valid, 50.0)]).expect("solves");
        let fresh = analyze_with(&valid, &[at(&valid, 51.5)]).expect("solves");
        let reused = analyze_reusing(&valid, &[at(&valid, 51.5)], Some(&before)).expect("solves");
        assert_eq!(reused, fresh);
        let mut others = Vec::new();
        let mut d = demo.clone();
        d.panels = 14;
        others.push(d);
        let mut d = demo.clone();
        d.groups.rib.depth = 2.0;
        others.push(d);
        let mut d = demo.clone();
        d.rib_system = RibSystem::TwoHinged;
        others.push(d);
        // the same models with other loads: no result may be taken from them
        let mut d = demo.clone();
        d.deck.surfacing = 3.1;
        others.push(d);
        let mut d = demo.clone();
        d.traffic.load_model =
            crate::traffic::models::LoadModel::preset(crate::traffic::models::ModelFamily::Hl93);
        others.push(d);
        for other in others {
            let v = ValidDesign::new(&other).expect("valid");
            let previous = analyze_with(&v, &[at(&v, 50.0)]).expect("solves");
            let reused = analyze_reusing(&valid, &[at(&valid, 51.5)], Some(&previous)).expect("solves");
            assert_eq!(reused, fresh, "{:?} {:?}", other.panels, other.rib_system);
        }
    }

    /// A drawing's extent works out the shown case's figures exactly as a whole analysis
    /// does (and every model's solution, summary and warnings), leaves the others undrawn
    /// and the action cases out; a whole analysis after it, reusing it, equals one
    /// computed afresh (nothing undrawn is kept).
    #[test]
    fn a_drawings_extent_draws_the_shown_case_alone_and_is_never_reused_for_the_others() {
        use crate::arch::cases::{pattern_case, Pattern};
        let valid = ValidDesign::new(&Design::demo()).expect("demo");
        let vehicle = [pattern_case(&valid, Pattern::Vehicle(50.0)).expect("on the deck")];
        let whole = analyze_with(&valid, &vehicle).expect("solves");
        let shown = whole.load_cases.len() - 1;
        let drawn = analyze_to(&valid, &vehicle, None, Extent::Drawing { shown }).expect("solves");
        assert_eq!(drawn.load_cases.get(shown), whole.load_cases.get(shown));
        assert!(drawn
            .load_cases
            .get(shown)
            .is_some_and(|c| c.force_diagram.is_some() && c.thrust_line.is_some()));
        for (k, c) in drawn.load_cases.iter().enumerate().filter(|(k, _)| *k != shown) {
            assert_eq!(c.notes, vec![FigureNote::NotDrawn], "case {k}");
            assert!(c.force_diagram.is_none() && c.thrust_line.is_none() && c.rib_funicular.is_none());
            assert_eq!(c.case, whole.load_cases[k].case);
        }
        assert_eq!(
            (&drawn.frame, &drawn.truss, &drawn.bare_rib),
            (&whole.frame, &whole.truss, &whole.bare_rib)
        );
        assert_eq!((&drawn.summary, &drawn.warnings), (&whole.summary, &whole.warnings));
        assert!(drawn.actions.cases.is_empty() && !whole.actions.cases.is_empty());
        assert_eq!(drawn.actions.braking, whole.actions.braking);
        let after = analyze_to(&valid, &vehicle, Some(&drawn), Extent::Whole).expect("solves");
        assert_eq!(after, whole);
        // a case past the last draws the dead load's figures
        let past = analyze_to(&valid, &vehicle, None, Extent::Drawing { shown: shown + 5 }).expect("solves");
        assert_eq!(past.load_cases.first(), whole.load_cases.first());
        assert_eq!(past.load_cases.get(shown).map(|c| c.notes.clone()), Some(vec![FigureNote::NotDrawn]));
    }

    /// A screen's extent is a whole analysis but for the figures of the cases not shown
    /// (the action cases and their report included), and `figures_of` works out any
    /// case's figures from it exactly as the whole analysis has them, for each rib
    /// system (check value: the engine's whole analysis of the same design).
    #[test]
    fn a_screens_extent_leaves_out_only_the_other_cases_figures() {
        use crate::arch::design::RibSystem;
        for system in [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed] {
            let mut d = Design::demo();
            d.rib_system = system;
            let valid = ValidDesign::new(&d).expect("demo");
            let whole = analyze_to(&valid, &[], None, Extent::Whole).expect("solves");
            let shown = 2;
            let screen = analyze_to(&valid, &[], None, Extent::Screen { shown }).expect("solves");
            assert_eq!(screen.load_cases.get(shown), whole.load_cases.get(shown), "{system:?}");
            let undrawn = screen.load_cases.iter().filter(|c| c.notes == [FigureNote::NotDrawn]).count();
            assert_eq!(undrawn, whole.load_cases.len() - 1, "{system:?}");
            assert!(!screen.actions.cases.is_empty(), "{system:?}");
            let mut filled = screen.clone();
            for k in 0..filled.load_cases.len() {
                filled.load_cases[k] = figures_of(&screen, &d, k).expect("a case");
            }
            assert_eq!(filled, whole, "{system:?}");
            assert!(figures_of(&screen, &d, whole.load_cases.len()).is_none());
            // past the last case: the dead load's, as a drawing's extent
            let past = analyze_to(&valid, &[], None, Extent::Screen { shown: 99 }).expect("solves");
            assert_eq!(past.load_cases.first(), whole.load_cases.first(), "{system:?}");
        }
    }

    /// The action cases solved with the standard ones (one factorisation per model) give
    /// the report of their own separate solve, bit for bit, and the models and solutions
    /// keep the standard cases only (check value: the engine's separate solve,
    /// `arch::actions::action_results` on a design validated anew).
    #[test]
    fn action_cases_solved_with_the_standard_ones_match_their_own_solve() {
        use crate::arch::actions::action_results;
        use crate::arch::design::{Bracing, RibSystem};
        for (system, bracing, panels) in [
            (RibSystem::ThreeHinged, Bracing::Single { flipped: false }, 8),
            (RibSystem::TwoHinged, Bracing::Crossed, 12),
            (RibSystem::Fixed, Bracing::None, 16),
        ] {
            let mut d = Design::demo();
            d.rib_system = system;
            d.bracing = bracing;
            d.panels = panels;
            let shared = analyze(&d).expect("solves");
            let separate = action_results(&ValidDesign::new(&d).expect("valid")).expect("solves");
            assert!(separate.cases.len() >= 5, "{system:?}: {:?}", separate.cases.len());
            assert_eq!(shared.actions, separate, "{system:?}");
            let names: Vec<&str> = shared.load_cases.iter().map(|c| c.case.as_str()).collect();
            for model in [&shared.frame, &shared.bare_rib] {
                let own: Vec<&str> = model.model.load_cases.iter().map(|c| c.name.as_str()).collect();
                let solved: Vec<&str> = model.solution.cases.iter().map(|c| c.name.as_str()).collect();
                assert_eq!(own, solved, "{system:?}");
                assert!(own.iter().all(|n| names.contains(n)), "{system:?}: {own:?}");
            }
        }
        // the report is kept with the validated design: a second analysis solves no
        // action case again and reports the same
        let d = Design::demo();
        let valid = ValidDesign::new(&d).expect("valid");
        assert!(valid.actions_known().is_none());
        let whole = analyze_valid(&valid).expect("solves");
        assert_eq!(valid.actions_known(), Some(&Ok(whole.actions.clone())));
        assert_eq!(analyze_valid(&valid).expect("solves"), whole);
        // with a previous analysis of the same design (its cases reused), the same
        let fresh = ValidDesign::new(&d).expect("valid");
        assert_eq!(analyze_reusing(&fresh, &[], Some(&whole)).expect("solves"), whole);
        // an action case picked to be shown is in the model once, and the report is as
        // without it
        let picked = action_cases(&d).into_iter().next().expect("an action case");
        let fresh = ValidDesign::new(&d).expect("valid");
        let shown = analyze_with(&fresh, std::slice::from_ref(&picked)).expect("solves");
        assert_eq!(shown.actions, whole.actions);
        let times = shown.frame.model.load_cases.iter().filter(|c| c.name == picked.name).count();
        assert_eq!(times, 1, "{}", picked.name);
    }

    #[test]
    fn demo_analysis_reports_every_model() {
        let a = analyze(&Design::demo()).expect("demo");
        assert_eq!(a.form.basis_name(), "panel loads");
        assert!(a.form.iterations >= 2 && a.form.final_change <= a.form.tolerance * a.form.rise);
        let t = a.truss.as_ref().expect("braced");
        assert_eq!(t.determinacy.determinacy, Determinacy::Determinate);
        assert!(t.bracing_ratio.is_some_and(|r| r < 1e-9));
        // rib moments are reported at every rib node
        let r = &a.residual_rib_moments;
        assert_eq!(r.nodes.len(), a.form.rib.len());
        // three hinges: zero moment at the crown hinge and the springings
        for k in [0, a.form.crown_node, r.nodes.len() - 1] {
            assert!(r.nodes[k].m.abs() < 1e-9 * r.thrust_times_rise);
        }
        // The frame's rib departs from the funicular (the deck is continuous and, with the
        // bracing, carries part of the load to the seats and piers; the rib's weight acts
        // between nodes, not lumped at them). How far is checked against the statics of
        // the three-hinged rib under the forces it receives, which gives every moment
        // (below), and the scale against its definition:
        assert_eq!(r.thrust_times_rise, a.form.thrust * a.form.rise);
        let statics = three_hinged_rib_statics(&a);
        let tol = 1e-9 * r.thrust_times_rise;
        for (k, (node, (left, right))) in r.nodes.iter().zip(&statics.nodes).enumerate() {
            for (reported, by_statics) in [(node.left, *left), (node.right, *right)] {
                let (reported, by_statics) = (reported.unwrap_or(0.0), by_statics.unwrap_or(0.0));
                assert!((reported - by_statics).abs() < tol, "node {k}: {reported} vs {by_statics} kNm");
            }
        }
        let case = a.frame.solution.case(DEAD).expect("dead");
        for (r_member, (&k, along)) in a.frame.map.rib_members.iter().zip(&statics.stations).enumerate() {
            for (station, &by_statics) in case.members[k].stations.iter().zip(along) {
                let m = station.forces.m;
                assert!(
                    (m - by_statics).abs() < tol,
                    "rib member {r_member} at {} m: {m} vs {by_statics}",
                    station.s
                );
            }
        }
        let largest =
            statics.nodes.iter().flat_map(|(l, r)| [*l, *r]).flatten().chain(statics.stations.concat());
        let largest = largest.fold(0.0, |a: f64, m| a.max(m.abs()));
        assert!((r.max_abs - largest).abs() < tol, "largest rib moment {} vs {largest} kNm", r.max_abs);
        assert!((r.relative - largest / r.thrust_times_rise).abs() < 1e-9);
        // Its size, against the middle-third rule: a rib found as the funicular of its
        // dead load keeps the dead-load line of pressure inside the middle third of its
        // depth, |M| <= |N| d / 6 at every section (Heyman, The Stone Skeleton, ch. 2;
        // common practice for a funicular rib). The demo is well inside (about 0.1 m of
        // the 0.2 m allowed); a reported moment many times too large would not be.
        let depth = Design::demo().groups.rib.depth;
        for &k in &a.frame.map.rib_members {
            for st in &case.members[k].stations {
                assert!(st.forces.m.abs() <= st.forces.n.abs() * depth / 6.0, "member {k} at {} m", st.s);
            }
        }
        assert!(a.load_cases[0].thrust_line.as_ref().is_some_and(|t| t.inside_middle_third));
    }

    /// Sagging moments of the frame model's three-hinged rib under dead load by statics
    /// alone: the forces the rib receives at its nodes (applied loads, and the end actions
    /// of every other member there, from the solver) and its own weight along its members;
    /// the springing reactions follow from the two hinge conditions, zero moment at the
    /// crown hinge and about the right springing (statics of a three-hinged arch; any
    /// structural analysis text). Neither the solver's rib moments nor its reactions are
    /// used.
    struct RibStatics {
        /// Per rib node, the moment just left and just right of it, kNm (`None` beyond the
        /// springings).
        nodes: Vec<(Option<f64>, Option<f64>)>,
        /// Per rib member (left to right), the moment at each of its stations, kNm.
        stations: Vec<Vec<f64>>,
    }

    fn three_hinged_rib_statics(a: &Analysis) -> RibStatics {
        let (model, map) = (&a.frame.model, &a.frame.map);
        let case = a.frame.solution.case(DEAD).expect("dead");
        let lc = model.load_cases.iter().find(|l| l.name == DEAD).expect("dead case");
        let pos = |n: usize| (model.nodes[n].x, model.nodes[n].y);
        let on_rib = |k: usize| map.rib_members.contains(&k);
        // what the rib receives at each rib node: (fx, fy, couple), kN and kNm
        let received: Vec<(f64, f64, f64)> = map
            .rib_nodes
            .iter()
            .map(|&n| {
                let mut f = (0.0, 0.0, 0.0);
                for l in lc.nodal.iter().filter(|l| l.node == n) {
                    f = (f.0 + l.fx, f.1 + l.fy, f.2 + l.mz);
                }
                for (k, mf) in case.members.iter().enumerate().filter(|(k, _)| !on_rib(*k)) {
                    let e = &mf.end_actions_global;
                    for (end, node) in [(0, model.members[k].start), (3, model.members[k].end)] {
                        if node == n {
                            f = (f.0 - e[end], f.1 - e[end + 1], f.2 - e[end + 2]);
                        }
                    }
                }
                f
            })
            .collect();
        // the rib's own weight: uniform, vertical, per metre of member (the generator's
        // only load on rib members)
        let weight: Vec<f64> = map
            .rib_members
            .iter()
            .map(|&k| {
                lc.member
                    .iter()
                    .filter(|l| l.member() == k)
                    .map(|l| match *l {
                        MemberLoad::Uniform {
                            w,
                            direction: LoadDirection::GlobalY,
                            projected: false,
                            ..
                        } => w,
                        other => panic!("rib member {k}: unexpected load {other:?}"),
                    })
                    .sum()
            })
            .collect();
        let rib: Vec<(f64, f64)> = map.rib_nodes.iter().map(|&n| pos(n)).collect();
        // anticlockwise moment about q of what acts on the rib left of a cut: the forces at
        // nodes 0..nodes, the whole weight of members 0..members, and the first `part` m of
        // member `members` (the springing reaction apart)
        let left_of = |q: (f64, f64), nodes: usize, members: usize, part: f64| -> f64 {
            let moment = |p: (f64, f64), fx: f64, fy: f64| (p.0 - q.0) * fy - (p.1 - q.1) * fx;
            let mut m = 0.0;
            for (r, f) in received.iter().enumerate().take(nodes) {
                m += moment(rib[r], f.0, f.1) + f.2;
            }
            let piece = |r: usize, length: f64| {
                let (p, e) = (rib[r], rib[r + 1]);
                let l = (e.0 - p.0).hypot(e.1 - p.1);
                let t = 0.5 * length / l;
                moment((p.0 + t * (e.0 - p.0), p.1 + t * (e.1 - p.1)), 0.0, weight[r] * length)
            };
            for r in 0..members {
                let (p, e) = (rib[r], rib[r + 1]);
                m += piece(r, (e.0 - p.0).hypot(e.1 - p.1));
            }
            if part > 0.0 {
                m += piece(members, part);
            }
            m
        };
        let last = rib.len() - 1;
        let (spring, crown, right) = (rib[0], rib[a.form.crown_node], rib[last]);
        // hinge conditions for the left reaction (h, v): about the crown hinge with what
        // lies left of it, and about the right springing with everything
        let arm = |q: (f64, f64)| (spring.0 - q.0, -(spring.1 - q.1)); // coefficients of v and h
        let (c1, c2) = (arm(crown), arm(right));
        let (r1, r2) = (
            -left_of(crown, a.form.crown_node, a.form.crown_node, 0.0),
            -left_of(right, last + 1, last, 0.0),
        );
        let det = c1.0 * c2.1 - c1.1 * c2.0;
        let v = (r1 * c2.1 - c1.1 * r2) / det;
        let h = (c1.0 * r2 - r1 * c2.0) / det;
        let sagging = |q: (f64, f64), nodes: usize, members: usize, part: f64| {
            let (cv, ch) = arm(q);
            -(left_of(q, nodes, members, part) + cv * v + ch * h)
        };
        let nodes = (0..=last)
            .map(|r| {
                let left = (r > 0).then(|| sagging(rib[r], r, r, 0.0));
                let right = (r < last).then(|| sagging(rib[r], r + 1, r, 0.0));
                (left, right)
            })
            .collect();
        let stations = map
            .rib_members
            .iter()
            .enumerate()
            .map(|(r, &k)| {
                let (p, e) = (rib[r], rib[r + 1]);
                let l = (e.0 - p.0).hypot(e.1 - p.1);
                case.members[k]
                    .stations
                    .iter()
                    .map(|st| {
                        let t = st.s / l;
                        let q = (p.0 + t * (e.0 - p.0), p.1 + t * (e.1 - p.1));
                        // at the end node the section lies just before it: the node's own
                        // forces act after it
                        sagging(q, r + 1, r, st.s)
                    })
                    .collect()
            })
            .collect();
        RibStatics { nodes, stations }
    }

    #[test]
    fn analyze_validates_once() {
        VALIDATIONS.with(|v| v.set(0));
        let mut d = Design::demo();
        analyze(&d).expect("demo");
        d.bracing = Bracing::Crossed;
        d.rib_system = RibSystem::TwoHinged;
        analyze(&d).expect("crossed");
        assert_eq!(VALIDATIONS.with(|v| v.get()), 2);
    }

    #[test]
    fn two_hinged_crown_shared_frees_both_seats() {
        let mut d = Design::demo();
        d.rib_system = RibSystem::TwoHinged;
        d.crown = Crown::Level { level: 99.5 }; // 0.5 m under the deck: shared
        let a = analyze(&d).expect("valid");
        assert!(a.form.rib[a.form.crown_node].shared_with_deck);
        assert!(!a.restraint.left_seat_fixed && !a.restraint.right_seat_fixed);
        assert_eq!(a.restraint.held_by, DeckHold::SharedCrownNode);
        d.crown = Crown::Level { level: 96.0 };
        let a = analyze(&d).expect("valid");
        assert!(a.restraint.left_seat_fixed && !a.restraint.right_seat_fixed);
    }

    /// Regression: at a rib node shared with the deck the rib moment jumps; the residual
    /// moments reported the left side and the thrust line the right (a symmetric
    /// two-hinged unbraced design with 7 panels and unequal approach piers showed
    /// -592.5 kNm against -36.4 kNm at one node). Both sides are now reported and the
    /// larger governs.
    #[test]
    fn shared_node_moments_report_both_sides() {
        let mut d = Design::demo();
        d.rib_system = RibSystem::TwoHinged;
        d.bracing = Bracing::None;
        d.panels = 7;
        d.springing_right_level = 76.0;
        d.crown = Crown::Level { level: 99.5 };
        d.approach_piers_left = 0;
        d.approach_piers_right = 2;
        let a = analyze(&d).expect("valid");
        let shared: Vec<&RibMoment> = a
            .form
            .rib
            .iter()
            .zip(&a.residual_rib_moments.nodes)
            .filter(|(n, _)| n.shared_with_deck)
            .map(|(_, m)| m)
            .collect();
        assert!(!shared.is_empty(), "the crown node is shared");
        let jump =
            shared.iter().map(|m| (m.left.unwrap_or(0.0) - m.right.unwrap_or(0.0)).abs()).fold(0.0, f64::max);
        assert!(jump > 1.0, "the deck joins with a moment: jump {jump} kNm");
        for m in &shared {
            let (l, r) = (m.left.unwrap_or(0.0), m.right.unwrap_or(0.0));
            assert_eq!(m.m.abs(), l.abs().max(r.abs()));
        }
        // the dead-load thrust line is checked on both sides of every node: its sections
        // give the same two moments (N e from the forces the rib receives, independent
        // of the solver's end moments)
        let line = a.load_cases[0].thrust_line.as_ref().expect("thrust line");
        let scale = a.residual_rib_moments.max_abs;
        for (k, m) in a.residual_rib_moments.nodes.iter().enumerate() {
            if let (Some(l), Some(section)) = (m.left, line.left_of[k]) {
                assert!((section.moment - l).abs() < 1e-6 * scale, "left of node {k}");
            }
            if let Some(r) = m.right {
                assert!((line.sections[k].moment - r).abs() < 1e-6 * scale, "right of node {k}");
            }
        }
    }
}
