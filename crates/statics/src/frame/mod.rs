//! The general plane-frame layer: the analysis model, member stiffness, the banded
//! factorisation, the direct stiffness solver (numbering, assembly, recovery and the
//! independent equilibrium check) and the determinacy of pin-jointed models. It knows
//! nothing of arches: members carry a free-text `group`, never a role.

pub mod banded;
pub mod determinacy;
pub mod element;
pub mod model;
pub mod solver;
