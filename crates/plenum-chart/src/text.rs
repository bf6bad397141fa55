//! Text widths, estimated without a font file.
//!
//! The chart names its fonts ([`crate::style::FONT_STACK`]) but cannot know
//! which one a viewer has, so label boxes are sized from the advance widths
//! of the first font of the stack, DejaVu Sans (regular and bold, in
//! thousandths of the em, read from the `hmtx` table of DejaVuSans.ttf and
//! DejaVuSans-Bold.ttf 2.37 as Debian's fonts-dejavu-core ships them). It is
//! one of the wider sans-serif faces, so a narrower fallback font leaves a
//! little more room inside a box, never text outside it. A character not in
//! the table counts a full em.

/// (character, regular, bold) advance widths in thousandths of the em.
const ADVANCES: &[(char, u16, u16)] = &[
    (' ', 318, 348),
    ('.', 318, 380),
    (',', 318, 380),
    (':', 337, 400),
    (';', 337, 400),
    ('·', 318, 380),
    ('\'', 275, 306),
    ('i', 278, 343),
    ('j', 278, 343),
    ('l', 278, 343),
    ('|', 337, 365),
    ('0', 636, 696),
    ('1', 636, 696),
    ('2', 636, 696),
    ('3', 636, 696),
    ('4', 636, 696),
    ('5', 636, 696),
    ('6', 636, 696),
    ('7', 636, 696),
    ('8', 636, 696),
    ('9', 636, 696),
    ('°', 500, 500),
    ('%', 950, 1002),
    ('/', 337, 365),
    ('-', 361, 415),
    ('(', 390, 457),
    (')', 390, 457),
    ('−', 838, 838),
    ('+', 838, 838),
    ('=', 838, 838),
    ('–', 500, 500),
    ('—', 1000, 1000),
    ('²', 401, 438),
    ('³', 401, 438),
    ('f', 352, 435),
    ('t', 392, 478),
    ('r', 411, 493),
    ('m', 974, 1042),
    ('w', 818, 924),
    ('s', 521, 595),
    ('z', 525, 582),
    ('c', 550, 593),
    ('k', 579, 665),
    ('v', 592, 652),
    ('x', 592, 645),
    ('y', 592, 652),
    ('a', 613, 675),
    ('e', 615, 678),
    ('o', 612, 687),
    ('b', 635, 716),
    ('d', 635, 716),
    ('g', 635, 716),
    ('h', 634, 712),
    ('n', 634, 712),
    ('p', 635, 716),
    ('q', 635, 716),
    ('u', 634, 712),
    ('A', 684, 774),
    ('B', 686, 762),
    ('C', 698, 734),
    ('D', 770, 830),
    ('E', 632, 683),
    ('F', 575, 683),
    ('G', 775, 821),
    ('H', 752, 837),
    ('I', 295, 372),
    ('J', 295, 372),
    ('K', 656, 775),
    ('L', 557, 637),
    ('M', 863, 995),
    ('N', 748, 837),
    ('O', 787, 850),
    ('P', 603, 733),
    ('Q', 787, 850),
    ('R', 695, 770),
    ('S', 635, 720),
    ('T', 611, 682),
    ('U', 732, 812),
    ('V', 684, 774),
    ('W', 989, 1103),
    ('X', 685, 771),
    ('Y', 611, 724),
    ('Z', 685, 725),
    ('&', 780, 872),
];

/// Advance width of one character, in em.
fn advance(c: char, bold: bool) -> f64 {
    let w = ADVANCES
        .iter()
        .find(|(ch, _, _)| *ch == c)
        .map_or(1000, |&(_, r, b)| if bold { b } else { r });
    f64::from(w) / 1000.0
}

/// The width of `text` at `size` px.
pub fn width(text: &str, size: f64, bold: bool) -> f64 {
    let em: f64 = text.chars().map(|c| advance(c, bold)).sum();
    em * size
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn widths_add_up() {
        // Two DejaVu Sans digits of 636/1000 em at 10 px.
        assert!((width("10", 10.0, false) - 12.72).abs() < 1e-9);
        assert!(width("Mixed", 12.0, true) > width("Mixed", 12.0, false));
        assert_eq!(width("", 12.0, false), 0.0);
        assert_eq!(width("\u{2603}", 10.0, false), 10.0);
    }
}
