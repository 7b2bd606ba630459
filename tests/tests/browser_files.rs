//! Files, projector mode and the print sheet in headless Chromium over WebDriver (needs
//! `dist/` built from this tree): the exported SVG parses and holds one element for every
//! member of the model; the PNG decodes to the canvas's size; the member table is
//! byte-identical to `springline export --csv`; the exported design file opens again to
//! the same results, and a corrupt one keeps the design with a message; projector mode
//! hides the controls and enlarges the type, and its shortcut toggles it; the print sheet
//! prints to one page on A4 and on US Letter.
//!
//! Downloads are caught in the page: a test replaces the download link's `click` with a
//! recorder, then reads the file from its object or data URL.

use serde_json::{json, Value};
use springline_statics::arch::design::Crown;
use springline_statics::arch::design_file::write_design_json;
use springline_statics::scene::svg::element_id;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{base64_decode, Driver, Session};
use std::collections::BTreeSet;

/// Makes the page record downloads instead of starting them.
fn record_downloads(s: &Session) {
    s.exec(
        // the blobs behind object URLs are kept to be read back directly: the page's
        // Content Security Policy lets no script fetch a blob: URL
        "window.__downloads = [];
         window.__blobs = {};
         const objectUrl = URL.createObjectURL;
         URL.createObjectURL = function (blob) { const url = objectUrl(blob); window.__blobs[url] = blob; return url; };
         HTMLAnchorElement.prototype.click = function () { window.__downloads.push({ name: this.download, href: this.href }); };",
        vec![],
    );
}

/// Clicks `button` and returns the file it offers: (name, text) for text files, (name,
/// data URL) for images.
fn download(s: &Session, button: &str) -> (String, String) {
    let before = s.exec("return window.__downloads.length;", vec![]).as_u64().unwrap_or(0);
    click_id(s, button);
    s.wait_for(
        &format!("the file of #{button}"),
        &format!("return window.__downloads.length > {before};"),
        std::time::Duration::from_secs(60),
    );
    let v = s.exec_async(
        "const done = arguments[arguments.length - 1]; const d = window.__downloads[window.__downloads.length - 1];
         if (d.href.startsWith('data:')) { done([d.name, d.href]); }
         else { window.__blobs[d.href].text().then(t => done([d.name, t])); }",
        vec![],
    );
    (v[0].as_str().unwrap_or("").to_string(), v[1].as_str().unwrap_or("").to_string())
}

/// Drops a file named `name` holding `text` on the page.
fn drop_file(s: &Session, name: &str, text: &str) {
    s.exec(
        "const dt = new DataTransfer(); dt.items.add(new File([arguments[1]], arguments[0], { type: 'application/json' }));
         window.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));",
        vec![json!(name), json!(text)],
    );
}

fn higher() -> Design {
    let mut d = Design::demo();
    d.crown = Crown::Rise { rise: 21.0 };
    d
}

#[test]
fn exports_are_complete_and_the_design_file_comes_back() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    record_downloads(&s);
    let demo = Design::demo();
    let analysis = analyze(&demo).expect("analyses");

    // SVG: parses, one group per member of the frame model, named by its model name
    let (name, text) = download(&s, "export-elevation-svg");
    assert_eq!(name, "tarnvale-gorge-road-bridge-elevation.svg");
    let ids: Vec<String> = svg::read(&text)
        .expect("the SVG parses")
        .filter_map(|e| match e {
            svg::parser::Event::Tag(_, _, a) => a.get("id").map(|v| v.to_string()),
            _ => None,
        })
        .collect();
    let members: BTreeSet<String> =
        analysis.frame.model.members.iter().map(|m| element_id(&m.name)).collect();
    let drawn: BTreeSet<String> = ids.iter().filter(|i| i.starts_with("member-")).cloned().collect();
    assert_eq!(drawn, members);
    assert_eq!(ids.iter().filter(|i| i.starts_with("member-")).count(), members.len(), "one element each");

    // PNG: decodes (its header) to the canvas's backing-store size
    let (name, url) = download(&s, "export-elevation-png");
    assert!(name.ends_with("-elevation.png"), "{name}");
    let (frame, pixels) = png_pixels(&url);
    let canvas =
        s.exec("const c = document.getElementById('elevation'); return [c.width, c.height];", vec![]);
    assert_eq!(
        (frame.width as u64, frame.height as u64),
        (canvas[0].as_u64().unwrap_or(0), canvas[1].as_u64().unwrap_or(0)),
        "the canvas's backing store, at the screen's pixel ratio"
    );
    assert!(pixels.chunks(4).any(|p| p[0] < 100), "not a blank image");

    // CSV: the same bytes as the command line's
    let (name, csv) = download(&s, "export-members-csv");
    assert_eq!(name, "tarnvale-gorge-road-bridge-members.csv");
    let dir = std::env::temp_dir().join(format!("springline-export-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp folder");
    let design_path = dir.join("demo.json");
    std::fs::write(&design_path, write_design_json(&demo)).expect("design file");
    let csv_path = dir.join("members.csv");
    let out = std::process::Command::new(springline_tests::cli::springline())
        .args(["export", design_path.to_str().expect("path"), "--csv", csv_path.to_str().expect("path")])
        .output()
        .expect("springline runs");
    assert!(out.status.success(), "{}", String::from_utf8_lossy(&out.stderr));
    assert_eq!(csv, std::fs::read_to_string(&csv_path).expect("the CLI's CSV"));
    assert_eq!(csv.lines().count(), 1 + analysis.frame.model.members.len(), "one row per member");
    let _ = std::fs::remove_dir_all(&dir);

    // the design file of another design, exported, opens again to its results
    set_field(&s, "rise", "21");
    let thrust = analyze(&higher()).expect("analyses").form.thrust;
    wait_value(&s, "result-thrust", thrust);
    // the design's own link, once the address has followed the edit
    s.wait_for(
        "the address to follow the edit",
        "return location.hash.length > 10 && !location.hash.includes('~');",
        WAIT,
    );
    std::thread::sleep(std::time::Duration::from_millis(600));
    let link_before = s.exec("return location.hash;", vec![]);
    let (name, json_text) = download(&s, "export-design-json");
    assert!(name.ends_with(".json"), "{name}");
    let value: Value = serde_json::from_str(&json_text).expect("JSON");
    assert!(value["summary"]["key_numbers"]["cost_index"].is_number(), "the summary");
    click_id(&s, "undo");
    wait_value(&s, "result-thrust", analysis.form.thrust);
    drop_file(&s, "option.json", &json_text);
    wait_value(&s, "result-thrust", thrust);
    // the same design, bit for bit: the same link
    s.wait_for("the address to follow", &format!("return location.hash === {link_before};"), WAIT);
    assert!(
        text_of(&s, "files-message").contains("Opened 'option.json'"),
        "{}",
        text_of(&s, "files-message")
    );

    // a design file of design format 1 (the oldest ever written) opens, updated
    let v1 = std::fs::read_to_string(
        springline_tests::workspace_root().join("tests/fixtures/designs/v1-demo.json"),
    )
    .expect("fixture");
    let v1_design = springline_statics::arch::design_file::read_design_json(&v1).expect("reads");
    drop_file(&s, "v1-demo.json", &v1);
    wait_value(&s, "result-thrust", analyze(&v1_design).expect("analyses").form.thrust);
    click_id(&s, "undo");
    wait_value(&s, "result-thrust", thrust);

    // a corrupt file: a message, and the design stays
    drop_file(&s, "broken.json", "{\"version\": 7, \"name\": ");
    s.wait_for(
        "the refusal",
        "const e = document.getElementById('files-message'); return !!e && e.textContent.includes('could not be opened');",
        WAIT,
    );
    assert!(text_of(&s, "files-message").contains("unchanged"), "{}", text_of(&s, "files-message"));
    wait_value(&s, "result-thrust", thrust);
    // a file of a newer version: refused with the version named
    drop_file(&s, "future.json", "{\"version\": 99}");
    s.wait_for(
        "the newer-version refusal",
        "const e = document.getElementById('files-message'); return !!e && e.textContent.includes('newer');",
        WAIT,
    );
    wait_value(&s, "result-thrust", thrust);
    // a well-formed file whose design does not validate: refused with the field's words
    // (check values: the engine's validation, a negative deck width, as the panels name it)
    let mut invalid = higher();
    invalid.deck.width = -1.0;
    drop_file(&s, "invalid.json", &springline_statics::arch::design_file::write_design_json(&invalid));
    s.wait_for(
        "the invalid design's refusal",
        "const e = document.getElementById('files-message'); \
         return !!e && e.textContent.includes('invalid.json') && !e.textContent.startsWith('Opening');",
        WAIT,
    );
    let refusal = text_of(&s, "files-message");
    assert!(
        refusal.contains("cannot be analysed")
            && refusal.contains("deck width")
            && refusal.contains("unchanged"),
        "{refusal}"
    );
    wait_value(&s, "result-thrust", thrust);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

#[test]
fn projector_mode_enlarges_and_hides_and_the_sheet_prints_on_one_page() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 900, 1.0);
    open(&s, &server);
    let style = "const b = getComputedStyle(document.body).fontSize;
                 const c = getComputedStyle(document.querySelector('aside.controls')).display;
                 const t = getComputedStyle(document.querySelector('.toolbar')).display;
                 const h = document.getElementById('elevation').getBoundingClientRect().height;
                 return [parseFloat(b), c, t, h, document.body.classList.contains('projector')];";
    let before = s.exec(style, vec![]);
    assert_eq!(before[4], json!(false));
    let press = "document.body.dispatchEvent(new KeyboardEvent('keydown', {key: 'b', code: 'KeyB', altKey: true, bubbles: true}));";
    s.exec(press, vec![]);
    s.wait_for("projector mode", "return document.body.classList.contains('projector');", WAIT);
    let on = s.exec(style, vec![]);
    assert!(on[0].as_f64().unwrap_or(0.0) >= 1.3 * before[0].as_f64().unwrap_or(99.0), "{before} -> {on}");
    assert_eq!((on[1].as_str(), on[2].as_str()), (Some("none"), Some("none")), "controls hidden: {on}");
    assert!(
        on[3].as_f64().unwrap_or(0.0) > before[3].as_f64().unwrap_or(1e9),
        "the drawing grows: {before} -> {on}"
    );
    std::fs::write(screenshots_dir().join("projector.png"), s.screenshot()).expect("screenshot");
    // the button (still on screen) leaves it too, and the shortcut enters again
    click_id(&s, "projector-toggle");
    s.wait_for("projector mode off", "return !document.body.classList.contains('projector');", WAIT);
    s.exec(press, vec![]);
    s.wait_for("projector mode again", "return document.body.classList.contains('projector');", WAIT);
    s.exec(press, vec![]);
    s.wait_for("projector mode off again", "return !document.body.classList.contains('projector');", WAIT);
    assert_eq!(s.exec(style, vec![])[1], before[1]);
    assert!(text_of(&s, "shortcuts").contains("Alt+B"));

    // the sheet's link follows the design once it rests; its QR code is worked out only
    // when the page prints (scoring the code's masks is tens of milliseconds of the page's
    // thread), and printing draws the code of the link printed
    s.wait_for(
        "the sheet's link",
        "return document.getElementById('print-link').textContent.includes('#');",
        WAIT,
    );
    let modules = "return document.getElementById('print-qr').dataset.modules ?? null;";
    assert_eq!(s.exec(modules, vec![]), Value::Null, "no code before the page prints");
    assert!(s.print_pdf(21.0, 29.7).starts_with(b"%PDF"));
    let width = s.exec(modules, vec![]);
    let link = text_of(&s, "print-link");
    let (version, read) = read_qr(&canvas_data_url(&s, "print-qr"));
    assert_eq!(read, link, "the code reads back as the link printed beside it");
    // a symbol of version V is 17 + 4 V modules a side (ISO/IEC 18004, symbol versions
    // and sizes: 21 at version 1, 177 at version 40; from memory of the standard)
    assert_eq!(width, json!((17 + 4 * version).to_string()), "data-modules: the code's width in modules");
    // an edit printed at once, before its link has rested: the code is drawn anew for
    // the link printed beside it, the edited design's
    set_field(&s, "panels", "14");
    assert!(s.print_pdf(21.0, 29.7).starts_with(b"%PDF"));
    let edited = text_of(&s, "print-link");
    assert_ne!(edited, link, "the sheet's link follows the edit as the page prints");
    assert_eq!(read_qr(&canvas_data_url(&s, "print-qr")).1, edited, "the code is the edited design's link");

    // an image of the sheet as printed (print media, the A4 width at 96 px per inch)
    s.set_window(794, 1123);
    s.cdp("Emulation.setEmulatedMedia", json!({ "media": "print" }));
    std::thread::sleep(std::time::Duration::from_millis(500));
    std::fs::write(screenshots_dir().join("print-sheet.png"), s.screenshot()).expect("screenshot");
    s.cdp("Emulation.setEmulatedMedia", json!({ "media": "" }));
    // the print sheet: one page on A4 and on US Letter, with the drawings (images) in it
    for (paper, w, h) in [("A4", 21.0, 29.7), ("US Letter", 21.59, 27.94)] {
        let pdf = s.print_pdf(w, h);
        assert!(pdf.starts_with(b"%PDF"), "{paper}: a PDF");
        let text = String::from_utf8_lossy(&pdf);
        let pages = text.matches("/Type /Page").count() - text.matches("/Type /Pages").count();
        assert_eq!(pages, 1, "{paper}: one page");
        assert!(pdf.len() > 20_000, "{paper}: {} bytes is too little for the drawings", pdf.len());
        // the elevation, the force diagram and the QR code print as images
        assert!(text.matches("/Subtype /Image").count() >= 3, "{paper}: the drawings print");
    }
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// The text and version of the one QR code in a PNG given as a data URL, read by rqrr (an
/// independent QR reader from the crate registry, which finds the code in the image
/// itself).
fn read_qr(url: &str) -> (usize, String) {
    let (frame, pixels) = png_pixels(url);
    let (w, h) = (frame.width as usize, frame.height as usize);
    let channels = frame.line_size / w;
    let mut image = rqrr::PreparedImage::prepare_from_greyscale(w, h, |x, y| pixels[(y * w + x) * channels]);
    let grids = image.detect_grids();
    assert_eq!(grids.len(), 1, "one QR code in the canvas");
    let (meta, text) = grids[0].decode().expect("the QR code decodes");
    (meta.version.0, text)
}

/// A PNG given as a data URL, decoded: its frame (size, line length) and its pixels.
fn png_pixels(url: &str) -> (png::OutputInfo, Vec<u8>) {
    let bytes = base64_decode(url.trim_start_matches("data:image/png;base64,"));
    let mut reader = png::Decoder::new(std::io::Cursor::new(bytes)).read_info().expect("a PNG");
    let mut pixels = vec![0; reader.output_buffer_size()];
    let frame = reader.next_frame(&mut pixels).expect("it decodes");
    (frame, pixels)
}
