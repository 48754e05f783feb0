//! Reading an input file with bounds (issue 22, item 7): the file type and
//! size are checked on the opened file before anything is read, so a path
//! naming `/dev/zero`, `/dev/urandom`, a FIFO with no writer or a folder is
//! refused at once instead of filling memory or hanging, and no more than
//! [`super::MAX_FILE_BYTES`] is ever read.

use std::fs::{File, OpenOptions};
use std::io::{self, Read};
use std::os::unix::fs::{FileTypeExt, OpenOptionsExt};
use std::path::Path;

fn refuse(why: String) -> io::Error {
    io::Error::new(io::ErrorKind::InvalidInput, why)
}

/// Open `path` for reading without blocking (a FIFO with no writer would
/// block the open itself) and refuse anything but a regular file of at
/// most [`super::MAX_FILE_BYTES`].
pub fn open_regular(path: &Path) -> io::Result<(File, u64)> {
    let file = OpenOptions::new()
        .read(true)
        .custom_flags(libc::O_NONBLOCK | libc::O_CLOEXEC)
        .open(path)?;
    let meta = file.metadata()?;
    let ft = meta.file_type();
    let kind = if ft.is_file() {
        None
    } else if ft.is_dir() {
        Some("a folder")
    } else if ft.is_fifo() {
        Some("a FIFO (named pipe)")
    } else if ft.is_char_device() || ft.is_block_device() {
        Some("a device")
    } else if ft.is_socket() {
        Some("a socket")
    } else {
        Some("not a regular file")
    };
    if let Some(kind) = kind {
        return Err(refuse(format!(
            "{kind}, not a regular file; save the input to a file first"
        )));
    }
    let len = meta.len();
    if len > super::MAX_FILE_BYTES as u64 {
        return Err(refuse(format!(
            "{len} bytes, larger than the 2 GiB limit ({} bytes)",
            super::MAX_FILE_BYTES
        )));
    }
    Ok((file, len))
}

/// The whole content of the regular file `path`, read with a cap.
pub fn read_bounded(path: &Path) -> io::Result<Vec<u8>> {
    let (file, len) = open_regular(path)?;
    let cap = super::MAX_FILE_BYTES as u64;
    let mut bytes = Vec::new();
    bytes
        .try_reserve_exact(len as usize + 1)
        .map_err(|_| refuse(format!("{len} bytes: not enough memory to read it")))?;
    file.take(cap + 1).read_to_end(&mut bytes)?;
    if bytes.len() as u64 > cap {
        return Err(refuse(format!(
            "grew beyond the 2 GiB limit ({cap} bytes) while being read"
        )));
    }
    Ok(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn devices_fifos_and_folders_are_refused_before_reading() {
        // /dev/zero would otherwise be read until memory runs out.
        let e = read_bounded(Path::new("/dev/zero")).unwrap_err();
        assert!(e.to_string().contains("a device"), "{e}");
        let e = read_bounded(Path::new("/")).unwrap_err();
        assert!(e.to_string().contains("a folder"), "{e}");
        let dir = std::env::temp_dir().join(format!("pp-fifo-read-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(&dir).unwrap();
        let fifo = dir.join("f");
        let c = std::ffi::CString::new(fifo.to_str().unwrap()).unwrap();
        // SAFETY: a valid path.
        assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
        // No writer: refused at once (a blocking open would hang here).
        let e = read_bounded(&fifo).unwrap_err();
        assert!(e.to_string().contains("FIFO"), "{e}");
        let f = dir.join("ok.ron");
        std::fs::write(&f, "(x: 1)").unwrap();
        assert_eq!(read_bounded(&f).unwrap(), b"(x: 1)");
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
