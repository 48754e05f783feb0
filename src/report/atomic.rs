//! Writing output so that a failed run never leaves a half-written file or
//! spoils an existing one, and never writes anywhere it was not asked to
//! (issue 22, items 1, 2, 4, 6). The rules, documented in
//! `docs/robustness.md`:
//!
//! - A regular file (or a new name) is replaced atomically: a temporary file
//!   beside it, created exclusively (`O_CREAT|O_EXCL|O_NOFOLLOW`) under an
//!   unpredictable name, is written, flushed to disk and renamed over it.
//!   The replaced file's permission bits (and, when run as root, its owner)
//!   are kept.
//! - A target that is not a regular file (a device such as `/dev/null`, a
//!   FIFO, `/dev/stdout` on a pipe or terminal) is written directly: it is
//!   never replaced by a regular file.
//! - A symlink the user names is followed: the file it points to is
//!   replaced and the link kept. A dangling symlink is refused (creating a
//!   file wherever a link points is how such links are abused).
//! - A read-only target (no write permission bit, or not writable by this
//!   user) is refused: it is not silently replaced.
//! - A folder is refused.
//! - The sweep's `<out>.partial` ([`Streamed`]) is created exclusively with
//!   `O_NOFOLLOW`; an existing one is reused only if it is a regular file and
//!   no other run holds its lock (`flock`), so two sweeps to one `--out`
//!   cannot interleave their rows.

use std::fs::{self, File, OpenOptions};
use std::io::{self, BufWriter, Write};
use std::os::unix::fs::{MetadataExt, OpenOptionsExt, PermissionsExt};
use std::os::unix::io::AsRawFd;
use std::path::{Path, PathBuf};

/// Write to `path` safely, or to standard output when `path` is None.
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
        Some(path) => match target(path)? {
            Target::Direct(file) => {
                let mut w = BufWriter::with_capacity(1 << 16, file);
                body(&mut w)?;
                w.flush()
            }
            Target::Replace { path, old } => replace(&path, old.as_ref(), body),
        },
    }
}

/// What writing to a named path means.
pub enum Target {
    /// Not a regular file: write straight into it.
    Direct(File),
    /// Replace the regular file at `path` (symlinks resolved); `old` is the
    /// file being replaced, if there is one.
    Replace {
        path: PathBuf,
        old: Option<fs::Metadata>,
    },
}

/// A target refused by the rules above (the user's choice of `--out`, so
/// exit status 2), as opposed to a failing write (a full disk: exit 1).
#[derive(Debug)]
struct Refused(&'static str);

impl std::fmt::Display for Refused {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.0)
    }
}

impl std::error::Error for Refused {}

fn refuse(kind: io::ErrorKind, why: &'static str) -> io::Error {
    io::Error::new(kind, Refused(why))
}

/// Whether `e` is a refusal of the target by these rules (not a failing
/// write).
pub fn is_refusal(e: &io::Error) -> bool {
    e.get_ref().is_some_and(|inner| inner.is::<Refused>())
}

/// Classify `path` by the rules in the module comment.
pub fn target(path: &Path) -> io::Result<Target> {
    let lm = match fs::symlink_metadata(path) {
        Err(e) if e.kind() == io::ErrorKind::NotFound => {
            return Ok(Target::Replace {
                path: path.to_path_buf(),
                old: None,
            })
        }
        other => other?,
    };
    let (real, m) = if lm.file_type().is_symlink() {
        let m = match fs::metadata(path) {
            Err(e) if e.kind() == io::ErrorKind::NotFound => {
                return Err(refuse(
                    io::ErrorKind::InvalidInput,
                    "a symlink to nothing; refusing to create a file through it",
                ))
            }
            other => other?,
        };
        let real = if m.is_file() {
            fs::canonicalize(path)?
        } else {
            path.to_path_buf()
        };
        (real, m)
    } else {
        (path.to_path_buf(), lm)
    };
    if m.is_dir() {
        return Err(refuse(io::ErrorKind::InvalidInput, "a folder, not a file"));
    }
    if !m.is_file() {
        return open_special(path).map(Target::Direct);
    }
    if m.permissions().mode() & 0o222 == 0 || !writable(&real) {
        return Err(refuse(
            io::ErrorKind::PermissionDenied,
            "read-only; refusing to replace it (make it writable or choose another file)",
        ));
    }
    Ok(Target::Replace {
        path: real,
        old: Some(m),
    })
}

fn writable(path: &Path) -> bool {
    use std::os::unix::ffi::OsStrExt;
    let Ok(c) = std::ffi::CString::new(path.as_os_str().as_bytes()) else {
        return false;
    };
    // SAFETY: `c` is a valid NUL-terminated path for the call's duration.
    unsafe { libc::access(c.as_ptr(), libc::W_OK) == 0 }
}

/// Open a device or FIFO for writing without creating or truncating it. A
/// FIFO with no reader would block for ever: it is opened non-blocking, so
/// that case is an error (ENXIO), then switched back to blocking writes.
fn open_special(path: &Path) -> io::Result<File> {
    let file = OpenOptions::new()
        .write(true)
        .custom_flags(libc::O_NONBLOCK | libc::O_CLOEXEC)
        .open(path)
        .map_err(|e| {
            if e.raw_os_error() == Some(libc::ENXIO) {
                refuse(io::ErrorKind::BrokenPipe, "a FIFO with no reader")
            } else {
                e
            }
        })?;
    let fd = file.as_raw_fd();
    // SAFETY: fcntl on a descriptor we own.
    unsafe {
        let flags = libc::fcntl(fd, libc::F_GETFL);
        if flags >= 0 {
            libc::fcntl(fd, libc::F_SETFL, flags & !libc::O_NONBLOCK);
        }
    }
    Ok(file)
}

/// A number another user cannot guess: the standard library's per-process
/// random hash keys (seeded from the operating system) over the time.
fn unpredictable() -> u64 {
    use std::hash::{BuildHasher, Hasher};
    let mut h = std::collections::hash_map::RandomState::new().build_hasher();
    let now = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_nanos());
    h.write_u128(now);
    h.finish()
}

fn folder_and_name(path: &Path) -> io::Result<(PathBuf, String)> {
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path
        .file_name()
        .ok_or_else(|| refuse(io::ErrorKind::InvalidInput, "not a file name"))?;
    Ok((dir, name.to_string_lossy().into_owned()))
}

/// Create a new file exclusively (never through a symlink, never an
/// existing file): `O_CREAT|O_EXCL|O_NOFOLLOW`.
fn create_exclusive(path: &Path, mode: u32) -> io::Result<File> {
    OpenOptions::new()
        .write(true)
        .create_new(true)
        .mode(mode)
        .custom_flags(libc::O_NOFOLLOW | libc::O_CLOEXEC)
        .open(path)
}

/// A fresh temporary file beside `path`, named `.NAME.tmp-PID-RANDOM`.
fn temporary(path: &Path) -> io::Result<(PathBuf, File)> {
    let (dir, name) = folder_and_name(path)?;
    let mut last = None;
    for _ in 0..16 {
        let tmp = dir.join(format!(
            ".{name}.tmp-{}-{:016x}",
            std::process::id(),
            unpredictable()
        ));
        match create_exclusive(&tmp, 0o666) {
            Ok(f) => return Ok((tmp, f)),
            Err(e) if e.kind() == io::ErrorKind::AlreadyExists => last = Some(e),
            Err(e) => return Err(e),
        }
    }
    Err(last.unwrap_or_else(|| io::Error::other("no temporary name")))
}

/// Give the new file the replaced file's permission bits and, where we may
/// (as root), its owner.
fn keep_nature(file: &File, old: Option<&fs::Metadata>) -> io::Result<()> {
    if let Some(old) = old {
        file.set_permissions(fs::Permissions::from_mode(old.mode() & 0o7777))?;
        // SAFETY: fchown on a descriptor we own; failure (not root) is fine.
        unsafe {
            let _ = libc::fchown(file.as_raw_fd(), old.uid(), old.gid());
        }
    }
    Ok(())
}

fn replace<F>(path: &Path, old: Option<&fs::Metadata>, body: F) -> io::Result<()>
where
    F: FnOnce(&mut dyn Write) -> io::Result<()>,
{
    let (tmp, file) = temporary(path)?;
    let _cleanup = crate::report::cleanup::Registered::new(&tmp);
    let result = (|| {
        let mut w = BufWriter::with_capacity(1 << 16, file);
        body(&mut w)?;
        let file = w.into_inner().map_err(|e| e.into_error())?;
        keep_nature(&file, old)?;
        file.sync_all()?;
        fs::rename(&tmp, path)
    })();
    if result.is_err() {
        let _ = fs::remove_file(&tmp);
    }
    result
}

/// A streamed output (the sweep's rows): straight into a special file, or
/// into a locked `<out>.partial` renamed over the target when complete.
pub enum Streamed {
    Direct(File),
    Partial {
        file: File,
        partial: PathBuf,
        target: PathBuf,
        old: Option<Box<fs::Metadata>>,
    },
}

impl Streamed {
    /// Open the output for `out`, rows going to `partial` (see the module
    /// comment for the rules).
    pub fn open(out: &Path, partial: &Path) -> io::Result<Streamed> {
        match target(out)? {
            Target::Direct(file) => Ok(Streamed::Direct(file)),
            Target::Replace { path, old } => Ok(Streamed::Partial {
                file: open_partial(partial)?,
                partial: partial.to_path_buf(),
                target: path,
                old: old.map(Box::new),
            }),
        }
    }

    /// A handle to write through (the same file).
    pub fn writer(&self) -> io::Result<File> {
        match self {
            Streamed::Direct(f) | Streamed::Partial { file: f, .. } => f.try_clone(),
        }
    }

    /// The partial file rows are kept in, if any.
    pub fn partial(&self) -> Option<&Path> {
        match self {
            Streamed::Direct(_) => None,
            Streamed::Partial { partial, .. } => Some(partial),
        }
    }

    /// All rows written and flushed by the caller: make the target whole.
    pub fn finish(self) -> io::Result<()> {
        match self {
            Streamed::Direct(_) => Ok(()),
            Streamed::Partial {
                file,
                partial,
                target,
                old,
            } => {
                keep_nature(&file, old.as_deref())?;
                file.sync_all()?;
                // Renamed while still locked; the lock goes with the handle.
                fs::rename(&partial, &target)
            }
        }
    }
}

fn lock(file: &File) -> io::Result<bool> {
    // SAFETY: flock on a descriptor we own.
    let r = unsafe { libc::flock(file.as_raw_fd(), libc::LOCK_EX | libc::LOCK_NB) };
    if r == 0 {
        return Ok(true);
    }
    let e = io::Error::last_os_error();
    if e.raw_os_error() == Some(libc::EWOULDBLOCK) {
        Ok(false)
    } else {
        Err(e)
    }
}

/// Create `<out>.partial` exclusively, or take over a stale one left by an
/// interrupted run: only a regular file, only when no other run holds its
/// lock, and only if the name still names the file we locked.
fn open_partial(path: &Path) -> io::Result<File> {
    for _ in 0..8 {
        match create_exclusive(path, 0o666) {
            Ok(f) => {
                if lock(&f)? {
                    return Ok(f);
                }
                continue;
            }
            Err(e) if e.kind() == io::ErrorKind::AlreadyExists => {}
            Err(e) => return Err(e),
        }
        let lm = match fs::symlink_metadata(path) {
            Err(e) if e.kind() == io::ErrorKind::NotFound => continue,
            other => other?,
        };
        if !lm.file_type().is_file() {
            return Err(refuse(
                io::ErrorKind::AlreadyExists,
                "its .partial file exists and is not a regular file (a symlink?); \
                 refusing to write through it (remove it first)",
            ));
        }
        let f = OpenOptions::new()
            .write(true)
            .custom_flags(libc::O_NOFOLLOW | libc::O_CLOEXEC)
            .open(path)?;
        if !lock(&f)? {
            return Err(refuse(
                io::ErrorKind::WouldBlock,
                "another run is writing its .partial file; wait for it or choose another --out",
            ));
        }
        let now = fs::symlink_metadata(path);
        let fm = f.metadata()?;
        match now {
            Ok(n) if n.dev() == fm.dev() && n.ino() == fm.ino() => {
                f.set_len(0)?;
                return Ok(f);
            }
            _ => continue, // renamed or replaced meanwhile: start again
        }
    }
    Err(refuse(
        io::ErrorKind::WouldBlock,
        "its .partial file keeps changing (another run?)",
    ))
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

#[cfg(test)]
mod exclusive {
    use super::*;

    #[test]
    fn exclusive_creation_never_follows_a_symlink() {
        let dir = std::env::temp_dir().join(format!("pp-excl-{}", std::process::id()));
        let _ = fs::remove_dir_all(&dir);
        fs::create_dir_all(&dir).unwrap();
        let victim = dir.join("victim");
        fs::write(&victim, "precious").unwrap();
        let link = dir.join("tmp");
        std::os::unix::fs::symlink(&victim, &link).unwrap();
        assert!(create_exclusive(&link, 0o600).is_err());
        assert!(open_partial(&link).is_err());
        assert_eq!(fs::read_to_string(&victim).unwrap(), "precious");
        // Two temporary names for one target differ (not just by PID).
        let (a, _fa) = temporary(&dir.join("out")).unwrap();
        let (b, _fb) = temporary(&dir.join("out")).unwrap();
        assert_ne!(a, b);
        fs::remove_dir_all(&dir).unwrap();
    }
}
