//! The app's state: one design signal (the last good design), the analysis derived from it,
//! the problems of the last refused edit, and what the pointer is over. Plain data and small
//! helpers, shared through context.

use crate::format::Units;
use crate::timing::{timed, Step};
use leptos::prelude::*;
use springline_statics::arch::analysis::{analyze_to, drawn_case, figures_of, Extent, FigureNote};
use springline_statics::arch::cases::{standard_cases, CaseSpec, Pattern};
use springline_statics::arch::design::Warning;
use springline_statics::arch::edit::{Drag, DragStop, Snapping};
use springline_statics::arch::readout::MemberKey;
use springline_statics::arch::sizing::SizeReport;
use springline_statics::error::{Field, Location, StaticsError};
use springline_statics::scene::envelope::Basis;
use springline_statics::scene::vehicle::{start_position, travel, vehicle_case, VehicleOnDeck};
use springline_statics::{Analysis, Design, ModelKind, ValidDesign};
use std::sync::Arc;

/// The analysis of the current design, or the engine's error when there is none.
pub type Outcome = Result<Arc<Analysis>, StaticsError>;

/// An edit the engine refused: the field the user edited and the engine's error, kept typed
/// so every field can pick out the problems that involve it.
#[derive(Debug, Clone, PartialEq)]
pub struct Refusal {
    /// The field the user edited.
    pub edited: Field,
    /// Why the engine refused the edited design.
    pub error: StaticsError,
    /// The design refused (a rise over the largest is told the largest rise).
    pub candidate: Design,
}

impl Refusal {
    /// The messages to show beside `field`, in the engine's order: every problem beside the
    /// edited field (those tied to no field too), elsewhere the problems that involve
    /// `field`. An error that is not a list of problems (a mechanism, no convergence) is
    /// shown whole beside the edited field; an out-of-range number also beside its field.
    /// The valley as a whole repeats nothing when one of its points was edited: that
    /// point already shows every problem, in the same panel.
    pub fn messages_for(&self, field: Field) -> Vec<String> {
        if field == Field::Valley && matches!(self.edited, Field::ValleyPoint(_)) {
            return Vec::new();
        }
        let everything = field == self.edited;
        match &self.error {
            StaticsError::Invalid(problems) => problems
                .iter()
                .filter(|p| everything || p.involves(field))
                .map(|p| shown(&p.location, &p.message))
                .collect(),
            StaticsError::OutOfRange { location, message }
                if everything || *location == Location::Field(field) =>
            {
                vec![shown(location, message)]
            }
            other if everything => vec![other.to_string()],
            _ => Vec::new(),
        }
    }
}

/// A problem's message as shown beside a field: a design field's message speaks for itself
/// (the field's label is already on screen beside it); any other place is named first, in
/// words (`Location`'s Display, never a file path).
fn shown(location: &Location, message: &str) -> String {
    match location {
        Location::Field(_) => message.to_string(),
        other => format!("{other}: {message}"),
    }
}

/// The member of the truss idealisation under the pointer, in either canvas.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Hovered(pub Option<usize>);

/// The value being dragged and where the pointer is, for the readout the elevation draws
/// beside it.
#[derive(Debug, Clone, PartialEq)]
pub struct DragReading {
    /// What the drag sets, in words and display units ("rise 19.50 m", "leading axle at
    /// x = 42.00 m").
    pub text: String,
    /// The pointer, CSS pixels of the elevation canvas.
    pub at: (f64, f64),
}

/// The validated design, or the engine's error when the design does not validate.
pub type Validated = Result<Arc<ValidDesign>, StaticsError>;

/// The analysis of `valid` with the vehicle's case after the standard ones when a vehicle
/// stands on the deck (leading axle at `vehicle`, m), else its standard cases alone
/// (`arch::analysis::analyze_reusing`, `scene::vehicle::vehicle_case`). The validation (and
/// its form finding) is not repeated: a move of the vehicle costs the solves alone.
///
/// `extra`: further cases after the standard ones (a pattern, an action, the governing
/// placements of a picked line), before the vehicle's.
///
/// `previous`: the analysis on screen, whose figures of unchanged cases are kept rather
/// than drawn again (`arch::analysis::analyze_reusing`: a vehicle move draws its own
/// case's figures only).
///
/// `extent`: how far it is worked out (`arch::analysis::Extent`; see `extent_of`).
pub fn analyse(
    valid: &ValidDesign,
    vehicle: Option<f64>,
    extra: &[CaseSpec],
    previous: Option<&Analysis>,
    extent: Extent,
) -> Result<Analysis, StaticsError> {
    let mut cases = extra.to_vec();
    if let Some(x) = vehicle {
        cases.push(vehicle_case(valid, x)?);
    }
    analyze_to(valid, &cases, previous, extent)
}

/// Whether a newly computed outcome differs from the last: a different analysis
/// (another `Arc`) always does; two errors when their messages differ.
fn analysis_changed(old: Option<&Outcome>, new: Option<&Outcome>) -> bool {
    match (old, new) {
        (Some(Ok(a)), Some(Ok(b))) => !Arc::ptr_eq(a, b),
        (Some(Err(a)), Some(Err(b))) => a != b,
        _ => true,
    }
}

/// A design checked by [`AppState::check`]: its validation, and its analysis with the
/// vehicle where it stood then and how far it was worked out, kept for the memos.
type Checked = (Design, Arc<ValidDesign>, Option<f64>, Extent, Arc<Analysis>);

/// Everything the components share.
#[derive(Clone, Copy)]
pub struct AppState {
    /// The last good design: only designs that analyse are ever stored here.
    pub design: RwSignal<Design>,
    /// Its validation (layout and form finding), memoised apart from the analysis so a
    /// move of the vehicle does not repeat it.
    pub valid: Memo<Validated>,
    /// The leading axle's x (m) of the load model's vehicle on the deck, when the user has
    /// chosen the vehicle; not part of the design (no undo step, no design link change).
    pub vehicle: RwSignal<Option<f64>>,
    /// Its analysis (with the vehicle's case last when a vehicle is on the deck), memoised.
    /// After an edit it carries the figures (force diagram, rib funicular, thrust line) of
    /// the case shown then alone (`Extent::Screen`): what reads the figures reads `drawn`.
    /// It does not follow the case shown (the effects that choose a case follow it).
    pub analysis: Memo<Outcome>,
    /// `analysis` with the figures of the case shown (`case`), worked out when they are
    /// missing (`arch::analysis::figures_of`): the same analysis when they are there.
    pub drawn: Memo<Outcome>,
    /// The truss member under the pointer.
    pub hovered: RwSignal<Hovered>,
    /// The member under the pointer or the keyboard, in any model (the readout's member);
    /// kept in step with `hovered` by [`AppState::hover`] and [`AppState::focus_member`].
    pub focus: RwSignal<Option<MemberKey>>,
    /// The model the elevation draws (frame model, or the truss idealisation where the
    /// design has one).
    pub elevation_model: RwSignal<ModelKind>,
    /// Display units.
    pub units: RwSignal<Units>,
    /// Bumped when the window is resized, so canvases redraw.
    pub resized: RwSignal<u32>,
    /// Designs before the current one (undo), oldest first.
    pub past: RwSignal<Vec<Design>>,
    /// Designs undone (redo), most recent last.
    pub future: RwSignal<Vec<Design>>,
    /// A page-level message (a link that could not be opened); a drag that stops says why
    /// in the status line instead (`drag_stop`).
    pub notice: RwSignal<Option<String>>,
    /// The load case shown in the drawings (index into `Analysis::load_cases`).
    pub case: RwSignal<usize>,
    /// True while a point of the elevation is being dragged (the force diagram keeps its
    /// scale meanwhile, so a change of thrust shows as a change of size).
    pub dragging: RwSignal<bool>,
    /// The last refused edit, until the next edit succeeds, an undo or redo, or a new
    /// design from a link; every field shows the problems that involve it.
    pub refused: RwSignal<Option<Refusal>>,
    /// Why the last drag stopped short of the pointer, in words, for the status line;
    /// cleared when the design is valid at the pointer again or another edit succeeds.
    pub drag_stop: RwSignal<Option<String>>,
    /// While dragging: the value being set and where the pointer is.
    pub drag_reading: RwSignal<Option<DragReading>>,
    /// The traffic envelopes of the frame model with the design they are for, worked out
    /// in the background worker once edits pause and not while dragging
    /// (`crate::settled`); `None` until the first.
    pub traffic: RwSignal<Option<Arc<(Design, TrafficOutcome)>>>,
    /// The dead load's buckling and natural frequencies (`arch::stability::arch_stability`)
    /// with the design they are for, worked out with the traffic envelopes
    /// (`crate::settled`); `None` until the first.
    pub stability: RwSignal<Option<Arc<(Design, StabilityOutcome)>>>,
    /// Which mode shape is drawn over the elevation, on request.
    pub mode_view: RwSignal<ModeView>,
    /// The traffic envelope is shown on the elevation (the load picker's "Envelope").
    pub envelope: RwSignal<bool>,
    /// The sizing view is shown (the load picker's "Sizes"): member utilisations and
    /// thrust blocks on the elevation, the sizing panel under the drawings.
    pub sizes: RwSignal<bool>,
    /// The size report (`arch::sizing::size_design`) with the design it is for, worked
    /// out with the traffic report once edits pause while the sizing view is on
    /// (`crate::settled`); `None` until the first.
    pub sized: RwSignal<Option<Arc<(Design, SizedOutcome)>>>,
    /// The sizing view's report of the design on screen: `sized` when it is for that
    /// design, waiting otherwise, off while the view is off.
    pub size_report: Memo<SizeView>,
    /// What the envelope shows: characteristic traffic or a combination's design values.
    pub basis: RwSignal<Basis>,
    /// The influence line picked (a frame model line name, `arch::influence::ArchLine`):
    /// a member clicked on the elevation, or a springing force chosen in the chart panel.
    pub picked: RwSignal<Option<String>>,
    /// Whether the governing placement shown is the largest (true) or the smallest
    /// effect's.
    pub largest: RwSignal<bool>,
    /// A named traffic pattern chosen in the load picker (added to the analysis as an
    /// extra case).
    pub pattern: RwSignal<Option<Pattern>>,
    /// One of the other actions chosen in the load picker, by its case id
    /// (`CaseKind::id`: `temperature-rise`, `erection`, ...), added as an extra case.
    pub action: RwSignal<Option<String>>,
    /// Extra load cases for the design they were built for (a pattern, an action, the
    /// governing placements of the picked line): the analysis includes them while that
    /// design is shown (`components::envelope::install`).
    pub extra: RwSignal<Option<Arc<ExtraCases>>>,
    /// True while the load model's vehicle is dragged along the deck (not a design edit:
    /// `dragging` stays false, so nothing says the results are for an earlier design).
    pub vehicle_dragging: RwSignal<bool>,
    /// The design the panels show: `design`, except that while a point or the vehicle is
    /// dragged it holds the design from before the drag and follows when the drag ends.
    /// The drawings and the value drawn beside the pointer follow every move (the status
    /// line too, except for the vehicle's position); the panels' many elements, redrawn per
    /// move, took most of a move's time.
    pub settled_design: Memo<Design>,
    /// `valid` as the panels show it, held like `settled_design`.
    pub settled_valid: Memo<Validated>,
    /// `analysis` as the panels show it, held like `settled_design`.
    pub settled_analysis: Memo<Outcome>,
    /// `drawn`, held while a drag is on (as `settled_analysis`).
    pub settled_drawn: Memo<Outcome>,
    /// `size_report` as the sizing panel shows it, held like `settled_design`.
    pub settled_size_report: Memo<SizeView>,
    /// The warnings of `settled_valid` (none when it failed), set only when they change:
    /// the many fields that show the warnings about them are not woken by every edit.
    pub settled_warnings: Signal<Vec<Warning>>,
    /// What follows `settled_design` on its own signal ([`AppState::design_value`]).
    followers: StoredValue<Followers>,
    /// The analysis just computed for a design about to be set, so the memo does not
    /// compute it a second time.
    checked: StoredValue<Option<Checked>>,
}

/// `source`'s value, except while `moving` is true: then the value from before stays (and
/// `source` is not even read, so its changes wake nothing). `changed` tells a new value
/// from the last.
pub(crate) fn held<T: Clone + Send + Sync + 'static>(
    moving: impl Fn() -> bool + Send + Sync + 'static,
    source: impl Fn() -> T + Send + Sync + 'static,
    changed: fn(Option<&T>, Option<&T>) -> bool,
) -> Memo<T> {
    Memo::new_with_compare(
        move |previous: Option<&T>| match previous {
            Some(p) if moving() => p.clone(),
            _ => source(),
        },
        changed,
    )
}

/// How far an analysis is worked out: while a drag is on, the drawings of case `shown()`
/// alone; otherwise everything but the other cases' figures (`Extent::Screen`, the case
/// from `shown_untracked()`). The shown case is tracked only while a drag is on, so a
/// memo calling this follows the case only then (the case is set in effects that follow
/// the analysis: tracked always, the two would wake each other); the figures of a case
/// shown later are worked out by the `drawn` memo.
fn extent_of(moving: bool, shown: impl FnOnce() -> usize, shown_untracked: impl FnOnce() -> usize) -> Extent {
    if moving {
        Extent::Drawing { shown: shown() }
    } else {
        Extent::Screen { shown: shown_untracked() }
    }
}

/// Whether an analysis worked out to `had` serves where one to `wanted` is asked: a
/// whole one serves any; one for the screen serves the screen and a drag (a case's
/// missing figures are worked out when it is shown); one for a drag only the same drag.
fn serves(had: Extent, wanted: Extent) -> bool {
    match (had, wanted) {
        (Extent::Whole, _) | (Extent::Screen { .. }, Extent::Screen { .. } | Extent::Drawing { .. }) => true,
        (had, wanted) => had == wanted,
    }
}

/// Whether a validation differs from the last: another `Arc`, or another error.
fn validation_changed(old: Option<&Validated>, new: Option<&Validated>) -> bool {
    match (old, new) {
        (Some(Ok(a)), Some(Ok(b))) => !Arc::ptr_eq(a, b),
        (Some(Err(a)), Some(Err(b))) => a != b,
        _ => true,
    }
}

/// The sizing view's report.
#[derive(Debug, Clone, PartialEq)]
pub enum SizeView {
    /// The view is off: nothing computed.
    Off,
    /// The traffic report of the design on screen is not ready yet.
    Waiting,
    /// The engine's size report.
    Ready(Arc<SizeReport>),
    /// Why the design cannot be sized, in the engine's words.
    Failed(String),
}

pub use springline_worker::{StabilityOutcome, TrafficOutcome};

/// A size report as the page keeps it (shared, not copied, by every view of it), or the
/// engine's error in words.
pub type SizedOutcome = Result<Arc<SizeReport>, String>;

/// The sizing view of a size report, or of the reason there is none.
pub fn size_view(outcome: &SizedOutcome) -> SizeView {
    match outcome {
        Ok(r) => SizeView::Ready(r.clone()),
        Err(e) => SizeView::Failed(e.clone()),
    }
}

/// Which mode shape the elevation shows over the members.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum ModeView {
    /// None: the elevation as the other views draw it.
    #[default]
    Off,
    /// The arch's lowest buckled shape under the dead load.
    Buckled,
    /// The first mode of free vibration.
    Vibration,
}

/// Extra load cases and the design they were built for.
pub type ExtraCases = (Design, Vec<CaseSpec>);

/// How many steps undo keeps.
pub const HISTORY_LIMIT: usize = 200;

impl AppState {
    /// State holding `design`.
    pub fn new(design: Design) -> Self {
        let design = RwSignal::new(design);
        let vehicle = RwSignal::new(None::<f64>);
        let extra = RwSignal::new(None::<Arc<ExtraCases>>);
        let checked = StoredValue::new(None::<Checked>);
        // the design and vehicle of the analysis on screen (plain, without extra cases) and
        // how far it was worked out
        let last = StoredValue::new(None::<((Design, Option<f64>), Extent)>);
        let dragging = RwSignal::new(false);
        let vehicle_dragging = RwSignal::new(false);
        // a point or the vehicle is being dragged (tracked)
        let moving = move || dragging.get() || vehicle_dragging.get();
        let case = RwSignal::new(0usize);
        let valid = Memo::new(move |shown: Option<&Validated>| {
            design.with(|d| {
                let cached =
                    checked.with_value(|c| c.as_ref().filter(|(cd, ..)| cd == d).map(|(_, v, ..)| v.clone()));
                match cached {
                    Some(v) => Ok(v),
                    None => {
                        let previous = shown.and_then(|v| v.as_ref().ok()).map(|v| &**v);
                        timed(Step::Compute, || ValidDesign::new_after(d, previous).map(Arc::new))
                    }
                }
            })
        });
        // a new analysis is a change: comparing two analyses field by field would cost a
        // good part of a vehicle move's budget, and a new one is computed only when its
        // inputs changed
        let analysis = Memo::new_with_compare(
            move |shown: Option<&Outcome>| {
                let previous = shown.and_then(|o| o.as_ref().ok()).map(|a| &**a);
                let x = vehicle.get();
                // while a drag is on, the drawings of the shown case alone
                let extent = extent_of(moving(), || case.get(), || case.get_untracked());
                let v = valid.get()?;
                // extra cases built for this very design: analysed with them
                let extra = extra.get();
                let extra = design.with_untracked(|d| {
                    extra.as_ref().filter(|e| e.0 == *d && !e.1.is_empty()).map(|e| e.1.clone())
                });
                if let Some(cases) = extra {
                    last.set_value(None);
                    return timed(Step::Compute, || analyse(&v, x, &cases, previous, extent).map(Arc::new));
                }
                // the analysis on screen when it is of this design and vehicle and worked out
                // far enough (a press and release that moved nothing keeps it, and so the
                // panels), else the one `check` just computed, else a new one
                let key = design.with_untracked(|d| (d.clone(), x));
                let serves = |e: Extent| serves(e, extent);
                let kept = last.with_value(|l| {
                    l.as_ref().filter(|(k, e)| *k == key && serves(*e)).and_then(|_| shown.cloned())
                });
                let cached = || {
                    checked.with_value(|c| {
                        c.as_ref()
                            .filter(|(cd, _, cx, ce, _)| *cd == key.0 && *cx == x && serves(*ce))
                            .map(|(.., ce, a)| (a.clone(), *ce))
                    })
                };
                let (outcome, worked_out) = match (kept, cached()) {
                    (Some(Ok(a)), _) => (Ok(a), last.with_value(|l| l.as_ref().map_or(extent, |l| l.1))),
                    (_, Some((a, e))) => (Ok(a), e),
                    _ => {
                        (timed(Step::Compute, || analyse(&v, x, &[], previous, extent).map(Arc::new)), extent)
                    }
                };
                last.set_value(Some((key, worked_out)));
                outcome
            },
            analysis_changed,
        );
        // the figures of the case shown: an edit's analysis has that case's alone
        // (`Extent::Screen`), and another case's are worked out when it is shown
        let drawn = Memo::new_with_compare(
            move |_: Option<&Outcome>| {
                let shown = case.get();
                let outcome = analysis.get();
                let Ok(a) = &outcome else { return outcome };
                let index = drawn_case(shown, a.load_cases.len());
                let undrawn =
                    a.load_cases.get(index).is_some_and(|c| c.notes.contains(&FigureNote::NotDrawn));
                let figures = undrawn
                    .then(|| timed(Step::Compute, || design.with_untracked(|d| figures_of(a, d, index))))
                    .flatten();
                match figures {
                    Some(figures) => {
                        let mut filled = (**a).clone();
                        filled.load_cases[index] = figures;
                        Ok(Arc::new(filled))
                    }
                    None => outcome,
                }
            },
            analysis_changed,
        );
        let settled_design = held(moving, move || design.get(), |old, new| old != new);
        let settled_valid = held(moving, move || valid.get(), validation_changed);
        let settled_analysis = held(moving, move || analysis.get(), analysis_changed);
        let settled_drawn = held(moving, move || drawn.get(), analysis_changed);
        let settled_warnings = RwSignal::new(Vec::new());
        Effect::new(move |_| {
            let now =
                settled_valid.with(|v| v.as_ref().map_or_else(|_| Vec::new(), |v| v.warnings().to_vec()));
            if settled_warnings.with_untracked(|w| *w != now) {
                settled_warnings.set(now);
            }
        });
        let followers = StoredValue::new(Followers::default());
        Effect::new(move |_| settled_design.with(|d| followers.with_value(|f| f.follow(d))));
        let traffic = RwSignal::new(None::<Arc<(Design, TrafficOutcome)>>);
        let sizes = RwSignal::new(false);
        let sized = RwSignal::new(None::<Arc<(Design, SizedOutcome)>>);
        let size_report = Memo::new(move |_| {
            if !sizes.get() {
                return SizeView::Off;
            }
            let Some(s) = sized.get() else { return SizeView::Waiting };
            // the report of the design on screen only
            if design.with(|d| *d != s.0) {
                return SizeView::Waiting;
            }
            size_view(&s.1)
        });
        let settled_size_report = held(moving, move || size_report.get(), |old, new| old != new);
        AppState {
            design,
            valid,
            vehicle,
            analysis,
            drawn,
            hovered: RwSignal::new(Hovered(None)),
            focus: RwSignal::new(None),
            elevation_model: RwSignal::new(ModelKind::Frame),
            units: RwSignal::new(Units::Si),
            resized: RwSignal::new(0),
            past: RwSignal::new(Vec::new()),
            future: RwSignal::new(Vec::new()),
            notice: RwSignal::new(None),
            case,
            dragging,
            refused: RwSignal::new(None),
            drag_stop: RwSignal::new(None),
            drag_reading: RwSignal::new(None),
            traffic,
            stability: RwSignal::new(None),
            mode_view: RwSignal::new(ModeView::Off),
            envelope: RwSignal::new(false),
            sizes,
            sized,
            size_report,
            basis: RwSignal::new(Basis::Design(0)),
            picked: RwSignal::new(None),
            largest: RwSignal::new(false),
            pattern: RwSignal::new(None),
            action: RwSignal::new(None),
            extra,
            vehicle_dragging,
            settled_design,
            settled_valid,
            settled_analysis,
            settled_drawn,
            settled_size_report,
            settled_warnings: settled_warnings.into(),
            followers,
            checked,
        }
    }

    /// A number of the design as the panels show it (`settled_design`), for an input box:
    /// [`AppState::design_value`] for a number, where a NaN stays a NaN without a set.
    pub fn design_number(&self, get: impl Fn(&Design) -> f64 + Send + Sync + 'static) -> Signal<f64> {
        self.design_part(get, |a, b| a == b || (a.is_nan() && b.is_nan()))
    }

    /// A part of the design as the panels show it (`settled_design`): a signal set only
    /// when that part changes. An edit wakes one effect that reads every registered part,
    /// not one effect per input box or option (a panel-count edit woke some 400 of them,
    /// most to find their part unchanged). The registration ends with the calling
    /// component.
    pub fn design_value<T: PartialEq + Send + Sync + 'static>(
        &self,
        get: impl Fn(&Design) -> T + Send + Sync + 'static,
    ) -> Signal<T> {
        self.design_part(get, T::eq)
    }

    /// [`AppState::design_value`] with `same` telling a part unchanged.
    fn design_part<T: Send + Sync + 'static>(
        &self,
        get: impl Fn(&Design) -> T + Send + Sync + 'static,
        same: fn(&T, &T) -> bool,
    ) -> Signal<T> {
        let value = RwSignal::new(self.settled_design.with_untracked(&get));
        self.follow_design(move |d| {
            let now = get(d);
            if value.try_with_untracked(|v| !same(v, &now)) == Some(true) {
                value.set(now);
            }
        });
        value.into()
    }

    /// Registers `follow`, run with each new `settled_design`, until the calling
    /// component ends.
    fn follow_design(&self, follow: impl Fn(&Design) + Send + Sync + 'static) {
        let followers = self.followers;
        let id = followers.try_update_value(|f| f.add(Box::new(follow))).unwrap_or(0);
        on_cleanup(move || {
            let _ = followers.try_update_value(|f| f.remove(id));
        });
    }

    /// Applies `edit` (a change of design field `field`) to a copy of the design and keeps
    /// it only if it analyses. Otherwise records the refusal (shown beside every field it
    /// involves), returns the engine's error and leaves the design (and the screen) as it
    /// was.
    pub fn try_edit(&self, field: Field, edit: impl FnOnce(&mut Design)) -> Result<(), StaticsError> {
        let mut candidate = self.design.get_untracked();
        edit(&mut candidate);
        if let Err(error) = self.check(&candidate) {
            self.refused.set(Some(Refusal { edited: field, error: error.clone(), candidate }));
            return Err(error);
        }
        self.commit(candidate);
        Ok(())
    }

    /// Analyses `design`, keeping the result for the memo; the engine's error if it does
    /// not analyse.
    ///
    /// While a drag is on, only the shown case's figures are worked out (what the memo
    /// asks for then); the screen's analysis follows when the drag ends. Otherwise every
    /// case is solved and the shown case's figures drawn (`Extent::Screen`).
    pub fn check(&self, design: &Design) -> Result<(), StaticsError> {
        let x = self.vehicle.get_untracked();
        let extent =
            extent_of(self.moving_untracked(), || self.case.get_untracked(), || self.case.get_untracked());
        // the design on screen, whose lanes the new one may share
        let previous = self.valid.get_untracked().ok();
        let (valid, analysis) = timed(Step::Compute, || {
            let valid = ValidDesign::new_after(design, previous.as_deref())?;
            let analysis = analyse(&valid, x, &[], None, extent)?;
            Ok::<_, StaticsError>((valid, analysis))
        })?;
        self.checked.set_value(Some((design.clone(), Arc::new(valid), x, extent, Arc::new(analysis))));
        Ok(())
    }

    /// Whether a point or the vehicle is being dragged (not tracked).
    pub fn moving_untracked(&self) -> bool {
        self.dragging.get_untracked() || self.vehicle_dragging.get_untracked()
    }

    /// The vehicle on the deck (its axles and total), when one is chosen and the design
    /// validates.
    pub fn vehicle_on_deck(&self) -> Option<VehicleOnDeck> {
        let x = self.vehicle.get()?;
        self.valid.with(|v| VehicleOnDeck::from_case(&vehicle_case(v.as_ref().ok()?, x).ok()?))
    }

    /// Puts the load model's vehicle on the deck at the left quarter of the arch span and
    /// shows its case (the last of the analysis). Nothing when the design does not
    /// validate or a vehicle is already on the deck (it stays where it is).
    pub fn choose_vehicle(&self) {
        if self.vehicle.get_untracked().is_some() {
            return;
        }
        let Some(x) = self.valid.with_untracked(|v| v.as_ref().ok().map(|v| start_position(v))) else {
            return;
        };
        self.clear_choices();
        // the case first, then the analysis it indexes into: an effect that follows the
        // case's id (the link) then reads the vehicle's case (after the analysis's own)
        let standard = self.valid.with_untracked(|v| v.as_ref().map_or(0, |v| standard_cases(v).len() + 1));
        self.case.set(standard);
        self.vehicle.set(Some(x));
    }

    /// Shows load case `index` of the analysis without a vehicle (the vehicle, if any,
    /// leaves the deck: its case is the last, so `index` points at the same case after).
    pub fn choose_case(&self, index: usize) {
        self.clear_choices();
        self.case.set(index);
        if self.vehicle.get_untracked().is_some() {
            self.vehicle.set(None);
        }
    }

    /// Takes back the load picker's other choices (a pattern, an action, the envelope,
    /// the sizes, a mode shape), so one choice holds at a time.
    pub fn clear_choices(&self) {
        if self.pattern.with_untracked(Option::is_some) {
            self.pattern.set(None);
        }
        if self.action.with_untracked(Option::is_some) {
            self.action.set(None);
        }
        if self.envelope.get_untracked() {
            self.envelope.set(false);
        }
        if self.sizes.get_untracked() {
            self.sizes.set(false);
        }
        if self.mode_view.get_untracked() != ModeView::Off {
            self.mode_view.set(ModeView::Off);
        }
    }

    /// Draws mode `view` over the elevation (the dead-load elevation under it), one
    /// choice of the load picker like the others.
    pub fn choose_mode(&self, view: ModeView) {
        self.choose_case(0);
        self.mode_view.set(view);
    }

    /// Moves the vehicle's leading axle to `x` (m), kept within its travel (the arch span,
    /// plus its length so that it can enter and leave: `scene::vehicle::travel`); returns
    /// the x it stands at, `None` when no vehicle is chosen or the design does not
    /// validate. Not a design edit: no undo step.
    pub fn move_vehicle(&self, x: f64) -> Option<f64> {
        self.vehicle.get_untracked()?;
        let length = self.vehicle_on_deck_untracked().map_or(0.0, |c| c.length());
        let (lo, hi) = self.valid.with_untracked(|v| v.as_ref().ok().map(|v| travel(v, length)))?;
        let x = if x.is_finite() { x.clamp(lo, hi) } else { lo };
        if self.vehicle.get_untracked() != Some(x) {
            self.vehicle.set(Some(x));
        }
        Some(x)
    }

    fn vehicle_on_deck_untracked(&self) -> Option<VehicleOnDeck> {
        let x = self.vehicle.get_untracked()?;
        self.valid.with_untracked(|v| VehicleOnDeck::from_case(&vehicle_case(v.as_ref().ok()?, x).ok()?))
    }

    /// The length of one panel of the arch span, m (the vehicle's step with Shift held),
    /// `None` when the design does not validate.
    pub fn panel_length(&self) -> Option<f64> {
        self.valid.with_untracked(|v| {
            let f = v.as_ref().ok()?.layout();
            (f.panels > 0).then(|| f.span() / f.panels as f64)
        })
    }

    /// Forgets the last refused edit (its messages leave the fields) and why the last
    /// drag stopped (the status line clears).
    pub fn clear_refusal(&self) {
        // only when there is one: a drag calls this on every pointer move
        if self.refused.with_untracked(Option::is_some) {
            self.refused.set(None);
        }
        if self.drag_stop.with_untracked(Option::is_some) {
            self.drag_stop.set(None);
        }
    }

    /// Makes `design` current as one undo step (the caller has checked that it analyses);
    /// the last refusal is forgotten, as an edit has now succeeded.
    pub fn commit(&self, design: Design) {
        self.clear_refusal();
        let previous = self.design.get_untracked();
        if previous == design {
            return;
        }
        self.remember(previous);
        self.design.set(design);
    }

    /// Records `previous` as the state undo returns to, and forgets what was undone.
    pub fn remember(&self, previous: Design) {
        self.past.update(|p| {
            p.push(previous);
            if p.len() > HISTORY_LIMIT {
                p.remove(0);
            }
        });
        self.future.update(|f| f.clear());
    }

    /// One step of `drag` (the engine's `edit::Drag::step`): moves its handle of the
    /// current design towards world point (x, y), m, and shows the result without
    /// recording a step (the drag as a whole is recorded once, when it ends). Each design
    /// shown is analysed once (`check` keeps the analysis for the memo). Past a limit the
    /// furthest valid position on the way is shown and the reason returned; the current
    /// design stays when no position is found.
    pub fn drag_step(&self, drag: &mut Drag, x: f64, y: f64, snapping: Snapping) -> Option<DragStop> {
        let from = self.design.get_untracked();
        let step = drag.step(&from, x, y, snapping, |d| self.check(d));
        if step.stop.is_none() {
            self.clear_refusal();
        }
        // the engine analysed the design it returns (through `check`) unless it is `from`
        if step.design != from {
            self.design.set(step.design);
        }
        step.stop
    }

    /// Ends a drag of a point (or of the force diagram's pole) that began on `before`: the
    /// drag's design is analysed whole (during the drag only the drawings' part was worked
    /// out, `Extent::Drawing`) and kept as one undo step; should the whole analysis refuse
    /// it (the action cases are solved apart), the design goes back to `before` and the
    /// status line says why. The panels then follow.
    pub fn end_drag(&self, before: Design) {
        self.dragging.set(false);
        self.drag_reading.set(None);
        let now = self.design.get_untracked();
        if now == before {
            return;
        }
        match self.check(&now) {
            Ok(()) => self.remember(before),
            Err(e) => {
                self.design.set(before);
                self.drag_stop.set(Some(format!("The drag was taken back: {e}.")));
            }
        }
    }

    /// Shows `design` during a drag without recording a step (the drag records one when
    /// it ends), if it analyses; otherwise leaves the design on screen and returns why.
    pub fn show_during_drag(&self, design: Design) -> Result<(), StaticsError> {
        if self.design.with_untracked(|d| *d == design) {
            return Ok(());
        }
        self.check(&design)?;
        self.clear_refusal();
        self.design.set(design);
        Ok(())
    }

    /// Sets the truss member under the pointer (only when it changes, so canvases redraw
    /// once per change, not per pointer move).
    pub fn hover(&self, member: Option<usize>) {
        if self.hovered.get_untracked().0 != member {
            self.hovered.set(Hovered(member));
            let key = member.and_then(|k| {
                self.analysis.with_untracked(|o| {
                    let t = o.as_ref().ok()?.truss.as_ref()?;
                    MemberKey::of(&t.map, ModelKind::Truss, k)
                })
            });
            if self.focus.get_untracked() != key {
                self.focus.set(key);
            }
        }
    }

    /// Sets the member under the pointer or the keyboard by its model-independent key
    /// (the elevation, the keyboard), and the truss member it is, if any, for the force
    /// diagram's highlight.
    pub fn focus_member(&self, key: Option<MemberKey>) {
        if self.focus.get_untracked() != key {
            self.focus.set(key);
        }
        let truss = key.and_then(|key| {
            self.analysis.with_untracked(|o| {
                let t = o.as_ref().ok()?.truss.as_ref()?;
                key.member_in(&t.map, ModelKind::Truss)
            })
        });
        if self.hovered.get_untracked().0 != truss {
            self.hovered.set(Hovered(truss));
        }
    }

    /// Steps back one design; false when there is none.
    pub fn undo(&self) -> bool {
        let Some(prev) = self.past.try_update(|p| p.pop()).flatten() else { return false };
        self.clear_refusal();
        let current = self.design.get_untracked();
        self.future.update(|f| f.push(current));
        self.design.set(prev);
        true
    }

    /// Re-applies the last undone design; false when there is none.
    pub fn redo(&self) -> bool {
        let Some(next) = self.future.try_update(|f| f.pop()).flatten() else { return false };
        self.clear_refusal();
        let current = self.design.get_untracked();
        self.past.update(|p| p.push(current));
        self.design.set(next);
        true
    }
}

/// Parses a number typed by a user: accepts a decimal point or comma, spaces as digit
/// groups, and rejects anything non-finite.
pub fn parse_number(text: &str) -> Result<f64, String> {
    let cleaned: String = text.trim().chars().filter(|c| !c.is_whitespace() && *c != '\u{202f}').collect();
    let cleaned = cleaned.replace(',', ".");
    match cleaned.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(v),
        _ => Err(format!("'{}' is not a number", text.trim())),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::analyze;
    use springline_statics::error::{GroupName, SectionProperty};

    /// Which kept analysis serves: a whole one any; a screen's a screen's of any case (the
    /// `drawn` memo works out the figures of the case shown) and a drag's; a drag's only
    /// a drag of the same case (it has neither the action cases nor other figures).
    #[test]
    fn an_analysis_serves_what_it_has_worked_out() {
        let (screen, drawing) = (|k| Extent::Screen { shown: k }, |k| Extent::Drawing { shown: k });
        assert!(serves(Extent::Whole, screen(3)) && serves(Extent::Whole, drawing(3)));
        assert!(serves(screen(1), screen(3)) && serves(screen(1), drawing(3)));
        assert!(!serves(screen(1), Extent::Whole));
        assert!(serves(drawing(2), drawing(2)));
        assert!(!serves(drawing(2), drawing(3)) && !serves(drawing(2), screen(2)));
        assert_eq!(extent_of(true, || 4, || 5), drawing(4));
        assert_eq!(extent_of(false, || 4, || 5), screen(5));
    }

    /// The refusal of a deck at 60 m under the demo's springings at 76 m (left) and 80 m
    /// (right) (the demo scenario; the engine's validation in `arch::design`).
    fn deck_at_60() -> Refusal {
        let mut d = Design::demo();
        d.deck.level = 60.0;
        let error = analyze(&d).expect_err("springings above the deck are refused");
        Refusal { edited: Field::DeckLevel, error, candidate: d }
    }

    #[test]
    fn a_springing_above_the_deck_is_shown_beside_both_springings_and_the_deck_level() {
        let r = deck_at_60();
        let left = r.messages_for(Field::SpringingLeftLevel);
        let right = r.messages_for(Field::SpringingRightLevel);
        assert_eq!(left.len(), 1, "{left:?}");
        assert!(left[0].contains("left springing (76 m) is at or above the deck (60 m)"), "{left:?}");
        assert_eq!(right.len(), 1, "{right:?}");
        assert!(right[0].contains("right springing (80 m) is at or above the deck (60 m)"), "{right:?}");
        // beside the edited field: every problem, the crown above the deck too
        let deck = r.messages_for(Field::DeckLevel);
        assert_eq!(deck.len(), r.error.problems().len());
        assert!(deck.contains(&left[0]) && deck.contains(&right[0]));
        assert!(deck.iter().any(|m| m.contains("crown (97.500 m) is above the deck")), "{deck:?}");
        // a field the problems do not involve shows nothing
        assert!(r.messages_for(Field::Panels).is_empty());
        assert!(r.messages_for(Field::Section(GroupName::Rib, SectionProperty::E)).is_empty());
    }

    /// A springing raised above the deck was shown beside the springing alone: the engine
    /// did not list the deck level among the fields of that problem, though raising the
    /// deck mends it as well.
    #[test]
    fn a_springing_raised_above_the_deck_is_shown_beside_the_deck_level_too() {
        let mut d = Design::demo();
        d.springing_left_level = 100.5; // the demo deck is at 100 m
        let error = analyze(&d).expect_err("refused");
        let r = Refusal { edited: Field::SpringingLeftLevel, error, candidate: d };
        let deck = r.messages_for(Field::DeckLevel);
        assert_eq!(deck.len(), 1, "{deck:?}");
        assert!(deck[0].contains("left springing (100.5 m) is at or above the deck (100 m)"), "{deck:?}");
        assert!(r.messages_for(Field::SpringingRightLevel).is_empty());
    }

    #[test]
    fn an_edited_ground_point_shows_the_valley_problems_and_the_valley_does_not_repeat_them() {
        let mut d = Design::demo();
        d.valley[3].x = 50.0; // the next point is at x = 45 m
        let error = analyze(&d).expect_err("refused");
        let r = Refusal { edited: Field::ValleyPoint(3), error, candidate: d };
        let point = r.messages_for(Field::ValleyPoint(3));
        assert!(
            point.iter().any(|m| m.contains("ground point 5 (x = 45 m) is not to the right of point 4")),
            "{point:?}"
        );
        assert!(r.messages_for(Field::Valley).is_empty());
        assert!(r.messages_for(Field::ValleyPoint(4)).is_empty());
        // edited as a whole (a preset, a point removed), the valley shows them
        let whole = Refusal { edited: Field::Valley, ..r };
        assert_eq!(whole.messages_for(Field::Valley), point);
    }

    #[test]
    fn an_error_that_is_not_a_problem_list_is_shown_whole_beside_the_edited_field_only() {
        let r = Refusal {
            edited: Field::Panels,
            error: StaticsError::Link(springline_statics::error::LinkError::Empty),
            candidate: Design::demo(),
        };
        let whole = r.error.to_string();
        assert!(whole.starts_with("cannot read link: it holds no design"), "{whole}");
        assert_eq!(r.messages_for(Field::Panels), vec![whole]);
        assert!(r.messages_for(Field::DeckLevel).is_empty());
    }

    #[test]
    fn a_problem_of_no_field_is_named_beside_the_edited_field() {
        let r = Refusal {
            edited: Field::Valley,
            error: StaticsError::invalid("rib between x = 60.000 m and 70.000 m", "below the ground"),
            candidate: Design::demo(),
        };
        assert_eq!(
            r.messages_for(Field::Valley),
            vec!["rib between x = 60.000 m and 70.000 m: below the ground"]
        );
        assert!(r.messages_for(Field::DeckLevel).is_empty());
    }

    #[test]
    fn parse_number_accepts_commas_and_rejects_text() {
        assert_eq!(parse_number(" 12,5 "), Ok(12.5));
        assert_eq!(parse_number("1 200"), Ok(1200.0));
        assert!(parse_number("abc").is_err());
        assert!(parse_number("inf").is_err());
    }
}

/// The registered followers of [`AppState::design_value`], each setting its own signal.
#[derive(Default)]
struct Followers {
    next: u64,
    entries: Vec<(u64, Follower)>,
}

/// Reads a part of a design and sets its signal when the part changed.
type Follower = Box<dyn Fn(&Design) + Send + Sync>;

impl Followers {
    fn add(&mut self, follow: Follower) -> u64 {
        self.next += 1;
        self.entries.push((self.next, follow));
        self.next
    }
    fn remove(&mut self, id: u64) {
        self.entries.retain(|(k, _)| *k != id);
    }
    fn follow(&self, design: &Design) {
        for (_, follow) in &self.entries {
            follow(design);
        }
    }
}
