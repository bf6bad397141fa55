//! A small reader for the committed reference CSV tables.

#![allow(dead_code)]

use std::collections::HashMap;
use std::path::PathBuf;

/// One reference table: named columns of optional numbers (an empty cell is `None`).
pub struct Table {
    pub name: String,
    pub columns: HashMap<String, usize>,
    pub rows: Vec<Vec<Option<f64>>>,
    /// Text cells of the first column, for tables whose first column is a label.
    pub labels: Vec<String>,
}

impl Table {
    pub fn get(&self, row: usize, column: &str) -> Option<f64> {
        let c = *self.columns.get(column)?;
        self.rows.get(row)?.get(c).copied().flatten()
    }

    /// A cell that must be present.
    pub fn num(&self, row: usize, column: &str) -> Result<f64, String> {
        self.get(row, column)
            .ok_or_else(|| format!("{}: row {row}: no value in column {column}", self.name))
    }
}

pub fn reference_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/psychro")
}

pub fn load(name: &str) -> Result<Table, String> {
    let path = reference_dir().join(name);
    let text = std::fs::read_to_string(&path).map_err(|e| format!("{}: {e}", path.display()))?;
    let mut lines = text
        .lines()
        .filter(|l| !l.starts_with('#') && !l.trim().is_empty());
    let header = lines.next().ok_or_else(|| format!("{name}: no header"))?;
    let columns: HashMap<String, usize> = header
        .split(',')
        .enumerate()
        .map(|(i, c)| (c.trim().to_string(), i))
        .collect();
    let mut rows = Vec::new();
    let mut labels = Vec::new();
    for (n, line) in lines.enumerate() {
        let cells: Vec<&str> = line.split(',').collect();
        if cells.len() != columns.len() {
            return Err(format!(
                "{name}: data row {n}: {} cells, expected {}",
                cells.len(),
                columns.len()
            ));
        }
        labels.push(cells[0].to_string());
        let mut row = Vec::with_capacity(cells.len());
        for (i, c) in cells.iter().enumerate() {
            let c = c.trim();
            if c.is_empty() {
                row.push(None);
            } else {
                match c.parse::<f64>() {
                    Ok(x) => row.push(Some(x)),
                    Err(_) if i == 0 => row.push(None),
                    Err(e) => return Err(format!("{name}: data row {n}: {c:?}: {e}")),
                }
            }
        }
        rows.push(row);
    }
    if rows.is_empty() {
        return Err(format!("{name}: no data rows"));
    }
    Ok(Table {
        name: name.to_string(),
        columns,
        rows,
        labels,
    })
}

/// The worst error seen for one quantity, and where.
#[derive(Default)]
pub struct Worst {
    pub value: f64,
    pub at: String,
    pub count: usize,
}

/// Tracks worst errors and tolerance failures over a table.
#[derive(Default)]
pub struct Tally {
    pub worst: Vec<(String, Worst)>,
    pub failures: Vec<String>,
}

impl Tally {
    fn slot(&mut self, what: &str) -> &mut Worst {
        if let Some(i) = self.worst.iter().position(|(k, _)| k == what) {
            &mut self.worst[i].1
        } else {
            self.worst.push((what.to_string(), Worst::default()));
            let last = self.worst.len() - 1;
            &mut self.worst[last].1
        }
    }

    /// Record an error `err` (already made absolute or relative) against `tol`.
    pub fn check(&mut self, what: &str, err: f64, tol: f64, at: &str) {
        let slot = self.slot(what);
        slot.count += 1;
        if err.is_nan() || err > slot.value {
            slot.value = err;
            slot.at = at.to_string();
        }
        if err.is_nan() || err > tol {
            self.failures
                .push(format!("{what}: error {err:.3e} > {tol:.1e} at {at}"));
        }
    }

    pub fn fail(&mut self, msg: String) {
        self.failures.push(msg);
    }

    pub fn report(&self, title: &str) {
        eprintln!("== {title}");
        for (k, w) in &self.worst {
            eprintln!(
                "  {k:<28} worst {:.3e} over {} rows at {}",
                w.value, w.count, w.at
            );
        }
    }

    pub fn assert_ok(&self, title: &str) {
        self.report(title);
        if !self.failures.is_empty() {
            let shown: Vec<&String> = self.failures.iter().take(25).collect();
            panic!(
                "{title}: {} check(s) out of tolerance:\n{}",
                self.failures.len(),
                shown
                    .iter()
                    .map(|s| s.as_str())
                    .collect::<Vec<_>>()
                    .join("\n")
            );
        }
    }
}

pub fn rel(a: f64, b: f64) -> f64 {
    if b == 0.0 {
        a.abs()
    } else {
        ((a - b) / b).abs()
    }
}

pub fn abs(a: f64, b: f64) -> f64 {
    (a - b).abs()
}
