//! The model example in the README stays a model that solves (the documentation cannot
//! drift from the format).

use springline_statics::{solve, Model};
use springline_tests::workspace_root;

#[test]
fn readme_model_example_solves_and_balances() {
    let readme = std::fs::read_to_string(workspace_root().join("README.md")).expect("README");
    let start = readme.find("```json\n{\n  \"title\": \"two-bar example\"").expect("the example block")
        + "```json\n".len();
    let end = start + readme[start..].find("\n```").expect("end of the block");
    let model: Model = serde_json::from_str(&readme[start..end]).expect("the example parses as a model");
    let s = solve(&model).expect("the example solves");
    let c = &s.cases[0];
    assert!(c.equilibrium.relative < 1e-9);
    // overall vertical equilibrium by hand: reactions carry the nodal 100 kN, the 20 kN
    // point load and the 5 kN/m over the 4 m horizontal projection of AB
    let fy: f64 = c.reactions.iter().map(|r| r.fy).sum();
    assert!((fy - (100.0 + 20.0 * 0.8 + 5.0 * 4.0)).abs() < 1e-9, "sum of vertical reactions {fy}");
}
