//! A tiny static file server (std only) for the browser tests: serves a folder on
//! 127.0.0.1, remembers every path requested, and stops when dropped.

use std::io::{BufRead, BufReader, Write};
use std::net::{TcpListener, TcpStream};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex};
use std::thread::JoinHandle;

/// A running server.
pub struct StaticServer {
    /// Port on 127.0.0.1.
    pub port: u16,
    stop: Arc<AtomicBool>,
    requests: Arc<Mutex<Vec<String>>>,
    thread: Option<JoinHandle<()>>,
}

impl StaticServer {
    /// Serves `root` (for example `dist/`). Panics when the folder has no index.html.
    pub fn start(root: &Path) -> StaticServer {
        assert!(
            root.join("index.html").exists(),
            "{} has no index.html: build the app first (scripts/test does: trunk build --release)",
            root.display()
        );
        let listener = TcpListener::bind("127.0.0.1:0").expect("bind");
        let port = listener.local_addr().expect("addr").port();
        listener.set_nonblocking(true).expect("nonblocking");
        let stop = Arc::new(AtomicBool::new(false));
        let requests = Arc::new(Mutex::new(Vec::new()));
        let (stop2, req2, root) = (stop.clone(), requests.clone(), root.to_path_buf());
        let thread = std::thread::spawn(move || {
            while !stop2.load(Ordering::Relaxed) {
                match listener.accept() {
                    Ok((stream, _)) => {
                        let (root, req) = (root.clone(), req2.clone());
                        std::thread::spawn(move || handle(stream, &root, &req));
                    }
                    Err(_) => std::thread::sleep(std::time::Duration::from_millis(5)),
                }
            }
        });
        StaticServer { port, stop, requests, thread: Some(thread) }
    }
    /// The base URL, e.g. `http://127.0.0.1:1234/`.
    pub fn url(&self) -> String {
        format!("http://127.0.0.1:{}/", self.port)
    }
    /// Every path requested so far.
    pub fn requests(&self) -> Vec<String> {
        self.requests.lock().map(|r| r.clone()).unwrap_or_default()
    }
}

impl Drop for StaticServer {
    fn drop(&mut self) {
        self.stop.store(true, Ordering::Relaxed);
        if let Some(t) = self.thread.take() {
            let _ = t.join();
        }
    }
}

fn handle(mut stream: TcpStream, root: &Path, requests: &Mutex<Vec<String>>) {
    let _ = stream.set_nonblocking(false);
    let mut reader = BufReader::new(match stream.try_clone() {
        Ok(s) => s,
        Err(_) => return,
    });
    let mut line = String::new();
    if reader.read_line(&mut line).is_err() {
        return;
    }
    // drain the headers
    let mut h = String::new();
    while reader.read_line(&mut h).map(|n| n > 2).unwrap_or(false) {
        h.clear();
    }
    let path = line.split_whitespace().nth(1).unwrap_or("/").to_string();
    if let Ok(mut r) = requests.lock() {
        r.push(path.clone());
    }
    let clean = path.split(['?', '#']).next().unwrap_or("/").trim_start_matches('/').to_string();
    let mut file: PathBuf = root.join(if clean.is_empty() { "index.html" } else { &clean });
    if clean.contains("..") || !file.exists() {
        file = PathBuf::new();
    }
    let (status, body, kind) = match std::fs::read(&file) {
        Ok(b) => ("200 OK", b, mime(&file)),
        Err(_) => ("404 Not Found", b"not found".to_vec(), "text/plain"),
    };
    let head = format!(
        "HTTP/1.1 {status}\r\nContent-Type: {kind}\r\nContent-Length: {}\r\nCache-Control: no-store\r\nConnection: close\r\n\r\n",
        body.len()
    );
    let _ = stream.write_all(head.as_bytes());
    let _ = stream.write_all(&body);
}

fn mime(p: &Path) -> &'static str {
    match p.extension().and_then(|e| e.to_str()).unwrap_or("") {
        "html" => "text/html; charset=utf-8",
        "js" => "text/javascript",
        "wasm" => "application/wasm",
        "css" => "text/css",
        "png" => "image/png",
        "svg" => "image/svg+xml",
        "json" => "application/json",
        _ => "application/octet-stream",
    }
}
