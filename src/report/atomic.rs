//! Writing output so that a failed run never leaves a half-written file or
//! spoils an existing one: write a temporary file beside the target, flush
//! it to disk, then rename it over the target in one step.

use std::fs;
use std::io::{self, BufWriter, Write};
use std::path::Path;

/// Write to `path` atomically, or to standard output when `path` is None.
/// `body` produces the whole output; if it fails, nothing is replaced.
pub fn write_output<F>(path: Option<&Path>, body: F) -> io::Result<()>
where
    F: FnOnce(&mut dyn Write) -> io::Result<()>,
{
    match path {
        None => {
            let stdout = io::stdout();
            let mut w = BufWriter::with_capacity(1 << 16, stdout.lock());
            body(&mut w)?;
            w.flush()
        }
        Some(path) => {
            let dir = match path.parent() {
                Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
                _ => std::path::PathBuf::from("."),
            };
            let name = path
                .file_name()
                .ok_or_else(|| io::Error::new(io::ErrorKind::InvalidInput, "not a file name"))?;
            let tmp = dir.join(format!(
                ".{}.tmp-{}",
                name.to_string_lossy(),
                std::process::id()
            ));
            let result = (|| {
                let file = fs::File::create(&tmp)?;
                let mut w = BufWriter::with_capacity(1 << 16, file);
                body(&mut w)?;
                let file = w.into_inner().map_err(|e| e.into_error())?;
                file.sync_all()?;
                fs::rename(&tmp, path)
            })();
            if result.is_err() {
                let _ = fs::remove_file(&tmp);
            }
            result
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn failure_keeps_the_old_file() {
        let dir = std::env::temp_dir().join(format!("pp-atomic-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let target = dir.join("out.txt");
        fs::write(&target, "old").unwrap();
        let r = write_output(Some(&target), |w| {
            w.write_all(b"half")?;
            Err(io::Error::other("boom"))
        });
        assert!(r.is_err());
        assert_eq!(fs::read_to_string(&target).unwrap(), "old");
        assert_eq!(
            fs::read_dir(&dir).unwrap().count(),
            1,
            "temporary file left behind"
        );
        write_output(Some(&target), |w| w.write_all(b"new")).unwrap();
        assert_eq!(fs::read_to_string(&target).unwrap(), "new");
        fs::remove_dir_all(&dir).unwrap();
    }
}
