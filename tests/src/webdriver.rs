//! A small W3C WebDriver client over plain HTTP/1.1 (std only), enough to drive Debian's
//! headless Chromium through chromedriver in the browser tests: sessions, navigation,
//! script execution, pointer actions, window size, screenshots and the browser log.

use serde_json::{json, Value};
use std::io::{Read, Write};
use std::net::TcpStream;
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::time::{Duration, Instant};

/// A running chromedriver process, killed on drop.
pub struct Driver {
    child: Child,
    port: u16,
    _home: PathBuf,
}

/// Where Debian installs the browser and its driver.
pub const CHROMIUM: &str = "/usr/bin/chromium";
/// Debian's chromedriver.
pub const CHROMEDRIVER: &str = "/usr/bin/chromedriver";

impl Driver {
    /// Starts chromedriver on a free port with its own temporary, config and cache
    /// folders. Panics (failing the test, never skipping it) when it is not installed.
    pub fn start() -> Driver {
        assert!(
            Path::new(CHROMEDRIVER).exists() && Path::new(CHROMIUM).exists(),
            "browser tests need Debian's chromium and chromium-driver ({CHROMIUM}, {CHROMEDRIVER}); \
             scripts/test installs them"
        );
        let port = free_port();
        let home = std::env::temp_dir().join(format!("springline-driver-{}-{port}", std::process::id()));
        for sub in ["tmp", "config", "cache"] {
            std::fs::create_dir_all(home.join(sub)).expect("driver folders");
        }
        let child = Command::new(CHROMEDRIVER)
            .arg(format!("--port={port}"))
            .env("TMPDIR", home.join("tmp"))
            .env("XDG_CONFIG_HOME", home.join("config"))
            .env("XDG_CACHE_HOME", home.join("cache"))
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .expect("start chromedriver");
        let deadline = Instant::now() + Duration::from_secs(20);
        while TcpStream::connect(("127.0.0.1", port)).is_err() {
            assert!(Instant::now() < deadline, "chromedriver did not start on port {port}");
            std::thread::sleep(Duration::from_millis(50));
        }
        Driver { child, port, _home: home }
    }

    /// Opens a headless Chromium session with a fresh profile, window `width` x `height`
    /// CSS pixels and device scale factor `scale`.
    pub fn session(&self, width: u32, height: u32, scale: f64) -> Session {
        let profile = std::env::temp_dir().join(format!(
            "springline-profile-{}-{}-{}",
            std::process::id(),
            self.port,
            Instant::now().elapsed().as_nanos() ^ rand_seed()
        ));
        self.session_in(width, height, scale, profile, false)
    }

    /// [`Driver::session`] in the browser profile folder `profile`, kept when the session
    /// ends if `keep` (so a later session starts the browser again on the same storage).
    pub fn session_in(&self, width: u32, height: u32, scale: f64, profile: PathBuf, keep: bool) -> Session {
        std::fs::create_dir_all(&profile).expect("profile folder");
        let args = vec![
            "--headless".to_string(),
            "--no-sandbox".into(),
            "--disable-gpu".into(),
            "--disable-quic".into(),
            "--no-first-run".into(),
            "--disable-background-networking".into(),
            "--disable-component-update".into(),
            "--disable-sync".into(),
            "--disable-dev-shm-usage".into(),
            format!("--force-device-scale-factor={scale}"),
            format!("--window-size={width},{height}"),
            format!("--user-data-dir={}", profile.display()),
        ];
        let caps = json!({
            "capabilities": { "alwaysMatch": {
                "browserName": "chrome",
                "goog:chromeOptions": { "binary": CHROMIUM, "args": args },
                "goog:loggingPrefs": { "browser": "ALL" }
            }}
        });
        let v = http(self.port, "POST", "/session", Some(&caps)).expect("new session");
        let id =
            v["value"]["sessionId"].as_str().unwrap_or_else(|| panic!("no session id in {v}")).to_string();
        let s = Session { port: self.port, id, profile, keep };
        s.set_window(width, height);
        s
    }
}

impl Drop for Driver {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

/// One browser session; closed on drop (also when a test assertion panics).
pub struct Session {
    port: u16,
    id: String,
    profile: PathBuf,
    keep: bool,
}

impl Session {
    fn cmd(&self, method: &str, path: &str, body: Option<&Value>) -> Value {
        let url = format!("/session/{}{}", self.id, path);
        match http(self.port, method, &url, body) {
            Ok(v) => v["value"].clone(),
            Err(e) => panic!("webdriver {method} {path}: {e}"),
        }
    }
    /// Navigates to `url` and waits for the load event.
    pub fn goto(&self, url: &str) {
        self.cmd("POST", "/url", Some(&json!({ "url": url })));
    }
    /// Runs `script` (a function body; `arguments` holds `args`) and returns its value.
    pub fn exec(&self, script: &str, args: Vec<Value>) -> Value {
        self.cmd("POST", "/execute/sync", Some(&json!({ "script": script, "args": args })))
    }
    /// Runs an asynchronous `script`: it must call `arguments[arguments.length - 1]` with
    /// its result.
    pub fn exec_async(&self, script: &str, args: Vec<Value>) -> Value {
        self.cmd("POST", "/execute/async", Some(&json!({ "script": script, "args": args })))
    }
    /// Polls `script` until it returns something other than null / false, or panics
    /// with `what` after `timeout`.
    pub fn wait_for(&self, what: &str, script: &str, timeout: Duration) -> Value {
        let deadline = Instant::now() + timeout;
        loop {
            let v = self.exec(script, vec![]);
            if !(v.is_null() || v == Value::Bool(false)) {
                return v;
            }
            assert!(Instant::now() < deadline, "timed out waiting for {what}");
            std::thread::sleep(Duration::from_millis(50));
        }
    }
    /// Sets the outer window size in CSS pixels.
    pub fn set_window(&self, width: u32, height: u32) {
        self.cmd("POST", "/window/rect", Some(&json!({ "width": width, "height": height })));
    }
    /// Performs W3C pointer actions (a list of action objects for one pointer).
    pub fn pointer(&self, kind: &str, actions: Vec<Value>) {
        let body = json!({ "actions": [ {
            "type": "pointer", "id": "p1", "parameters": { "pointerType": kind }, "actions": actions
        } ] });
        self.cmd("POST", "/actions", Some(&body));
        self.cmd("DELETE", "/actions", None);
    }
    /// Drags with the mouse from (x0, y0) to (x1, y1) in viewport CSS pixels, in `steps`.
    pub fn drag(&self, from: (f64, f64), to: (f64, f64), steps: usize) {
        let mut actions = vec![
            json!({"type": "pointerMove", "duration": 0, "x": from.0.round() as i64, "y": from.1.round() as i64}),
            json!({"type": "pointerDown", "button": 0}),
        ];
        for i in 1..=steps {
            let t = i as f64 / steps as f64;
            let (x, y) = (from.0 + t * (to.0 - from.0), from.1 + t * (to.1 - from.1));
            actions.push(
                json!({"type": "pointerMove", "duration": 10, "x": x.round() as i64, "y": y.round() as i64}),
            );
        }
        actions.push(json!({"type": "pointerUp", "button": 0}));
        self.pointer("mouse", actions);
    }
    /// Moves the mouse to (x, y) in viewport CSS pixels.
    pub fn hover(&self, at: (f64, f64)) {
        self.pointer(
            "mouse",
            vec![json!({"type": "pointerMove", "duration": 0, "x": at.0.round() as i64, "y": at.1.round() as i64})],
        );
    }
    /// Entries of the browser console since the last call: (level, message).
    pub fn console(&self) -> Vec<(String, String)> {
        let v = self.cmd("POST", "/se/log", Some(&json!({ "type": "browser" })));
        v.as_array()
            .map(|a| {
                a.iter()
                    .map(|e| {
                        (
                            e["level"].as_str().unwrap_or("").to_string(),
                            e["message"].as_str().unwrap_or("").to_string(),
                        )
                    })
                    .collect()
            })
            .unwrap_or_default()
    }
    /// The page printed to PDF (WebDriver "Print Page") on paper `width` x `height` cm,
    /// backgrounds printed; the PDF's bytes.
    pub fn print_pdf(&self, width_cm: f64, height_cm: f64) -> Vec<u8> {
        let v = self.cmd(
            "POST",
            "/print",
            Some(&json!({ "page": { "width": width_cm, "height": height_cm }, "background": true })),
        );
        base64_decode(v.as_str().unwrap_or(""))
    }
    /// Runs a Chromium DevTools command through ChromeDriver (`goog/cdp/execute`).
    pub fn cdp(&self, command: &str, params: Value) -> Value {
        self.cmd("POST", "/goog/cdp/execute", Some(&json!({ "cmd": command, "params": params })))
    }
    /// A PNG screenshot of the viewport.
    pub fn screenshot(&self) -> Vec<u8> {
        let v = self.cmd("GET", "/screenshot", None);
        base64_decode(v.as_str().unwrap_or(""))
    }
}

impl Drop for Session {
    fn drop(&mut self) {
        let _ = http(self.port, "DELETE", &format!("/session/{}", self.id), None);
        if !self.keep {
            let _ = std::fs::remove_dir_all(&self.profile);
        }
    }
}

fn rand_seed() -> u128 {
    use std::collections::hash_map::RandomState;
    use std::hash::{BuildHasher, Hasher};
    let mut h = RandomState::new().build_hasher();
    h.write_u8(1);
    h.finish() as u128
}

/// A free TCP port on the loopback interface.
pub fn free_port() -> u16 {
    std::net::TcpListener::bind("127.0.0.1:0")
        .and_then(|l| l.local_addr())
        .map(|a| a.port())
        .expect("free port")
}

/// One HTTP/1.1 request with a JSON body to 127.0.0.1:`port`; returns the JSON reply.
fn http(port: u16, method: &str, path: &str, body: Option<&Value>) -> Result<Value, String> {
    let mut stream = TcpStream::connect(("127.0.0.1", port)).map_err(|e| e.to_string())?;
    stream.set_read_timeout(Some(Duration::from_secs(120))).map_err(|e| e.to_string())?;
    let body = body.map(|b| b.to_string()).unwrap_or_default();
    let req = format!(
        "{method} {path} HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\nContent-Type: application/json\r\n\
         Content-Length: {}\r\nConnection: close\r\n\r\n{body}",
        body.len()
    );
    stream.write_all(req.as_bytes()).map_err(|e| e.to_string())?;
    // read the head, then exactly Content-Length bytes (the driver may keep the
    // connection open), or to the end for chunked / unsized replies
    let mut raw = Vec::new();
    let mut buf = [0u8; 16384];
    let split = loop {
        if let Some(p) = raw.windows(4).position(|w| w == b"\r\n\r\n") {
            break p;
        }
        let n = stream.read(&mut buf).map_err(|e| e.to_string())?;
        if n == 0 {
            return Err("connection closed before the reply head".into());
        }
        raw.extend_from_slice(&buf[..n]);
    };
    let head = String::from_utf8_lossy(&raw[..split]).to_string();
    let lower = head.to_ascii_lowercase();
    let length: Option<usize> =
        lower.lines().find_map(|l| l.strip_prefix("content-length:")).and_then(|v| v.trim().parse().ok());
    let mut content = raw[split + 4..].to_vec();
    match length {
        Some(len) => {
            while content.len() < len {
                let n = stream.read(&mut buf).map_err(|e| e.to_string())?;
                if n == 0 {
                    break;
                }
                content.extend_from_slice(&buf[..n]);
            }
        }
        None => {
            stream.read_to_end(&mut content).map_err(|e| e.to_string())?;
            if lower.contains("transfer-encoding: chunked") {
                content = dechunk(&content);
            }
        }
    }
    let status: u16 = head.split_whitespace().nth(1).and_then(|s| s.parse().ok()).unwrap_or(0);
    let v: Value =
        serde_json::from_slice(&content).map_err(|e| format!("bad JSON ({e}) in reply to {path}"))?;
    if status >= 400 {
        return Err(format!("HTTP {status}: {}", v["value"]["message"].as_str().unwrap_or(&v.to_string())));
    }
    Ok(v)
}

fn dechunk(mut data: &[u8]) -> Vec<u8> {
    let mut out = Vec::new();
    while let Some(line_end) = data.windows(2).position(|w| w == b"\r\n") {
        let size = usize::from_str_radix(String::from_utf8_lossy(&data[..line_end]).trim(), 16).unwrap_or(0);
        if size == 0 {
            break;
        }
        let start = line_end + 2;
        out.extend_from_slice(&data[start..(start + size).min(data.len())]);
        data = &data[(start + size + 2).min(data.len())..];
    }
    out
}

/// Standard base64 (RFC 4648) decoding, ignoring anything outside the alphabet.
pub fn base64_decode(s: &str) -> Vec<u8> {
    let val = |c: u8| -> Option<u32> {
        match c {
            b'A'..=b'Z' => Some((c - b'A') as u32),
            b'a'..=b'z' => Some((c - b'a' + 26) as u32),
            b'0'..=b'9' => Some((c - b'0' + 52) as u32),
            b'+' | b'-' => Some(62),
            b'/' | b'_' => Some(63),
            _ => None,
        }
    };
    let mut out = Vec::with_capacity(s.len() * 3 / 4);
    let (mut acc, mut bits) = (0u32, 0u32);
    for c in s.bytes().filter_map(val) {
        acc = (acc << 6) | c;
        bits += 6;
        if bits >= 8 {
            bits -= 8;
            out.push((acc >> bits) as u8);
            acc &= (1 << bits) - 1;
        }
    }
    out
}
