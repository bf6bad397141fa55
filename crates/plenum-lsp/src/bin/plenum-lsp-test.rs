//! The language server with its test hooks on (`plenum/testPanic`,
//! `plenum/stats`), for the protocol and editor tests. `plenum lsp` is the
//! same server without them.

fn main() -> std::process::ExitCode {
    plenum_lsp::run_with(plenum_lsp::Options { test_hooks: true })
}
