//! The parax language server: a thin shell that speaks the Language Server
//! Protocol (through `tower-lsp-server`) over the editor features of
//! `parax-ide`. Documents live in ropes with incremental sync; positions are
//! converted by `parax_syntax::LineIndex` in the encoding negotiated with the
//! client; evaluation runs on a worker task, never in a handler, and only the
//! newest version of a document is evaluated. This is the only crate that knows LSP types.

pub mod client;
mod convert;
mod documents;
mod gate;
mod server;

pub use documents::{apply_change, EditError};
pub use gate::{Counts, Gate};
pub use server::Server;

use tower_lsp_server::{LspService, Server as Transport};

/// Serve the protocol on standard input and output until the client exits.
///
/// One runtime thread reads the messages, answers them and runs the small
/// incremental updates between them; first readings of a document and large
/// updates go to the blocking pool. With several runtime threads every message
/// and every update crossed threads (the message loop runs where `block_on`
/// is called, the tasks elsewhere), which the latency benchmark measured as the
/// largest cost of an edit in a short file.
pub fn run_stdio() -> std::io::Result<()> {
    let rt = tokio::runtime::Builder::new_current_thread()
        .enable_all()
        .build()?;
    rt.block_on(async {
        let (service, socket) = LspService::new(Server::new);
        match pipes() {
            Some((input, output)) => Transport::new(input, output, socket).serve(service).await,
            None => {
                Transport::new(tokio::io::stdin(), tokio::io::stdout(), socket)
                    .serve(service)
                    .await
            }
        }
    });
    Ok(())
}

/// Standard input and output as pipes the runtime polls itself (how editors
/// start a language server). `tokio::io::stdin`/`stdout` instead hand every
/// read and write to a thread of the blocking pool and back, which costs two
/// thread switches per message; measured by the latency benchmark. `None` when
/// they are not pipes (a terminal, a file), and then those are used.
#[cfg(unix)]
fn pipes() -> Option<(
    tokio::net::unix::pipe::Receiver,
    tokio::net::unix::pipe::Sender,
)> {
    use std::os::fd::AsFd;
    use tokio::net::unix::pipe;
    let input = std::io::stdin().as_fd().try_clone_to_owned().ok()?;
    let output = std::io::stdout().as_fd().try_clone_to_owned().ok()?;
    Some((
        pipe::Receiver::from_owned_fd(input).ok()?,
        pipe::Sender::from_owned_fd(output).ok()?,
    ))
}

#[cfg(not(unix))]
fn pipes() -> Option<(tokio::io::Stdin, tokio::io::Stdout)> {
    None
}

/// Serve the protocol on any pair of streams (used by in-process tests).
pub async fn serve<I, O>(input: I, output: O)
where
    I: tokio::io::AsyncRead + Unpin,
    O: tokio::io::AsyncWrite,
{
    let (service, socket) = LspService::new(Server::new);
    Transport::new(input, output, socket).serve(service).await;
}

/// [`serve`] with the worker held at `gate` (a test hook: the test gives the
/// permits, so what is merged into one evaluation does not depend on timing).
pub async fn serve_gated<I, O>(input: I, output: O, gate: Gate)
where
    I: tokio::io::AsyncRead + Unpin,
    O: tokio::io::AsyncWrite,
{
    let (service, socket) = LspService::new(move |client| Server::gated(client, gate));
    Transport::new(input, output, socket).serve(service).await;
}
