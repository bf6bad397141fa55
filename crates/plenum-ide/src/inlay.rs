//! Inlay hints: the required capacity and margin of each air handler beside
//! its `rated` line (or its header), and each zone's computed airflow.

use std::path::Path;

use plenum_model::fs::normalize;
use plenum_units::Measure;

use crate::report::{self, show};
use crate::world::Analysis;

#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum InlayKind {
    /// An air handler's required capacity and margin.
    Capacity,
    /// A zone's design airflow.
    Airflow,
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct InlayHint {
    /// Where the hint sits (after this offset).
    pub offset: u32,
    pub label: String,
    pub kind: InlayKind,
    pub tooltip: Option<String>,
}

impl Analysis {
    /// The hints of one file, in order.
    pub fn inlay_hints(&self, path: &Path) -> Vec<InlayHint> {
        let path = normalize(path);
        let mut out: Vec<InlayHint> = Vec::new();
        for d in self.designs_with(&path) {
            let Some(file) = d.file_by_path(&path) else {
                continue;
            };
            let system = d.system;
            let design = &d.model.design;
            for (ahu, outcome) in design.ahus.iter().zip(&d.eval.ahus) {
                let Ok(r) = &outcome.result else {
                    continue;
                };
                let g = r.governing();
                let required = show(Measure::Capacity, g.coil.tons, system);
                let label = match g.capacity.margin {
                    Some(m) => format!(
                        "required {required} · margin {} · {}",
                        report::margin(m, system),
                        report::status_word(g.capacity.status)
                    ),
                    None => format!("required {required}"),
                };
                let rated = ahu.coil.as_ref().and_then(|c| c.rated_btuh.map(|r| r.loc));
                // Beside `rated` when this file holds it, else after the header's `{`.
                let at = match rated {
                    Some(l) if l.file == file.id => Some(l.span.end),
                    _ if ahu.loc.file == file.id => header_end(&file.text, ahu.loc.span.start),
                    _ => None,
                };
                if let Some(offset) = at {
                    push(
                        &mut out,
                        InlayHint {
                            offset,
                            label,
                            kind: InlayKind::Capacity,
                            tooltip: Some(format!(
                                "coil total {} at the {} design state",
                                report::capacity(g.coil.total_btuh, system),
                                g.case.key()
                            )),
                        },
                    );
                }
            }
            for (zone, z) in design.zones.iter().zip(&d.eval.zones) {
                let Some(f) = &z.flow else {
                    continue;
                };
                if zone.loc.file != file.id {
                    continue;
                }
                if let Some(offset) = header_end(&file.text, zone.loc.span.start) {
                    push(
                        &mut out,
                        InlayHint {
                            offset,
                            label: show(Measure::Airflow, f.design_airflow_cfm, system),
                            kind: InlayKind::Airflow,
                            tooltip: Some(format!(
                                "design airflow; ventilation {} (62.1 V_oz); resulting RH {}",
                                show(Measure::Airflow, f.v_oz_cfm, system),
                                show(Measure::RelativeHumidity, f.room_rh_pct, system)
                            )),
                        },
                    );
                }
            }
        }
        out.sort_by_key(|h| h.offset);
        out
    }
}

fn push(out: &mut Vec<InlayHint>, h: InlayHint) {
    if !out.iter().any(|o| o.offset == h.offset && o.kind == h.kind) {
        out.push(h);
    }
}

/// The offset just after the `{` of the block header that starts at `start`.
fn header_end(text: &str, start: u32) -> Option<u32> {
    let rest = text.get(start as usize..)?;
    let mut in_str = false;
    let mut escaped = false;
    for (i, c) in rest.char_indices() {
        match c {
            _ if escaped => escaped = false,
            '\\' if in_str => escaped = true,
            '"' => in_str = !in_str,
            '{' if !in_str => return u32::try_from(start as usize + i + 1).ok(),
            _ => {}
        }
    }
    None
}
