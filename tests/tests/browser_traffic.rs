//! The Traffic panel and the Traffic block of the results, in headless Chromium over
//! WebDriver (needs `dist/` built from this tree): choosing a load model brings its
//! combinations and the engine's thrust range for them, and undo takes it back; a
//! carriageway wider than the deck, or rib positions that are not numbers, are refused
//! beside the field and the design stays as it was.
//!
//! Expected values come from the engine (`arch::traffic::traffic_envelopes` of the
//! frame model, the presets of `traffic::models` and `traffic::combination`), never
//! from the page itself.

use serde_json::json;
use springline_statics::arch::traffic::{traffic_envelopes, TrafficReport};
use springline_statics::arch::validate::ValidDesign;
use springline_statics::traffic::models::{LoadModel, ModelFamily};
use springline_statics::traffic::TrafficDesign;
use springline_statics::{Design, ModelKind};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The engine's traffic report of `design`'s frame model.
fn report_of(design: &Design) -> TrafficReport {
    let valid = ValidDesign::new(design).expect("the design validates");
    traffic_envelopes(&valid, ModelKind::Frame).expect("envelopes").expect("a frame report")
}

/// The SI value a results cell carries.
fn data_value(s: &Session, id: &str) -> f64 {
    s.exec(
        "const e = document.getElementById(arguments[0]); return e ? +e.dataset.value : null;",
        vec![json!(id)],
    )
    .as_f64()
    .unwrap_or_else(|| panic!("no value in #{id}"))
}

/// The row labels of the thrust table.
fn row_labels(s: &Session) -> Vec<String> {
    let v = s.exec(
        "return [...document.querySelectorAll('#traffic-thrust tbody th')].map(h => h.textContent);",
        vec![],
    );
    serde_json::from_value(v).unwrap_or_default()
}

/// Chooses the load model family with key `key` in the menu (a change event, as a user's
/// choice sends).
fn choose_model(s: &Session, key: &str) {
    s.exec(
        "const e = document.getElementById('load-model'); e.value = arguments[0];
         e.dispatchEvent(new Event('change', { bubbles: true }));",
        vec![json!(key)],
    );
}

fn wait_model_title(s: &Session, title: &str) {
    s.wait_for(
        &format!("the traffic block to show '{title}'"),
        &format!(
            "const e = document.getElementById('traffic-model'); return e && e.textContent.endsWith({})",
            json!(title)
        ),
        WAIT,
    );
}

/// Every value of the thrust table is the engine's for `report` (kN, relative 1e-9).
fn assert_thrust_table(s: &Session, report: &TrafficReport) {
    let t = &report.thrust;
    let close = |id: &str, expected: f64| {
        let shown = data_value(s, id);
        assert!((shown - expected).abs() <= 1e-9 * expected.abs().max(1.0), "#{id}: {shown} vs {expected}");
    };
    close("traffic-permanent", t.permanent);
    close("traffic-characteristic-max", t.traffic_max.value);
    close("traffic-characteristic-min", t.traffic_min.value);
    for (i, d) in t.design.iter().enumerate() {
        close(&format!("traffic-design-{i}-max"), d.max);
        close(&format!("traffic-design-{i}-min"), d.min);
    }
}

#[test]
fn choosing_hl93_brings_its_combinations_and_undo_takes_them_back() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    // the demo: EN 1991-2 LM1 and its five combinations (gr1a, SLS characteristic and frequent, gr2 with braking, temperature leading)
    let en = report_of(&demo);
    wait_model_title(&s, &en.load_model);
    assert_eq!(
        row_labels(&s)[2..],
        [
            "ULS gr1a, design",
            "SLS characteristic, design",
            "SLS frequent, design",
            "ULS gr2, design",
            "ULS temperature leading, design"
        ]
    );
    assert_thrust_table(&s, &en);
    let en_lanes = text_of(&s, "traffic-lanes");
    assert_eq!(en_lanes, en.lanes);

    choose_model(&s, ModelFamily::Hl93.key());
    let mut hl93 = demo.clone();
    hl93.traffic = TrafficDesign::preset(ModelFamily::Hl93, demo.traffic.carriageway_width);
    let expected = report_of(&hl93);
    assert_eq!(expected.load_model, LoadModel::preset(ModelFamily::Hl93).title());
    wait_model_title(&s, &expected.load_model);
    assert_eq!(row_labels(&s)[2..], ["Strength I, design", "Service I, design"]);
    assert_thrust_table(&s, &expected);
    // the panel describes the new model: its lanes and its combinations with clauses
    let notes = text_of(&s, "load-model-notes");
    assert!(notes.contains("Strength I — AASHTO LRFD Tables 3.4.1-1 and 3.4.1-2 (DC factors"), "{notes}");
    assert!(notes.contains("design lane"), "{notes}");
    assert!(!notes.contains("ULS gr1a"), "{notes}");
    // the carriageway stayed as it was
    let width = s.exec("return document.getElementById('carriageway-width').value", vec![]);
    assert_eq!(width, json!("7.5"));

    // in US units the thrusts read in kip
    s.exec("document.getElementById('units').click();", vec![]);
    s.wait_for(
        "the traffic thrusts in kip",
        "return document.getElementById('traffic-design-0-max').textContent.endsWith('kip')",
        WAIT,
    );
    s.exec("document.getElementById('units').click();", vec![]);
    // one undo step takes the model back
    s.exec("document.getElementById('undo').click();", vec![]);
    wait_model_title(&s, &en.load_model);
    assert_eq!(s.exec("return document.getElementById('load-model').value", vec![]), json!("en-lm1"));
    assert_thrust_table(&s, &en);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

#[test]
fn a_carriageway_wider_than_the_deck_is_refused_beside_the_field() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let en = report_of(&demo);
    wait_model_title(&s, &en.load_model);
    let results_before = results_text(&s);
    // the demo deck is 11 m wide (Design::demo); 20 m of carriageway cannot fit
    assert!(demo.deck.width < 20.0);
    set_field(&s, "carriageway-width", "20");
    s.wait_for(
        "the refusal beside the carriageway width",
        "return document.getElementById('carriageway-width-error').textContent.includes('wider than the deck')",
        WAIT,
    );
    let message = text_of(&s, "carriageway-width-error");
    assert!(message.contains("the carriageway (20 m) is wider than the deck (11 m)"), "{message}");
    // the deck width, which mends it too, says so as well
    assert!(text_of(&s, "deck-width-error").contains("wider than the deck"));
    let invalid = s.exec(
        "return document.getElementById('carriageway-width').closest('.field').classList.contains('invalid')",
        vec![],
    );
    assert_eq!(invalid, json!(true));
    // the design is unchanged: the same results, the same lanes, nothing to undo
    assert_eq!(results_text(&s), results_before);
    assert_eq!(text_of(&s, "traffic-lanes"), en.lanes);
    assert_eq!(s.exec("return document.getElementById('undo').disabled", vec![]), json!(true));

    // rib positions that are not numbers: a message beside the field, nothing changes
    set_field(&s, "rib-positions", "left, right");
    s.wait_for(
        "the message beside the rib positions",
        "return document.getElementById('rib-positions-error').textContent.includes('is not a number')",
        WAIT,
    );
    assert!(text_of(&s, "rib-positions-error").contains("commas"));
    assert_eq!(results_text(&s), results_before);
    // positions the engine accepts are taken (one undo step) and the sharing follows
    set_field(&s, "rib-positions", "-3, 3");
    let mut moved = demo.clone();
    moved.traffic.rib_positions = vec![-3.0, 3.0];
    let expected = report_of(&moved);
    s.wait_for(
        "the sharing of ribs at -3 m and +3 m",
        &format!(
            "return document.getElementById('traffic-sharing').textContent === {}",
            json!(format!("Sharing: {}", expected.sharing.rule))
        ),
        WAIT,
    );
    assert_eq!(text_of(&s, "rib-positions-error"), "");
    assert_eq!(s.exec("return document.getElementById('undo').disabled", vec![]), json!(false));
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
    // the inputs column scrolled to the Traffic panel, the page to the Traffic block
    s.exec(
        "document.getElementById('traffic-results').scrollIntoView();
         const aside = document.querySelector('aside.controls');
         aside.scrollTop += document.getElementById('traffic-panel').getBoundingClientRect().top - aside.getBoundingClientRect().top;",
        vec![],
    );
    std::fs::write(screenshots_dir().join("traffic-1500x900.png"), s.screenshot()).expect("screenshot");
}

/// On a phone the Traffic panel and block fit the screen's width: nothing sticks out
/// sideways, the menu shows its whole first choice, the table fits.
#[test]
fn the_traffic_panel_and_block_fit_a_phone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(390, 844, 2.0);
    open(&s, &server);
    wait_model_title(&s, &report_of(&Design::demo()).load_model);
    s.exec("document.getElementById('inputs-toggle').click();", vec![]);
    s.wait_for(
        "the inputs to open",
        "return document.getElementById('load-model').getBoundingClientRect().height > 0",
        WAIT,
    );
    let fits = s.exec(
        "const w = document.documentElement.clientWidth;
         const right = id => document.getElementById(id).getBoundingClientRect().right;
         return [document.documentElement.scrollWidth - w,
                 ['load-model', 'rib-positions', 'load-model-notes', 'traffic-thrust'].every(id => right(id) <= w),
                 document.getElementById('load-model').scrollWidth <= document.getElementById('load-model').clientWidth + 24];",
        vec![],
    );
    assert_eq!(fits, json!([0, true, true]), "page overflow, boxes inside, menu wide enough");
    s.exec("document.getElementById('traffic-panel').scrollIntoView();", vec![]);
    std::fs::write(screenshots_dir().join("traffic-390x844-inputs.png"), s.screenshot()).expect("screenshot");
    s.exec("document.getElementById('traffic-results').scrollIntoView();", vec![]);
    std::fs::write(screenshots_dir().join("traffic-390x844.png"), s.screenshot()).expect("screenshot");
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// While the crown is dragged the drawings follow the pointer, the results table and the
/// traffic block hold the design from before the drag, and the block says it updates on
/// release; letting go brings the report of the dragged design, whose permanent thrust is
/// the frame model's dead-load thrust the results table shows (one solve of the same
/// model).
#[test]
fn the_traffic_block_waits_for_the_end_of_a_drag() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    wait_model_title(&s, &report_of(&demo).load_model);
    let permanent0 = data_value(&s, "traffic-permanent");
    let thrust0 = data_value(&s, "result-left-h");
    assert!((permanent0 - thrust0).abs() <= 1e-6 * thrust0, "{permanent0} vs {thrust0}");
    // the crown in viewport pixels (the drawing's published transform)
    let a = springline_statics::analyze(&demo).expect("demo analyses");
    let t = transform(&s, "elevation");
    let c = to_px(t, a.form.crown.x, a.form.crown.y);
    let o = canvas_origin(&s, "elevation");
    let (x, y) = ((o.0 + c.0).round(), (o.1 + c.1).round());
    // synthetic pointer events, so the button stays down between the checks
    let pointer = |kind: &str, y: f64| {
        s.exec(
            "document.getElementById('elevation').dispatchEvent(new PointerEvent(arguments[0],
               { pointerId: 7, clientX: arguments[1], clientY: arguments[2], button: 0, buttons: 1, bubbles: true }));",
            vec![json!(kind), json!(x), json!(y)],
        );
    };
    pointer("pointerdown", y);
    let grabbed = s.exec("return document.getElementById('elevation').dataset.readout;", vec![]);
    assert!(grabbed.as_str().is_some_and(|r| r.starts_with("rise ")), "{grabbed}");
    pointer("pointermove", y + 20.0);
    pointer("pointermove", y + 40.0);
    s.wait_for(
        "the drawing to follow the drag",
        &format!(
            "const r = document.getElementById('elevation').dataset.readout || '';
             return r.startsWith('rise ') && r !== {grabbed};"
        ),
        WAIT,
    );
    assert!(text_of(&s, "traffic-pending").contains("updates when you let go"));
    // the panels hold the design from before the drag until it ends
    assert_eq!(data_value(&s, "traffic-permanent"), permanent0, "held during the drag");
    assert_eq!(data_value(&s, "result-left-h"), thrust0, "held during the drag");
    pointer("pointerup", y + 40.0);
    s.wait_for(
        "the traffic block to update",
        "const p = document.getElementById('traffic-permanent');
         const h = +document.getElementById('result-left-h').dataset.value;
         return document.getElementById('traffic-pending') === null
             && document.getElementById('traffic-results').dataset.current === 'true'
             && p !== null && Math.abs(+p.dataset.value - h) <= 1e-6 * h",
        WAIT,
    );
    let permanent1 = data_value(&s, "traffic-permanent");
    let thrust1 = data_value(&s, "result-left-h");
    assert!((permanent1 - thrust1).abs() <= 1e-6 * thrust1, "{permanent1} vs {thrust1}");
    assert!((thrust1 - thrust0).abs() > 1.0, "the results followed the drag's end: {thrust1} vs {thrust0}");
    // the analysis after the drag is whole: the other actions' table has its cases (a
    // drag's own analysis leaves them out)
    let action_rows = s.exec(
        "const t = document.getElementById('actions-table'); return t ? t.tBodies[0].rows.length : 0;",
        vec![],
    );
    assert!(action_rows.as_u64().is_some_and(|n| n >= 4), "actions table rows after the drag: {action_rows}");
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// The results shown once edits pause come from one background worker kept between
/// pauses (`crates/app/src/worker_job.rs`: a fresh worker's first answer costs about three
/// times a warm one's): after the pause that follows the page's load, three panel-count
/// edits, each left to rest, start no new worker, and each time the traffic block shows
/// the engine's permanent thrust of the design on screen, not an earlier one's.
#[test]
fn the_results_of_each_pause_come_from_the_one_kept_worker() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let mut design = Design::demo();
    let both_current = "return ['traffic-results', 'stability-results'].every(id => {
             const e = document.getElementById(id); return e && e.dataset.current === 'true'; });";
    s.wait_for("the results of the design on load", both_current, WAIT);
    // every worker the page starts from now on is counted
    s.exec(
        "window.springlineWorkersStarted = 0;
         const Plain = window.Worker;
         window.Worker = class extends Plain {
             constructor(...args) { super(...args); window.springlineWorkersStarted += 1; }
         };",
        vec![],
    );
    for panels in [14, 18, 16] {
        design.panels = panels;
        let expected = report_of(&design).thrust.permanent;
        set_field(&s, "panels", &panels.to_string());
        s.wait_for(
            &format!("the traffic block of {panels} panels"),
            &format!(
                "const p = document.getElementById('traffic-permanent');
                 return document.getElementById('traffic-results').dataset.current === 'true'
                     && p !== null && Math.abs(+p.dataset.value - {expected}) <= 1e-9 * Math.abs({expected})"
            ),
            WAIT,
        );
        s.wait_for(&format!("the stability of {panels} panels"), both_current, WAIT);
    }
    let started = s.exec("return window.springlineWorkersStarted;", vec![]);
    assert_eq!(started, json!(0), "workers started for the three pauses");
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// A preset's own values are fields: a national annex's alpha_Q1 = 0.8 (EN 1991-2
/// 4.3.2(3) allows national choices) lowers the characteristic thrust to the engine's
/// value for that model, and undo brings the published value back.
#[test]
fn a_model_value_is_edited_in_its_field() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let before = report_of(&demo);
    wait_model_title(&s, &before.load_model);
    s.exec("document.getElementById('model-values').open = true;", vec![]);
    let field = "model-alpha-tandem-0";
    assert_eq!(s.exec("return document.getElementById(arguments[0]).value", vec![json!(field)]), json!("1"));
    set_field(&s, field, "0.8");
    let mut annex = demo.clone();
    assert!(annex.traffic.load_model.set_value("alpha_tandem[0]", 0.8));
    let expected = report_of(&annex);
    assert!(expected.thrust.traffic_max.value < before.thrust.traffic_max.value - 1.0);
    s.wait_for(
        "the traffic block to follow the new factor",
        &format!(
            "const e = document.getElementById('traffic-characteristic-max');
             return e && Math.abs(+e.dataset.value - {}) <= 1e-6 * {}",
            expected.thrust.traffic_max.value, expected.thrust.traffic_max.value
        ),
        WAIT,
    );
    assert_thrust_table(&s, &expected);
    s.exec("document.getElementById('model-values').scrollIntoView();", vec![]);
    std::fs::write(screenshots_dir().join("traffic-model-values.png"), s.screenshot()).expect("screenshot");
    // a negative load is refused beside the model and changes nothing
    set_field(&s, "model-udl-lane-1", "-2");
    s.wait_for(
        "the refusal beside the field",
        "const e = document.getElementById('model-udl-lane-1-error'); return e && e.textContent.length > 0",
        WAIT,
    );
    assert_thrust_table(&s, &expected);
    s.exec("document.getElementById('undo').click();", vec![]);
    s.wait_for(
        "undo to bring the published factor back",
        "return document.getElementById('model-alpha-tandem-0').value === '1'",
        WAIT,
    );
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
