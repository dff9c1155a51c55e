//! test helpers
