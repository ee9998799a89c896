//! A test hook: a gate the server's worker waits at, so a test decides exactly
//! when each evaluation starts and ends, and counters of what the server did.
//! With it, which edits are merged into one evaluation depends on the order of
//! the messages only, not on how fast the machine is. A server made by
//! [`crate::Server::new`] (what `parax lsp` runs) has no gate.

use std::sync::Arc;
use tokio::sync::{watch, Semaphore};

/// What a gated server has done so far.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct Counts {
    /// Document notifications handled (`didOpen` and `didChange`, applied or
    /// rejected).
    pub received: usize,
    /// Documents the worker took up (its changes queued so far taken with it).
    pub taken: usize,
    /// Queued changes the worker took with them, in all (a whole text read
    /// afresh counts as one).
    pub changes_taken: usize,
    /// Evaluations the worker finished and kept or dropped.
    pub evaluated: usize,
    /// Of those, the ones of the newest text (and so published).
    pub published: usize,
}

/// The gate: the worker takes one permit to take up a dirty document and one
/// to keep what it computed. Cloning shares the gate.
#[derive(Debug, Clone)]
pub struct Gate {
    inner: Arc<Inner>,
}

#[derive(Debug)]
struct Inner {
    take: Semaphore,
    keep: Semaphore,
    counts: watch::Sender<Counts>,
}

impl Default for Gate {
    fn default() -> Self {
        Gate::closed()
    }
}

impl Gate {
    /// A closed gate: the worker waits until permits are given.
    pub fn closed() -> Self {
        Gate {
            inner: Arc::new(Inner {
                take: Semaphore::new(0),
                keep: Semaphore::new(0),
                counts: watch::Sender::new(Counts::default()),
            }),
        }
    }

    /// Let the worker take up `n` more dirty documents.
    pub fn allow_taking(&self, n: usize) {
        self.inner.take.add_permits(n);
    }

    /// Let the worker keep (and publish) `n` more finished evaluations.
    pub fn allow_keeping(&self, n: usize) {
        self.inner.keep.add_permits(n);
    }

    /// The counts now.
    pub fn counts(&self) -> Counts {
        *self.inner.counts.borrow()
    }

    /// Wait until `done` holds of the counts, and return them.
    pub async fn until(&self, done: impl Fn(&Counts) -> bool) -> Counts {
        let mut rx = self.inner.counts.subscribe();
        let c = *rx
            .wait_for(|c| done(c))
            .await
            .expect("the sender lives in the gate");
        c
    }

    pub(crate) async fn before_taking(&self) {
        if let Ok(p) = self.inner.take.acquire().await {
            p.forget();
        }
    }

    pub(crate) async fn before_keeping(&self) {
        if let Ok(p) = self.inner.keep.acquire().await {
            p.forget();
        }
    }

    pub(crate) fn received(&self) {
        self.inner.counts.send_modify(|c| c.received += 1);
    }

    pub(crate) fn taken(&self, changes: usize) {
        self.inner.counts.send_modify(|c| {
            c.taken += 1;
            c.changes_taken += changes;
        });
    }

    pub(crate) fn evaluated(&self, published: bool) {
        self.inner.counts.send_modify(|c| {
            c.evaluated += 1;
            c.published += usize::from(published);
        });
    }
}
