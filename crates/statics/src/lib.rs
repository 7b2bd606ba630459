//! Springline's statics engine: the stiffness solver for plane frames and trusses, and
//! (built on it) funicular form finding, structure generation and force diagrams for
//! deck arches. Pure Rust, no IO; compiles to native and wasm32.
//!
//! Layers, each using only those listed after it:
//!
//! | folder | what |
//! | --- | --- |
//! | `scene` | drawings as data: shapes, styles and placed labels |
//! | `link` | the permalink codec |
//! | `arch` | the deck arch: design, layout, form, generation, cases, analysis, traffic envelopes, sizing, quantities, foundations |
//! | `traffic` | cross-section, load models, sharing between ribs, combinations |
//! | `graphic` | reciprocal figure, funicular, thrust line |
//! | `frame` | model, element, banded factorisation, solver, determinacy |
//! | `sizing` | member resistance, section families, materials (for any structure) |
//!
//! and `error`, `geom`, `tolerance` and `units` (display units), shared by all.
//!
//! Units: m, kN, kN/m, kN/m2 (also E and stresses), rad. Axes x right, y up.
//! Axial force tension positive; bending moment positive when the right-hand fibre
//! (looking from a member's start to its end) is in tension (sagging for members drawn
//! left to right).
#![warn(missing_docs)]
// User data must never panic the engine: every problem is returned as a `StaticsError`.
// The few exceptions (indexing in the numeric kernels) are listed in the module docs of
// `frame` and `graphic`.
#![cfg_attr(
    not(test),
    deny(clippy::unwrap_used, clippy::expect_used, clippy::panic, clippy::indexing_slicing)
)]

pub mod error;
pub mod geom;
pub mod json;
pub mod order;
pub mod tolerance;
pub mod units;

pub mod frame;
pub mod graphic;
pub mod sizing;

pub mod traffic;

pub mod arch;
pub mod export;
pub mod link;
pub mod scene;

pub use error::{Problem, StaticsError};
pub use frame::determinacy::{truss_determinacy, Determinacy, DeterminacyReport};
pub use frame::model::{
    frame, truss, Dof, LoadCase, LoadDirection, Member, MemberKind, MemberLoad, Model, NodalLoad, Node,
    PrescribedDisplacement, Support, TemperatureLoad,
};
pub use frame::solver::{
    solve, validate, CaseResult, EquilibriumCheck, MemberForces, Reaction, SectionForces, Solution,
};
pub use geom::{Point, Vector};

pub use graphic::funicular::{rib_funicular, FunicularMethod, RibFunicular};
pub use graphic::reciprocal::{
    force_diagram, AxialSense, ForceDiagram, Segment, SegmentOf, Space, SpaceKind,
};
pub use graphic::thrust_line::{rib_chain, thrust_line, PressurePoint, ThrustLine};

pub use arch::analysis::{analyze, analyze_valid, Analysis};
pub use arch::cases::{add_cases, build_case, standard_cases, CaseKind, CaseSpec, DeckLoad, Half};
pub use arch::design::{Design, Warning};
pub use arch::form::{Form, LoadBasis, PanelLoads};
pub use arch::generate::{
    bare_rib_model, frame_model, truss_model, Generated, MemberRole, ModelKind, ModelMap,
};
pub use arch::summary::Summary;
pub use arch::validate::{validate_design, ValidDesign};

pub use link::permalink::{decode as decode_link, encode as encode_link};
