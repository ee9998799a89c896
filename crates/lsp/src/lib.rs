//! The parax language server: a thin shell that speaks the Language Server
//! Protocol (through `tower-lsp-server`) over the editor features of
//! `parax-ide`. Documents live in ropes with incremental sync; positions are
//! converted by `parax_syntax::LineIndex` in the encoding negotiated with the
//! client; evaluation runs off the message loop and only the newest version of a
//! document is evaluated. This is the only crate that knows LSP types.

pub mod client;
mod convert;
mod documents;
mod server;

pub use documents::{apply_change, EditError};
pub use server::Server;

use tower_lsp_server::{LspService, Server as Transport};

/// Serve the protocol on standard input and output until the client exits.
pub fn run_stdio() -> std::io::Result<()> {
    let rt = tokio::runtime::Builder::new_multi_thread()
        .worker_threads(2)
        .enable_all()
        .build()?;
    rt.block_on(async {
        let (service, socket) = LspService::new(Server::new);
        Transport::new(tokio::io::stdin(), tokio::io::stdout(), socket)
            .serve(service)
            .await;
    });
    Ok(())
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
