//! Named tolerances, one place for all: each says what it compares, in which unit or
//! relative to what, and why its value. A bare small number in the middle of a function
//! is a defect; name it here.

// frame layer: banded
/// Relative size below which a pivot counts as zero: d_i < PIVOT_TOLERANCE * K_ii.
///
/// Measured here: bare ribs whose EA is 1e5 times realistic (the stiffest models in the
/// tests) keep every pivot above 4e-6 of its diagonal; a true mechanism leaves rounding,
/// which stays near 1e-16 of the diagonal but, after a nearly parallel pair of bars, was
/// seen at 1e-11. 1e-9 separates the two with margin both ways; a structure that stiff
/// in one mode and that soft in another is a mechanism for any practical purpose.
/// Pinned from both sides by `tests/pivot_tolerance.rs`: a pivot ratio of 1e-11 is
/// refused, 4e-6 and 1e-7 solve.
pub const PIVOT_TOLERANCE: f64 = 1e-9;

/// A pivot within this many times its own rounding estimate, eps * (K_jj + sum of
/// L_jk^2 K_kk), is rounding noise: the structure is a mechanism. After a nearly
/// singular earlier pivot the noise of a true mechanism was seen above
/// `PIVOT_TOLERANCE` of the diagonal (a random frame of the property tests, kept as a
/// regression seed); the estimate grows with K_kk / d_k of the earlier pivots, so it
/// follows that amplification, while sound structures keep pivots many orders above it
/// (every solve in the test suite passes with this margin).
pub const ROUNDING_MARGIN: f64 = 1e3;

// frame layer: determinacy
/// Singular values below this fraction of the largest count as zero. The matrix holds
/// direction cosines and unit entries, so rank gaps are sharp.
pub const RANK_TOLERANCE: f64 = 1e-9;

/// The fast determinacy path trusts a factorisation of A A^T only when its rounding
/// bound is below 1 / NONSINGULAR_MARGIN of the smallest eigenvalue's lower bound (ratio
/// 1 already proves non-singularity to first order in eps; the margin covers the
/// neglected higher orders and the rounding of the bound itself). Stable frameworks sit
/// near 1e-12, true mechanisms at 1 or more: the argument is in
/// `frame::determinacy::without_mechanism`.
pub const NONSINGULAR_MARGIN: f64 = 1e2;

// frame layer: solver
/// Iterative refinement stops once a correction is at most this fraction of the largest
/// displacement (relative, dimensionless): a thousand roundings. Measured on the demo's
/// frame and truss models: the first correction is 1e-14 to 2e-14 of the largest
/// displacement, a second would be 1e-15 (one rounding, nothing gained), while a model
/// whose EA is far above EI / L^2 keeps corrections above it and takes every step.
/// Pinned by `frame::solver`'s tests.
pub const REFINED: f64 = 1e3 * f64::EPSILON;

/// A solved case whose equilibrium residual (largest node residual over the reference
/// force, `EquilibriumCheck::relative`) passes this is reported as ill-conditioned. The
/// refined solve keeps it near 1e-13 on every test model, so 1e-9 means stiffnesses
/// many orders apart have eaten most of the digits.
pub const ILL_CONDITIONED: f64 = 1e-9;

/// Greatest ratio of the largest to the smallest axial stiffness E A of the design's
/// member groups before it is reported as ill-conditioned. Real deck arches stay within
/// about 1e3 (a 10 m2 concrete rib against a 1e-3 m2 steel brace); beyond 1e6 the
/// softest group carries nothing to the digits the solver keeps and the stiffness matrix
/// nears a mechanism.
pub const STIFFNESS_CONTRAST: f64 = 1e6;

/// Reactions of a case without net load count as vanished below this fraction of
/// E A times the largest imposed strain (they are then rounding noise).
pub const VANISHING_REACTION: f64 = 1e-6;

// frame layer: stability
/// A Ritz pair (mu, x) of A x = mu K x has converged when its residual in the energy norm,
/// ||K^-1 A x - mu x||_K with x^T K x = 1, is below this fraction of |mu|. That residual
/// bounds the error of mu itself (Krylov-Weinstein: |mu - mu_exact| <= residual) and the
/// error is in fact of its square over the gap to the next eigenvalue, so critical load
/// factors and frequencies come out near rounding; mode shapes to about this fraction
/// over the relative gap. 1e-9 is four orders above the residual's own rounding in
/// double precision (about sqrt(eps) n b times smaller, measured below 1e-12 on every
/// test model), so it is always reachable.
pub const EIGEN_RESIDUAL: f64 = 1e-9;

/// An eigenvalue mu (1 / alpha_cr, 1 / omega^2) counts as zero below this fraction of
/// the largest |mu| of the problem: the pencil's null space (freedoms without mass,
/// members without axial force) comes out at rounding, about 1e-16 of the largest. A
/// mode 1e10 times higher than the first (a load factor or omega^2 ratio) has no
/// engineering meaning.
pub const EIGENVALUE_NOISE: f64 = 1e-10;

/// A direction of the iterated subspace whose energy (x^T K x, columns scaled to unit
/// energy first) falls below this fraction of the largest is dropped: the subspace has
/// collapsed onto fewer vectors than it holds (the pencil has fewer modes than asked).
pub const SUBSPACE_RANK: f64 = 1e-10;

/// A member counts as compressed when its axial force is below -COMPRESSED_MEMBER times
/// the largest |N| of the case: forces that small are rounding of a member that carries
/// nothing (the solver's equilibrium holds to about 1e-12 of the largest force).
pub const COMPRESSED_MEMBER: f64 = 1e-9;

// arch layer: second order
/// Two governing placements are one (`arch::second_order::same_placement`) when each load
/// of one differs from the other's by at most this fraction of the larger of the two
/// cases' largest loads (forces, line loads and moments alike: a scale of rounding, not
/// of units), and each position along a member by at most this fraction of the larger
/// position (at least 1 m). A placement found from two envelope lines meets their zero
/// crossings computed from different lines, so the same patch of lane load can come
/// twice, differing in its last bits: measured on the demo at 16, 32 and 64 panels,
/// 1e-16 to 4e-14 of the largest load. The critical load factors of two cases that close
/// differ by about as much, far below the eigen solution's own tolerance
/// (`EIGEN_RESIDUAL`). Equal loads listed in another order, or a near-zero load one case
/// has and the other lacks, are not merged: a case buckled twice, on the safe side.
pub const SAME_PLACEMENT: f64 = 1e-10;

// graphic layer: reciprocal
/// Relative size below which a force counts as zero (its segment is a point), as a
/// fraction of the largest force of the case: the solver's equilibrium holds to about
/// 1e-12 of it, so anything below 1e-9 is rounding, not force.
pub const ZERO_FORCE: f64 = 1e-9;

/// Two members whose direction vectors' cross product is below this fraction of the
/// product of their lengths are parallel and cannot cross.
pub const PARALLEL: f64 = 1e-12;

/// A crossing closer to a member end than this fraction of its length is a joint, not a
/// crossing (members meeting at a node are never cut).
pub const CROSSING_END: f64 = 1e-9;

// graphic layer: funicular
/// Loads closer than this fraction of the span to a support are still "inside" (round-off
/// in computed panel positions must not reject a load on the support vertical).
pub const SPAN_TOLERANCE: f64 = 1e-12;

// arch layer: layout
/// Posts shorter than this fraction of the span are never made: rib and deck share the
/// node instead (a zero-length member cannot be analysed; 1e-6 of a 100 m span is 0.1 mm).
pub const SHARED_NODE_GAP: f64 = 1e-6;

// arch layer: form
/// Vertical clearance (m) by which a rib may dip into the ground before it is reported:
/// the springings sit exactly on the ground, so only round-off is forgiven.
pub const GROUND_TOLERANCE: f64 = 1e-6;

// arch layer: design
/// Relative allowance on the section bound I <= A d^2 / 4 (`MAX_I_OVER_AREA_DEPTH_SQUARED`)
/// for round-off in the product A d^2 / 4: a section typed exactly at the bound (the
/// demo's piers) is not warned about. Products of three typed decimals are off by a few
/// eps; 1e-9 is far above that and far below any mistyped I.
pub const SECTION_BOUND_ROUNDING: f64 = 1e-9;
