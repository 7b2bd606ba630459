//! `springline solve MODEL.json`: solve a neutral analysis model.

use super::{print_json, read_text, Conventions, CONVENTIONS};
use anyhow::{bail, Context};
use serde::Serialize;
use springline_statics::{solve, truss_determinacy, DeterminacyReport, MemberKind, Model, Solution};

#[derive(Serialize)]
struct Output<'a> {
    conventions: Conventions,
    title: &'a str,
    /// Degree of static indeterminacy, for models whose members are all pin-ended.
    determinacy: Option<DeterminacyReport>,
    solution: Solution,
}

pub fn run(args: &[String]) -> anyhow::Result<()> {
    let [path] = args else { bail!("usage: springline solve MODEL.json") };
    let text = read_text(path)?;
    let model: Model =
        serde_json::from_str(&text).with_context(|| format!("'{path}' is not a valid model file"))?;
    let all_pinned =
        model.members.iter().all(|m| m.kind == MemberKind::Truss || (m.release_start && m.release_end));
    let determinacy = if all_pinned { Some(truss_determinacy(&model)?) } else { None };
    let solution = solve(&model)?;
    print_json(&Output { conventions: CONVENTIONS, title: &model.title, determinacy, solution })
}
