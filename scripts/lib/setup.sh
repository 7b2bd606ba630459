# Shared helpers of the set-up scripts: say what is happening, install what is missing.

step() { printf '\n==> %s\n' "$*"; }
note() { printf '    %s\n' "$*"; }

# The wasm32 target of the installed Rust toolchain.
ensure_wasm_target() {
    if rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown; then
        note "wasm32-unknown-unknown target: present"
    else
        note "installing the wasm32-unknown-unknown target (rustup)"
        rustup target add wasm32-unknown-unknown
    fi
}
