//! Removing this run's temporary files when it is interrupted (SIGINT,
//! SIGTERM, SIGHUP; issue 22, item 5). A temporary file is registered while
//! it exists; the signal handler unlinks every registered path, restores the
//! default action and raises the signal again, so the exit status still
//! says how the run ended. The handler only loads atomics and calls
//! `unlink`, `signal` and `raise`, which are async-signal-safe. A sweep's
//! `<out>.partial` is not registered: it is kept on purpose.

use std::ffi::CString;
use std::os::unix::ffi::OsStrExt;
use std::path::Path;
use std::sync::atomic::{AtomicPtr, Ordering};
use std::sync::Once;

const SLOTS: usize = 16;
static PATHS: [AtomicPtr<libc::c_char>; SLOTS] =
    [const { AtomicPtr::new(std::ptr::null_mut()) }; SLOTS];
static INSTALL: Once = Once::new();

extern "C" fn on_signal(sig: libc::c_int) {
    for slot in &PATHS {
        let p = slot.load(Ordering::SeqCst);
        if !p.is_null() {
            // SAFETY: `p` is a leaked CString, never freed.
            unsafe {
                libc::unlink(p);
            }
        }
    }
    // SAFETY: async-signal-safe calls with valid arguments.
    unsafe {
        libc::signal(sig, libc::SIG_DFL);
        libc::raise(sig);
    }
}

fn install() {
    INSTALL.call_once(|| {
        for sig in [libc::SIGINT, libc::SIGTERM, libc::SIGHUP] {
            // SAFETY: installing a handler that is async-signal-safe; a
            // signal the parent set to be ignored stays ignored.
            unsafe {
                let handler = on_signal as extern "C" fn(libc::c_int) as libc::sighandler_t;
                let old = libc::signal(sig, handler);
                if old == libc::SIG_IGN {
                    libc::signal(sig, libc::SIG_IGN);
                }
            }
        }
    });
}

/// A path removed if the process is interrupted while this value lives.
pub struct Registered {
    slot: Option<usize>,
}

impl Registered {
    pub fn new(path: &Path) -> Registered {
        install();
        let Ok(c) = CString::new(path.as_os_str().as_bytes()) else {
            return Registered { slot: None };
        };
        let raw = c.into_raw();
        for (i, slot) in PATHS.iter().enumerate() {
            if slot
                .compare_exchange(
                    std::ptr::null_mut(),
                    raw,
                    Ordering::SeqCst,
                    Ordering::SeqCst,
                )
                .is_ok()
            {
                return Registered { slot: Some(i) };
            }
        }
        // SAFETY: `raw` came from `into_raw` above and was not stored.
        drop(unsafe { CString::from_raw(raw) });
        Registered { slot: None }
    }
}

impl Drop for Registered {
    fn drop(&mut self) {
        if let Some(i) = self.slot {
            // The path's few bytes are not freed: a handler running on
            // another thread may still be reading them.
            PATHS[i].store(std::ptr::null_mut(), Ordering::SeqCst);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn an_interrupted_process_removes_its_registered_files() {
        let dir = std::env::temp_dir().join(format!("pp-cleanup-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(&dir).unwrap();
        let tmp = dir.join(".out.tmp-x");
        std::fs::write(&tmp, "half").unwrap();
        let reg = Registered::new(&tmp);
        // SAFETY: the child only stores to atomics, raises a signal
        // (async-signal-safe) and exits; the parent waits for it.
        let pid = unsafe { libc::fork() };
        assert!(pid >= 0, "fork failed");
        if pid == 0 {
            // The child inherits every path the parent's other test threads
            // registered (an atomic write's temporary file in flight); it
            // must remove only its own, or it unlinks theirs under them.
            for (i, slot) in PATHS.iter().enumerate() {
                if Some(i) != reg.slot {
                    slot.store(std::ptr::null_mut(), Ordering::SeqCst);
                }
            }
            unsafe {
                libc::raise(libc::SIGTERM);
                libc::_exit(0);
            }
        }
        let mut status = 0;
        // SAFETY: waiting for our own child.
        unsafe { libc::waitpid(pid, &mut status, 0) };
        assert!(libc::WIFSIGNALED(status), "child not ended by the signal");
        assert_eq!(libc::WTERMSIG(status), libc::SIGTERM);
        assert!(!tmp.exists(), "temporary file left after SIGTERM");
        drop(reg);
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
