//! Issue 22: never destroy a file the run was not asked to write, never hang
//! on an input, never abort on a broken output. Every file-system case runs
//! in a temporary folder of its own, on copies of the repository's models.
//! Expected behaviour is the project's rule (RULES.md: "bad input: clear
//! error naming what and where (exit 2), never a panic or half-written
//! file") and the issue's text.

mod common;
use common::*;
use std::ffi::OsStr;
use std::fs;
use std::path::{Path, PathBuf};

fn repo(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("models")
        .join(name)
}

/// A fresh folder holding copies of the repository's models.
fn scratch(name: &str) -> PathBuf {
    let d = dir(&format!("io-{name}"));
    for f in [
        "four_panel_live.ron",
        "vehicles.ron",
        "millrace-footbridge.ron",
        "millrace-sweep.ron",
    ] {
        fs::copy(repo(f), d.join(f)).unwrap();
    }
    d
}

fn pp(args: &[&OsStr]) -> Run {
    run_os(args)
}

fn os<P: AsRef<OsStr> + ?Sized>(p: &P) -> &OsStr {
    p.as_ref()
}

/// Exit 2, no panic, every needle in stderr.
fn refused(r: &Run, needles: &[&str]) {
    assert_eq!(r.code, 2, "stdout: {}\nstderr: {}", r.stdout, r.stderr);
    assert!(!r.stderr.contains("panicked"), "{}", r.stderr);
    for n in needles {
        assert!(r.stderr.contains(n), "{n:?} not in: {}", r.stderr);
    }
}

fn is_root() -> bool {
    // SAFETY: geteuid has no preconditions.
    unsafe { libc::geteuid() == 0 }
}

// ---- item 3: --out equal to an input --------------------------------------

#[test]
fn out_naming_the_model_is_refused_and_the_model_kept() {
    let d = scratch("out-model");
    let m = d.join("four_panel_live.ron");
    let before = fs::read(&m).unwrap();
    let r = pp(&[os("solve"), m.as_os_str(), os("--out"), m.as_os_str()]);
    refused(&r, &["same file as the input", "four_panel_live.ron"]);
    assert_eq!(fs::read(&m).unwrap(), before, "the model was replaced");
    // A hard link to the model is the same file (same device and inode).
    let link = d.join("link.ron");
    fs::hard_link(&m, &link).unwrap();
    let r = pp(&[os("rate"), m.as_os_str(), os("--out"), link.as_os_str()]);
    refused(&r, &["same file as the input"]);
    // So is a symlink to it.
    let sym = d.join("sym.ron");
    std::os::unix::fs::symlink(&m, &sym).unwrap();
    let r = pp(&[
        os("solve"),
        m.as_os_str(),
        os("--format"),
        os("json"),
        os("--out"),
        sym.as_os_str(),
    ]);
    refused(&r, &["same file as the input"]);
    assert_eq!(fs::read(&m).unwrap(), before);
    // A different output file is fine.
    let ok = d.join("out.txt");
    let r = pp(&[os("solve"), m.as_os_str(), os("--out"), ok.as_os_str()]);
    assert_eq!(r.code, 0, "{}", r.stderr);
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn out_naming_the_vehicles_file_is_refused() {
    let d = scratch("out-vehicles");
    let m = d.join("four_panel_live.ron");
    let v = d.join("vehicles.ron");
    let before = fs::read(&v).unwrap();
    let r = pp(&[os("envelope"), m.as_os_str(), os("--out"), v.as_os_str()]);
    refused(&r, &["same file as the input", "vehicles.ron"]);
    assert_eq!(
        fs::read(&v).unwrap(),
        before,
        "the vehicles file was replaced"
    );
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn out_naming_the_sweep_file_is_refused() {
    let d = scratch("out-sweep");
    let m = d.join("millrace-footbridge.ron");
    let s = d.join("millrace-sweep.ron");
    let before = fs::read(&s).unwrap();
    let r = pp(&[
        os("sweep"),
        m.as_os_str(),
        s.as_os_str(),
        os("--out"),
        s.as_os_str(),
    ]);
    refused(&r, &["same file as the input", "millrace-sweep.ron"]);
    assert_eq!(fs::read(&s).unwrap(), before, "the sweep file was replaced");
    let r = pp(&[
        os("sweep"),
        m.as_os_str(),
        s.as_os_str(),
        os("--out"),
        m.as_os_str(),
    ]);
    refused(&r, &["same file as the input", "millrace-footbridge.ron"]);
    fs::remove_dir_all(d).unwrap();
}

// ---- items 1, 2, 6: what --out may replace ---------------------------------

fn four_panel(d: &Path) -> PathBuf {
    d.join("four_panel_live.ron")
}

fn solve_to(m: &Path, out: &Path) -> Run {
    pp(&[os("solve"), m.as_os_str(), os("--out"), out.as_os_str()])
}

#[test]
fn a_device_target_is_written_not_replaced() {
    use std::os::unix::fs::FileTypeExt;
    let d = scratch("dev");
    let m = four_panel(&d);
    let r = solve_to(&m, Path::new("/dev/null"));
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(fs::metadata("/dev/null")
        .unwrap()
        .file_type()
        .is_char_device());
    if is_root() {
        // A device node of our own (the null device, major 1 minor 3).
        let node = d.join("fakenull");
        let c = std::ffi::CString::new(node.to_str().unwrap()).unwrap();
        // SAFETY: valid path; makedev(1, 3) is the null device.
        let rc = unsafe { libc::mknod(c.as_ptr(), libc::S_IFCHR | 0o666, libc::makedev(1, 3)) };
        assert_eq!(rc, 0, "mknod failed");
        let r = solve_to(&m, &node);
        assert_eq!(r.code, 0, "{}", r.stderr);
        let ft = fs::symlink_metadata(&node).unwrap().file_type();
        assert!(
            ft.is_char_device(),
            "the device node was replaced by a regular file"
        );
    } else {
        eprintln!("skipped the mknod case: not root");
    }
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn dev_stdout_on_a_pipe_is_written_directly() {
    let d = scratch("stdout");
    let m = four_panel(&d);
    // The test harness gives the child a pipe for standard output.
    let r = solve_to(&m, Path::new("/dev/stdout"));
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(
        r.stdout.contains("U1L1") || r.stdout.contains("member"),
        "{}",
        r.stdout
    );
    fs::remove_dir_all(d).unwrap();
}

fn mkfifo(p: &Path) {
    let c = std::ffi::CString::new(p.to_str().unwrap()).unwrap();
    // SAFETY: valid path.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
}

#[test]
fn a_fifo_target_is_written_and_one_without_reader_refused() {
    use std::os::unix::fs::FileTypeExt;
    let d = scratch("fifo");
    let m = four_panel(&d);
    let fifo = d.join("pipe");
    mkfifo(&fifo);
    // No reader: refused at once rather than blocking for ever.
    let r = solve_to(&m, &fifo);
    refused(&r, &["FIFO with no reader"]);
    // With a reader: the report arrives through the FIFO, which stays one.
    let f2 = fifo.clone();
    let reader = std::thread::spawn(move || fs::read_to_string(f2).unwrap());
    // Wait until the reader has opened the FIFO (the writer's non-blocking
    // open needs a reader present).
    let mut r;
    loop {
        r = solve_to(&m, &fifo);
        if r.code == 0 {
            break;
        }
        assert!(r.stderr.contains("no reader"), "{}", r.stderr);
        std::thread::yield_now();
    }
    let got = reader.join().unwrap();
    assert!(got.contains("Screening"), "report not received: {got}");
    assert!(fs::symlink_metadata(&fifo).unwrap().file_type().is_fifo());
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn a_symlinked_target_is_followed_and_a_dangling_one_refused() {
    let d = scratch("symlink");
    let m = four_panel(&d);
    let real = d.join("real.txt");
    fs::write(&real, "old").unwrap();
    let link = d.join("out.txt");
    std::os::unix::fs::symlink(&real, &link).unwrap();
    let r = solve_to(&m, &link);
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(fs::symlink_metadata(&link)
        .unwrap()
        .file_type()
        .is_symlink());
    assert!(fs::read_to_string(&real).unwrap().contains("Screening"));
    // Dangling: the file it points to is not created.
    let nowhere = d.join("nowhere.txt");
    let dangling = d.join("dangling.txt");
    std::os::unix::fs::symlink(&nowhere, &dangling).unwrap();
    refused(&solve_to(&m, &dangling), &["symlink to nothing"]);
    assert!(!nowhere.exists());
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn a_read_only_target_is_refused_and_a_writable_one_keeps_its_mode() {
    use std::os::unix::fs::PermissionsExt;
    let d = scratch("readonly");
    let m = four_panel(&d);
    let ro = d.join("ro.txt");
    fs::write(&ro, "keep me").unwrap();
    fs::set_permissions(&ro, fs::Permissions::from_mode(0o444)).unwrap();
    // Refused even as root (who could write it): no write bit is set.
    refused(&solve_to(&m, &ro), &["read-only"]);
    assert_eq!(fs::read_to_string(&ro).unwrap(), "keep me");
    let rw = d.join("rw.txt");
    fs::write(&rw, "old").unwrap();
    fs::set_permissions(&rw, fs::Permissions::from_mode(0o640)).unwrap();
    assert_eq!(solve_to(&m, &rw).code, 0);
    let mode = fs::metadata(&rw).unwrap().permissions().mode() & 0o777;
    assert_eq!(mode, 0o640, "mode not kept: {mode:o}");
    // No temporary file left beside the outputs.
    let left: Vec<_> = fs::read_dir(&d)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.contains(".tmp-"))
        .collect();
    assert!(left.is_empty(), "{left:?}");
    fs::remove_dir_all(d).unwrap();
}

fn sweep_to(d: &Path, out: &Path) -> Run {
    pp(&[
        os("sweep"),
        d.join("millrace-footbridge.ron").as_os_str(),
        d.join("millrace-sweep.ron").as_os_str(),
        os("--format"),
        os("csv"),
        os("--out"),
        out.as_os_str(),
    ])
}

#[test]
fn a_symlinked_partial_file_is_not_written_through() {
    let d = scratch("partial-link");
    let victim = d.join("victim");
    fs::write(&victim, "precious").unwrap();
    std::os::unix::fs::symlink(&victim, d.join("res.csv.partial")).unwrap();
    let r = sweep_to(&d, &d.join("res.csv"));
    refused(&r, &["not a regular file"]);
    assert_eq!(fs::read_to_string(&victim).unwrap(), "precious");
    assert!(!d.join("res.csv").exists());
    fs::remove_dir_all(d).unwrap();
}

#[test]
fn a_partial_file_held_by_another_run_is_refused_a_stale_one_reused() {
    use std::os::unix::io::AsRawFd;
    let d = scratch("partial-lock");
    let out = d.join("res.csv");
    let partial = d.join("res.csv.partial");
    fs::write(&partial, "stale rows\n").unwrap();
    // Another run holds the lock.
    let held = fs::OpenOptions::new().write(true).open(&partial).unwrap();
    // SAFETY: flock on a descriptor we own.
    assert_eq!(unsafe { libc::flock(held.as_raw_fd(), libc::LOCK_EX) }, 0);
    refused(&sweep_to(&d, &out), &["another run"]);
    assert_eq!(fs::read_to_string(&partial).unwrap(), "stale rows\n");
    drop(held);
    // A stale partial (nobody holds it) is taken over and renamed.
    let r = sweep_to(&d, &out);
    assert_eq!(r.code, 0, "{}", r.stderr);
    assert!(!partial.exists());
    let text = fs::read_to_string(&out).unwrap();
    assert!(!text.contains("stale rows"), "{text}");
    // 40 axis variants + 6 listed + the base = 47 rows (docs/sweeps.md's
    // example, counted by hand from models/millrace-sweep.ron) + header.
    assert!(
        text.lines().filter(|l| !l.starts_with('#')).count() >= 47,
        "{text}"
    );
    fs::remove_dir_all(d).unwrap();
}

// ---- item 15: a failing standard output or error --------------------------

fn run_with(
    args: &[&str],
    stdout: std::process::Stdio,
    stderr: std::process::Stdio,
) -> (i32, String) {
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_panelpoint"))
        .args(args)
        .stdout(stdout)
        .stderr(stderr)
        .output()
        .unwrap();
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn dev_full() -> std::process::Stdio {
    fs::OpenOptions::new()
        .write(true)
        .open("/dev/full")
        .unwrap()
        .into()
}

/// The write end of a pipe whose read end is already closed.
fn closed_pipe() -> std::process::Stdio {
    use std::os::unix::io::FromRawFd;
    let mut fds = [0; 2];
    // SAFETY: pipe fills two descriptors; the read end is closed at once and
    // the write end handed to the child.
    unsafe {
        assert_eq!(libc::pipe(fds.as_mut_ptr()), 0);
        libc::close(fds[0]);
        std::process::Stdio::from(std::fs::File::from_raw_fd(fds[1]))
    }
}

#[test]
fn a_full_or_closed_standard_output_is_an_error_not_a_panic() {
    use std::process::Stdio;
    let m = repo("four_panel_live.ron");
    let m = m.to_str().unwrap();
    // README: exit status 1 for a failure that is not the input's.
    let (code, err) = run_with(&["validate", m], dev_full(), Stdio::piped());
    assert_eq!(code, 1, "{err}");
    assert!(err.contains("cannot write standard output"), "{err}");
    assert!(!err.contains("panicked"), "{err}");
    let (code, err) = run_with(&["rate", m], closed_pipe(), Stdio::piped());
    assert_eq!(code, 1, "{err}");
    assert!(err.contains("cannot write standard output"), "{err}");
    assert!(!err.contains("panicked"), "{err}");
}

#[test]
fn a_full_or_closed_standard_error_keeps_the_exit_status() {
    use std::process::Stdio;
    // A missing model is bad input: exit 2 even when the message cannot be
    // printed (a panic would be 101).
    let (code, _) = run_with(
        &["validate", "/nonexistent/m.ron"],
        Stdio::null(),
        dev_full(),
    );
    assert_eq!(code, 2);
    let (code, _) = run_with(
        &["solve", "/nonexistent/m.ron"],
        Stdio::null(),
        closed_pipe(),
    );
    assert_eq!(code, 2);
}

// ---- item 13: CSV formula injection ----------------------------------------

#[test]
fn formula_like_ids_are_neutralised_in_csv_and_exact_in_json() {
    // Member ids that a spreadsheet would run as formulas.
    let t = triangle("4.0", "1.5")
        .replace("fy: 250.0", "fy: 250.0, fu: 400.0")
        .replace("(id: \"AB\"", "(id: \"=1+2\"")
        .replace("(id: \"BC\"", "(id: \"-BC\"")
        .replace("(id: \"CA\"", "(id: \"@CA\"")
        .replace("(id: \"C\"", "(id: \"+C\"")
        .replace("\"C\"", "\"+C\"");
    let d = dir("csv-inject");
    let m = write(&d, "m.ron", &t);
    let csv = pp(&[os("solve"), m.as_os_str(), os("--format"), os("csv")]);
    assert_eq!(csv.code, 0, "{}", csv.stderr);
    for line in csv.stdout.lines().skip(1) {
        for cell in line.split(',') {
            let c = cell.trim_start_matches('"');
            // A cell may start with '-' only as a number.
            if c.starts_with(['=', '+', '@']) || (c.starts_with('-') && c.parse::<f64>().is_err()) {
                panic!("formula-like cell {cell:?} in {line:?}");
            }
        }
    }
    assert!(csv.stdout.contains(",'=1+2,"), "{}", csv.stdout);
    assert!(csv.stdout.contains(",'+C,"), "{}", csv.stdout);
    // A negative force stays a plain number (the apex load compresses the
    // rafters: by statics each carries -10/(2·0.6) = -8.33 kN).
    assert!(csv.stdout.contains(",-8.33"), "{}", csv.stdout);
    let rate = pp(&[os("rate"), m.as_os_str(), os("--format"), os("csv")]);
    assert_eq!(rate.code, 0, "{}", rate.stderr);
    assert!(
        rate.stdout.contains("'-BC") && !rate.stdout.contains(",-BC"),
        "{}",
        rate.stdout
    );
    let json = pp(&[os("solve"), m.as_os_str(), os("--format"), os("json")]);
    assert!(json.stdout.contains("\"=1+2\"") && !json.stdout.contains("'=1+2"));
    fs::remove_dir_all(d).unwrap();
}

// ---- item 7: bounded reads -------------------------------------------------

#[test]
fn devices_fifos_and_folders_are_refused_as_inputs_without_hanging() {
    let d = scratch("reads");
    let m = four_panel(&d);
    let fifo = d.join("pipe.ron");
    mkfifo(&fifo);
    // The model: /dev/zero would be read until memory runs out, a FIFO with
    // no writer would block for ever.
    for (path, needle) in [
        (Path::new("/dev/zero"), "a device"),
        (Path::new("/dev/urandom"), "a device"),
        (fifo.as_path(), "a FIFO"),
        (d.as_path(), "a folder"),
    ] {
        refused(
            &pp(&[os("validate"), path.as_os_str()]),
            &["cannot read", needle],
        );
        // The sweep file.
        refused(
            &pp(&[os("sweep"), m.as_os_str(), path.as_os_str()]),
            &["cannot read", needle],
        );
    }
    // The vehicles file (allowed outside the folder, still refused).
    let t = fs::read_to_string(&m).unwrap().replace(
        "vehicles_file: \"vehicles.ron\"",
        "vehicles_file: \"/dev/zero\"",
    );
    let z = write(&d, "z.ron", t);
    refused(
        &pp(&[os("--allow-outside-files"), os("validate"), z.as_os_str()]),
        &["vehicles_file \"/dev/zero\"", "a device"],
    );
    fs::remove_dir_all(d).unwrap();
}

// ---- item 8: vehicles_file stays in the model's folder -----------------------

#[test]
fn a_vehicles_file_outside_the_models_folder_is_refused_unless_allowed() {
    let d = scratch("outside");
    let sub = d.join("model");
    fs::create_dir_all(&sub).unwrap();
    fs::copy(repo("vehicles.ron"), sub.join("vehicles.ron")).unwrap();
    let text = fs::read_to_string(four_panel(&d)).unwrap();
    let with = |v: &str| {
        text.replace(
            "vehicles_file: \"vehicles.ron\"",
            &format!("vehicles_file: \"{v}\""),
        )
    };
    // Inside (the same folder): fine, whatever the current folder is.
    let ok = write(&sub, "ok.ron", with("vehicles.ron"));
    assert_eq!(pp(&[os("validate"), ok.as_os_str()]).code, 0);
    // `..`, an absolute path and a symlink leading out are refused.
    let up = write(&sub, "up.ron", with("../vehicles.ron"));
    refused(
        &pp(&[os("validate"), up.as_os_str()]),
        &["outside the model's folder", "--allow-outside-files"],
    );
    let abs = write(
        &sub,
        "abs.ron",
        with(d.join("vehicles.ron").to_str().unwrap()),
    );
    refused(
        &pp(&[os("validate"), abs.as_os_str()]),
        &["outside the model's folder"],
    );
    std::os::unix::fs::symlink(d.join("vehicles.ron"), sub.join("link.ron")).unwrap();
    let link = write(&sub, "link-model.ron", with("link.ron"));
    refused(
        &pp(&[os("validate"), link.as_os_str()]),
        &["outside the model's folder"],
    );
    // The explicit option allows it.
    let r = pp(&[os("--allow-outside-files"), os("validate"), up.as_os_str()]);
    assert_eq!(r.code, 0, "{}", r.stderr);
    // A file that is not RON is never quoted in the error.
    let secret = write(&d, "secret", "root:x:0:0:hunter2:/root:/bin/sh\n");
    let s = write(&sub, "s.ron", with(secret.to_str().unwrap()));
    let r = pp(&[os("--allow-outside-files"), os("validate"), s.as_os_str()]);
    refused(&r, &["vehicles_file", "line 1, column 1"]);
    assert!(
        !r.stderr.contains("root") && !r.stderr.contains("hunter2"),
        "{}",
        r.stderr
    );
    fs::remove_dir_all(d).unwrap();
}
