# Shared helpers of the set-up scripts: say what is happening, install what is missing,
# skip what is already there. Versions measured to work together (shared toolchain notes).

# CI may start with a sparse environment: make sure HOME is known
HOME="${HOME:-$(getent passwd "$(id -u)" | cut -d: -f6)}"
export HOME
TRUNK_VERSION="0.21.14"
BINARYEN_VERSION="132.0.0"
TOOLS_DIR="${SPRINGLINE_TOOLS:-$HOME/.cache/springline-tools}"
export TRUNK_SKIP_VERSION_CHECK=true
export PATH="$TOOLS_DIR/node_modules/.bin:$HOME/.cargo/bin:$PATH"

step() { printf '\n==> %s\n' "$*"; }
note() { printf '    %s\n' "$*"; }

as_root() {
    if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi
}

# The wasm32 target of the installed Rust toolchain.
ensure_wasm_target() {
    if rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown; then
        note "wasm32-unknown-unknown target: present"
    else
        note "installing the wasm32-unknown-unknown target (rustup)"
        rustup target add wasm32-unknown-unknown
    fi
}

# trunk, pinned: newer releases need a newer compiler than this machine has.
ensure_trunk() {
    if trunk --version 2>/dev/null | grep -q "$TRUNK_VERSION"; then
        note "trunk $TRUNK_VERSION: present"
    else
        note "installing trunk $TRUNK_VERSION (cargo install, about 9 minutes on 2 cores)"
        cargo install trunk --locked --version "$TRUNK_VERSION"
    fi
}

# wasm-bindgen-cli at exactly the version Cargo.lock pins (trunk only uses a matching one).
ensure_wasm_bindgen() {
    local want
    want=$(awk '/^name = "wasm-bindgen"$/{getline; gsub(/[^0-9.]/, ""); print; exit}' Cargo.lock)
    if [ -z "$want" ]; then
        echo "cannot find the wasm-bindgen version in Cargo.lock" >&2
        exit 1
    fi
    if wasm-bindgen --version 2>/dev/null | grep -q " $want"; then
        note "wasm-bindgen-cli $want: present"
    else
        # no --locked: its own lock file pins a crate the registry mirror may lack
        note "installing wasm-bindgen-cli $want (cargo install, about 3 minutes)"
        cargo install wasm-bindgen-cli --version "$want"
    fi
}

# binaryen's wasm-opt from the npm registry (Debian's older one breaks the app).
ensure_wasm_opt() {
    if "$TOOLS_DIR/node_modules/.bin/wasm-opt" --version 2>/dev/null | grep -q "version ${BINARYEN_VERSION%%.*}"; then
        note "wasm-opt ${BINARYEN_VERSION%%.*}: present"
    else
        note "installing binaryen $BINARYEN_VERSION into $TOOLS_DIR (npm)"
        mkdir -p "$TOOLS_DIR"
        npm install --silent --no-audit --no-fund --prefix "$TOOLS_DIR" "binaryen@$BINARYEN_VERSION"
    fi
}

# Debian's Chromium and ChromeDriver for the browser tests.
ensure_chromium() {
    if [ -x /usr/bin/chromium ] && [ -x /usr/bin/chromedriver ]; then
        note "chromium and chromedriver: present"
    else
        note "installing chromium and chromium-driver (Debian packages)"
        as_root apt-get update -qq
        as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium chromium-driver
    fi
}

# Everything the browser build needs.
ensure_web_tools() {
    ensure_wasm_target
    ensure_trunk
    ensure_wasm_bindgen
    ensure_wasm_opt
}

# Release build of the app into dist/ (nothing is downloaded once the tools are here).
build_app() {
    trunk build --release --offline
}

# The nightly toolchain and cargo-fuzz, for scripts/fuzz (libFuzzer needs nightly's
# sanitizer flags).
CARGO_FUZZ_VERSION="0.13.2"
ensure_fuzz_tools() {
    if rustup toolchain list 2>/dev/null | grep -q '^nightly'; then
        note "nightly toolchain: present"
    else
        note "installing the nightly toolchain (rustup, minimal profile)"
        rustup toolchain install nightly --profile minimal
    fi
    if cargo fuzz --version 2>/dev/null | grep -q "$CARGO_FUZZ_VERSION"; then
        note "cargo-fuzz $CARGO_FUZZ_VERSION: present"
    else
        note "installing cargo-fuzz $CARGO_FUZZ_VERSION (cargo install, about 2 minutes)"
        cargo install cargo-fuzz --locked --version "$CARGO_FUZZ_VERSION"
    fi
}
