//! Option sweeps: one parameter of a design varied over a range (or two as a grid), each
//! option validated, analysed, its traffic envelopes found and (on request) sized, and
//! the key numbers of each put in a row.
//!
//! What each parameter moves and what stays fixed:
//! - `rise-ratio`: the rise over the span between the springings; the springings (and so
//!   the span), the deck and the valley stay, the crown level follows;
//! - `panels`: the number of arch panels; everything else stays;
//! - `springing-level`: the left springing's level, the right one moved by the same
//!   amount (their difference stays); the crown keeps how it is given (by rise: it moves
//!   with the springings; by level: it stays);
//! - `ribs`: the number of ribs side by side over the same deck width, evenly spaced (any
//!   rib positions given by hand are dropped: they were for another count);
//! - `rib-system`: three-hinged, two-hinged or fixed;
//! - `form-basis`: what the form is found for, `panel-loads` or `as-built`.
//!
//! An option that does not validate or analyse is a row with its reason, not an error.
//! Concept-design values: local codes and a licensed engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::design::{Design, RibSystem};
use crate::arch::form::Basis;
use crate::arch::options::key_numbers;
use crate::error::{Location, Problem, StaticsError};
use serde::{Deserialize, Serialize};

/// A parameter a sweep varies.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Parameter {
    /// Rise over span.
    RiseRatio,
    /// Number of arch panels.
    Panels,
    /// Left springing level, m (the right one moves with it).
    SpringingLevel,
    /// Number of ribs.
    Ribs,
    /// Rib system (0 three-hinged, 1 two-hinged, 2 fixed).
    RibSystem,
    /// Form-finding basis (0 panel loads, 1 as built).
    FormBasis,
}

impl Parameter {
    /// Every parameter with its name on the command line.
    pub const ALL: [(Parameter, &'static str); 6] = [
        (Parameter::RiseRatio, "rise-ratio"),
        (Parameter::Panels, "panels"),
        (Parameter::SpringingLevel, "springing-level"),
        (Parameter::Ribs, "ribs"),
        (Parameter::RibSystem, "rib-system"),
        (Parameter::FormBasis, "form-basis"),
    ];

    /// The name on the command line (`rise-ratio`).
    pub fn key(self) -> &'static str {
        Parameter::ALL.iter().find(|(p, _)| *p == self).map_or("?", |(_, k)| k)
    }

    /// Whether the values are numbers on a scale (a chart can plot them); the rib system
    /// and the form basis are categories.
    pub fn is_numeric(self) -> bool {
        categories(self).is_none()
    }

    /// The column title with its unit.
    pub fn column(self) -> &'static str {
        match self {
            Parameter::RiseRatio => "rise/span set (-)",
            Parameter::Panels => "panels (-)",
            Parameter::SpringingLevel => "left springing level (m)",
            Parameter::Ribs => "ribs (-)",
            Parameter::RibSystem => "rib system",
            Parameter::FormBasis => "form basis",
        }
    }
}

/// The rib systems by their sweep value.
const SYSTEMS: [(RibSystem, &str); 3] = [
    (RibSystem::ThreeHinged, "three-hinged"),
    (RibSystem::TwoHinged, "two-hinged"),
    (RibSystem::Fixed, "fixed"),
];

/// The form-finding bases by their sweep value.
const BASES: [(Basis, &str); 2] = [(Basis::PanelLoads, "panel-loads"), (Basis::AsBuilt, "as-built")];

/// The names of a categorical parameter's values (`None` for a numeric one).
fn categories(parameter: Parameter) -> Option<Vec<&'static str>> {
    match parameter {
        Parameter::RibSystem => Some(SYSTEMS.iter().map(|(_, n)| *n).collect()),
        Parameter::FormBasis => Some(BASES.iter().map(|(_, n)| *n).collect()),
        _ => None,
    }
}

/// One varied parameter and its values.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Axis {
    /// The parameter.
    pub parameter: Parameter,
    /// Its values (rib systems by index into three-hinged, two-hinged, fixed; form bases
    /// into panel-loads, as-built).
    pub values: Vec<f64>,
}

fn refuse(message: String) -> StaticsError {
    StaticsError::Invalid(vec![Problem::new(Location::Part("sweep".into()), message)])
}

/// Most values of one axis (a grid of two holds their product).
pub const MAX_VALUES: usize = 1000;

/// Reads `NAME=FROM:TO:COUNT` (COUNT values evenly from FROM to TO, both included) or
/// `NAME=V1,V2,...` (rib systems by name: `three-hinged`, `two-hinged`, `fixed`; form
/// bases: `panel-loads`, `as-built`).
///
/// Errors: `Invalid` naming the accepted parameters and forms.
pub fn parse_axis(spec: &str) -> Result<Axis, StaticsError> {
    let names: Vec<&str> = Parameter::ALL.iter().map(|(_, k)| *k).collect();
    let Some((name, range)) = spec.split_once('=') else {
        return Err(refuse(format!(
            "'{spec}' is not NAME=FROM:TO:COUNT or NAME=V1,V2,...; NAME is one of {}",
            names.join(", ")
        )));
    };
    let Some(parameter) = Parameter::ALL.iter().find(|(_, k)| *k == name.trim()).map(|(p, _)| *p) else {
        return Err(refuse(format!("'{name}' is no parameter to vary; give one of {}", names.join(", "))));
    };
    let values: Vec<f64> = if let Some(names) = categories(parameter) {
        range
            .split(',')
            .map(|v| {
                names.iter().position(|n| *n == v.trim()).map(|i| i as f64).ok_or_else(|| {
                    refuse(format!("'{v}' is no {}; give {}", parameter.column(), names.join(", ")))
                })
            })
            .collect::<Result<_, _>>()?
    } else if let [from, to, count] = range.split(':').collect::<Vec<_>>()[..] {
        let number = |t: &str| {
            t.trim()
                .parse::<f64>()
                .ok()
                .filter(|v| v.is_finite())
                .ok_or_else(|| refuse(format!("'{t}' is not a number")))
        };
        let (from, to) = (number(from)?, number(to)?);
        let count: usize =
            count.trim().parse().ok().filter(|c| (1..=MAX_VALUES).contains(c)).ok_or_else(|| {
                refuse(format!("'{count}' is not a count of values from 1 to {MAX_VALUES}"))
            })?;
        (0..count)
            .map(|k| if count == 1 { from } else { from + (to - from) * k as f64 / (count - 1) as f64 })
            .collect()
    } else {
        range
            .split(',')
            .map(|t| {
                t.trim()
                    .parse::<f64>()
                    .ok()
                    .filter(|v| v.is_finite())
                    .ok_or_else(|| refuse(format!("'{t}' is not a number")))
            })
            .collect::<Result<_, _>>()?
    };
    if values.is_empty() || values.len() > MAX_VALUES {
        return Err(refuse(format!("a sweep takes 1 to {MAX_VALUES} values of {name}")));
    }
    if matches!(parameter, Parameter::Panels | Parameter::Ribs)
        && values.iter().any(|v| v.fract() != 0.0 || *v < 1.0)
    {
        return Err(refuse(format!("{name} takes whole numbers of at least 1")));
    }
    Ok(Axis { parameter, values })
}

/// `design` with `parameter` set to `value` (see the module doc).
pub fn apply(design: &Design, parameter: Parameter, value: f64) -> Design {
    let mut d = design.clone();
    match parameter {
        Parameter::RiseRatio => {
            let span = match (
                d.springing_x(d.springing_left_level, true),
                d.springing_x(d.springing_right_level, false),
            ) {
                (Some(a), Some(b)) => b - a,
                _ => f64::NAN,
            };
            d.set_rise(value * span);
        }
        Parameter::Panels => d.panels = value as usize,
        Parameter::SpringingLevel => {
            let delta = value - d.springing_left_level;
            d.springing_left_level = value;
            d.springing_right_level += delta;
        }
        Parameter::Ribs => {
            d.deck.ribs = value as usize;
            d.traffic.rib_positions.clear();
        }
        Parameter::RibSystem => {
            d.rib_system = SYSTEMS.get(value as usize).map_or(d.rib_system, |(s, _)| *s);
        }
        Parameter::FormBasis => {
            d.form.basis = BASES.get(value as usize).map_or(d.form.basis, |(b, _)| *b);
        }
    }
    d
}

/// The value `parameter` has in `design`, in the units a sweep gives it (rise over span
/// as a ratio, the left springing level in m, counts, a rib system or form basis as its
/// index): where a chart marks the design on screen. `None` when it cannot be found (the
/// springings miss the valley, a zero span).
pub fn current_value(design: &Design, parameter: Parameter) -> Option<f64> {
    match parameter {
        Parameter::RiseRatio => {
            let a = design.springing_x(design.springing_left_level, true)?;
            let b = design.springing_x(design.springing_right_level, false)?;
            let span = b - a;
            (span.abs() > 1e-9).then(|| design.rise() / span)
        }
        Parameter::Panels => Some(design.panels as f64),
        Parameter::SpringingLevel => Some(design.springing_left_level),
        Parameter::Ribs => Some(design.deck.ribs as f64),
        Parameter::RibSystem => SYSTEMS.iter().position(|(s, _)| *s == design.rib_system).map(|k| k as f64),
        Parameter::FormBasis => BASES.iter().position(|(b, _)| *b == design.form.basis).map(|k| k as f64),
    }
}

/// The names of a categorical parameter's values, in the order of their values (0, 1,
/// ...); `None` for a numeric parameter.
pub fn category_names(parameter: Parameter) -> Option<Vec<&'static str>> {
    categories(parameter)
}

/// What a sweep over `axes` holds fixed and what follows the varied parameters, in words
/// (the `held` of [`Sweep`]).
pub fn held(axes: &[Axis]) -> String {
    axes.iter().map(|a| held_words(a.parameter)).collect::<Vec<_>>().join("; ")
}

/// The key numbers of one option.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SweepRow {
    /// The varied parameters' values, in the order of the axes.
    pub values: Vec<f64>,
    /// Whether the option validates and analyses (and sizes, when sizing).
    pub feasible: bool,
    /// Why not, in the engine's words.
    pub reason: Option<String>,
    /// Rise over span of the option.
    pub rise_ratio: Option<f64>,
    /// Form thrust, kN.
    pub form_thrust: Option<f64>,
    /// Least and greatest design thrust over the ultimate combinations, kN (whole
    /// cross-section).
    pub thrust_range: Option<[f64; 2]>,
    /// Largest design |N| of a rib, post and bracing member per rib line over the ultimate
    /// combinations, kN (`None` where the option has no such member).
    pub rib_force: Option<f64>,
    /// As `rib_force`, posts.
    pub post_force: Option<f64>,
    /// As `rib_force`, bracing.
    pub bracing_force: Option<f64>,
    /// Steel, t (with sizing).
    pub steel: Option<f64>,
    /// Concrete, m3 (with sizing).
    pub concrete: Option<f64>,
    /// Cost index (with sizing).
    pub cost_index: Option<f64>,
    /// The arch's least alpha_cr over the sizing's cases with the rib's sized section
    /// (with sizing; `arch::second_order`).
    pub alpha_cr: Option<f64>,
}

/// A sweep's rows and what it held fixed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sweep {
    /// The axes.
    pub axes: Vec<Axis>,
    /// What stays fixed and what follows, in words.
    pub held: String,
    /// One row per option (the last axis varies fastest).
    pub rows: Vec<SweepRow>,
    /// Whether the options were sized.
    pub sized: bool,
    /// Caution.
    pub caution: String,
}

fn held_words(parameter: Parameter) -> &'static str {
    match parameter {
        Parameter::RiseRatio => "rise-ratio: springings, span, deck and valley fixed; the crown level follows",
        Parameter::Panels => "panels: everything else fixed",
        Parameter::SpringingLevel => {
            "springing-level: the right springing moves with the left (their difference fixed); a crown given by \
             rise moves with them, one given by level stays"
        }
        Parameter::Ribs => "ribs: the deck width fixed, the ribs evenly spaced across it",
        Parameter::RibSystem => "rib-system: everything else fixed",
        Parameter::FormBasis => "form-basis: everything else fixed",
    }
}

/// One option's row (see [`SweepRow`]): the option's key numbers
/// (`arch::options::key_numbers`) that a sweep reports.
pub fn option_row(design: &Design, values: Vec<f64>, size: bool) -> SweepRow {
    let n = key_numbers(design, size);
    SweepRow {
        values,
        feasible: n.feasible,
        reason: n.reason,
        rise_ratio: n.rise_ratio,
        form_thrust: n.form_thrust,
        thrust_range: n.thrust_range,
        rib_force: n.rib_force,
        post_force: n.post_force,
        bracing_force: n.bracing_force,
        steel: n.steel,
        concrete: n.concrete,
        cost_index: n.cost_index,
        alpha_cr: n.alpha_cr,
    }
}

/// Sweeps `design` over one axis or a grid of two (see the module doc); with `size`, each
/// option is sized too (`arch::sizing`).
///
/// Errors: `Invalid` for no axis, more than two, the same parameter twice, or a grid of
/// more than [`MAX_VALUES`] options.
pub fn sweep(design: &Design, axes: &[Axis], size: bool) -> Result<Sweep, StaticsError> {
    sweep_each(design, axes, size, |_, _, _| true)
}

/// [`sweep`], calling `on_row(done, total, row)` after each option (`done` counts from 1)
/// so a caller can show progress; when `on_row` returns `false` the sweep stops there and
/// returns the rows made so far (a cancelled sweep is a shorter one, not an error).
///
/// Errors: as [`sweep`].
pub fn sweep_each(
    design: &Design,
    axes: &[Axis],
    size: bool,
    mut on_row: impl FnMut(usize, usize, &SweepRow) -> bool,
) -> Result<Sweep, StaticsError> {
    sweep_share(design, axes, size, Share::WHOLE, |index, total, row| on_row(index + 1, total, row))
}

/// One share of a sweep's options, so several threads or web workers can sweep at once:
/// the options whose index (their place in the sweep's rows, counting from 0) leaves the
/// remainder `part` when divided by `parts`. Options taken in turn like this share the
/// work about evenly, since neighbouring options cost about the same.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub struct Share {
    /// Which share, from 0.
    pub part: usize,
    /// How many shares in all (at least 1).
    pub parts: usize,
}

impl Share {
    /// Every option: the one share of a sweep run alone.
    pub const WHOLE: Share = Share { part: 0, parts: 1 };

    /// Whether the option at `index` is this share's.
    pub fn holds(self, index: usize) -> bool {
        index.checked_rem(self.parts) == Some(self.part)
    }
}

/// The number of options of a sweep over `axes`: the product of their values' counts.
pub fn option_count(axes: &[Axis]) -> usize {
    axes.iter().map(|a| a.values.len()).product()
}

/// The option at `index` (row order, the last axis fastest) of a sweep over `first` and
/// `second`: its design and the varied values; `None` past the last option.
fn option_at(
    design: &Design,
    first: &Axis,
    second: Option<&Axis>,
    index: usize,
) -> Option<(Design, Vec<f64>)> {
    let inner = second.map_or(1, |a| a.values.len()).max(1);
    let a = *first.values.get(index / inner)?;
    let d = apply(design, first.parameter, a);
    match second {
        None => Some((d, vec![a])),
        Some(second) => {
            let b = *second.values.get(index % inner)?;
            Some((apply(&d, second.parameter, b), vec![a, b]))
        }
    }
}

/// The options of `share` of the sweep [`sweep`] would make, in row order: the returned
/// sweep holds that share's rows only (its axes, words and caution as the whole sweep's).
/// `on_row(index, total, row)` follows each option, `index` its place among all the
/// sweep's rows (from 0) and `total` the number of options in the whole sweep; when it
/// returns `false` the share stops there. [`interleave`] puts the shares of one sweep back
/// together into the rows [`sweep`] gives, bit for bit (each option is worked out alone).
///
/// Errors: as [`sweep`], and `Invalid` for a share with no parts or a part beyond them.
pub fn sweep_share(
    design: &Design,
    axes: &[Axis],
    size: bool,
    share: Share,
    mut on_row: impl FnMut(usize, usize, &SweepRow) -> bool,
) -> Result<Sweep, StaticsError> {
    let (first, second) = match axes {
        [first] => (first, None),
        [first, second] if first.parameter == second.parameter => {
            return Err(refuse(format!("{} is varied twice", first.parameter.key())));
        }
        [first, second] => (first, Some(second)),
        _ => return Err(refuse("a sweep varies one parameter, or two as a grid".into())),
    };
    if share.parts == 0 || share.part >= share.parts {
        return Err(refuse(format!("share {} of {} of a sweep does not exist", share.part, share.parts)));
    }
    let count = option_count(axes);
    if count > MAX_VALUES {
        return Err(refuse(format!("{count} options: a sweep takes at most {MAX_VALUES}")));
    }
    let mut rows = Vec::with_capacity(count.div_ceil(share.parts));
    for index in (0..count).filter(|&i| share.holds(i)) {
        let Some((option, values)) = option_at(design, first, second, index) else { break };
        let row = option_row(&option, values, size);
        let more = on_row(index, count, &row);
        rows.push(row);
        if !more {
            break;
        }
    }
    Ok(Sweep { held: held(axes), axes: axes.to_vec(), rows, sized: size, caution: CAUTION.into() })
}

/// The whole sweep from its shares (`shares[k]` the share `Share { part: k, parts:
/// shares.len() }` of one sweep, every one complete): their rows back in row order. A
/// sweep does not record which share it is, so the caller keeps them in order: shares
/// of one length given in another order would interleave without complaint.
///
/// Errors: `Invalid` for no shares, shares of different sweeps (axes or sizing), or a
/// share with a row too many or too few.
pub fn interleave(shares: Vec<Sweep>) -> Result<Sweep, StaticsError> {
    let parts = shares.len();
    let Some(first) = shares.first() else {
        return Err(refuse("no share of a sweep to put together".into()));
    };
    if shares.iter().any(|s| s.axes != first.axes || s.sized != first.sized) {
        return Err(refuse("the shares are of different sweeps".into()));
    }
    let count = option_count(&first.axes);
    let expected = |part: usize| (count + parts - 1 - part) / parts;
    if let Some((part, s)) = shares.iter().enumerate().find(|(part, s)| s.rows.len() != expected(*part)) {
        return Err(refuse(format!(
            "share {part} of {parts} holds {} options where its sweep gives it {}",
            s.rows.len(),
            expected(part)
        )));
    }
    let (axes, held, sized, caution) =
        (first.axes.clone(), first.held.clone(), first.sized, first.caution.clone());
    let mut iters: Vec<_> = shares.into_iter().map(|s| s.rows.into_iter()).collect();
    let rows = (0..count).filter_map(|index| iters.get_mut(index % parts).and_then(Iterator::next)).collect();
    Ok(Sweep { axes, held, rows, sized, caution })
}

/// The sweep as CSV: a header with every column's unit, then one line per option
/// (empty cells where a number does not apply; the reason in quotes).
pub fn to_csv(s: &Sweep) -> String {
    let mut head: Vec<String> = s.axes.iter().map(|a| a.parameter.column().to_string()).collect();
    head.extend(
        [
            "feasible",
            "rise/span (-)",
            "form thrust (kN)",
            "least design thrust (kN)",
            "greatest design thrust (kN)",
            "largest rib force per rib line (kN)",
            "largest post force per rib line (kN)",
            "largest bracing force per rib line (kN)",
        ]
        .map(String::from),
    );
    if s.sized {
        head.extend(["steel (t)", "concrete (m3)", "cost index", "alpha_cr"].map(String::from));
    }
    head.push("reason".into());
    let num = |v: Option<f64>, decimals: usize| v.map_or(String::new(), |v| format!("{v:.decimals$}"));
    let mut lines = vec![head.join(",")];
    for r in &s.rows {
        let mut cells: Vec<String> = s
            .axes
            .iter()
            .zip(&r.values)
            .map(|(a, v)| match a.parameter {
                Parameter::RibSystem | Parameter::FormBasis => categories(a.parameter)
                    .and_then(|names| names.get(*v as usize).copied())
                    .unwrap_or("?")
                    .to_string(),
                Parameter::Panels | Parameter::Ribs => format!("{v:.0}"),
                // six decimals at most, without trailing zeros (0.12, not 0.12000000000000001)
                _ => {
                    let t = format!("{v:.6}");
                    t.trim_end_matches('0').trim_end_matches('.').to_string()
                }
            })
            .collect();
        cells.push(r.feasible.to_string());
        cells.push(num(r.rise_ratio, 4));
        cells.push(num(r.form_thrust, 1));
        cells.push(num(r.thrust_range.map(|t| t[0]), 1));
        cells.push(num(r.thrust_range.map(|t| t[1]), 1));
        cells.push(num(r.rib_force, 1));
        cells.push(num(r.post_force, 1));
        cells.push(num(r.bracing_force, 1));
        if s.sized {
            cells.push(num(r.steel, 2));
            cells.push(num(r.concrete, 2));
            cells.push(num(r.cost_index, 0));
            cells.push(num(r.alpha_cr, 2));
        }
        cells.push(r.reason.as_ref().map_or(String::new(), |t| format!("\"{}\"", t.replace('"', "'"))));
        lines.push(cells.join(","));
    }
    lines.join("\n")
}
