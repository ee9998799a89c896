//! Rendering the one diagnostics and derived-values model for a terminal and as JSON.

pub mod human;
pub mod json;
pub mod sarif;
