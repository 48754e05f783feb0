//! The error catalogue (docs/errors.md) must show what the binary really
//! prints: every ```ron example is run and its stderr compared with the
//! ```text block after it. `PANELPOINT_BLESS=1` rewrites the blocks.

use std::process::Command;

#[test]
fn catalogue_messages_match_the_binary() {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/errors.md");
    let doc = std::fs::read_to_string(&path).unwrap();
    let bless = std::env::var_os("PANELPOINT_BLESS").is_some();
    let dir = std::env::temp_dir().join(format!("pp-catalogue-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let mut out = String::new();
    let mut rest = doc.as_str();
    let (mut checked, mut wrong) = (0, Vec::new());
    while let Some(start) = rest.find("```ron\n") {
        let body_start = start + "```ron\n".len();
        let body_len = rest[body_start..].find("```\n").unwrap();
        let model = &rest[body_start..body_start + body_len];
        let text_open =
            body_start + body_len + rest[body_start + body_len..].find("```text\n").unwrap();
        let msg_start = text_open + "```text\n".len();
        let msg_len = rest[msg_start..].find("```\n").unwrap();
        let shown = &rest[msg_start..msg_start + msg_len];
        std::fs::write(dir.join("m.ron"), model).unwrap();
        let r = Command::new(env!("CARGO_BIN_EXE_panelpoint"))
            .args(["solve", "m.ron"])
            .current_dir(&dir)
            .output()
            .unwrap();
        assert_eq!(r.status.code(), Some(2), "example {}: {model}", checked + 1);
        assert!(r.stdout.is_empty());
        let actual = String::from_utf8(r.stderr).unwrap();
        if actual != shown {
            wrong.push(format!(
                "example {}:\n  doc: {shown}  now: {actual}",
                checked + 1
            ));
        }
        out.push_str(&rest[..msg_start]);
        out.push_str(&actual);
        rest = &rest[msg_start + msg_len..];
        checked += 1;
    }
    out.push_str(rest);
    std::fs::remove_dir_all(&dir).unwrap();
    assert!(checked >= 20, "only {checked} examples found");
    if bless {
        std::fs::write(&path, out).unwrap();
    } else {
        assert!(wrong.is_empty(), "{}", wrong.join("\n"));
    }
}
