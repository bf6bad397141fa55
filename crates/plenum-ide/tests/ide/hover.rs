use expect_test::{Expect, expect};

use super::analyse;

fn check(fixture: &str, expect: Expect) {
    let (a, fx) = analyse(fixture);
    let (path, offset) = fx.position();
    let actual = match a.hover(&path, offset) {
        Some(h) => {
            let text = fx.text(&path).unwrap();
            format!("[{}]\n{}\n", &text[h.span.range()], h.markdown)
        }
        None => "no hover\n".to_string(),
    };
    expect.assert_eq(&actual);
}

#[test]
fn hover_on_an_air_handler_shows_the_coil() {
    let fx = super::OFFICE.replace("ahu rtu_1", "ahu rtu$0_1");
    check(&fx, expect![[""]]);
}
