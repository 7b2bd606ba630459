//! The force canvas as data (`scene::force`): golden scenes, legible labels at three
//! canvas sizes, the pole's name, and a fixed force scale during a drag.
//!
//! Golden scenes live in `tests/fixtures/scenes/forces-*.json` (numbers rounded to
//! 0.01 px); run with `SPRINGLINE_BLESS=1` to rewrite them after an intended change, and
//! look at the difference before committing it. With `SPRINGLINE_SCENE_SVG=dir` every
//! scene checked here is also written there as SVG, to look at.

use serde_json::Value;
use springline_statics::arch::design::{Bracing, Crown, RibSystem};
use springline_statics::scene::force::{
    force_drawing, AreaKind, AreaView, ForceDrawing, ForceOptions, POLE_NAME,
};
use springline_statics::scene::{Ink, Pattern, Scene, Shape, Tag, Viewport};
use springline_statics::{analyze, Analysis, Design};
use springline_tests::workspace_root;

/// Canvas sizes, CSS px: the force canvas beside the elevation on a wide screen, on a
/// medium one, and on a phone (web/style.css gives the canvases 440 px of height on a
/// desktop; the phone's is smaller).
const SIZES: [(f64, f64); 3] = [(700.0, 420.0), (480.0, 320.0), (360.0, 260.0)];

fn designs() -> Vec<(&'static str, Design)> {
    let demo = Design::demo();
    let mut crossed = demo.clone();
    crossed.bracing = Bracing::Crossed;
    crossed.rib_system = RibSystem::TwoHinged;
    let mut unbraced = demo.clone();
    unbraced.bracing = Bracing::None;
    let mut eight = demo.clone();
    eight.panels = 8;
    let mut many = demo.clone();
    many.panels = 32;
    let mut unequal = demo.clone();
    unequal.springing_left_level = 72.0;
    unequal.springing_right_level = 86.0;
    vec![
        ("demo", demo),
        ("crossed", crossed),
        ("unbraced", unbraced),
        ("8-panels", eight),
        ("32-panels", many),
        ("unequal-springings", unequal),
    ]
}

fn analysed(d: &Design) -> Analysis {
    analyze(d).unwrap_or_else(|e| panic!("{} analyses: {e}", d.name))
}

fn draw(a: &Analysis, case: usize, opts: &ForceOptions, size: (f64, f64)) -> ForceDrawing {
    let d = force_drawing(a, case, opts, Viewport::new(size.0, size.1));
    let key: String = a.design.chars().filter(|c| c.is_ascii_alphanumeric()).take(12).collect();
    let what =
        format!("{}-{}-{:?}", a.frame.model.members.len(), opts.highlight.is_some(), a.summary.span as i64);
    dump_svg(&d.scene, &format!("{key}-{what}-case{case}-{}x{}", size.0, size.1));
    d
}

/// Every number rounded to 0.01 (pixels of a scene), so the goldens do not depend on
/// the last digits of floating point.
fn rounded(v: Value) -> Value {
    match v {
        Value::Number(n) => match n.as_f64() {
            Some(f) if n.is_f64() => serde_json::json!((f * 100.0).round() / 100.0),
            _ => Value::Number(n),
        },
        Value::Array(a) => Value::Array(a.into_iter().map(rounded).collect()),
        Value::Object(o) => Value::Object(o.into_iter().map(|(k, v)| (k, rounded(v))).collect()),
        other => other,
    }
}

fn check_golden(name: &str, scene: &Scene) {
    let path = workspace_root().join("tests/fixtures/scenes").join(format!("forces-{name}.json"));
    let got = rounded(serde_json::to_value(scene).expect("a scene serialises"));
    if std::env::var_os("SPRINGLINE_BLESS").is_some() {
        std::fs::create_dir_all(path.parent().expect("folder")).expect("fixtures folder");
        std::fs::write(&path, serde_json::to_string_pretty(&got).expect("json") + "\n")
            .expect("golden written");
        return;
    }
    let text = std::fs::read_to_string(&path)
        .unwrap_or_else(|e| panic!("{}: {e} (run with SPRINGLINE_BLESS=1 to create it)", path.display()));
    let want: Value = serde_json::from_str(&text).expect("golden is JSON");
    if got != want {
        let out = std::env::temp_dir().join(format!("forces-{name}.got.json"));
        let _ = std::fs::write(&out, serde_json::to_string_pretty(&got).unwrap_or_default());
        panic!(
            "force scene '{name}' differs from {} (this run's scene: {}); if the change is intended, rerun with \
             SPRINGLINE_BLESS=1",
            path.display(),
            out.display()
        );
    }
}

/// Golden scenes: the demo (braced: reciprocal figure and pole construction) and the
/// unbraced demo (thrust line), at the wide size, the demo also with a member
/// highlighted and in US units.
#[test]
fn force_scenes_match_their_goldens() {
    let all = designs();
    let demo = analysed(&all[0].1);
    check_golden("demo", &draw(&demo, 0, &ForceOptions::default(), SIZES[0]).scene);
    // the rib member with the largest force in the figure, highlighted, in kip
    let truss = demo.truss.as_ref().expect("braced");
    let rib = truss.map.rib_members[0];
    let opts = ForceOptions {
        units: springline_statics::units::Units::UsCustomary,
        highlight: Some(rib),
        ..ForceOptions::default()
    };
    let highlighted = draw(&demo, 0, &opts, SIZES[1]).scene;
    assert!(
        highlighted.items.iter().any(
            |i| i.tag == Tag::Member { member: rib } && i.stroke.is_some_and(|s| s.ink == Ink::Highlight)
        ),
        "the highlighted member is drawn in the highlight ink"
    );
    assert!(highlighted.labels.iter().any(|l| l.text.contains("kip")), "US units on the labels");
    check_golden("demo-highlight-us", &highlighted);
    let unbraced = analysed(&all[2].1);
    check_golden("unbraced", &draw(&unbraced, 0, &ForceOptions::default(), SIZES[0]).scene);
}

/// No label covers another or leaves the canvas, for six designs, every load case and
/// three canvas sizes; the demo drops no label (each found room, in full or in its short
/// form); every design keeps its title and case line and may leave out only space labels.
#[test]
fn labels_never_overlap_or_leave_the_canvas() {
    for (name, d) in designs() {
        let a = analysed(&d);
        for case in 0..a.load_cases.len() {
            for size in SIZES {
                let drawing = draw(&a, case, &ForceOptions::default(), size);
                let s = &drawing.scene;
                let overlaps: Vec<_> = s
                    .overlapping_labels()
                    .into_iter()
                    .map(|(i, j)| (&s.labels[i].text, &s.labels[j].text))
                    .collect();
                assert!(
                    overlaps.is_empty(),
                    "{name} case {case} at {size:?}: overlapping labels {overlaps:?}"
                );
                let outside: Vec<_> = s.labels_outside().into_iter().map(|i| &s.labels[i].text).collect();
                assert!(outside.is_empty(), "{name} case {case} at {size:?}: labels outside {outside:?}");
                assert!(!s.labels.is_empty() && !s.items.is_empty(), "{name}: something is drawn");
                // every design and size: the header's title and case line are there, and
                // anything left out is a space label of the figure (Bow's letters and
                // numerals, already as short as they get) that found no room among the
                // lines, never a title, key, value or the pole's name
                let texts: Vec<&str> = s.labels.iter().map(|l| l.text.as_str()).collect();
                let title = texts
                    .iter()
                    .any(|t| t.starts_with("Force diagram · ") || t.starts_with("Thrust line · "));
                assert!(title, "{name} case {case} at {size:?}: title in {texts:?}");
                let case_title = a.load_cases[case].description.title();
                assert!(texts.contains(&case_title.as_str()), "{name} case {case} at {size:?}: {case_title}");
                for gone in &drawing.dropped {
                    let bow = gone.chars().all(|c| {
                        // letters, numerals, ranges "AB–AD" and their short form "AB–AD +5"
                        c.is_ascii_uppercase() || c.is_ascii_digit() || matches!(c, ',' | ' ' | '–' | '+')
                    });
                    assert!(bow, "{name} case {case} at {size:?}: {gone:?} left out");
                }
                // space labels left out are said to be there (zooming in shows them)
                if !drawing.dropped.is_empty() {
                    assert!(
                        texts.iter().any(|t| t.ends_with("hidden: zoom in")),
                        "{name} case {case} at {size:?}: {} left out without a word",
                        drawing.dropped.len()
                    );
                }
                if name == "demo" {
                    assert!(
                        drawing.dropped.is_empty(),
                        "demo case {case} at {size:?} dropped {:?}; areas {:?}; labels {:?}",
                        drawing.dropped,
                        drawing.areas,
                        s.labels.iter().map(|l| (&l.text, l.rect)).collect::<Vec<_>>()
                    );
                }
                // areas lie inside the canvas and do not overlap
                for (i, area) in drawing.areas.iter().enumerate() {
                    assert!(s.viewport.frame().contains(&area.rect), "{name}: area {i} inside");
                    for other in &drawing.areas[i + 1..] {
                        assert!(!area.rect.overlaps(&other.rect), "{name}: areas apart");
                    }
                }
            }
        }
    }
}

/// Where several spaces share a point the figure writes one label: under the demo's
/// dead load the diagonals carry nothing in the truss idealisation, so many spaces meet.
/// Every space is named in exactly one label (in its text or, when shortened, in its
/// hover detail), spaces at one point in the same label, and there are fewer labels than
/// spaces. (Points a few pixels apart may share a label too; zooming in separates them.)
#[test]
fn spaces_sharing_a_point_get_one_label() {
    let a = analysed(&Design::demo());
    let fd = a.load_cases[0].force_diagram.as_ref().expect("figure");
    let d = draw(&a, 0, &ForceOptions::default(), SIZES[0]);
    let space_labels: Vec<_> = d
        .scene
        .labels
        .iter()
        .filter(|l| l.detail.as_deref().is_some_and(|t| t.starts_with("spaces ")))
        .collect();
    // which label names each space (index into fd.spaces -> label)
    let mut label_of: Vec<Option<usize>> = vec![None; fd.spaces.len()];
    for (k, l) in space_labels.iter().enumerate() {
        let list = l.detail.as_deref().unwrap_or("").trim_start_matches("spaces ");
        for part in list.split(", ") {
            let (x, y) = part.split_once('–').unwrap_or((part, part));
            let ix = fd.spaces.iter().position(|s| s.label == x).expect("first of a run");
            let iy = fd.spaces.iter().position(|s| s.label == y).expect("last of a run");
            for named in &mut label_of[ix..=iy] {
                assert_eq!(*named, None, "a space named twice ({part})");
                *named = Some(k);
            }
        }
    }
    assert!(label_of.iter().all(Option::is_some), "every space named: {label_of:?}");
    let mut shared = 0;
    for i in 0..fd.spaces.len() {
        for j in i + 1..fd.spaces.len() {
            let (p, q) = (fd.spaces[i].point, fd.spaces[j].point);
            if (p.x - q.x).abs() <= 1e-9 * fd.largest_force && (p.y - q.y).abs() <= 1e-9 * fd.largest_force {
                assert_eq!(
                    label_of[i], label_of[j],
                    "{} and {} share a point",
                    fd.spaces[i].label, fd.spaces[j].label
                );
                shared += 1;
            }
        }
    }
    assert!(shared > 0, "the demo has spaces sharing points (zero diagonals)");
    assert!(space_labels.len() < fd.spaces.len());
    // the figure draws the zero-force diagonals as rings, dotted or solid never
    let zero = fd.zero_force_members.len();
    assert!(zero > 0);
    let rings = d
        .scene
        .items
        .iter()
        .filter(|i| matches!(i.shape, Shape::Circle { .. }) && matches!(i.tag, Tag::Member { .. }))
        .count();
    assert_eq!(rings, zero, "one ring per zero-force member");
    // tension dashed, compression solid
    for i in d.scene.items.iter().filter(|i| matches!(i.tag, Tag::Member { .. })) {
        if let Some(s) = i.stroke {
            match s.ink {
                Ink::Tension => assert_eq!(s.pattern, Pattern::Dashed),
                Ink::Compression => assert_eq!(s.pattern, Pattern::Solid),
                _ => {}
            }
        }
    }
}

/// The pole of the rib's construction is named so no space can be: no space label of
/// any figure equals it, and the pole construction writes it.
#[test]
fn the_pole_name_is_no_space_label() {
    for (name, d) in designs() {
        let a = analysed(&d);
        for figs in &a.load_cases {
            if let Some(fd) = &figs.force_diagram {
                assert!(
                    fd.spaces.iter().all(|s| s.label != POLE_NAME),
                    "{name}: a space is named {POLE_NAME}"
                );
            }
        }
        if a.truss.is_some() {
            let s = draw(&a, 0, &ForceOptions::default(), SIZES[0]).scene;
            assert!(s.labels.iter().any(|l| l.text == POLE_NAME), "{name}: the pole is named");
        }
    }
}

/// The pole-distance segment of the pole construction in a drawing: the line from the
/// pole to the load line at the pole's level, found by its ends through the area's
/// transform. Returns its length in pixels.
fn thrust_segment(d: &ForceDrawing, a: &Analysis) -> f64 {
    let pc = &a.load_cases[0].rib_funicular.as_ref().expect("rib funicular").construction;
    let area = d.areas.iter().find(|x| x.kind == AreaKind::Pole).expect("pole area");
    let (p, q) = (area.transform.px(pc.pole.x, pc.pole.y), area.transform.px(0.0, pc.pole.y));
    let found = d.scene.items.iter().find_map(|i| match i.shape {
        Shape::Line { from, to }
            if (from.x - p.x).abs() < 1e-6
                && (from.y - p.y).abs() < 1e-6
                && (to.x - q.x).abs() < 1e-6
                && (to.y - q.y).abs() < 1e-6 =>
        {
            Some((to.x - from.x).hypot(to.y - from.y))
        }
        _ => None,
    });
    found.expect("the pole distance is drawn whole (not clipped)")
}

/// Halving the rise about doubles the thrust. With the scale fixed (as during a drag)
/// the thrust segment draws longer in proportion to the engine's thrusts; fitted, the
/// figure shrinks instead and the segment keeps about its length.
#[test]
fn a_fixed_scale_draws_a_larger_thrust_longer() {
    let mut high = Design::demo();
    high.springing_right_level = high.springing_left_level;
    high.crown = Crown::Rise { rise: 20.0 };
    let mut low = high.clone();
    low.crown = Crown::Rise { rise: 10.0 };
    let (ah, al) = (analysed(&high), analysed(&low));
    let thrust =
        |a: &Analysis| -a.load_cases[0].rib_funicular.as_ref().expect("funicular").construction.pole.x;
    let ratio = thrust(&al) / thrust(&ah);
    assert!((1.8..2.2).contains(&ratio), "half the rise, about twice the thrust: {ratio}");
    // zoomed out to half so that the doubled figure stays whole in its area
    let opts =
        ForceOptions { views: [AreaView { zoom: 0.5, ..AreaView::FIT }; 2], ..ForceOptions::default() };
    let size = SIZES[0];
    let before = draw(&ah, 0, &opts, size);
    let fixed = before.fixed_scale().expect("force areas");
    let after = draw(&al, 0, &ForceOptions { fixed_scale: Some(fixed), ..opts }, size);
    let (lb, la) = (thrust_segment(&before, &ah), thrust_segment(&after, &al));
    assert!((la / lb - ratio).abs() < 1e-9 * ratio, "fixed scale: {la} px / {lb} px vs thrusts {ratio}");
    // the figure's own scale is kept too
    let figure =
        |d: &ForceDrawing| d.areas.iter().find(|x| x.kind == AreaKind::Figure).expect("figure").base_scale;
    assert!((figure(&after) - figure(&before)).abs() < 1e-12 * figure(&before));
    // fitted, the larger thrust does not draw twice as long
    let refit = draw(&al, 0, &opts, size);
    let lr = thrust_segment(&refit, &al);
    assert!(lr / lb < 0.9 * ratio, "refitted: {lr} px vs {lb} px");
}

/// Pointers map back: the member under a figure segment's midpoint is that member, and a
/// shortened label's full list is its hover detail.
#[test]
fn pointers_find_members_and_labels() {
    let a = analysed(&Design::demo());
    let d = draw(&a, 0, &ForceOptions::default(), SIZES[0]);
    let fd = a.load_cases[0].force_diagram.as_ref().expect("figure");
    let t = d.scene.transform.expect("published transform");
    assert_eq!(t, d.areas[0].transform, "the scene's transform is the figure's");
    let seg = fd
        .segments
        .iter()
        .filter(|s| matches!(s.of, springline_statics::SegmentOf::Member { .. }) && !s.zero)
        .max_by(|x, y| x.force.abs().total_cmp(&y.force.abs()))
        .expect("members");
    let (l, r) = (fd.spaces[seg.left].point, fd.spaces[seg.right].point);
    let mid = t.px((l.x + r.x) / 2.0, (l.y + r.y) / 2.0);
    let springline_statics::SegmentOf::Member { member } = seg.of else { unreachable!() };
    let found = d.member_at(mid, 3.0).expect("a member under the pointer");
    // a collinear member may share the spot; it must carry the same force then
    let force_of = |m: usize| {
        fd.segments
            .iter()
            .find(|s| s.of == springline_statics::SegmentOf::Member { member: m })
            .map(|s| s.force)
    };
    assert!(found == member || force_of(found) == force_of(member), "{found} vs {member}");
    for l in &d.scene.labels {
        let c = springline_statics::scene::Px::new(l.rect.x + l.rect.w / 2.0, l.rect.y + l.rect.h / 2.0);
        assert_eq!(d.label_at(c).map(|x| &x.text), Some(&l.text));
    }
}

// ---------------------------------------------------------------------------------------
// an SVG view of a scene, for looking at (not a format of the app)

fn dump_svg(scene: &Scene, name: &str) {
    let Some(dir) = std::env::var_os("SPRINGLINE_SCENE_SVG") else { return };
    let mut out = format!(
        "<svg xmlns='http://www.w3.org/2000/svg' width='{}' height='{}'><rect width='100%' height='100%' fill='{}'/>",
        scene.viewport.width,
        scene.viewport.height,
        Ink::Background.css()
    );
    for it in &scene.items {
        let stroke = it.stroke.map_or("stroke='none'".to_string(), |s| {
            let dash = s.pattern.dashes(s.width).iter().map(|d| d.to_string()).collect::<Vec<_>>().join(",");
            format!("stroke='{}' stroke-width='{}' stroke-dasharray='{}'", s.ink.css(), s.width, dash)
        });
        let fill = it.fill.map_or("none", |f| f.css());
        let el = match &it.shape {
            Shape::Line { from, to } => {
                format!("<line x1='{}' y1='{}' x2='{}' y2='{}'", from.x, from.y, to.x, to.y)
            }
            Shape::Path { points, closed } => format!(
                "<{} points='{}'",
                if *closed { "polygon" } else { "polyline" },
                points.iter().map(|p| format!("{},{}", p.x, p.y)).collect::<Vec<_>>().join(" ")
            ),
            Shape::Circle { center, radius } => {
                format!("<circle cx='{}' cy='{}' r='{}'", center.x, center.y, radius)
            }
            Shape::Arrow { tail, head, .. } => {
                format!("<line x1='{}' y1='{}' x2='{}' y2='{}'", tail.x, tail.y, head.x, head.y)
            }
            Shape::Box { rect } => {
                format!("<rect x='{}' y='{}' width='{}' height='{}'", rect.x, rect.y, rect.w, rect.h)
            }
        };
        out += &format!("{el} {stroke} fill='{fill}'/>");
    }
    for l in &scene.labels {
        if let Some(p) = l.leader {
            out += &format!(
                "<line x1='{}' y1='{}' x2='{}' y2='{}' stroke='#999' stroke-width='0.8'/>",
                l.rect.x + l.rect.w / 2.0,
                l.rect.y + l.rect.h / 2.0,
                p.x,
                p.y
            );
        }
        if l.boxed {
            out += &format!(
                "<rect x='{}' y='{}' width='{}' height='{}' fill='#fbfaf7' fill-opacity='0.88' stroke='#ddd' stroke-width='0.5'/>",
                l.rect.x, l.rect.y, l.rect.w, l.rect.h
            );
        }
        let text = l.text.replace('&', "&amp;").replace('<', "&lt;");
        out += &format!(
            "<text x='{}' y='{}' font-family='sans-serif' font-size='{}' fill='{}' dominant-baseline='middle'>{text}</text>",
            l.rect.x + 3.0,
            l.rect.y + l.rect.h / 2.0,
            l.size.px(),
            l.ink.css()
        );
    }
    out += "</svg>";
    let _ = std::fs::create_dir_all(&dir);
    let _ = std::fs::write(std::path::Path::new(&dir).join(format!("{name}.svg")), out);
}
