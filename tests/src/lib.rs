//! Cross-crate checks live in tests/*.rs.
