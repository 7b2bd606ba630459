//! Member sizing, the pure leaf: materials, parametric section families, buckling and
//! member resistance checks, and the search for the smallest size of a family that carries
//! a demand.
//!
//! Knows nothing of arches: a member is a material, a section family, a demand (the
//! largest tension, compression and moment) and two buckling lengths. Units: m, kN,
//! kN/m2 (stresses and E), kNm. Results are for concept design; local codes and a
//! licensed engineer govern.

pub mod buckling;
pub mod materials;
pub mod resistance;
pub mod sections;
