//! Refusing an output file that is one of the run's inputs (issue 22, item
//! 3): `solve m.ron --out m.ron` would otherwise replace the model with its
//! results. Inputs are recorded as they are read; every write through
//! [`super::commands::write`] or the sweep's sink checks its target first.
//! Two paths name the same file when they have the same device and inode
//! (so hard links and symlinks to an input are caught too).

use crate::error::Error;
use std::os::unix::fs::MetadataExt;
use std::path::{Path, PathBuf};
use std::sync::Mutex;

static INPUTS: Mutex<Vec<PathBuf>> = Mutex::new(Vec::new());

/// Record a file the run reads (model, sweep file, vehicles file).
pub fn input(path: &Path) {
    if let Ok(mut v) = INPUTS.lock() {
        v.push(path.to_path_buf());
    }
}

fn identity(path: &Path) -> Option<(u64, u64)> {
    std::fs::metadata(path).ok().map(|m| (m.dev(), m.ino()))
}

/// Exit 2 when `out` (or the sweep's `partial` beside it) is the same file
/// as an input. A target that does not exist yet cannot be an input.
pub fn check_out(out: &Path) -> Result<(), Error> {
    let Some(target) = identity(out) else {
        return Ok(());
    };
    let inputs = INPUTS.lock().map(|v| v.clone()).unwrap_or_default();
    for input in inputs {
        if identity(&input) == Some(target) {
            return Err(Error::Usage(format!(
                "--out {}: is the same file as the input {}; refusing to overwrite an input \
                 (choose another output file)",
                out.display(),
                input.display()
            )));
        }
    }
    Ok(())
}

/// [`check_out`] for an optional `--out`.
pub fn check(out: &Option<PathBuf>) -> Result<(), Error> {
    out.as_deref().map_or(Ok(()), check_out)
}
