//! The results panel: the same numbers `springline analyze` prints, with units. Each value
//! cell carries its SI value in `data-value` for tests and assistive tools. The table
//! names the load case in words and the model of every number; the sign convention of
//! the springing forces is stated once, under it; when the three thrusts on screen differ
//! a short note says why. The Traffic block follows (`traffic_results.rs`).

use crate::format::{Quantity, Units};
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::form::Basis;
use springline_statics::arch::generate::DEAD;
use springline_statics::arch::readout::MemberKey;
use springline_statics::{Analysis, MemberRole, ModelKind, Warning};

/// How the springing forces read, stated once under the table (the drawings use the
/// same `SpringingForce` values).
pub const SPRINGING_CONVENTION: &str = "Springing forces are what the rib applies to its abutment: \
    thrust H positive outward (away from the span), vertical V positive downward, the angle \
    below the horizontal, a fixed rib's moment anticlockwise positive. Member forces N: tension +, \
    compression −.";

/// One result row.
struct Row {
    id: &'static str,
    label: String,
    quantity: Quantity,
    si: f64,
    text: Option<String>,
}

fn row(id: &'static str, label: &str, quantity: Quantity, si: f64) -> Row {
    Row { id, label: label.into(), quantity, si, text: None }
}

fn text_row(id: &'static str, label: &str, text: String) -> Row {
    Row { id, label: label.into(), quantity: Quantity::Count, si: f64::NAN, text: Some(text) }
}

/// The rows for analysis `a`, springing forces in load case `case` (an index into
/// `Analysis::load_cases`, the case the drawings show), `ribs` the design's rib count
/// (the plane models carry every rib together), lengths of the form-finding line in
/// `units`; `focus` a member (pointed at or stepped to while the vehicle is on the deck)
/// whose force in this case gets a row of its own, so the vehicle moving along the deck
/// shows it change sign here too.
fn rows(a: &Analysis, case: usize, ribs: usize, units: Units, focus: Option<MemberKey>) -> Vec<Row> {
    let s = &a.summary;
    let all_ribs = if ribs == 1 { "the one rib".to_string() } else { format!("all {ribs} ribs") };
    let mut r = vec![
        row("result-thrust", "Form thrust H_form (form finding, dead load)", Quantity::Force, s.form_thrust),
        row("result-span", "Span", Quantity::Length, s.span),
        row("result-rise", "Rise", Quantity::Length, s.rise),
    ];
    // the as-built form's thrust changes along the rib with the horizontal forces its
    // nodes receive: each springing's own, when they differ
    let [form_left, form_right] = s.form_reactions;
    if (form_left.fx + form_right.fx).abs() > 1e-9 * s.form_thrust.abs() {
        r.insert(
            1,
            row("result-thrust-left", "Form thrust at the left springing", Quantity::Force, form_left.fx),
        );
        r.insert(
            2,
            row("result-thrust-right", "Form thrust at the right springing", Quantity::Force, -form_right.fx),
        );
    }
    let shown = a.load_cases.get(case).map_or(DEAD, |c| c.case.as_str());
    if let Some(forces) = s.springings_of(shown) {
        for (id_h, id_v, id_a, name, f) in [
            ("result-left-h", "result-left-v", "result-left-angle", "left", forces.left),
            ("result-right-h", "result-right-v", "result-right-angle", "right", forces.right),
        ] {
            r.push(row(id_h, &format!("Springing {name}: thrust H ({all_ribs})"), Quantity::Force, f.thrust));
            r.push(row(
                id_v,
                &format!("Springing {name}: vertical V ({all_ribs})"),
                Quantity::Force,
                f.vertical,
            ));
            r.push(row(
                id_a,
                &format!("Springing {name}: angle below horizontal"),
                Quantity::Angle,
                f.angle_deg,
            ));
        }
        if s.fixed_rib {
            // a fixed rib: its springing moments (on the abutment, anticlockwise positive)
            r.push(row(
                "result-left-m",
                &format!("Springing left: moment ({all_ribs})"),
                Quantity::Moment,
                forces.left.moment,
            ));
            r.push(row(
                "result-right-m",
                &format!("Springing right: moment ({all_ribs})"),
                Quantity::Moment,
                forces.right.moment,
            ));
        }
    }
    // the bracing's extremes in this case: a load moving along the deck (the vehicle)
    // turns diagonals from tension to compression, and these rows follow it
    for (id, label, tension) in [
        ("result-case-bracing-tension", "Bracing, most tension in this case", true),
        ("result-case-bracing-compression", "Bracing, most compression in this case", false),
    ] {
        if let Some((n, key)) = case_bracing_extreme(a, case, tension) {
            r.push(row(id, &format!("{label} (frame model, {all_ribs}): {key}"), Quantity::Force, n));
        }
    }
    // the member in focus, in this case (frame model)
    let focused = focus.and_then(|key| {
        let k = key.member_in(&a.frame.map, ModelKind::Frame)?;
        let m = a.frame.solution.cases.get(case)?.members.get(k)?;
        Some((key, 0.5 * (m.start.n + m.end.n)))
    });
    if let Some((key, n)) = focused {
        r.push(row(
            "result-focus-n",
            &format!("{key}: N in this case (frame model, {all_ribs})"),
            Quantity::Force,
            n,
        ));
    }
    if let Some(pole) = a.load_cases.get(case).and_then(|c| c.rib_funicular.as_ref()) {
        r.push(row("result-pole", "Pole distance H (bare rib, force diagram)", Quantity::Force, pole.thrust));
    }
    r.push(row(
        "result-thrust-min",
        "Springing thrust, least over the cases",
        Quantity::Force,
        s.thrust_range[0],
    ));
    r.push(row(
        "result-thrust-max",
        "Springing thrust, greatest over the cases",
        Quantity::Force,
        s.thrust_range[1],
    ));
    for (id, label, role) in [
        ("result-rib-n", "Rib, largest axial force", MemberRole::Rib),
        ("result-post-n", "Posts, largest axial force", MemberRole::Post),
        ("result-bracing-n", "Bracing, largest axial force", MemberRole::Bracing),
        ("result-deck-n", "Deck, largest axial force", MemberRole::Deck),
    ] {
        if let Some(n) = s.largest_axial(role) {
            r.push(row(id, &format!("{label} (dead load, {all_ribs})"), Quantity::Force, n));
        }
    }
    r.push(row(
        "result-rib-m",
        &format!("Residual rib moment, largest |M| (dead load, {all_ribs})"),
        Quantity::Moment,
        s.residual_rib_moment,
    ));
    r.push(text_row(
        "result-form",
        "Form finding",
        format!(
            "{} · {} iterations · last change {}",
            s.form_basis,
            s.form_iterations,
            units.show(Quantity::Length, s.form_final_change)
        ),
    ));
    r.push(text_row("result-restraint", "Deck restraint", s.deck_held_by.to_string()));
    let truss = match &a.truss {
        Some(t) => t.determinacy.describe(),
        None => "none (no bracing)".into(),
    };
    r.push(text_row("result-determinacy", "Truss idealisation", truss));
    r.push(text_row(
        "result-equilibrium",
        "Equilibrium check (frame model)",
        format!("residual {:.1e} of the largest force", s.equilibrium),
    ));
    r
}

/// The bracing member of the frame model with the most tension (`tension`) or the most
/// compression in load case `case`, and its axial force N (kN, the mean of its end
/// forces, tension +); `None` when the design has no bracing or no member is on that
/// side of zero.
fn case_bracing_extreme(a: &Analysis, case: usize, tension: bool) -> Option<(f64, MemberKey)> {
    let solved = a.frame.solution.cases.get(case)?;
    let sign = if tension { 1.0 } else { -1.0 };
    let (k, n) = a
        .frame
        .map
        .roles
        .iter()
        .enumerate()
        .filter(|(_, r)| **r == MemberRole::Bracing)
        .filter_map(|(k, _)| solved.members.get(k).map(|m| (k, 0.5 * (m.start.n + m.end.n))))
        .filter(|(_, n)| sign * n > 0.0)
        .max_by(|x, y| (sign * x.1).total_cmp(&(sign * y.1)))?;
    Some((n, MemberKey::of(&a.frame.map, ModelKind::Frame, k)?))
}

/// Why the thrusts on screen differ, in words, or `None` when the engine finds them equal
/// (`Summary::thrusts_differ`): the form thrust (the funicular of the dead load, form
/// finding), the springing thrusts of load case `case` (frame model: the deck is
/// continuous with the rib and its seats and piers take part of the load) and the pole
/// distance (the bare rib alone under the case's loads). Forces in `units`; every number
/// is the engine's summary's.
fn thrust_note(a: &Analysis, case: usize, units: Units) -> Option<String> {
    let s = &a.summary;
    let figures = a.load_cases.get(case)?;
    let springs = s.springings_of(&figures.case)?;
    let pole = figures.rib_funicular.as_ref().map(|f| f.thrust);
    if !s.thrusts_differ(&figures.case, pole) {
        return None;
    }
    let force = |v: f64| units.show(Quantity::Force, v);
    let mut note = format!(
        "Why the thrusts differ: the form thrust ({}) is the funicular of the dead load, found \
         {}. The springing thrusts ({} left, {} right) come \
         from the frame model, where the deck is continuous with the rib, the rib shortens and \
         bends, and the deck's seats and the approach piers take {} vertically and {} \
         horizontally of this case's load.",
        force(s.form_thrust),
        match s.form_basis {
            Basis::PanelLoads => "with the loads lumped at the rib nodes",
            Basis::AsBuilt => "for the forces the frame model's rib receives under the dead load alone",
        },
        force(springs.left.thrust),
        force(springs.right.thrust),
        force(springs.seats_piers_vertical),
        force(springs.seats_piers_horizontal),
    );
    if let Some(pole) = pole {
        note.push_str(&format!(
            " The pole distance ({}) is the bare rib's: the rib alone on its springings, \
             carrying every load of the case.",
            force(pole)
        ));
    }
    Some(note)
}

/// The design's warnings as the list under the table shows them: each named as the
/// panels name its field ("crown level: rise / span ..."), never by its file path.
fn warning_lines(warnings: &[Warning]) -> Vec<String> {
    warnings.iter().map(|w| w.to_string()).collect()
}

/// One row as the table shows it: its cell id, label, the text shown, the SI value in
/// `data-value` (empty for a text row) and the quantity's key.
#[derive(Clone, Default, PartialEq, Eq, Hash)]
struct ShownRow {
    id: &'static str,
    label: String,
    shown: String,
    data: String,
    kind: &'static str,
}

/// The results table.
#[component]
pub fn ResultsPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    // the rows as shown, memoised: the keyed list below keeps each row while its id
    // stays and rewrites only the texts that changed (rows come and go only with their
    // ids: the focused member's, a springing's own thrust)
    let shown_rows = Memo::new(move |_| {
        let units: Units = state.units.get();
        let case = state.case.get();
        let ribs = state.settled_design.with(|d| d.deck.ribs);
        // the member in focus gets its row while the vehicle is on the deck: the row
        // shows it change as the vehicle is moved with the keys, or when a drag of it ends
        // (elsewhere the readout does, and a table that changed under a passing pointer
        // would only distract)
        let focus = if state.vehicle.with(Option::is_some) { state.focus.get() } else { None };
        state.settled_drawn.with(|a| {
            let Ok(a) = a else { return Vec::new() };
            rows(a, case, ribs, units, focus)
                .into_iter()
                .map(|r| ShownRow {
                    id: r.id,
                    shown: r.text.clone().unwrap_or_else(|| units.show(r.quantity, r.si)),
                    data: if r.text.is_some() { String::new() } else { format!("{}", r.si) },
                    kind: if r.text.is_some() { "text" } else { r.quantity.key() },
                    label: r.label,
                })
                .collect::<Vec<_>>()
        })
    });
    // every part of the table reads the one analysis, the shown case's figures worked out
    let caption = Memo::new(move |_| {
        let case = state.case.get();
        state.settled_drawn.with(|a| {
            a.as_ref().ok().map(|a| a.load_cases.get(case).map(|c| c.description.title()).unwrap_or_default())
        })
    });
    let note = Memo::new(move |_| {
        let (case, units) = (state.case.get(), state.units.get());
        state.settled_drawn.with(|a| a.as_ref().ok().and_then(|a| thrust_note(a, case, units)))
    });
    // the warnings are the validation's: a move of the vehicle leaves them be
    let warnings = Memo::new(move |_| {
        state.settled_valid.with(|v| v.as_ref().map(|v| warning_lines(v.warnings())).ok())
    });
    let failure = Memo::new(move |_| state.settled_drawn.with(|a| a.as_ref().err().map(|e| e.to_string())));
    let table = move || {
        caption.get().map(|title| {
            view! {
                <table class="results">
                    <caption id="results-caption">
                        {format!("{title}: springing forces and bracing extremes of the frame model in this case; other member forces of the frame model under dead load")}
                    </caption>
                    <tbody>
                        <For
                            each=move || shown_rows.with(|rows| rows.iter().map(|r| r.id).collect::<Vec<_>>())
                            key=|id| *id
                            children=move |id| {
                                // a row stays while its id does; its words and number follow,
                                // written by one effect per row (four reactive parts per row
                                // woke some eighty effects an edit), which looks first where
                                // its row stood last (rows keep their places between edits; a
                                // search of every row for every row was hundreds of compares)
                                let at = std::cell::Cell::new(0);
                                let now = move || {
                                    shown_rows.with(|rows| {
                                        let k = Some(at.get())
                                            .filter(|&k| rows.get(k).is_some_and(|r| r.id == id))
                                            .or_else(|| rows.iter().position(|r| r.id == id))?;
                                        at.set(k);
                                        Some(rows[k].clone())
                                    })
                                };
                                let first = untrack(&now).unwrap_or_default();
                                let (head, cell) = (NodeRef::<leptos::html::Th>::new(), NodeRef::<leptos::html::Td>::new());
                                let written = first.clone();
                                Effect::new(move |shown: Option<ShownRow>| {
                                    let row = now().unwrap_or_default();
                                    let was = shown.unwrap_or_else(|| written.clone());
                                    // not in the page yet: what it shows stays what was written
                                    let (Some(th), Some(td)) = (head.get_untracked(), cell.get_untracked()) else {
                                        return was;
                                    };
                                    if row.label != was.label {
                                        crate::dom::write_text(&th, &row.label);
                                    }
                                    if row.data != was.data {
                                        let _ = td.set_attribute("data-value", &row.data);
                                    }
                                    if row.kind != was.kind {
                                        let _ = td.set_attribute("data-quantity", row.kind);
                                    }
                                    if row.shown != was.shown {
                                        crate::dom::write_text(&td, &row.shown);
                                    }
                                    row
                                });
                                view! {
                                    <tr>
                                        <th node_ref=head scope="row">{first.label.clone()}</th>
                                        <td node_ref=cell id=id data-value=first.data.clone() data-quantity=first.kind>
                                            {first.shown.clone()}
                                        </td>
                                    </tr>
                                }
                            }
                        />
                    </tbody>
                </table>
                <p class="convention" id="results-convention">{SPRINGING_CONVENTION}</p>
                {move || note.get().map(|n| view! { <p class="thrust-note" id="thrust-note">{n}</p> })}
                <ul class="warnings">
                    {move || {
                        warnings.get().unwrap_or_default().into_iter().map(|line| view! { <li>{line}</li> }).collect_view()
                    }}
                </ul>
            }
        })
    };
    view! {
        <section class="results-panel" aria-labelledby="results-title">
            <h2 id="results-title">"Results"</h2>
            {table}
            {move || failure.get().map(|e| view! { <p class="error">{e}</p> })}
            <crate::components::traffic_results::TrafficResults />
            <crate::components::stability::StabilityResults />
            <crate::components::actions::ActionsResults />
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::{analyze, Design};

    /// The warnings list named a field by its file path ("crown.level: rise / span ...");
    /// it reads as the Arch panel labels the field. Check value: the demo's crown lowered
    /// to 85 m gives a rise far below a tenth of its span (common practice warns outside
    /// 1/10 to 1/3).
    #[test]
    fn a_warning_names_its_field_as_the_panel_does() {
        let mut d = Design::demo();
        d.crown = springline_statics::arch::design::Crown::Level { level: 85.0 };
        let a = analyze(&d).expect("a flat arch still analyses");
        let lines = warning_lines(&a.warnings);
        assert!(lines.iter().any(|l| l.starts_with("crown level: rise / span = 1/")), "{lines:?}");
        assert!(lines.iter().all(|l| !l.contains("crown.level") && !l.contains('_')), "{lines:?}");
    }

    /// The demo (three-hinged, single diagonals): form thrust, springing thrusts and pole
    /// distance differ in the half-span case, and the note names the model of each with
    /// the engine's own numbers (the seats' and piers' share too); under the dead load
    /// the three-hinged demo's three thrusts agree to a tenth of a percent (its rib is
    /// the funicular of that load and determinate), so no note appears.
    #[test]
    fn the_thrust_note_names_each_model_with_the_engines_numbers() {
        let a = analyze(&Design::demo()).expect("demo analyses");
        let half = a.load_cases.iter().position(|c| c.description.id() == "half-left").expect("half case");
        let note = thrust_note(&a, half, Units::Si).expect("the half-span thrusts differ");
        let s = &a.summary;
        let springs = s.springings_of(&a.load_cases[half].case).expect("springings");
        for v in [
            s.form_thrust,
            springs.left.thrust,
            springs.right.thrust,
            springs.seats_piers_vertical,
            springs.seats_piers_horizontal,
        ] {
            let shown = Units::Si.show(Quantity::Force, v);
            assert!(note.contains(&shown), "{shown} in {note}");
        }
        assert!(note.contains("frame model") && note.contains("bare rib"), "{note}");
        let dead = a.load_cases.iter().position(|c| c.description.id() == "dead").expect("dead case");
        assert_eq!(thrust_note(&a, dead, Units::Si), None, "the demo's dead-load thrusts agree");
        // in US units the same note speaks kip
        let us = thrust_note(&a, half, Units::UsCustomary).expect("note");
        assert!(us.contains("kip") && !us.contains("kN"), "{us}");
    }

    /// Member forces say they are for all ribs together (the plane models carry every
    /// rib: the demo has 2); the form-finding line converts its length unit.
    #[test]
    fn member_rows_say_all_ribs_and_the_form_line_converts() {
        let a = analyze(&Design::demo()).expect("demo analyses");
        let r = rows(&a, 0, 2, Units::UsCustomary, None);
        let rib = r.iter().find(|r| r.id == "result-rib-n").expect("rib row");
        assert!(rib.label.contains("all 2 ribs"), "{}", rib.label);
        let form = r.iter().find(|r| r.id == "result-form").and_then(|r| r.text.clone()).expect("form row");
        assert!(form.contains("ft") && !form.ends_with(" m"), "{form}");
        assert!(r.iter().any(|r| r.id == "result-pole"));
    }

    /// The vehicle at the left quarter (leading axle at x = 56.6 m on the demo) pulls
    /// hardest on the diagonal of the panel under it, d2–r3; moved to x = 110 m, that
    /// diagonal is in compression and the one under the vehicle there, d10–r9, has the
    /// most tension (the demo's engine solution; sign change under a moving load, as the
    /// influence line of a panel's shear says).
    #[test]
    fn the_bracing_extremes_follow_the_vehicle() {
        use springline_statics::scene::vehicle::start_position;
        use springline_statics::ValidDesign;
        let v = ValidDesign::new(&Design::demo()).expect("demo");
        let mut d2_r3 = Vec::new();
        for (x, most) in [(start_position(&v), "bracing d2–r3"), (110.0, "bracing d10–r9")] {
            let a = crate::state::analyse(
                &v,
                Some(x),
                &[],
                None,
                springline_statics::arch::analysis::Extent::Whole,
            )
            .expect("analyses");
            let case = a.load_cases.len() - 1;
            let (n, key) = case_bracing_extreme(&a, case, true).expect("tension");
            assert_eq!(key.to_string(), most);
            assert!(n > 0.0);
            let (c, _) = case_bracing_extreme(&a, case, false).expect("compression");
            assert!(c < 0.0);
            let shown = rows(&a, case, 2, Units::Si, None);
            let row = shown.iter().find(|r| r.id == "result-case-bracing-tension").expect("row");
            assert!(row.label.ends_with(&format!("all 2 ribs): {most}")) && row.si == n, "{}", row.label);
            let k =
                a.frame.map.roles.iter().enumerate().filter(|(_, r)| **r == MemberRole::Bracing).find_map(
                    |(k, _)| {
                        (MemberKey::of(&a.frame.map, ModelKind::Frame, k)?.to_string() == "bracing d2–r3")
                            .then_some(k)
                    },
                );
            let k = k.expect("d2–r3");
            let m = &a.frame.solution.cases[case].members[k];
            d2_r3.push(0.5 * (m.start.n + m.end.n));
            // the member in focus has its own row with its force in this case
            let key = MemberKey::of(&a.frame.map, ModelKind::Frame, k);
            let focused = rows(&a, case, 2, Units::Si, key);
            let row = focused.iter().find(|r| r.id == "result-focus-n").expect("the focused member's row");
            assert_eq!(row.si, 0.5 * (m.start.n + m.end.n));
            assert!(row.label.starts_with("bracing d2–r3: N in this case"), "{}", row.label);
        }
        assert!(d2_r3[0] > 0.0 && d2_r3[1] < 0.0, "{d2_r3:?}");
    }
}
