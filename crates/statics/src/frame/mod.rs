//! The general plane-frame layer: the analysis model, member stiffness, the banded
//! factorisation (internal), the direct stiffness solver, the determinacy of pin-jointed
//! models, and in-plane linear buckling and natural frequencies (`stability`, with the
//! eigensolvers in the internal `eigen`).
//! It knows nothing of arches: members carry a free-text `group`, never a role.
//!
//! The solver by concept: `solver` (validation and the solve), `numbering` (reverse
//! Cuthill-McKee order and equation numbers), `assembly` (stiffness matrix and load
//! vectors), `recovery` (member end forces, stations, reactions), `equilibrium` (the
//! independent check) and `results` (what a solve returns).
//!
//! Exception to the crate's no-panic lints: indexing (`clippy::indexing_slicing`) is
//! allowed in this layer, its numeric kernels, because every index comes from a model
//! checked first.

// why: every index comes from a model `solver::validate` (or the model's own construction)
// has checked: node indices of members, supports and loads in range, the freedom numbering
// built from the node count, the band width from that numbering; `envelope` indexes lines
// its `check` has matched (positions and ordinates of one length, increasing)
#![allow(clippy::indexing_slicing)]

pub mod determinacy;
pub mod element;
pub mod envelope;
pub mod equilibrium;
pub mod influence;
pub mod model;
pub mod results;
pub mod solver;
pub mod stability;

mod assembly;
mod banded;
mod eigen;
mod numbering;
mod recovery;
