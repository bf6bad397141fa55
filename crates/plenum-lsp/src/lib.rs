//! The Plenum language server: LSP over stdio, on `tower-lsp-server`, with
//! every answer computed by `plenum-ide`. This is the only crate of the
//! project that knows LSP and JSON-RPC.
//!
//! * `convert` — every position, range, text change and URI conversion
//!   (UTF-8 or UTF-16 columns as negotiated, CRLF, clamping).
//! * `sequencer` — document mutations applied in the order the client sent
//!   them, before tower-lsp-server runs handlers concurrently.
//! * `server` — lifecycle, notifications and diagnostics publishing.
//! * `requests` — one function per request kind, each inside `catch_unwind`.
//!
//! Start it with [`serve_stdio`] (async) or [`run`] (builds the runtime);
//! `plenum lsp` does the latter.

mod convert;
mod requests;
mod sequencer;
mod server;
mod state;
mod workspace;

use std::sync::{Arc, Mutex};

use tokio::io::{AsyncRead, AsyncWrite};
use tower_lsp_server::{LspService, Server};

pub use convert::{Encoding, path_from_uri, uri_string_from_path};
pub use server::Options;

use server::Backend;
use state::State;

/// Serve LSP over the given streams until the client sends `exit`.
pub async fn serve<I, O>(input: I, output: O, options: Options)
where
    I: AsyncRead + Unpin,
    O: AsyncWrite,
{
    let state = Arc::new(Mutex::new(State::new()));
    let shared = state.clone();
    let (service, socket) = LspService::build(move |client| Backend {
        client,
        state: shared,
        publish_lock: Arc::new(tokio::sync::Mutex::new(())),
        options,
    })
    .custom_method("plenum/testPanic", Backend::test_panic)
    .custom_method("plenum/stats", Backend::test_stats)
    .finish();
    let service = sequencer::Sequenced {
        inner: service,
        state,
    };
    Server::new(input, output, socket).serve(service).await;
}

/// Serve LSP on standard input and output.
pub async fn serve_stdio() {
    serve(tokio::io::stdin(), tokio::io::stdout(), Options::default()).await;
}

/// Run the server on standard input and output to the end: after the
/// client's `shutdown` and `exit` the process can exit with status 0.
pub fn run() -> std::process::ExitCode {
    run_with(Options::default())
}

/// [`run`] with options (the test binary turns the test hooks on).
pub fn run_with(options: Options) -> std::process::ExitCode {
    let runtime = match tokio::runtime::Builder::new_multi_thread()
        .worker_threads(2)
        .enable_all()
        .build()
    {
        Ok(rt) => rt,
        Err(e) => {
            eprintln!("plenum lsp: cannot start the async runtime: {e}");
            return std::process::ExitCode::from(2);
        }
    };
    runtime.block_on(serve(tokio::io::stdin(), tokio::io::stdout(), options));
    // A client may keep our stdin open after `exit`: do not wait for the
    // blocking read on it, nor for a request the client never answered.
    runtime.shutdown_timeout(std::time::Duration::from_millis(100));
    std::process::ExitCode::SUCCESS
}
