//! Flexural buckling: the Euler load, the buckling curves of steel members, the
//! instability factor of timber columns, and the second-order rule for concrete members.

use serde::{Deserialize, Serialize};

/// A flexural buckling curve of EN 1993-1-1 6.3.1.2 (Table 6.1).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Curve {
    /// Curve a0, imperfection factor 0.13.
    A0,
    /// Curve a, 0.21.
    A,
    /// Curve b, 0.34.
    B,
    /// Curve c, 0.49.
    C,
    /// Curve d, 0.76.
    D,
}
