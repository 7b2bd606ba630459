//! Running the built `springline` binary from the integration tests.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

/// Runs the binary with `args`, feeding `stdin`, in the current directory.
pub fn run(args: &[&str], stdin: &str) -> Output {
    run_with(Command::new(env!("CARGO_BIN_EXE_springline")).args(args).stdout(Stdio::piped()), stdin)
}

/// Runs the binary with `args` in the directory `dir`.
#[allow(dead_code)] // not every test file runs in a directory of its own
pub fn run_in(dir: &Path, args: &[&str]) -> Output {
    run_with(
        Command::new(env!("CARGO_BIN_EXE_springline")).args(args).current_dir(dir).stdout(Stdio::piped()),
        "",
    )
}

/// Spawns a prepared command with stdin and stderr piped, feeds `stdin`, waits.
pub fn run_with(command: &mut Command, stdin: &str) -> Output {
    let mut child =
        command.stdin(Stdio::piped()).stderr(Stdio::piped()).spawn().expect("the springline binary starts");
    if let Some(mut input) = child.stdin.take() {
        // a command that does not read stdin may close it early: not an error here
        let _ = input.write_all(stdin.as_bytes());
    }
    child.wait_with_output().expect("the springline binary finishes")
}

/// Bytes as text (lossy), for messages and JSON.
pub fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

/// The demo design JSON, as `springline demo` prints it.
pub fn demo_json() -> String {
    let out = run(&["demo"], "");
    assert!(out.status.success(), "{}", text(&out.stderr));
    text(&out.stdout)
}

/// A fresh empty directory for one test, under cargo's scratch folder for integration
/// tests.
#[allow(dead_code)] // not every test file needs a directory
pub fn empty_dir(name: &str) -> PathBuf {
    let dir = Path::new(env!("CARGO_TARGET_TMPDIR")).join(name);
    // left over from an earlier run: start empty
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("the scratch directory can be made");
    dir
}
