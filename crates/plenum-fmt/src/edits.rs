//! Minimal text edits between two texts: a line diff (Myers' O(ND)
//! algorithm), then each changed hunk trimmed to the bytes that differ.

use std::ops::Range;

/// Replace the bytes `range` of the old text by `new_text`.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct TextEdit {
    /// Byte range in the old text; both ends lie on character boundaries.
    pub range: Range<usize>,
    pub new_text: String,
}

/// Above this many edit steps the line diff gives up and replaces the whole
/// differing middle in one edit (still correct, just not minimal). Bounds
/// the diff's memory at about `MAX_D²` words.
const MAX_D: usize = 1_000;

/// The edits, sorted and non-overlapping, that turn `old` into `new`.
/// Applying them with [`apply_edits`] gives `new`; equal texts give none.
pub fn diff_edits(old: &str, new: &str) -> Vec<TextEdit> {
    let a: Vec<&str> = old.split_inclusive('\n').collect();
    let b: Vec<&str> = new.split_inclusive('\n').collect();
    // Common leading and trailing lines need no diff.
    let pre = a.iter().zip(&b).take_while(|(x, y)| x == y).count();
    let suf = a[pre..]
        .iter()
        .rev()
        .zip(b[pre..].iter().rev())
        .take_while(|(x, y)| x == y)
        .count();
    let (am, bm) = (&a[pre..a.len() - suf], &b[pre..b.len() - suf]);
    let hunks = match myers(am, bm) {
        Some(h) => h,
        None => vec![(0..am.len(), 0..bm.len())],
    };
    // Byte offsets of the old lines, and the new lines' texts.
    let mut starts = Vec::with_capacity(a.len() + 1);
    let mut at = 0;
    for l in &a {
        starts.push(at);
        at += l.len();
    }
    starts.push(at);
    let mut edits = Vec::new();
    for (ra, rb) in hunks {
        if ra.is_empty() && rb.is_empty() {
            continue;
        }
        let start = starts[pre + ra.start];
        let end = starts[pre + ra.end];
        let new_text: String = bm[rb].concat();
        if let Some(e) = trimmed(old, start..end, &new_text) {
            edits.push(e);
        }
    }
    edits
}

/// The edit replacing `old[range]` by `new_text`, without the bytes they
/// share at either end; `None` when they are equal.
fn trimmed(old: &str, range: Range<usize>, new_text: &str) -> Option<TextEdit> {
    let o = &old[range.clone()];
    if o == new_text {
        return None;
    }
    let mut p = o
        .bytes()
        .zip(new_text.bytes())
        .take_while(|(x, y)| x == y)
        .count();
    while !o.is_char_boundary(p) {
        p -= 1;
    }
    let (o2, n2) = (&o[p..], &new_text[p..]);
    let mut s = o2
        .bytes()
        .rev()
        .zip(n2.bytes().rev())
        .take_while(|(x, y)| x == y)
        .count();
    while !o2.is_char_boundary(o2.len() - s) {
        s -= 1;
    }
    Some(TextEdit {
        range: range.start + p..range.end - s,
        new_text: n2[..n2.len() - s].to_string(),
    })
}

/// Apply sorted, non-overlapping edits; `None` when they are not (or a range
/// is out of bounds or not on character boundaries).
pub fn apply_edits(text: &str, edits: &[TextEdit]) -> Option<String> {
    let mut out = String::with_capacity(text.len());
    let mut at = 0;
    for e in edits {
        if e.range.start < at || e.range.end < e.range.start {
            return None;
        }
        out.push_str(text.get(at..e.range.start)?);
        text.get(e.range.clone())?;
        out.push_str(&e.new_text);
        at = e.range.end;
    }
    out.push_str(text.get(at..)?);
    Some(out)
}

/// The differing hunks of two line lists: pairs of ranges (old lines, new
/// lines), in order. `None` when the diff needs more than [`MAX_D`] steps.
fn myers(a: &[&str], b: &[&str]) -> Option<Vec<(Range<usize>, Range<usize>)>> {
    let (n, m) = (a.len(), b.len());
    let max = n + m;
    if max == 0 {
        return Some(Vec::new());
    }
    let off = max as isize;
    let mut v = vec![0isize; 2 * max + 2];
    // trace[d] is the furthest-reaching x on each diagonal before step d.
    let mut trace: Vec<Vec<isize>> = Vec::new();
    let idx = |k: isize| (k + off) as usize;
    let mut found = None;
    'outer: for d in 0..=max.min(MAX_D) as isize {
        trace.push(v[idx(-d)..=idx(d)].to_vec());
        let mut k = -d;
        while k <= d {
            let mut x = if k == -d || (k != d && v[idx(k - 1)] < v[idx(k + 1)]) {
                v[idx(k + 1)]
            } else {
                v[idx(k - 1)] + 1
            };
            let mut y = x - k;
            while (x as usize) < n && (y as usize) < m && a[x as usize] == b[y as usize] {
                x += 1;
                y += 1;
            }
            v[idx(k)] = x;
            if x as usize >= n && y as usize >= m {
                found = Some(d);
                break 'outer;
            }
            k += 2;
        }
    }
    let d_end = found?;
    // Walk back through the trace, collecting the path's moves.
    #[derive(Clone, Copy, PartialEq)]
    enum Op {
        Equal,
        Delete,
        Insert,
    }
    let mut ops = Vec::new();
    let (mut x, mut y) = (n as isize, m as isize);
    for d in (0..=d_end).rev() {
        let vd = &trace[d as usize];
        let get = |k: isize| vd[(k + d) as usize];
        let k = x - y;
        if d == 0 {
            while x > 0 && y > 0 {
                ops.push(Op::Equal);
                x -= 1;
                y -= 1;
            }
            break;
        }
        let prev_k = if k == -d || (k != d && get(k - 1) < get(k + 1)) {
            k + 1
        } else {
            k - 1
        };
        let prev_x = get(prev_k);
        let prev_y = prev_x - prev_k;
        while x > prev_x && y > prev_y {
            ops.push(Op::Equal);
            x -= 1;
            y -= 1;
        }
        if x == prev_x {
            ops.push(Op::Insert);
        } else {
            ops.push(Op::Delete);
        }
        x = prev_x;
        y = prev_y;
    }
    ops.reverse();
    // Group the moves into hunks.
    let mut hunks = Vec::new();
    let (mut i, mut j) = (0usize, 0usize);
    let mut open: Option<(usize, usize)> = None;
    for op in ops {
        match op {
            Op::Equal => {
                if let Some((si, sj)) = open.take() {
                    hunks.push((si..i, sj..j));
                }
                i += 1;
                j += 1;
            }
            Op::Delete => {
                open.get_or_insert((i, j));
                i += 1;
            }
            Op::Insert => {
                open.get_or_insert((i, j));
                j += 1;
            }
        }
    }
    if let Some((si, sj)) = open {
        hunks.push((si..i, sj..j));
    }
    Some(hunks)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn check(old: &str, new: &str) -> Vec<TextEdit> {
        let edits = diff_edits(old, new);
        assert_eq!(apply_edits(old, &edits).as_deref(), Some(new), "{edits:?}");
        for e in &edits {
            assert_ne!(&old[e.range.clone()], e.new_text);
        }
        edits
    }

    #[test]
    fn equal_texts_need_no_edit() {
        assert!(check("a\nb\n", "a\nb\n").is_empty());
        assert!(check("", "").is_empty());
    }

    #[test]
    fn a_changed_line_becomes_one_small_edit() {
        let edits = check("a\n  x  1\nc\n", "a\n  x 1\nc\n");
        assert_eq!(
            edits,
            vec![TextEdit {
                range: 6..7,
                new_text: String::new()
            }]
        );
    }

    #[test]
    fn inserted_and_deleted_lines_are_separate_edits() {
        let old = "a\nb\nc\nd\ne\n";
        let new = "a\nB\nc\nd\nd2\ne\n";
        let edits = check(old, new);
        assert_eq!(edits.len(), 2, "{edits:?}");
        check("x\ny\n", "");
        check("", "x\ny\n");
        check("p\nq", "p\nq\n");
    }

    #[test]
    fn trimming_respects_character_boundaries() {
        // `°` is C2 B0 and `²` is C2 B2: they share a first byte.
        check("t 57 °F\n", "t 57 ²F\n");
        check("°°°\n", "°²°\n");
    }

    #[test]
    fn apply_rejects_overlaps_and_bad_ranges() {
        let e = |r: Range<usize>| TextEdit {
            range: r,
            new_text: "z".into(),
        };
        assert_eq!(apply_edits("abcd", &[e(1..3), e(2..4)]), None);
        assert_eq!(apply_edits("abcd", &[e(3..9)]), None);
        assert_eq!(apply_edits("°", &[e(1..2)]), None);
        assert_eq!(
            apply_edits("abcd", &[e(0..1), e(3..4)]).as_deref(),
            Some("zbcz")
        );
    }

    #[test]
    fn a_total_rewrite_still_applies() {
        let old: String = (0..300).map(|i| format!("old {i}\n")).collect();
        let new: String = (0..300).map(|i| format!("new {i}\n")).collect();
        check(&old, &new);
    }
}
