//! Finding design files and reading them.

use std::path::{Path, PathBuf};

/// The extension of design files.
pub const EXTENSION: &str = "plenum";

/// Expand the command-line paths into the design files to check, in a stable
/// order. A file named explicitly is always included; folders are searched for
/// `*.plenum`, honouring `.gitignore` (also outside a git repository) and hidden
/// files. A path that does not exist is an error.
pub fn discover(paths: &[PathBuf]) -> Result<Vec<PathBuf>, String> {
    let default = [PathBuf::from(".")];
    let roots = if paths.is_empty() {
        &default[..]
    } else {
        paths
    };
    let mut out = Vec::new();
    for root in roots {
        let meta = std::fs::metadata(root)
            .map_err(|e| format!("cannot read `{}`: {}", root.display(), io_reason(&e)))?;
        if meta.is_file() {
            out.push(root.clone());
            continue;
        }
        let mut found = Vec::new();
        let walker = ignore::WalkBuilder::new(root)
            .require_git(false)
            .follow_links(false)
            .build();
        for entry in walker {
            let entry = entry.map_err(|e| format!("cannot search `{}`: {e}", root.display()))?;
            let path = entry.path();
            if entry.file_type().is_some_and(|t| t.is_file()) && has_extension(path) {
                found.push(path.to_path_buf());
            }
        }
        found.sort();
        out.extend(found);
    }
    Ok(out)
}

fn has_extension(path: &Path) -> bool {
    path.extension().is_some_and(|e| e == EXTENSION)
}

pub fn io_reason(e: &std::io::Error) -> String {
    match e.kind() {
        std::io::ErrorKind::NotFound => "no such file or folder".to_string(),
        std::io::ErrorKind::PermissionDenied => "permission denied".to_string(),
        _ => e.to_string(),
    }
}

/// A file's text, or where its UTF-8 broke.
pub enum Loaded {
    Text(String),
    /// Not UTF-8: the offset of the first bad byte.
    NotUtf8 {
        offset: usize,
    },
}

pub fn load(path: &Path) -> Result<Loaded, String> {
    let bytes = std::fs::read(path)
        .map_err(|e| format!("cannot read `{}`: {}", path.display(), io_reason(&e)))?;
    match String::from_utf8(bytes) {
        Ok(text) => Ok(Loaded::Text(text)),
        Err(e) => Ok(Loaded::NotUtf8 {
            offset: e.utf8_error().valid_up_to(),
        }),
    }
}
