//! Shared helpers of Springline's cross-crate and browser tests (the tests themselves
//! live in `tests/tests/*.rs`): a minimal WebDriver client and a static file server.

pub mod cli;
pub mod family;
pub mod outputs;
pub mod page;
pub mod serve;
pub mod stats;
pub mod webdriver;

/// The workspace root (the folder holding the root Cargo.toml).
pub fn workspace_root() -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).parent().map(|p| p.to_path_buf()).unwrap_or_default()
}

/// Sets every member group's unit weight to zero (form and forces from the deck alone).
pub fn without_self_weight(design: &mut springline_statics::Design) {
    let g = &mut design.groups;
    for s in [&mut g.rib, &mut g.deck, &mut g.posts, &mut g.piers, &mut g.bracing] {
        s.unit_weight = 0.0;
    }
}

/// The vertical resultant (kN, y up) of every load of case `case` of `model`: nodal
/// loads plus member loads, each worked out from its own definition (not from the
/// solver's fixed-end actions), so a test can compare it with the solved reactions.
pub fn total_vertical_load(model: &springline_statics::Model, case: usize) -> f64 {
    use springline_statics::{LoadDirection, MemberLoad};
    let lc = &model.load_cases[case];
    let nodal: f64 = lc.nodal.iter().map(|l| l.fy).sum();
    let along = |member: usize| {
        let m = &model.members[member];
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        (b.x - a.x, b.y - a.y)
    };
    // the y component of a unit load along `direction` on a member of run (dx, dy)
    let unit_y = |direction: LoadDirection, (dx, dy): (f64, f64)| {
        let l = dx.hypot(dy);
        match direction {
            LoadDirection::LocalX => dy / l,
            LoadDirection::LocalY => dx / l,
            LoadDirection::GlobalX => 0.0,
            LoadDirection::GlobalY => 1.0,
        }
    };
    let members: f64 = lc
        .member
        .iter()
        .map(|ml| match *ml {
            MemberLoad::Uniform { member, w, direction, projected } => {
                let (dx, dy) = along(member);
                let length = match (projected, direction) {
                    (true, LoadDirection::GlobalY) => dx.abs(),
                    (true, LoadDirection::GlobalX) => dy.abs(),
                    _ => dx.hypot(dy),
                };
                w * length * unit_y(direction, (dx, dy))
            }
            MemberLoad::Point { member, p, direction, .. } => p * unit_y(direction, along(member)),
        })
        .sum();
    nodal + members
}
