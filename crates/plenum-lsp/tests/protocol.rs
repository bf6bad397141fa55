//! Protocol tests: the server binary spoken to over JSON-RPC, as an editor does.
#![allow(clippy::unwrap_used)]

mod common;

use common::{Client, pos, uri, utf8, utf16};
use serde_json::{Value, json};

/// A design with non-ASCII text (`°`, `²`, a 4-byte emoji) before the
/// places the tests point at, on the same line.
const DESIGN: &str = "site { cooling 95 °F db, 75 °F wb }  # 🌡 ²\n\
\n\
zone east \"Ost ° ² 🌡\" { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\n\
zone west \"Wést 🌡\" like east { sensible 16 kBtu/h }\n\
zone bad \"°²🌡\" { sensible 5 kBtu/h; bogus 3 }\n\
\n\
ahu rtu_1 \"Roof 🌡 unit\" { serves east, west, bad; coil { rated 10 ton } }\n";

/// No error among the diagnostics (assumptions are reported as information).
fn no_errors(d: &[Value]) -> bool {
    !d.iter().any(|x| x["severity"] == 1)
}

fn markdown(hover: &Value) -> String {
    hover["contents"]["value"]
        .as_str()
        .unwrap_or("")
        .to_string()
}

fn start_at(text: &str, needle: &str) -> usize {
    text.find(needle).unwrap()
}

#[test]
fn positions_with_non_ascii_text_before_them_in_utf16_and_utf8() {
    for (caps, enc) in [(utf16(), "utf-16"), (utf8(), "utf-8")] {
        let (mut c, init) = Client::start(caps, None);
        assert_eq!(init["capabilities"]["positionEncoding"], enc);
        let u = "file:///w/design.plenum";
        c.open(u, DESIGN);
        let diags = c.diagnostics(u);
        let bogus = diags.iter().find(|d| d["code"] == "unknown-key").unwrap();
        let (line, col) = pos(DESIGN, start_at(DESIGN, "bogus"), enc);
        assert_eq!(
            bogus["range"]["start"],
            json!({ "line": line, "character": col }),
            "{enc}"
        );
        let (_, end) = pos(DESIGN, start_at(DESIGN, "bogus") + 5, enc);
        assert_eq!(bogus["range"]["end"]["character"], end, "{enc}");

        // `west` in `serves`, after an emoji on its line: the zone's hover.
        let at = DESIGN.rfind("west").unwrap() + 1;
        let (line, col) = pos(DESIGN, at, enc);
        let h = c.hover(u, line, col);
        assert!(markdown(&h).contains("zone west"), "{enc}: {h}");
        let (_, s) = pos(DESIGN, DESIGN.rfind("west").unwrap(), enc);
        assert_eq!(h["range"]["start"]["character"], s, "{enc}");

        // `ton` after the emoji: the quantity in the other system.
        let (line, col) = pos(DESIGN, start_at(DESIGN, "10 ton") + 4, enc);
        let h = c.hover(u, line, col);
        assert!(markdown(&h).contains("35.2 kW"), "{enc}: {h}");
        assert!(c.shutdown().success());
    }
}

#[test]
fn crlf_files_keep_their_lines_and_columns() {
    let text = DESIGN.replace('\n', "\r\n");
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/crlf.plenum";
    c.open(u, &text);
    let diags = c.diagnostics(u);
    let bogus = diags.iter().find(|d| d["code"] == "unknown-key").unwrap();
    let (line, col) = pos(&text, start_at(&text, "bogus"), "utf-16");
    assert_eq!(line, 4);
    assert_eq!(
        bogus["range"]["start"],
        json!({ "line": line, "character": col })
    );
    // An edit at the end of a CRLF line: `bogus 3` becomes `latent 3 kBtu/h`.
    let (l, s) = pos(&text, start_at(&text, "bogus 3"), "utf-16");
    let (_, e) = pos(&text, start_at(&text, "bogus 3") + 7, "utf-16");
    c.change(
        u,
        2,
        json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": e } }, "text": "latent 3 kBtu/h" }]),
    );
    c.diagnostics_where(u, no_errors);
    let (line, col) = pos(&text, start_at(&text, "rtu_1"), "utf-16");
    let h = c.hover(u, line, col);
    assert!(markdown(&h).contains("ton ("), "{h}");
    assert!(c.shutdown().success());
}

fn coil_tons(h: &Value) -> String {
    markdown(h)
        .lines()
        .find(|l| l.contains("Coil total"))
        .unwrap_or("")
        .to_string()
}

#[test]
fn incremental_edits_move_the_hover_and_the_diagnostics() {
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/inc.plenum";
    let text = DESIGN.replace("; bogus 3", "");
    c.open(u, &text);
    c.diagnostics_where(u, no_errors);
    let (hl, hc) = pos(&text, start_at(&text, "rtu_1"), "utf-16");
    let before = coil_tons(&c.hover(u, hl, hc));
    // The east zone's sensible load goes from 20 to 60 kBtu/h.
    let at = start_at(&text, "sensible 20") + 9;
    let (l, s) = pos(&text, at, "utf-16");
    c.change(
        u,
        2,
        json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": s + 1 } }, "text": "6" }]),
    );
    let after = coil_tons(&c.hover(u, hl, hc));
    // The diagnostics follow: the 10 ton coil is now too small.
    c.diagnostics_where(u, |d| d.iter().any(|x| x["code"] == "undersized-coil"));
    assert_ne!(before, after);
    assert!(
        before.contains("ton") && after.contains("ton"),
        "{before} / {after}"
    );
    // A typo in a key shows up, then goes away with the next edit.
    let at = start_at(&text, "latent 2");
    let (l, s) = pos(&text, at, "utf-16");
    c.change(
        u,
        3,
        json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": s + 6 } }, "text": "latnet" }]),
    );
    let d = c.diagnostics_where(u, |d| d.iter().any(|x| x["code"] == "unknown-key"));
    let typo = d.iter().find(|x| x["code"] == "unknown-key").unwrap();
    assert!(
        typo["message"].as_str().unwrap().contains("latnet"),
        "{typo}"
    );
    c.change(
        u,
        4,
        json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": s + 6 } }, "text": "latent" }]),
    );
    c.diagnostics_where(u, |d| !d.iter().any(|x| x["code"] == "unknown-key"));
    assert!(c.shutdown().success());
}

#[test]
fn out_of_range_positions_are_clamped_not_errors() {
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/range.plenum";
    c.open(u, DESIGN);
    c.diagnostics(u);
    // Far past the end of the text and past the end of a line.
    let h = c.hover(u, 999, 999);
    assert!(h.is_null() || h.is_object());
    let comp = c.request(
        "textDocument/completion",
        json!({ "textDocument": { "uri": u }, "position": { "line": 0, "character": 9999 } }),
    );
    assert!(comp.is_array() || comp.is_null() || comp.is_object());
    // An edit whose range lies past the end appends at the end.
    c.change(
        u,
        2,
        json!([{ "range": { "start": { "line": 500, "character": 3 }, "end": { "line": 900, "character": 0 } }, "text": "zone extra { sensible 1 kBtu/h }\n" }]),
    );
    let syms = c.request(
        "textDocument/documentSymbol",
        json!({ "textDocument": { "uri": u } }),
    );
    let names: Vec<&str> = syms
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|s| s["name"].as_str())
        .collect();
    assert!(names.contains(&"extra"), "{names:?}");
    assert!(c.shutdown().success());
}

#[test]
fn a_request_during_a_burst_of_edits_sees_every_edit_in_order() {
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/burst.plenum";
    let text = DESIGN.replace("; bogus 3", "");
    c.open(u, &text);
    let at = start_at(&text, "sensible 20") + 9;
    let (l, s) = pos(&text, at, "utf-16");
    // 60 edits, each rewriting the two digits of east's sensible load:
    // applied in order the last one (79) wins; any reordering leaves another.
    for (i, v) in (20..80).enumerate() {
        c.change(
            u,
            2 + i as i32,
            json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": s + 2 } }, "text": v.to_string() }]),
        );
    }
    let (zl, zc) = pos(&text, start_at(&text, "zone east") + 6, "utf-16");
    let h = c.hover(u, zl, zc);
    assert!(markdown(&h).contains("sensible 79,000 Btu/h"), "{h}");
    let stats = c.request("plenum/stats", Value::Null);
    assert_eq!(stats["staleChanges"], 0);
    // A change that is not newer than the document is dropped, not applied.
    c.change(
        u,
        5,
        json!([{ "range": { "start": { "line": l, "character": s }, "end": { "line": l, "character": s + 2 } }, "text": "11" }]),
    );
    let h = c.hover(u, zl, zc);
    assert!(markdown(&h).contains("sensible 79,000 Btu/h"), "{h}");
    assert_eq!(c.request("plenum/stats", Value::Null)["staleChanges"], 1);
    assert!(c.shutdown().success());
}

#[test]
fn a_panic_inside_a_request_is_an_error_and_the_server_goes_on() {
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/panic.plenum";
    c.open(u, DESIGN);
    let id = c.send_request("plenum/testPanic", Value::Null);
    let r = c.response(id);
    assert_eq!(r["error"]["code"], -32603, "{r}");
    assert!(
        r["error"]["message"]
            .as_str()
            .unwrap()
            .contains("still running")
    );
    let (line, col) = pos(DESIGN, start_at(DESIGN, "rtu_1"), "utf-16");
    let h = c.hover(u, line, col);
    assert!(markdown(&h).contains("Coil total"));
    assert!(c.shutdown().success());
}

#[test]
fn closing_a_document_clears_its_diagnostics() {
    let (mut c, _) = Client::start(utf16(), None);
    let u = "file:///w/close.plenum";
    c.open(u, DESIGN);
    c.diagnostics_where(u, |d| d.iter().any(|x| x["code"] == "unknown-key"));
    c.notify(
        "textDocument/didClose",
        json!({ "textDocument": { "uri": u } }),
    );
    c.diagnostics_where(u, |d| d.is_empty());
    assert!(c.shutdown().success());
}

const SITE: &str = "site {\n  elevation 0 ft\n  cooling   95 °F db, 75 °F wb\n}\n";
const MAIN: &str = "use \"shared/site.plenum\"\n\nzone east {\n  area     1_000 ft²\n  people   5\n  use      office\n  sensible 20 kBtu/h\n}\n\nahu rtu_1 {\n  serves east\n}\n";

#[test]
fn an_edit_to_a_used_file_rechecks_the_designs_that_use_it() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path();
    std::fs::create_dir_all(root.join("shared")).unwrap();
    std::fs::write(root.join("plenum.toml"), "").unwrap();
    std::fs::write(root.join("shared/site.plenum"), SITE).unwrap();
    std::fs::write(root.join("main.plenum"), MAIN).unwrap();
    let (mut c, _) = Client::start(utf16(), Some(root));
    let main = uri(&root.join("main.plenum"));
    let site = uri(&root.join("shared/site.plenum"));
    // The used file is read from disk: the design is whole.
    c.open(&main, MAIN);
    c.diagnostics_where(&main, no_errors);
    let (l, ch) = pos(MAIN, start_at(MAIN, "rtu_1"), "utf-16");
    let before = coil_tons(&c.hover(&main, l, ch));
    assert!(before.contains("ton"), "{before}");
    // Open the shared file and make the outdoor air hotter and wetter.
    c.open(&site, SITE);
    let (sl, sc) = pos(SITE, start_at(SITE, "95 °F db, 75"), "utf-16");
    c.change(
        &site,
        2,
        json!([{ "range": { "start": { "line": sl, "character": sc }, "end": { "line": sl, "character": sc + 16 } }, "text": "104 °F db, 82 °F wb" }]),
    );
    let after = coil_tons(&c.hover(&main, l, ch));
    assert_ne!(before, after);
    // A mistake in the shared file is reported in the shared file.
    c.change(
        &site,
        3,
        json!([{ "range": { "start": { "line": 1, "character": 2 }, "end": { "line": 1, "character": 11 } }, "text": "elevaton " }]),
    );
    let d = c.diagnostics_where(&site, |d| d.iter().any(|x| x["code"] == "unknown-key"));
    let typo = d.iter().find(|x| x["code"] == "unknown-key").unwrap();
    assert_eq!(typo["range"]["start"]["line"], 1);
    assert!(c.shutdown().success());
}

#[test]
fn the_project_is_found_without_workspace_folders() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path();
    std::fs::create_dir_all(root.join("shared")).unwrap();
    std::fs::create_dir_all(root.join("east")).unwrap();
    std::fs::write(root.join("plenum.toml"), "").unwrap();
    std::fs::write(root.join("shared/site.plenum"), SITE).unwrap();
    std::fs::write(
        root.join("east/main.plenum"),
        MAIN.replace("shared/", "../shared/"),
    )
    .unwrap();
    std::fs::write(
        root.join("west.plenum"),
        "use \"shared/site.plenum\"\nzone library_west { sensible 9 kBtu/h }\nahu w { serves library_west }\n",
    )
    .unwrap();
    // No rootUri, no workspace folders.
    let (mut c, _) = Client::start(utf16(), None);
    let main = uri(&root.join("east/main.plenum"));
    let text = MAIN.replace("shared/", "../shared/");
    c.open(&main, &text);
    // `../shared` stays inside the project (the folder with plenum.toml).
    c.diagnostics_where(&main, no_errors);
    // The sibling design, never opened, is part of the workspace.
    let syms = c.request("workspace/symbol", json!({ "query": "library_w" }));
    let names: Vec<&str> = syms
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|s| s["name"].as_str())
        .collect();
    assert_eq!(names, ["library_west"]);
    assert!(c.shutdown().success());
}

#[test]
fn a_changed_plenum_toml_rechecks_every_design() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path();
    std::fs::create_dir_all(root.join("shared")).unwrap();
    std::fs::write(root.join("plenum.toml"), "").unwrap();
    std::fs::write(root.join("shared/site.plenum"), SITE).unwrap();
    std::fs::write(root.join("main.plenum"), MAIN).unwrap();
    let (mut c, _) = Client::start(utf16(), Some(root));
    let main = uri(&root.join("main.plenum"));
    c.open(&main, MAIN);
    c.diagnostics(&main);
    let builds = c.request("plenum/stats", Value::Null)["designBuilds"]
        .as_u64()
        .unwrap();
    std::fs::write(root.join("plenum.toml"), "# changed\n").unwrap();
    c.notify(
        "workspace/didChangeWatchedFiles",
        json!({ "changes": [{ "uri": uri(&root.join("plenum.toml")), "type": 2 }] }),
    );
    let _ = c.request(
        "textDocument/documentSymbol",
        json!({ "textDocument": { "uri": main } }),
    );
    let after = c.request("plenum/stats", Value::Null)["designBuilds"]
        .as_u64()
        .unwrap();
    assert!(after > builds, "{builds} → {after}");
    // Saving plenum.toml does the same.
    c.notify(
        "textDocument/didSave",
        json!({ "textDocument": { "uri": uri(&root.join("plenum.toml")) } }),
    );
    let _ = c.request(
        "textDocument/documentSymbol",
        json!({ "textDocument": { "uri": main } }),
    );
    let again = c.request("plenum/stats", Value::Null)["designBuilds"]
        .as_u64()
        .unwrap();
    assert!(again > after, "{after} → {again}");
    assert!(c.shutdown().success());
}

#[test]
fn shutdown_then_exit_ends_the_process_with_status_0() {
    let (c, _) = Client::start(utf16(), None);
    let status = c.shutdown();
    assert_eq!(status.code(), Some(0));
}
