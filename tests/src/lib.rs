//! Shared helpers of Springline's cross-crate and browser tests (the tests themselves
//! live in `tests/tests/*.rs`): a minimal WebDriver client and a static file server.

pub mod page;
pub mod serve;
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
