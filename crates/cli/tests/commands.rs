//! Every subcommand run as the built binary: help, usage errors and the exit codes that
//! `springline --help` documents (0 success, 1 refused input, 2 usage, 3 IO), and
//! standard input as `-`. The expected codes and texts are this tool's own contract
//! (README, "Command-line tool"); clap's wording is checked only where a test needs it.

mod common;

use common::{demo_json, empty_dir, run, run_in, run_with, text};
use std::process::{Command, Output};

/// A usage error: exit 2, nothing on stdout, clap's message on stderr (returned).
fn usage_error(args: &[&str]) -> String {
    let out = run(args, "");
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{args:?}: {err}");
    assert!(out.stdout.is_empty(), "{args:?} printed {}", text(&out.stdout));
    assert!(err.starts_with("error: "), "{args:?}: {err}");
    err
}

/// A failed run with the given exit code, nothing on stdout and `springline: ...` on
/// stderr (returned).
fn failed(out: &Output, code: i32) -> String {
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(code), "{err}");
    assert!(out.stdout.is_empty(), "printed {}", text(&out.stdout));
    assert!(err.starts_with("springline: "), "{err}");
    err
}

/// Names of the entries of a directory, sorted.
fn listing(dir: &std::path::Path) -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(dir)
        .expect("the directory can be listed")
        .map(|entry| entry.expect("a directory entry").file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    names
}

/// Regression: `springline analyze --help` used to read a file named `--help`. Now it
/// prints the help and exits 0, even with such a file in the working directory, and
/// touches no file.
#[test]
fn analyze_help_prints_help_and_reads_no_file() {
    let dir = empty_dir("analyze_help");
    std::fs::write(dir.join("--help"), "not a design").expect("write");
    let out = run_in(&dir, &["analyze", "--help"]);
    let help = text(&out.stdout);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    assert!(out.stderr.is_empty(), "{}", text(&out.stderr));
    assert!(help.contains("Usage: springline analyze [OPTIONS] <DESIGN.json|--link <LINK>>"), "{help}");
    assert!(help.contains("`-` reads standard input"), "{help}");
    assert!(help.contains("springline demo | springline analyze -"), "{help}");
    assert_eq!(listing(&dir), ["--help"]);
    assert_eq!(std::fs::read_to_string(dir.join("--help")).expect("read"), "not a design");
}

/// Every subcommand has a one-line description, its arguments and an example in its
/// own help, with `-h` as with `--help`, and `springline help CMD` says the same.
#[test]
fn every_subcommand_has_its_own_help() {
    let cases: [(&str, &str, &str); 9] = [
        ("demo", "Print the demo design as JSON", "springline demo > design.json"),
        ("analyze", "Analyse a design", "springline analyze design.json"),
        ("link", "Print the permalink fragment of a design", "springline link design.json"),
        ("model", "Export a generated model", "springline model --truss design.json"),
        ("solve", "Solve a model in the neutral model format", "springline solve frame.json"),
        (
            "influence",
            "Print an influence line of the frame model as CSV",
            "springline influence design.json --of thrust",
        ),
        (
            "size",
            "Size the member groups, weigh the design and size its thrust blocks",
            "springline size design.json --text",
        ),
        (
            "sweep",
            "Sweep one parameter of a design (or two as a grid)",
            "springline sweep design.json --vary rise-ratio=0.10:0.20:21",
        ),
        (
            "export",
            "Write the design's drawings (SVG), member table (CSV) and design file",
            "springline export design.json --svg elevation.svg --csv members.csv",
        ),
    ];
    for (command, description, example) in cases {
        for flag in ["--help", "-h"] {
            let out = run(&[command, flag], "");
            let help = text(&out.stdout);
            assert_eq!(out.status.code(), Some(0), "{command} {flag}");
            assert!(help.starts_with(description), "{command} {flag}: {help}");
            assert!(help.contains(&format!("Usage: springline {command}")), "{command} {flag}: {help}");
            assert!(help.contains(example), "{command} {flag}: {help}");
        }
        let out = run(&["help", command], "");
        assert_eq!(out.status.code(), Some(0));
        assert!(text(&out.stdout).contains(example), "help {command}");
    }
}

/// The top-level help names every subcommand and carries the caution and the exit
/// codes.
#[test]
fn top_level_help_has_the_caution_and_the_exit_codes() {
    let out = run(&["--help"], "");
    let help = text(&out.stdout);
    assert_eq!(out.status.code(), Some(0));
    assert!(
        help.contains("Results are for concept design only; local codes and a licensed engineer govern."),
        "{help}"
    );
    for command in ["demo", "analyze", "link", "model", "solve", "influence", "size", "sweep"] {
        assert!(help.contains(&format!("\n  {command} ")), "{command}: {help}");
    }
    for code in ["0  success", "1  the engine refused the input", "2  usage error", "3  a file"] {
        assert!(help.contains(code), "{code}: {help}");
    }
}

/// No subcommand, or an unknown one, is a usage error.
#[test]
fn missing_or_unknown_subcommand_is_a_usage_error() {
    let out = run(&[], "");
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("Usage: springline <COMMAND>"), "{}", text(&out.stderr));
    assert!(usage_error(&["analyse"]).contains("unrecognized subcommand 'analyse'"));
    assert!(usage_error(&["demo", "extra"]).contains("unexpected argument 'extra'"));
}

/// Regression: `model --rib --truss` used to read `--rib` as the design path. Now the
/// two flags conflict: exit 2, naming both, before any file is read.
#[test]
fn model_truss_and_rib_conflict() {
    let dir = empty_dir("model_conflict");
    // the old reading would have opened this file as the design and succeeded
    std::fs::write(dir.join("--rib"), demo_json()).expect("write");
    for args in [
        &["model", "--rib", "--truss", "d.json"][..],
        &["model", "--rib", "--truss"],
        &["model", "d.json", "--truss", "--rib"],
    ] {
        let out = run_in(&dir, args);
        let err = text(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{args:?}: {err}");
        assert!(out.stdout.is_empty(), "{args:?}");
        assert!(err.contains("cannot be used with"), "{args:?}: {err}");
        assert!(err.contains("'--rib'") && err.contains("'--truss'"), "{args:?}: {err}");
    }
}

/// `analyze` takes exactly one of a design path and `--link`.
#[test]
fn analyze_takes_a_path_or_a_link_not_both() {
    let both = usage_error(&["analyze", "d.json", "--link", "#s1.AAAA"]);
    assert!(both.contains("'[DESIGN.json]' cannot be used with '--link <LINK>'"), "{both}");
    let neither = usage_error(&["analyze"]);
    assert!(neither.contains("required arguments were not provided"), "{neither}");
    assert!(neither.contains("<DESIGN.json|--link <LINK>>"), "{neither}");
    usage_error(&["analyze", "a.json", "b.json"]);
}

/// A file that cannot be read is exit 3, naming the path, for every command that reads
/// one.
#[test]
fn missing_file_is_an_io_error_naming_the_path() {
    let dir = empty_dir("missing_file");
    let missing = dir.join("no-such-design.json");
    let path = missing.to_str().expect("a UTF-8 scratch path");
    for command in ["analyze", "link", "model", "solve"] {
        let err = failed(&run(&[command, path], ""), 3);
        assert!(err.contains(&format!("cannot read '{path}'")), "{command}: {err}");
    }
    // a directory is not a readable file either
    let dir_path = dir.to_str().expect("a UTF-8 scratch path");
    let err = failed(&run(&["analyze", dir_path], ""), 3);
    assert!(err.contains(dir_path), "{err}");
}

/// Output that cannot be written is exit 3 (`/dev/full` refuses every write).
#[cfg(target_os = "linux")]
#[test]
fn unwritable_output_is_an_io_error() {
    let full = std::fs::File::create("/dev/full").expect("/dev/full opens");
    let out = run_with(Command::new(env!("CARGO_BIN_EXE_springline")).arg("demo").stdout(full), "");
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(3), "{err}");
    assert!(err.starts_with("springline: cannot write to standard output"), "{err}");
}

/// Content the engine cannot use is exit 1: not JSON, JSON that is not a design, not
/// UTF-8, a design that fails validation, a model that is a mechanism.
#[test]
fn refused_input_is_exit_1() {
    let dir = empty_dir("refused_input");
    let not_a_design = dir.join("not-a-design.json");
    std::fs::write(&not_a_design, r#"{"bridge": "not a design"}"#).expect("write");
    let path = not_a_design.to_str().expect("a UTF-8 scratch path");
    for command in ["analyze", "link", "model"] {
        let err = failed(&run(&[command, path], ""), 1);
        assert!(err.contains(&format!("'{path}' is not a valid design file")), "{command}: {err}");
    }
    let err = failed(&run(&["solve", path], ""), 1);
    assert!(err.contains(&format!("'{path}' is not a valid model file")), "{err}");

    let err = failed(&run(&["analyze", "-"], "not JSON"), 1);
    assert!(err.contains("standard input is not a valid design file"), "{err}");
    let not_utf8 = dir.join("latin1.json");
    std::fs::write(&not_utf8, b"{\"name\": \"Tarnvale \xe9\"}").expect("write");
    let err = failed(&run(&["analyze", not_utf8.to_str().expect("UTF-8 path")], ""), 1);
    assert!(err.contains("is not UTF-8 text"), "{err}");

    // one panel is fewer than the engine accepts: it says which field
    let one_panel = demo_json().replace("\"panels\": 12", "\"panels\": 1");
    assert_ne!(one_panel, demo_json());
    for command in ["analyze", "model"] {
        let err = failed(&run(&[command, "-"], &one_panel), 1);
        assert!(err.contains("panels"), "{command}: {err}");
    }

    // a bar pinned at one end only: node B swings freely (a mechanism)
    let loose_bar = r#"{"title": "loose bar",
        "nodes": [{"name": "A", "x": 0, "y": 0}, {"name": "B", "x": 4, "y": 0}],
        "members": [{"name": "AB", "kind": "truss", "start": 0, "end": 1, "e": 2.1e8, "a": 0.01}],
        "supports": [{"node": 0, "x": true, "y": true}],
        "load_cases": [{"name": "dead", "nodal": [{"node": 1, "fx": 0, "fy": -10, "mz": 0}]}]}"#;
    let err = failed(&run(&["solve", "-"], loose_bar), 1);
    assert!(err.contains("mechanism") && err.contains("node B"), "{err}");
}

/// An unbraced design has no truss idealisation: `model --truss` refuses it (exit 1).
#[test]
fn truss_of_an_unbraced_design_is_refused() {
    let braced = "\"bracing\": {\n    \"kind\": \"single\",\n    \"flipped\": false\n  }";
    assert!(demo_json().contains(braced), "the demo is braced with single diagonals");
    let unbraced = demo_json().replace(braced, "\"bracing\": {\"kind\": \"none\"}");
    let err = failed(&run(&["model", "--truss", "-"], &unbraced), 1);
    assert!(err.contains("no truss idealisation"), "{err}");
    let out = run(&["model", "-"], &unbraced);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
}

/// `-` reads standard input: `demo | analyze -` and `demo | model - | solve -` work and
/// agree with each other.
#[test]
fn standard_input_pipelines_work() {
    let analysis = run(&["analyze", "-"], &demo_json());
    assert_eq!(analysis.status.code(), Some(0), "{}", text(&analysis.stderr));
    let analysis: serde_json::Value = serde_json::from_slice(&analysis.stdout).expect("analysis JSON");
    let thrust = analysis["form"]["thrust"].as_f64().expect("form.thrust");
    assert!(thrust > 0.0, "{thrust}");

    for (flag, pinned) in [("--truss", true), ("--rib", false), ("", false)] {
        let args: Vec<&str> = ["model", "-"].into_iter().chain((!flag.is_empty()).then_some(flag)).collect();
        let model = run(&args, &demo_json());
        assert_eq!(model.status.code(), Some(0), "{flag}: {}", text(&model.stderr));
        let solved = run(&["solve", "-"], &text(&model.stdout));
        assert_eq!(solved.status.code(), Some(0), "{flag}: {}", text(&solved.stderr));
        let solved: serde_json::Value = serde_json::from_slice(&solved.stdout).expect("solution JSON");
        assert_eq!(solved["determinacy"].is_object(), pinned, "{flag}: determinacy only for all-bar models");
        assert!(solved["conventions"]["caution"].as_str().is_some_and(|c| c.contains("licensed engineer")));
    }
}

/// `analyze` reports the traffic: every line's envelope with its governing placement,
/// the permanent effect and the design extremes per combination; the thrust range and
/// the sharing rule, also in `--summary`.
#[test]
fn analyze_reports_traffic_envelopes() {
    let out = run(&["analyze", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let report: serde_json::Value = serde_json::from_slice(&out.stdout).expect("analysis JSON");
    let frame = &report["traffic"]["frame"];
    assert!(frame["load_model"].as_str().is_some_and(|m| m.contains("EN 1991-2")), "{frame}");
    assert!(frame["sharing"]["rule"].as_str().is_some_and(|r| r.contains("per rib line")));
    let combinations = frame["combinations"].as_array().expect("combinations").len();
    assert_eq!(
        combinations, 5,
        "ULS gr1a, SLS characteristic, SLS frequent, ULS gr2, ULS temperature leading"
    );
    // the other actions: braking after EN 1991-2 eq. 4.6 on the demo's 164 m deck,
    // 360 + 0.10 x 9 x 3 x 164 = 802.8 kN (worked in arch::actions); the deflection check
    assert_eq!(report["actions"]["braking"]["force"].as_f64(), Some(802.8));
    assert!(report["actions"]["cases"].as_array().is_some_and(|c| c.len() == 7), "{}", report["actions"]);
    assert!(frame["deflection"]["worst"].as_f64().is_some_and(|w| w > 0.0), "{}", frame["deflection"]);
    let lines = frame["lines"].as_array().expect("lines");
    assert!(lines.len() > 50, "every member and springing: {}", lines.len());
    for line in lines {
        let (max, min) = (&line["traffic_max"], &line["traffic_min"]);
        assert!(
            max["value"].as_f64().expect("max") >= 0.0 && min["value"].as_f64().expect("min") <= 0.0,
            "{line}"
        );
        assert_eq!(line["design"].as_array().expect("design").len(), combinations);
        assert!(line["per"] == "whole_cross_section" || line["per"] == "rib_line");
    }
    // the thrust: the whole section; its largest traffic effect puts the uniform load
    // somewhere and the tandem somewhere
    let thrust = &frame["thrust"];
    assert_eq!(thrust["per"], "whole_cross_section");
    assert!(thrust["traffic_max"]["value"].as_f64().expect("max") > 100.0, "{thrust}");
    assert!(!thrust["traffic_max"]["loaded"].as_array().expect("loaded").is_empty());
    assert!(thrust["traffic_max"]["vehicle"]["first_axle"].as_f64().is_some());
    assert!(report["traffic"]["truss"]["lines"].is_array(), "the demo is braced");

    let out = run(&["analyze", "--summary", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let brief: serde_json::Value = serde_json::from_slice(&out.stdout).expect("summary JSON");
    assert!(brief["span"].as_f64().is_some(), "{brief}");
    assert_eq!(brief["traffic"]["thrust"], *thrust);
    assert!(brief["traffic"]["sharing_rule"].as_str().is_some_and(|r| r.contains("whole cross-section")));
}

/// `--pattern` adds named cases: the governing placement of the thrust gives, solved in
/// the frame model, the thrust the envelope reports (within 3 %: the case brings deck loads
/// to the joints as simple spans, the influence line along the continuous deck).
#[test]
fn analyze_adds_named_patterns() {
    let out =
        run(&["analyze", "--pattern", "governing:thrust:max", "--pattern", "quarter-2", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let report: serde_json::Value = serde_json::from_slice(&out.stdout).expect("analysis JSON");
    let cases = report["load_cases"].as_array().expect("cases");
    let kinds: Vec<&str> = cases.iter().filter_map(|c| c["description"]["kind"].as_str()).collect();
    assert!(kinds.contains(&"placement") && kinds.contains(&"quarter"), "{kinds:?}");
    let placement = cases.iter().find(|c| c["description"]["kind"] == "placement").expect("placement case");
    let name = placement["case"].as_str().expect("case name");
    let springings = report["summary"]["springings"].as_array().expect("springings");
    let solved = springings.iter().find(|s| s["case"] == name).expect("its springing forces");
    let thrust = solved["left"]["thrust"].as_f64().expect("thrust");
    let envelope = &report["traffic"]["frame"]["thrust"];
    let expected =
        envelope["permanent"].as_f64().expect("g") + envelope["traffic_max"]["value"].as_f64().expect("q");
    assert!((thrust - expected).abs() <= 0.03 * expected, "{thrust} vs {expected}");

    // an action alone: its springing forces join the summary, not the thrust range
    let out =
        run(&["analyze", "--summary", "--pattern", "braking", "--pattern", "erection", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let brief: serde_json::Value = serde_json::from_slice(&out.stdout).expect("summary JSON");
    let springings = brief["springings"].as_array().expect("springings");
    let braking = springings.iter().find(|s| s["case"] == "braking").expect("braking case");
    // braking to the right on the demo: the seats slide, so the springings take it all,
    // 802.8 kN (EN 1991-2 eq. 4.6, worked in arch::actions): H_left - H_right = 802.8
    let (hl, hr) =
        (braking["left"]["thrust"].as_f64().expect("h"), braking["right"]["thrust"].as_f64().expect("h"));
    assert!((hr - hl - 802.8).abs() < 1e-6, "{hl} {hr}");
    let range = brief["thrust_range"].as_array().expect("range");
    assert!(range[0].as_f64().expect("lo") > 1000.0, "the range is the loaded arch's: {range:?}");
    assert_eq!(brief["actions"]["braking"]["force"].as_f64(), Some(802.8));
    assert!(brief["actions"]["deflection"]["allowed"].as_f64().is_some());

    let err = failed(&run(&["analyze", "--pattern", "quarter-9", "-"], &demo_json()), 1);
    assert!(err.contains("quarter-1 to quarter-4"), "{err}");
    let err = failed(&run(&["analyze", "--pattern", "governing:nothing:max", "-"], &demo_json()), 1);
    assert!(err.contains("names no line"), "{err}");
}

/// A closed pipe (`springline analyze - | head -1`) is not an error.
#[test]
fn closed_output_pipe_is_not_an_error() {
    let mut child = Command::new(env!("CARGO_BIN_EXE_springline"))
        .arg("demo")
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .expect("the springline binary starts");
    // close the reading end before the binary writes
    drop(child.stdout.take());
    let out = child.wait_with_output().expect("the springline binary finishes");
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
}

/// `size` prints the sizing report (every group sized on the demo, the thrust blocks,
/// quantities), a text summary with `--text`, and with `--adopted` a design file whose
/// typed sections are the sized ones; `--text` and `--adopted` conflict.
#[test]
fn size_reports_sizes_quantities_and_foundations() {
    let out = run(&["size", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let report: serde_json::Value = serde_json::from_slice(&out.stdout).expect("size JSON");
    let groups = report["sizing"]["groups"].as_array().expect("groups");
    assert_eq!(groups.len(), 5);
    for g in groups {
        assert_eq!(g["outcome"]["outcome"], "sized", "{g}");
        assert!(g["utilisation"].as_f64().is_some_and(|u| u > 0.0 && u <= 1.0), "{g}");
    }
    let members = report["sizing"]["members"].as_array().expect("members");
    assert!(members.iter().all(|m| m["combination"].as_str().is_some_and(|c| c.starts_with("ULS"))));
    assert!(report["quantities"]["steel"].as_f64().is_some_and(|t| t > 100.0));
    let left = &report["foundations"]["springings"][0];
    // 17 023 kN / 1 000 kN/m2 (worked by hand in the engine's tests)
    let area = left["block"]["bearing_area"].as_f64().expect("area");
    assert!((area - 17.02).abs() < 0.02, "{area}");
    assert!(report["caution"].as_str().is_some_and(|c| c.contains("licensed engineer")));
    assert!(report["units"].as_str().is_some_and(|u| u.contains("t (tonnes)")));

    let out = run(&["size", "--text", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let summary = text(&out.stdout);
    assert!(summary.contains("rib      box ") && summary.contains("left springing: H "), "{summary}");
    assert!(summary.contains("licensed engineer"), "{summary}");
    assert!(summary.lines().next().is_some_and(|l| l.ends_with("form found for panel loads)")), "{summary}");

    let out = run(&["size", "--adopted", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let adopted: serde_json::Value = serde_json::from_slice(&out.stdout).expect("design JSON");
    let rib_area = groups[0]["section"]["a"].as_f64().expect("sized rib area");
    assert_eq!(adopted["groups"]["rib"]["a"].as_f64(), Some(rib_area));
    let again = run(&["analyze", "--summary", "-"], &text(&out.stdout));
    assert_eq!(again.status.code(), Some(0), "the adopted design analyses: {}", text(&again.stderr));

    let err = usage_error(&["size", "--text", "--adopted", "-"]);
    assert!(err.contains("cannot be used with"), "{err}");
}

/// `size --settle` runs the massing loop: the demo settles, every pass is listed, and the
/// last report is the settled design's; `--passes` needs `--settle`.
#[test]
fn size_settle_runs_the_massing_loop() {
    let out = run(&["size", "--settle", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let m: serde_json::Value = serde_json::from_slice(&out.stdout).expect("massing JSON");
    assert_eq!(m["converged"], true, "{}", m["last_change"]);
    let history = m["history"].as_array().expect("history");
    assert_eq!(history.len() as u64, m["passes"].as_u64().expect("passes"));
    assert_eq!(history.last().and_then(|h| h["changed"].as_str()), Some("nothing"));
    assert!(m["report"]["sizing"]["groups"].is_array());
    let out = run(&["size", "--settle", "--passes", "1", "--text", "-"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let summary = text(&out.stdout);
    assert!(summary.starts_with("massing loop: NOT settled after 1 pass"), "{summary}");
    assert!(summary.contains("stopped: not settled after 1 passes (the cap)"), "{summary}");
    let err = usage_error(&["size", "--passes", "3", "-"]);
    assert!(err.contains("--settle"), "{err}");
}

/// `sweep` prints CSV with unit-named columns, one line per option (a failing option with
/// its reason), JSON with `--json`, the same rows whatever `--jobs` says; a bad range is
/// refused (exit 1) and `--vary` is required (exit 2).
#[test]
fn sweep_prints_one_row_per_option() {
    let out = run(&["sweep", "-", "--vary", "rise-ratio=0.12,0.18,0.6"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let csv = text(&out.stdout);
    let lines: Vec<&str> = csv.lines().collect();
    assert_eq!(lines.len(), 4, "{csv}");
    assert!(
        lines[0].starts_with("rise/span set (-),feasible,") && lines[0].contains("form thrust (kN)"),
        "{csv}"
    );
    assert!(lines[1].starts_with("0.12,true,") && lines[2].starts_with("0.18,true,"), "{csv}");
    assert!(lines[3].starts_with("0.6,false,"), "{csv}");
    let out = run(&["sweep", "-", "--vary", "ribs=1,2", "--json"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let s: serde_json::Value = serde_json::from_slice(&out.stdout).expect("sweep JSON");
    assert_eq!(s["rows"].as_array().map(Vec::len), Some(2));
    assert!(s["held"].as_str().is_some_and(|h| h.contains("evenly spaced")));
    assert!(s["caution"].as_str().is_some_and(|c| c.contains("licensed engineer")));
    let err = failed(&run(&["sweep", "-", "--vary", "height=1:2:3"], &demo_json()), 1);
    assert!(err.contains("rise-ratio"), "{err}");
    usage_error(&["sweep", "-"]);
    // the chart: an SVG with its captions; a grid cannot be drawn (refused, exit 1)
    let dir = empty_dir("sweep_chart");
    let svg = dir.join("rise.svg");
    let path = svg.to_string_lossy().to_string();
    let out =
        run(&["sweep", "-", "--vary", "rise-ratio=0.12:0.18:3", "--size", "--chart", &path], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let drawn = std::fs::read_to_string(&svg).expect("the chart is written");
    assert!(
        drawn.starts_with("<svg") && drawn.contains("Thrust against the swept parameter"),
        "{drawn:.200}"
    );
    assert!(drawn.contains("Steel of the sized option"));
    let grid = ["sweep", "-", "--vary", "panels=10,12", "--vary", "ribs=1,2", "--chart", &path];
    let err = failed(&run(&grid, &demo_json()), 1);
    assert!(err.contains("one numeric parameter"), "{err}");
    // the form basis is a category: rows by name, no chart
    let out = run(&["sweep", "-", "--vary", "form-basis=panel-loads,as-built"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let csv = text(&out.stdout);
    let lines: Vec<&str> = csv.lines().collect();
    assert!(lines[0].starts_with("form basis,feasible,"), "{csv}");
    assert!(lines[1].starts_with("panel-loads,true,") && lines[2].starts_with("as-built,true,"), "{csv}");
    let basis = ["sweep", "-", "--vary", "form-basis=as-built", "--chart", &path];
    let err = failed(&run(&basis, &demo_json()), 1);
    assert!(err.contains("one numeric parameter"), "{err}");
    // on one thread or several, the same rows to the byte; no thread at all is refused
    let grid = |jobs: &str| {
        run(&["sweep", "-", "--vary", "panels=10:14:3", "--vary", "ribs=1,2", "--jobs", jobs], &demo_json())
    };
    let (one, three) = (grid("1"), grid("3"));
    assert_eq!(one.status.code(), Some(0), "{}", text(&one.stderr));
    assert_eq!(text(&one.stdout).lines().count(), 7);
    assert_eq!(text(&one.stdout), text(&three.stdout));
    usage_error(&["sweep", "-", "--vary", "ribs=1,2", "--jobs", "0"]);
}

/// `modes` prints alpha_cr and frequencies with their shapes (JSON) or a text summary
/// naming what buckles; the same numbers as the engine; a mode count out of range is
/// refused (exit 1).
#[test]
fn modes_prints_buckling_and_vibration() {
    use springline_statics::arch::stability::arch_stability;
    let out = run(&["modes", "-", "--modes", "2"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let s: serde_json::Value = serde_json::from_slice(&out.stdout).expect("modes JSON");
    let valid = springline_statics::ValidDesign::new(&springline_statics::Design::demo()).expect("valid");
    let engine = arch_stability(&valid, 2).expect("stability");
    let alpha = s["alpha_cr"].as_f64().expect("alpha_cr");
    assert!((alpha - engine.alpha_cr).abs() < 1e-9 * alpha, "{alpha} vs {}", engine.alpha_cr);
    assert_eq!(s["vibration"]["modes"].as_array().map(Vec::len), Some(2));
    assert!(s["dead"]["modes"][0]["shape"]["nodes"].as_array().is_some_and(|n| !n.is_empty()));
    let out = run(&["modes", "-", "--text"], &demo_json());
    let summary = text(&out.stdout);
    assert!(summary.contains("buckling mode 1: alpha_cr ") && summary.contains("Hz"), "{summary}");
    assert!(summary.contains("out-of-plane") && summary.contains("licensed engineer"), "{summary}");
    let err = failed(&run(&["modes", "-", "--modes", "0"], &demo_json()), 1);
    assert!(err.contains("1 to 50"), "{err}");
}

/// `seek` prints the design found on standard output (it pipes into `analyze -`, whose
/// form thrust meets the goal) and the report on standard error; a goal no rise meets
/// exits 1 with the nearest value and prints no design; one goal exactly is required
/// (exit 2).
#[test]
fn seek_prints_the_design_found_and_fails_when_unmet() {
    let out = run(&["seek", "-", "--max-thrust", "7500"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let report = text(&out.stderr);
    assert!(report.contains("met: rise") && report.contains("licensed engineer"), "{report}");
    let analysed = run(&["analyze", "-", "--summary"], &text(&out.stdout));
    assert_eq!(analysed.status.code(), Some(0), "{}", text(&analysed.stderr));
    let summary: serde_json::Value = serde_json::from_slice(&analysed.stdout).expect("summary JSON");
    let thrust = summary["form_thrust"].as_f64().expect("thrust");
    assert!(thrust <= 7500.0 && thrust > 7499.0, "{thrust}");

    let out = run(&["seek", "-", "--max-thrust", "10"], &demo_json());
    assert_eq!(out.status.code(), Some(1));
    assert!(out.stdout.is_empty());
    let err = text(&out.stderr);
    assert!(err.contains("no rise") && err.contains("nearest"), "{err}");

    let err = usage_error(&["seek", "-"]);
    assert!(err.contains("--max-thrust"), "{err}");
    let err = usage_error(&["seek", "-", "--max-thrust", "1", "--min-clearance", "2"]);
    assert!(err.contains("cannot be used with"), "{err}");
}

/// `springline export` writes what the engine's export makes (the app's Files panel makes
/// the same through its worker), asks for at least one file, and refuses a bad design.
#[test]
fn export_writes_the_engines_files() {
    use springline_statics::export::{export, Export, DRAWING_SIZE};
    let dir = empty_dir("export");
    std::fs::write(dir.join("demo.json"), demo_json()).expect("design file");
    let out = run_in(
        &dir,
        &[
            "export",
            "demo.json",
            "--svg",
            "e.svg",
            "--force-svg",
            "f.svg",
            "--csv",
            "m.csv",
            "--json",
            "d.json",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let demo = springline_statics::Design::demo();
    let (w, h) = DRAWING_SIZE;
    for (file, what) in [
        ("e.svg", Export::ElevationSvg { width: w, height: h }),
        ("f.svg", Export::ForceSvg { width: w, height: h }),
        ("m.csv", Export::MemberTable),
        ("d.json", Export::DesignFile),
    ] {
        let written = std::fs::read_to_string(dir.join(file)).expect(file);
        assert_eq!(written, export(&demo, what).expect("exports"), "{file}");
    }
    let none = run_in(&dir, &["export", "demo.json"]);
    assert_eq!(none.status.code(), Some(1));
    assert!(text(&none.stderr).contains("nothing to export"), "{}", text(&none.stderr));
    std::fs::write(dir.join("bad.json"), "{\"version\": 7, \"name\": 3}").expect("bad file");
    let bad = run_in(&dir, &["export", "bad.json", "--csv", "x.csv"]);
    assert_eq!(bad.status.code(), Some(1), "{}", text(&bad.stderr));
    assert!(!dir.join("x.csv").exists(), "nothing written for a refused design");
}

/// `solve --time N` prints the same solution as `solve`, and on standard error the time
/// per solve over N more solves: a median no faster than the fastest, both positive.
#[test]
fn solve_time_reports_the_time_per_solve_and_changes_nothing_else() {
    let model = run(&["model", "--truss", "-"], &demo_json());
    assert_eq!(model.status.code(), Some(0), "{}", text(&model.stderr));
    let model = text(&model.stdout);
    let plain = run(&["solve", "-"], &model);
    let timed = run(&["solve", "--time", "25", "-"], &model);
    assert_eq!(timed.status.code(), Some(0), "{}", text(&timed.stderr));
    assert_eq!(text(&timed.stdout), text(&plain.stdout), "the same solution");
    let err = text(&timed.stderr);
    let number = |after: &str| -> f64 {
        let rest = err.split(after).nth(1).unwrap_or_else(|| panic!("no '{after}' in: {err}"));
        rest.split_whitespace().next().and_then(|v| v.parse().ok()).unwrap_or(f64::NAN)
    };
    assert!(err.starts_with("solve time over 25 solves in this process"), "{err}");
    let (median, fastest) = (number("median "), number("fastest "));
    assert!(fastest > 0.0 && median >= fastest, "median {median} us, fastest {fastest} us");
    // 0 solves is a usage error (exit 2), like any value out of range
    assert_eq!(run(&["solve", "--time", "0", "-"], &model).status.code(), Some(2));
}
