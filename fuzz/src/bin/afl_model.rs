//! AFL++ entry point (coverage-guided), built with `cargo afl build`.

fn main() {
    afl::fuzz!(|data: &[u8]| {
        panelpoint_fuzz::fuzz_one(data);
    });
}
