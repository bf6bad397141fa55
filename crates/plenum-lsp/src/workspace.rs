//! Finding the design files of a workspace folder on disk.

use std::path::{Path, PathBuf};

/// Folders never searched.
const SKIP: [&str; 3] = ["target", "node_modules", "out"];
/// At most this many directory entries are looked at per folder scanned.
const MAX_ENTRIES: usize = 20_000;
const MAX_DEPTH: usize = 12;

/// The `*.plenum` files under `root`, skipping hidden folders and build
/// output, bounded in depth and count.
pub(crate) fn design_files(root: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    let mut seen = 0usize;
    let mut stack: Vec<(PathBuf, usize)> = vec![(root.to_path_buf(), 0)];
    while let Some((dir, depth)) = stack.pop() {
        let Ok(entries) = std::fs::read_dir(&dir) else {
            continue;
        };
        for e in entries.flatten() {
            seen += 1;
            if seen > MAX_ENTRIES {
                return out;
            }
            let name = e.file_name();
            let name = name.to_string_lossy();
            let Ok(kind) = e.file_type() else { continue };
            let path = e.path();
            if kind.is_dir() {
                if depth < MAX_DEPTH && !name.starts_with('.') && !SKIP.contains(&name.as_ref()) {
                    stack.push((path, depth + 1));
                }
            } else if kind.is_file() && name.ends_with(".plenum") {
                out.push(plenum_model::fs::normalize(&path));
            }
        }
    }
    out.sort();
    out
}
