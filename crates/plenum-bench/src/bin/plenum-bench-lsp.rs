//! The language server exactly as `plenum lsp` runs it
//! (`plenum_lsp::run`), built inside this crate so that its benchmark and
//! stress test can start it.

fn main() -> std::process::ExitCode {
    plenum_lsp::run()
}
