//! The one error type of the statics crate.

use crate::model::Dof;
use serde::Serialize;
use thiserror::Error;

/// One problem found in a model or design, with where it is and what to do.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Problem {
    /// What the problem is about, for example `member r3` or `node A`.
    pub location: String,
    /// What is wrong and how to fix it.
    pub message: String,
}

impl std::fmt::Display for Problem {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}: {}", self.location, self.message)
    }
}

/// Everything that can go wrong in the engine, with what the user can do about it.
#[derive(Debug, Clone, PartialEq, Error, Serialize)]
pub enum StaticsError {
    /// The input has problems; every problem found is listed.
    #[error("{} problem(s) in the input: {}", .0.len(), join(.0))]
    Invalid(Vec<Problem>),
    /// The structure can move without resistance (a mechanism), so it has no unique
    /// static solution.
    #[error(
        "the structure is a mechanism: node {node_label} can move {} without resistance; \
         add a support, a brace or remove a hinge there",
        .direction.describe()
    )]
    Mechanism {
        /// Index of a node that moves in the mechanism.
        node: usize,
        /// Its display name.
        node_label: String,
        /// The direction in which it moves most.
        direction: Dof,
        /// The mechanism mode found: displacement per free freedom (unit largest
        /// component), as (node, dof, value) triples.
        mode: Vec<(usize, Dof, f64)>,
    },
    /// An iteration did not converge.
    #[error("{what} did not converge in {iterations} iterations (last change {last_change:.3e}); {hint}")]
    NoConvergence {
        /// What was iterated.
        what: String,
        /// Iterations used.
        iterations: usize,
        /// Size of the last change.
        last_change: f64,
        /// What to try.
        hint: String,
    },
    /// A permalink or file could not be read.
    #[error("cannot read {what}: {reason}")]
    Unreadable {
        /// What was being read.
        what: String,
        /// Why it failed.
        reason: String,
    },
}

fn join(problems: &[Problem]) -> String {
    problems.iter().map(|p| p.to_string()).collect::<Vec<_>>().join("; ")
}

impl StaticsError {
    /// Shorthand for a list of one problem.
    pub fn invalid(location: impl Into<String>, message: impl Into<String>) -> Self {
        StaticsError::Invalid(vec![Problem { location: location.into(), message: message.into() }])
    }
}
