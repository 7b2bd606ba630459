//! Shared helpers of Springline's cross-crate and browser tests (the tests themselves
//! live in `tests/tests/*.rs`): a minimal WebDriver client and a static file server.

pub mod page;
pub mod serve;
pub mod webdriver;

/// The workspace root (the folder holding the root Cargo.toml).
pub fn workspace_root() -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).parent().map(|p| p.to_path_buf()).unwrap_or_default()
}
