//! The `springline` binary as a process, for tests that compare the app with the CLI.

use std::path::PathBuf;
use std::process::Command;

/// The `springline` binary `cargo test --workspace` builds: in the profile folder
/// (`target/<profile>/`) above the test binary's own folder (`target/<profile>/deps/`).
///
/// Panics with what to run when it is not there.
pub fn springline() -> PathBuf {
    let exe = std::env::current_exe().expect("the test binary's path");
    let profile = exe.parent().and_then(|deps| deps.parent()).map(|p| p.to_path_buf()).unwrap_or_default();
    let bin = profile.join(format!("springline{}", std::env::consts::EXE_SUFFIX));
    assert!(
        bin.is_file(),
        "the CLI binary is not at {}: build it first (`cargo build -p springline-cli`, or run `cargo test \
         --workspace`, which builds it)",
        bin.display()
    );
    bin
}

/// Runs `springline` with `args`, standard input `input`; its standard output, or a panic
/// with its standard error.
pub fn run(args: &[&str], input: &str) -> String {
    use std::io::Write;
    let mut child = Command::new(springline())
        .args(args)
        .stdin(std::process::Stdio::piped())
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .expect("the CLI starts");
    if let Some(mut stdin) = child.stdin.take() {
        stdin.write_all(input.as_bytes()).expect("the CLI reads its input");
    }
    let out = child.wait_with_output().expect("the CLI ends");
    assert!(out.status.success(), "springline {args:?} failed: {}", String::from_utf8_lossy(&out.stderr));
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// The rows (x, value) of the CSV `springline influence` prints (header line skipped).
pub fn influence_rows(csv: &str) -> Vec<(f64, f64)> {
    csv.lines()
        .skip(1)
        .filter_map(|l| {
            let (x, v) = l.split_once(',')?;
            Some((x.trim().parse().ok()?, v.trim().parse().ok()?))
        })
        .collect()
}
