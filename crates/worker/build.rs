//! The wire fingerprint (`SPRINGLINE_WIRE`): a hash of the sources the replies' types come
//! from, this crate's and the engine's. postcard bytes say nothing of their types, so a
//! page and a worker of different builds (one of them cached by the browser) would misread
//! each other's replies rather than refuse them; each reply starts with the fingerprint and
//! the page reads only its own build's.

use std::path::{Path, PathBuf};

fn main() {
    let root = PathBuf::from(std::env::var("CARGO_MANIFEST_DIR").unwrap_or_default());
    let mut files = Vec::new();
    for dir in ["src", "../statics/src"] {
        let dir = root.join(dir);
        println!("cargo:rerun-if-changed={}", dir.display());
        rust_files(&dir, &mut files);
    }
    files.sort();
    // FNV-1a over each file's path (relative to this crate) and bytes
    let mut hash: u64 = 0xcbf2_9ce4_8422_2325;
    for file in &files {
        let name = file.strip_prefix(&root).unwrap_or(file).to_string_lossy().into_owned();
        for byte in name.bytes().chain(std::fs::read(file).unwrap_or_default()) {
            hash = (hash ^ u64::from(byte)).wrapping_mul(0x0100_0000_01b3);
        }
    }
    println!("cargo:rustc-env=SPRINGLINE_WIRE={hash:016x}");
}

fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(entries) = std::fs::read_dir(dir) else { return };
    for entry in entries.flatten() {
        let path = entry.path();
        if path.is_dir() {
            rust_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            out.push(path);
        }
    }
}
