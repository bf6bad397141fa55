//! Code actions: the fix of a diagnostic, and raising an undersized coil's
//! rated capacity to the next standard size above the required load.

use std::path::Path;

use plenum_engine::CapacityStatus;
use plenum_model::fs::normalize;
use plenum_syntax::{Entry, Item, Property};
use plenum_units::Measure;

use crate::report::show;
use crate::world::Analysis;
use crate::{SourceChange, Span, TextEdit};

/// Nominal cooling capacities of packaged and split equipment, tons. The
/// list is *common practice* (the sizes manufacturers commonly catalogue),
/// not a published standard; written from memory.
pub const STANDARD_SIZES_TON: [f64; 21] = [
    1.5, 2.0, 2.5, 3.0, 3.5, 4.0, 5.0, 6.0, 7.5, 8.5, 10.0, 12.5, 15.0, 17.5, 20.0, 25.0, 27.5,
    30.0, 40.0, 50.0, 60.0,
];

/// The smallest standard size strictly above `required_tons`, if the list has one.
pub fn next_standard_size(required_tons: f64) -> Option<f64> {
    STANDARD_SIZES_TON
        .iter()
        .copied()
        .find(|&s| s > required_tons)
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct CodeAction {
    pub title: String,
    /// The code of the diagnostic it fixes, when it fixes one.
    pub diagnostic: Option<String>,
    pub change: SourceChange,
    /// The action is the obvious fix (editors may apply it on save).
    pub preferred: bool,
}

fn trim(v: f64) -> String {
    let s = format!("{v:.1}");
    s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
}

fn find_property(items: &[Item], span: Span) -> Option<&Property> {
    fn in_entries(entries: &[Entry], span: Span) -> Option<&Property> {
        for e in entries {
            match e {
                Entry::Property(p) if p.span == span => return Some(p),
                Entry::Block(b) => {
                    if let Some(p) = in_entries(&b.body.entries, span) {
                        return Some(p);
                    }
                }
                _ => {}
            }
        }
        None
    }
    items.iter().find_map(|i| match i {
        Item::Block(b) => in_entries(&b.body.entries, span),
        _ => None,
    })
}

impl Analysis {
    /// The actions available for the text `range` of `path`.
    pub fn code_actions(&self, path: &Path, range: Span) -> Vec<CodeAction> {
        let path = normalize(path);
        let mut out: Vec<CodeAction> = Vec::new();
        for d in self.diagnostics(&path) {
            let touches = d.span.start <= range.end && range.start <= d.span.end;
            if let (true, Some(fix)) = (touches, &d.fix) {
                let a = CodeAction {
                    title: fix.title.clone(),
                    diagnostic: Some(d.code.clone()),
                    change: fix.change.clone(),
                    preferred: true,
                };
                if !out.contains(&a) {
                    out.push(a);
                }
            }
        }
        for d in self.designs_with(&path) {
            let Some(file) = d.file_by_path(&path) else {
                continue;
            };
            for (ahu, outcome) in d.model.design.ahus.iter().zip(&d.eval.ahus) {
                let Ok(r) = &outcome.result else {
                    continue;
                };
                let g = r.governing();
                if g.capacity.status != CapacityStatus::Undersized {
                    continue;
                }
                let Some(rated) = ahu.coil.as_ref().and_then(|c| c.rated_btuh) else {
                    continue;
                };
                if rated.loc.file != file.id {
                    continue;
                }
                let in_block = ahu.loc.file == file.id
                    && ahu.loc.span.start <= range.end
                    && range.start <= ahu.loc.span.end;
                let on_rated =
                    rated.loc.span.start <= range.end && range.start <= rated.loc.span.end;
                if !in_block && !on_rated {
                    continue;
                }
                let required = g.coil.tons;
                let Some(size) = next_standard_size(required) else {
                    continue;
                };
                if size * 12_000.0 <= rated.value {
                    continue;
                }
                let Some(p) = find_property(&file.parse.file.items, rated.loc.span) else {
                    continue;
                };
                let mut change = SourceChange::default();
                change.insert(
                    &path,
                    TextEdit {
                        span: p.value.span,
                        new_text: format!("{} ton", trim(size)),
                    },
                );
                out.push(CodeAction {
                    title: format!(
                        "Raise `rated` to {} ton, the next standard size above the {} required (common practice)",
                        trim(size),
                        show(Measure::Capacity, required, plenum_units::UnitSystem::Ip)
                    ),
                    diagnostic: None,
                    change,
                    preferred: false,
                });
            }
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_next_size_is_strictly_above_required() {
        assert_eq!(next_standard_size(11.8), Some(12.5));
        assert_eq!(next_standard_size(12.5), Some(15.0));
        assert_eq!(next_standard_size(0.2), Some(1.5));
        assert_eq!(next_standard_size(60.0), None);
        assert!(STANDARD_SIZES_TON.windows(2).all(|w| w[0] < w[1]));
    }
}
