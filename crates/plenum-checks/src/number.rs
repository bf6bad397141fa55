//! Figures as messages show them: IP first, SI beside it for SI projects.
//! Conversion factors from NIST SP 811 (2008), appendix B.

/// Btu/h per ton of refrigeration.
const BTUH_PER_TON: f64 = 12_000.0;

/// `1,234,567` (rounded to a whole number).
pub fn grouped(v: f64) -> String {
    let r = v.round();
    let neg = r < 0.0;
    let digits = format!("{:.0}", r.abs());
    let mut out = String::new();
    for (i, c) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i) % 3 == 0 {
            out.push(',');
        }
        out.push(c);
    }
    if neg && digits != "0" {
        format!("-{out}")
    } else {
        out
    }
}

/// `12.47 ton`
pub fn tons(btuh: f64) -> String {
    format!("{:.2} ton", btuh / BTUH_PER_TON)
}

/// `149,640 Btu/h`
pub fn btuh(v: f64) -> String {
    format!("{} Btu/h", grouped(v))
}

/// `1,250 cfm`, with L/s for SI projects.
pub fn cfm(v: f64, si: bool) -> String {
    if si {
        format!("{} cfm ({} L/s)", grouped(v), grouped(v * 0.471_947_4))
    } else {
        format!("{} cfm", grouped(v))
    }
}

/// `v` with one decimal, exactly as `format!("{v:.1}")`. A whole number
/// (most defaults are: 75 °F, 50 %, 100 %) is written from its integer,
/// which skips the exact-decimal float formatting, the costliest part of a
/// message.
fn one_decimal(v: f64) -> String {
    if v.fract() == 0.0 && v.abs() < 1e15 && !(v == 0.0 && v.is_sign_negative()) {
        format!("{}.0", v as i64)
    } else {
        format!("{v:.1}")
    }
}

/// `55.0 °F`, with °C for SI projects.
pub fn temp(f: f64, si: bool) -> String {
    if si {
        format!(
            "{} °F ({} °C)",
            one_decimal(f),
            one_decimal((f - 32.0) / 1.8)
        )
    } else {
        format!("{} °F", one_decimal(f))
    }
}

/// A temperature difference: `18.0 °F`, with K for SI projects.
pub fn dt(f: f64, si: bool) -> String {
    if si {
        format!("{} °F ({} K)", one_decimal(f), one_decimal(f / 1.8))
    } else {
        format!("{} °F", one_decimal(f))
    }
}

/// `52.2 %`
pub fn pct(v: f64) -> String {
    let s = one_decimal(v);
    let s = s.strip_suffix(".0").unwrap_or(&s).to_string();
    format!("{} %", if s == "-0" { "0" } else { &s })
}

/// A capacity margin (rated / required − 1) as a signed percentage, with
/// enough decimals that a margin below zero never shows as `+0.0 %`.
pub fn margin(m: f64) -> String {
    let p = m * 100.0;
    for decimals in 1..=3 {
        let s = format!("{p:+.decimals$}");
        let zero = s
            .trim_start_matches(['+', '-'])
            .chars()
            .all(|c| c == '0' || c == '.');
        if !zero {
            return format!("{s} %");
        }
    }
    if p < 0.0 {
        "-0.001 % or less".to_string()
    } else if p > 0.0 {
        "+0.001 % or less".to_string()
    } else {
        "0 %".to_string()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn figures() {
        assert_eq!(grouped(1_234_567.4), "1,234,567");
        assert_eq!(grouped(999.5), "1,000");
        assert_eq!(grouped(-0.2), "0");
        assert_eq!(tons(150_000.0), "12.50 ton");
        assert_eq!(btuh(149_640.2), "149,640 Btu/h");
        assert_eq!(margin(-0.0532), "-5.3 %");
        assert_eq!(margin(-0.0004), "-0.04 %");
        assert_eq!(margin(0.25), "+25.0 %");
        assert_eq!(pct(52.2004), "52.2 %");
        assert_eq!(pct(50.0), "50 %");
        assert_eq!(temp(55.0, true), "55.0 °F (12.8 °C)");
        assert_eq!(cfm(1000.0, true), "1,000 cfm (472 L/s)");
    }

    #[test]
    fn one_decimal_is_the_formatting_of_one_decimal() {
        for v in [
            0.0,
            -0.0,
            1.0,
            -1.0,
            75.0,
            100.0,
            -40.0,
            0.25,
            0.35,
            2.5,
            52.2004,
            49.96,
            -0.04,
            1e14,
            -1e14,
            1e15,
            1e16,
            123_456_789.0,
            0.05,
            f64::MIN_POSITIVE,
        ] {
            assert_eq!(one_decimal(v), format!("{v:.1}"), "{v}");
        }
        assert_eq!(pct(-0.0), "0 %");
        assert_eq!(temp(-0.0, false), "-0.0 °F");
    }
}
