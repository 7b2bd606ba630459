//! The results panel: the same numbers `springline analyze` prints, with units. Each value
//! cell carries its SI value in `data-value` for tests and assistive tools.

use crate::format::{Quantity, Units};
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::Analysis;

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

/// Largest |N| of the members of `group` in the frame model, kN, with its sign.
fn extreme(a: &Analysis, group: &str) -> Option<f64> {
    let m = &a.frame.model;
    let c = &a.frame.solution.cases[0];
    m.members
        .iter()
        .zip(&c.members)
        .filter(|(mm, _)| mm.group == group)
        .flat_map(|(_, f)| [f.start.n, f.end.n])
        .max_by(|x, y| x.abs().total_cmp(&y.abs()))
}

fn rows(a: &Analysis) -> Vec<Row> {
    let f = &a.form;
    let mut r = vec![
        row("result-thrust", "Thrust H (form finding)", Quantity::Force, f.thrust),
        row("result-span", "Span", Quantity::Length, f.span),
        row("result-rise", "Rise", Quantity::Length, f.rise),
    ];
    let model = &a.frame.model;
    let case = &a.frame.solution.cases[0];
    for (id_h, id_v, id_a, name, p) in [
        ("result-left-h", "result-left-v", "result-left-angle", "left", f.springing_left),
        ("result-right-h", "result-right-v", "result-right-angle", "right", f.springing_right),
    ] {
        let idx = model.nodes.iter().position(|n| (n.x - p.x).abs() < 1e-9 && (n.y - p.y).abs() < 1e-9);
        if let Some(rc) = idx.and_then(|i| case.reaction(i)) {
            r.push(row(id_h, &format!("Springing {name}: horizontal"), Quantity::Force, rc.fx));
            r.push(row(id_v, &format!("Springing {name}: vertical"), Quantity::Force, rc.fy));
            r.push(row(
                id_a,
                &format!("Springing {name}: angle from horizontal"),
                Quantity::Angle,
                rc.fy.atan2(rc.fx.abs()).to_degrees(),
            ));
        }
    }
    for (id, label, group) in [
        ("result-rib-n", "Rib, largest axial force", "rib"),
        ("result-post-n", "Posts, largest axial force", "post"),
        ("result-bracing-n", "Bracing, largest axial force", "bracing"),
        ("result-deck-n", "Deck, largest axial force", "deck"),
    ] {
        if let Some(n) = extreme(a, group) {
            r.push(row(id, label, Quantity::Force, n));
        }
    }
    r.push(row(
        "result-rib-m",
        "Residual rib moment, largest |M|",
        Quantity::Moment,
        a.residual_rib_moments.max_abs,
    ));
    r.push(text_row(
        "result-form",
        "Form finding",
        format!("{} · {} iterations · last change {:.1e} m", f.basis, f.iterations, f.final_change),
    ));
    r.push(text_row("result-restraint", "Deck restraint", a.restraint.description.clone()));
    if let Some(t) = &a.truss {
        r.push(text_row("result-determinacy", "Truss idealisation", t.determinacy_text.clone()));
    } else {
        r.push(text_row("result-determinacy", "Truss idealisation", "none (no bracing)".into()));
    }
    r.push(text_row(
        "result-equilibrium",
        "Equilibrium check (frame model)",
        format!("residual {:.1e} of the largest force", case.equilibrium.relative),
    ));
    r
}

/// The results table.
#[component]
pub fn ResultsPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let body = move || {
        let units: Units = state.units.get();
        match state.analysis.get() {
            Ok(a) => {
                let warnings = a
                    .warnings
                    .iter()
                    .map(|w| view! { <li>{format!("{}: {}", w.location, w.message)}</li> })
                    .collect_view();
                let table = rows(&a)
                    .into_iter()
                    .map(|r| {
                        let shown = r.text.clone().unwrap_or_else(|| units.show(r.quantity, r.si));
                        let data = if r.text.is_some() { String::new() } else { format!("{}", r.si) };
                        let kind = if r.text.is_some() { "text" } else { r.quantity.key() };
                        view! {
                            <tr>
                                <th scope="row">{r.label}</th>
                                <td id=r.id data-value=data data-quantity=kind>{shown}</td>
                            </tr>
                        }
                    })
                    .collect_view();
                view! {
                    <table class="results">
                        <caption>"Dead load · frame model unless stated · N: tension +, compression −"</caption>
                        <tbody>{table}</tbody>
                    </table>
                    <ul class="warnings">{warnings}</ul>
                }
                .into_any()
            }
            Err(e) => view! { <p class="error">{e.to_string()}</p> }.into_any(),
        }
    };
    view! { <section class="results-panel" aria-label="Results"><h2>"Results"</h2>{body}</section> }
}
