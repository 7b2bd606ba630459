//! Springline's statics engine: the stiffness solver for plane frames and trusses, and
//! (built on it) funicular form finding, structure generation and force diagrams for
//! deck arches. Pure Rust, no IO; compiles to native and wasm32.
//!
//! Units: m, kN, kN/m, kN/m2 (also E and stresses), rad. Axes x right, y up.
//! Axial force tension positive; bending moment positive when the right-hand fibre
//! (looking from a member's start to its end) is in tension (sagging for members drawn
//! left to right).
#![warn(missing_docs)]

pub mod banded;
pub mod determinacy;
pub mod element;
pub mod error;
pub mod model;
pub mod reciprocal;
pub mod solver;
pub mod thrust_line;

pub use determinacy::{truss_determinacy, Determinacy, DeterminacyReport};
pub use error::{Problem, StaticsError};
pub use model::{
    frame, truss, Dof, LoadCase, LoadDirection, Member, MemberKind, MemberLoad, Model, NodalLoad, Node,
    PrescribedDisplacement, Support, TemperatureLoad,
};
pub use solver::{
    solve, validate, CaseResult, EquilibriumCheck, MemberForces, Reaction, SectionForces, Solution,
};

// Deck-arch layer (built on the solver): owned by the form-finding work.
pub mod analysis;
pub mod design;
pub mod funicular;
pub mod generate;

// Form finding and the default layout (issue 3), added at the end.
pub mod form;
pub mod layout;

pub use analysis::{analyze, Analysis};
pub use design::{validate_design, Design, Warning};
pub use form::{find_form, Form, LoadBasis, PanelLoads};
pub use generate::{bare_rib_model, frame_model, truss_model};

// The permalink codec (issue 6): a whole design in a URL fragment.
pub mod permalink;

pub use permalink::{decode as decode_link, encode as encode_link};

// Force diagram and thrust line (issue 4): extra load cases for generated models.
pub mod cases;
pub use cases::{add_cases, build_case, standard_cases, CaseSpec, DeckLoad, Half};
pub use funicular::{rib_funicular, FunicularMethod, RibFunicular};
pub use reciprocal::{force_diagram, AxialSense, ForceDiagram, Segment, SegmentOf, Space, SpaceKind};
pub use thrust_line::{rib_chain, thrust_line, PressurePoint, ThrustLine};
