//! Cross-check of `springline_statics::solve` against an independent general-purpose
//! finite element library from PyPI: PyNiteFEA (3D frame analysis; the exact version
//! is recorded in every expected file and pinned in tests/reference/requirements.txt).
//!
//! tests/reference/run_reference.py builds each model of tests/reference/models/ in
//! that library (plane model in 3D: out-of-plane freedoms restrained, truss members and
//! hinges as end releases), solves every load case and writes the reactions and member
//! end forces, converted to Springline's sign convention, to tests/reference/expected/.
//! The conversion is documented and self-checked against closed-form beam answers in
//! that script. This test does not run Python: it reads the committed expected files.
//!
//! For every model:
//! 1. the SHA-256 of the model file must equal the hash recorded in its expected file,
//!    so the numbers below are the library's answers for exactly these model bytes;
//! 2. every reaction component and every member's (N, V, M) at both ends, in every load
//!    case, must equal the library's within the tolerance of `tolerances` below.

use sha2::{Digest, Sha256};
use springline_statics::{solve, Model};
use std::path::{Path, PathBuf};

/// What the reference script wrote for one model.
#[derive(serde::Deserialize)]
struct Expected {
    model_file: String,
    model_sha256: String,
    library: Library,
    cases: Vec<ExpectedCase>,
}

#[derive(serde::Deserialize)]
struct Library {
    name: String,
    version: String,
}

#[derive(serde::Deserialize)]
struct ExpectedCase {
    name: String,
    reactions: Vec<ExpectedReaction>,
    members: Vec<ExpectedMember>,
}

#[derive(serde::Deserialize)]
struct ExpectedReaction {
    node: usize,
    fx: f64,
    fy: f64,
    mz: f64,
}

#[derive(serde::Deserialize)]
struct ExpectedMember {
    member: usize,
    n_start: f64,
    v_start: f64,
    m_start: f64,
    n_end: f64,
    v_end: f64,
    m_end: f64,
}

/// The library these expected values come from (checked against each expected file).
const LIBRARY_NAME: &str = "PyNiteFEA";
const LIBRARY_VERSION: &str = "3.2.0";

/// Relative tolerance on every compared value, as a fraction of the largest force in the
/// load case (moments: of that force times the model's characteristic length).
///
/// Why 1e-6: both programs assemble the same Euler-Bernoulli element stiffnesses and
/// fixed-end actions and solve the same linear system in f64, so they agree to rounding
/// amplified by the conditioning of the stiffness matrix (EA/L against 12 EI/L^3 spans
/// about 5 to 6 decades in these arch models); the observed differences are below 2e-13
/// of the case's largest force (PyNiteFEA 3.2.0 on x86-64). Any genuine modelling difference (a wrong fixed-end term,
/// release, projection or sign) changes results by far more than 1e-6 of the largest
/// force. The absolute 1e-9 (kN, kNm) only keeps exact zeros (truss moments, forces in
/// unloaded members) from demanding bit equality.
const REL_TOL: f64 = 1e-6;
const ABS_TOL: f64 = 1e-9;

fn reference_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("reference")
}

fn sha256_hex(bytes: &[u8]) -> String {
    let digest = Sha256::digest(bytes);
    digest.iter().map(|b| format!("{b:02x}")).collect()
}

/// Largest side of the nodes' bounding box, m (same definition as the solver's).
fn characteristic_length(model: &Model) -> f64 {
    let xs = model.nodes.iter().map(|n| n.x);
    let ys = model.nodes.iter().map(|n| n.y);
    let span =
        |v: Vec<f64>| v.iter().copied().fold(f64::MIN, f64::max) - v.iter().copied().fold(f64::MAX, f64::min);
    span(xs.collect()).max(span(ys.collect())).max(1.0)
}

/// (force tolerance kN, moment tolerance kNm) for one expected load case.
fn tolerances(case: &ExpectedCase, lchar: f64) -> (f64, f64) {
    let mut forces: Vec<f64> = Vec::new();
    let mut moments: Vec<f64> = Vec::new();
    for r in &case.reactions {
        forces.extend([r.fx, r.fy]);
        moments.push(r.mz);
    }
    for m in &case.members {
        forces.extend([m.n_start, m.v_start, m.n_end, m.v_end]);
        moments.extend([m.m_start, m.m_end]);
    }
    let fmax = forces.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    let mmax = moments.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    let scale = fmax.max(mmax / lchar);
    (REL_TOL * scale + ABS_TOL, REL_TOL * scale * lchar + ABS_TOL)
}

/// Reads a model file and its expected file; checks the recorded hash, library and
/// version (panics on a mismatch).
fn load(model_path: &Path) -> (String, Model, Expected) {
    let stem = model_path.file_name().and_then(|s| s.to_str()).unwrap_or_default().to_string();
    let expected_path = reference_dir().join("expected").join(&stem);
    let model_bytes = std::fs::read(model_path).expect("model file readable");
    let expected_text = std::fs::read_to_string(&expected_path).unwrap_or_else(|e| {
        panic!("{}: no expected file ({e}); run run_reference.py", expected_path.display())
    });
    let expected: Expected = serde_json::from_str(&expected_text).expect("expected file parses");
    // (i) the expected values were computed from exactly these model bytes
    assert_eq!(expected.model_file, stem, "{stem}: expected file names another model");
    assert_eq!(
        sha256_hex(&model_bytes),
        expected.model_sha256,
        "{stem}: model file changed since {LIBRARY_NAME} was run on it; re-run tests/reference/run_reference.py"
    );
    assert_eq!(
        (expected.library.name.as_str(), expected.library.version.as_str()),
        (LIBRARY_NAME, LIBRARY_VERSION),
        "{stem}: expected values come from another library or version"
    );
    let model: Model = serde_json::from_slice(&model_bytes).expect("model deserialises");
    (stem, model, expected)
}

/// (ii) Solves `model` with Springline and compares every reaction and member end force
/// with `expected`; returns the failures (empty when all agree) and the largest
/// difference found as a fraction of its case's scale.
fn compare(stem: &str, model: &Model, expected: &Expected) -> (Vec<String>, f64) {
    let mut failures = Vec::new();
    let solution = solve(model).unwrap_or_else(|e| panic!("{stem}: solve failed: {e}"));
    assert_eq!(solution.cases.len(), expected.cases.len(), "{stem}: number of load cases");
    let lchar = characteristic_length(model);
    let mut worst: f64 = 0.0;
    for (ours, theirs) in solution.cases.iter().zip(&expected.cases) {
        assert_eq!(ours.name, theirs.name, "{stem}: load case order");
        let (tol_f, tol_m) = tolerances(theirs, lchar);
        let scale_f = (tol_f - ABS_TOL) / REL_TOL;
        let mut cmp = |what: String, a: f64, b: f64, tol: f64, scale: f64| {
            let d = (a - b).abs();
            if scale > 0.0 {
                worst = worst.max(d / scale);
            }
            if d.is_nan() || d > tol {
                failures.push(format!(
                    "{stem} / '{}' / {what}: Springline {a:.9e}, {LIBRARY_NAME} {LIBRARY_VERSION} {b:.9e}, |diff| {d:.3e} > tol {tol:.3e}",
                    theirs.name
                ));
            }
        };
        assert_eq!(ours.reactions.len(), theirs.reactions.len(), "{stem}: number of reactions");
        for r in &theirs.reactions {
            let o = ours.reaction(r.node).unwrap_or_else(|| {
                panic!("{stem} / '{}': Springline gives no reaction at node {}", theirs.name, r.node)
            });
            let node = model.node_label(r.node);
            cmp(format!("reaction {node} fx"), o.fx, r.fx, tol_f, scale_f);
            cmp(format!("reaction {node} fy"), o.fy, r.fy, tol_f, scale_f);
            cmp(format!("reaction {node} mz"), o.mz, r.mz, tol_m, scale_f * lchar);
        }
        assert_eq!(ours.members.len(), theirs.members.len(), "{stem}: number of members");
        assert_eq!(theirs.members.len(), model.members.len(), "{stem}: expected covers every member");
        for m in &theirs.members {
            let o = &ours.members[m.member];
            assert_eq!(o.member, m.member);
            let name = model.member_label(m.member);
            cmp(format!("member {name} N start"), o.start.n, m.n_start, tol_f, scale_f);
            cmp(format!("member {name} V start"), o.start.v, m.v_start, tol_f, scale_f);
            cmp(format!("member {name} M start"), o.start.m, m.m_start, tol_m, scale_f * lchar);
            cmp(format!("member {name} N end"), o.end.n, m.n_end, tol_f, scale_f);
            cmp(format!("member {name} V end"), o.end.v, m.v_end, tol_f, scale_f);
            cmp(format!("member {name} M end"), o.end.m, m.m_end, tol_m, scale_f * lchar);
        }
    }
    (failures, worst)
}

fn model_files() -> Vec<PathBuf> {
    let dir = reference_dir().join("models");
    let mut files: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap_or_else(|e| panic!("{}: {e}", dir.display()))
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "json"))
        .collect();
    files.sort();
    files
}

/// Every model in tests/reference/models/ against PyNiteFEA 3.2.0, all reactions and all
/// member end forces, tolerance REL_TOL of the case's largest force (+ ABS_TOL).
#[test]
fn solver_matches_pynitefea_on_every_reference_model() {
    let files = model_files();
    let names: Vec<String> =
        files.iter().filter_map(|p| p.file_stem()?.to_str().map(str::to_string)).collect();
    for required in ["braced_truss", "frame_deck_arch", "bare_rib", "portal_hinge"] {
        assert!(names.iter().any(|n| n == required), "reference model {required}.json is missing");
    }
    let mut all = Vec::new();
    for f in &files {
        let (stem, model, expected) = load(f);
        let (failures, worst) = compare(&stem, &model, &expected);
        println!(
            "{}: largest |Springline - {LIBRARY_NAME} {LIBRARY_VERSION}| = {worst:.2e} of the case's largest force",
            f.display()
        );
        all.extend(failures);
    }
    assert!(
        all.is_empty(),
        "{} value(s) disagree with {LIBRARY_NAME} {LIBRARY_VERSION}:\n{}",
        all.len(),
        all.join("\n")
    );
}

/// The comparison must be able to fail: one member end moment and one reaction of the
/// library's values, moved by ten times the tolerance, are both reported (and nothing else).
#[test]
fn a_perturbed_library_value_is_reported() {
    let path = reference_dir().join("models").join("portal_hinge.json");
    let (stem, model, mut expected) = load(&path);
    let lchar = characteristic_length(&model);
    let (tol_f, tol_m) = tolerances(&expected.cases[0], lchar);
    expected.cases[0].members[1].m_end += 10.0 * tol_m;
    expected.cases[0].reactions[1].fx -= 10.0 * tol_f;
    let (failures, _) = compare(&stem, &model, &expected);
    assert_eq!(failures.len(), 2, "{failures:?}");
    assert!(failures[0].contains("reaction") && failures[1].contains("M end"), "{failures:?}");
}
