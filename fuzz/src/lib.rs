//! The fuzz target of panelpoint, in libFuzzer style: `fuzz_one(bytes)`
//! runs one input through the whole pipeline and panics on a finding. The
//! pipeline itself lives beside the regression cases so the main test
//! suite replays saved inputs through exactly the same code.

#[path = "../../tests/regressions/pipeline.rs"]
mod pipeline;

pub use pipeline::fuzz_one;
