//! The largest eigenvalues mu of the symmetric pencils of stability and vibration,
//! A x = mu K x, with K the stiffness of the free freedoms (symmetric positive definite,
//! factorised once as banded LDL^T) and A symmetric: minus the geometric stiffness
//! (banded, indefinite: mu = 1 / alpha_cr) or the lumped mass (diagonal, positive
//! semi-definite: mu = 1 / omega^2). Working with mu keeps K on the right, so every
//! reduced problem is symmetric-definite whatever the sign of A.
//!
//! Two solvers with one answer: the positive eigenvalues, largest first, up to the number
//! asked for, each with its eigenvector normalised to x^T K x = 1.
//!
//! - [`subspace_iteration`]: subspace iteration with a Rayleigh-Ritz step in every
//!   iteration (Bathe, Finite Element Procedures, sec. 11.6), the power step K^-1 A X
//!   replaced by a Chebyshev polynomial of K^-1 A that damps the interval of unwanted
//!   eigenvalues (Zhou & Saad, J. Comput. Phys. 219, 2006; Saad, Numerical Methods for
//!   Large Eigenvalue Problems, 2nd ed., sec. 7.4). Each product with K^-1 is one
//!   back-substitution with the banded factors per vector. The subspace holds
//!   max(2 q, q + 8) vectors for q modes asked (Bathe's choice; max(2 q, q + 5) when
//!   started from a similar problem's subspace); its start vectors are |diag A| and
//!   pseudo-random vectors (`start_vectors` says why not unit vectors). Once a filter
//!   has shown how fast the residuals fall, the next is no higher in degree than it
//!   takes to meet the tolerance (`filter_degree`).
//!   The pairs are accepted when their residuals meet `tolerance::EIGEN_RESIDUAL` and a
//!   Sturm sequence check (the negative pivots of K - sigma A just below the smallest
//!   value found, one more banded factorisation) shows that no larger mu was missed.
//!
//!   Why a filter: plain subspace iteration favours the largest |mu|, and it converges
//!   at the ratio of the first eigenvalue outside the subspace to the wanted one. A
//!   braced frame has many similar bar modes (a clustered spectrum: ratios near 1), and
//!   for buckling its members in tension give negative mu (the load reversed) as large
//!   as the positive ones, which crowd them out of the subspace. The filter damps
//!   everything from below the most negative Ritz value up to the smallest Ritz value
//!   held, and grows what lies above: measured on a 32-panel braced deck arch, 140
//!   plain iterations became 6 filtered ones of degree 8.
//! - [`dense`]: the oracle for tests and small models: Cholesky K = L L^T of the dense
//!   matrix, C = L^-1 A L^-T, its symmetric eigen-decomposition (nalgebra) and
//!   x = L^-T z. O(n^3); refused above `MAX_DENSE_FREEDOMS`.

use crate::error::{Iteration, Location, StaticsError};
use crate::frame::banded::{BandMatrix, LdlFactor};
use crate::tolerance::{EIGENVALUE_NOISE, EIGEN_RESIDUAL, SUBSPACE_RANK};
use nalgebra::{DMatrix, DVector, SymmetricEigen};

/// Most iterations (each a Chebyshev filter of degree `CHEBYSHEV_DEGREE` and a
/// Rayleigh-Ritz step) before the subspace iteration reports that it did not converge.
/// The test and benchmark models converge in 1 (a warm start) to 12.
pub const MAX_SUBSPACE_ITERATIONS: usize = 100;

/// Highest degree of the Chebyshev filter of an iteration: each degree costs one
/// back-substitution per vector; 8 amplifies the wanted modes over the damped interval
/// by about 90 per iteration at least (`FILTER_EDGE`), far more when they stand apart.
/// `filter_degree` lowers it when the wanted modes are far apart.
const CHEBYSHEV_DEGREE: usize = 8;

/// The filter of the next iteration aims at residuals this many times below
/// `tolerance::EIGEN_RESIDUAL` (`filter_degree`): a rate measured over one filter may be
/// a little optimistic, and missing the tolerance costs a whole iteration more.
const FILTER_MARGIN: f64 = 10.0;

/// Vectors beyond the wanted ones in a subspace started cold: Bathe's max(2 q, q + 8).
const COLD_GUARD_VECTORS: usize = 8;

/// Vectors beyond the wanted ones in a subspace started warm (from a similar problem's
/// subspace): it already holds the wanted modes closely, so fewer guards do. Measured on
/// the governing placements of the demo deck arch at 16, 32 and 64 panels (3 modes, each
/// case warm from the one before): 5 took 20-30% fewer instructions than 8 for the
/// same iterations within a few percent; 3, 4 and 6 less well (8 vectors make two whole
/// blocks of the block products, `frame::banded`).
const WARM_GUARD_VECTORS: usize = 5;

/// Largest ratio by which one filter may grow the largest Ritz value's mode over the
/// smallest wanted one's (`filter_degree`): a contamination of 1e-4, left by a
/// Rayleigh-Ritz step, stays below 1 after the filter.
const FILTER_GAIN: f64 = 1e4;

/// The upper end of the damped interval stays at least this fraction of the interval
/// below the smallest wanted Ritz value (and above the lower end).
const FILTER_EDGE: f64 = 0.1;

/// The lower end of the damped interval lies this fraction of the largest |Ritz value|
/// below the lowest Ritz value seen, so the most negative modes are damped too (one
/// lower still gets amplified, enters the subspace and moves the end on the next
/// iteration).
const LOWER_MARGIN: f64 = 0.05;

/// The subspace iteration concludes that the pencil has no positive eigenvalue when
/// none has appeared after this many iterations: the filter amplifies any positive mu
/// over everything at or below zero by at least 90 per iteration.
const EMPTY_ITERATIONS: usize = 10;

/// When fewer positive pairs than asked exist, their number must stay the same for this
/// many iterations before the search stops.
const SETTLE_ITERATIONS: usize = 3;

/// Iterations between a restart of the subspace's other directions (after a failed
/// Sturm check) and the next check: a random vector is dominated by the stiffest modes,
/// and takes a few filters before the missed mode stands out in it.
const RESTART_ITERATIONS: usize = 4;

/// The Sturm check counts eigenvalues below the smallest found one less this fraction
/// of it: far above the error of a converged value (`EIGEN_RESIDUAL` squared), so the
/// found value itself is never counted, and a true value missed within it would equal
/// the found one to engineering precision.
const STURM_MARGIN: f64 = 1e-6;

/// Largest number of free freedoms the dense solver takes (about 200 MB of matrices and
/// some seconds of work at that size).
pub const MAX_DENSE_FREEDOMS: usize = 3000;

/// Largest number of sweeps the dense symmetric eigen-decomposition may take.
const EIGEN_SWEEPS: usize = 10_000;

/// The matrix A of the pencil A x = mu K x.
pub(crate) enum Operand<'a> {
    /// A banded symmetric matrix with the band of K (minus the geometric stiffness).
    Band(&'a BandMatrix),
    /// A diagonal matrix, one entry per free freedom (the lumped mass).
    Diagonal(&'a [f64]),
}

impl Operand<'_> {
    fn order(&self) -> usize {
        match self {
            Operand::Band(b) => b.order(),
            Operand::Diagonal(d) => d.len(),
        }
    }
    fn diagonal(&self, i: usize) -> f64 {
        match self {
            Operand::Band(b) => b.get(i, i),
            Operand::Diagonal(d) => d[i],
        }
    }
    fn entry(&self, i: usize, j: usize) -> f64 {
        match self {
            Operand::Band(b) => b.get(i, j),
            Operand::Diagonal(d) => {
                if i == j {
                    d[i]
                } else {
                    0.0
                }
            }
        }
    }
    /// Every column of `x` multiplied by A.
    fn times(&self, x: &DMatrix<f64>) -> Result<DMatrix<f64>, StaticsError> {
        match self {
            Operand::Band(b) => band_times(b, x),
            Operand::Diagonal(d) => {
                let mut y = x.clone();
                for mut column in y.column_iter_mut() {
                    for (v, w) in column.iter_mut().zip(d.iter()) {
                        *v *= w;
                    }
                }
                Ok(y)
            }
        }
    }
}

/// The positive eigenvalues found, largest first, with their eigenvectors.
#[derive(Debug, Clone)]
pub(crate) struct Modes {
    /// mu, positive, descending.
    pub(crate) values: Vec<f64>,
    /// One eigenvector per value, one entry per free freedom, x^T K x = 1.
    pub(crate) vectors: Vec<Vec<f64>>,
    /// Iterations used (0 for the dense solver).
    pub(crate) iterations: usize,
    /// The whole subspace the iteration ended with (its Ritz vectors, one per column),
    /// to start a similar problem from; empty for the dense solver.
    pub(crate) subspace: DMatrix<f64>,
}

impl Modes {
    fn none(iterations: usize) -> Modes {
        Modes { values: Vec::new(), vectors: Vec::new(), iterations, subspace: DMatrix::zeros(0, 0) }
    }
}

/// A times every column of `x`, the columns taken together (`BandMatrix::mul_rows_into`,
/// on the transpose: a column-major matrix's transpose holds its rows one after another).
fn band_times(b: &BandMatrix, x: &DMatrix<f64>) -> Result<DMatrix<f64>, StaticsError> {
    let (n, p) = x.shape();
    let rows = x.transpose();
    let mut y = DMatrix::zeros(p, n);
    b.mul_rows_into(rows.as_slice(), y.as_mut_slice(), p)?;
    Ok(y.transpose())
}

/// K^-1 y for every column of `y`, the columns solved together
/// (`LdlFactor::solve_rows_in_place`, on the transpose as in `band_times`).
fn solve_columns(factor: &LdlFactor, y: DMatrix<f64>) -> Result<DMatrix<f64>, StaticsError> {
    let p = y.ncols();
    let mut rows = y.transpose();
    factor.solve_rows_in_place(rows.as_mut_slice(), p)?;
    Ok(rows.transpose())
}

/// The Rayleigh-Ritz solution in the span of a subspace: Ritz values descending, the
/// K-orthonormal Ritz vectors and their products with K and A.
struct Ritz {
    values: Vec<f64>,
    x: DMatrix<f64>,
    kx: DMatrix<f64>,
    ax: DMatrix<f64>,
}

fn symmetric_part(m: &DMatrix<f64>) -> DMatrix<f64> {
    (m + m.transpose()) * 0.5
}

fn eigen(m: DMatrix<f64>, what: Iteration) -> Result<SymmetricEigen<f64, nalgebra::Dyn>, StaticsError> {
    if m.iter().any(|v| !v.is_finite()) {
        return Err(not_finite(what));
    }
    SymmetricEigen::try_new(m, f64::EPSILON, EIGEN_SWEEPS).ok_or(StaticsError::NoConvergence {
        what,
        iterations: EIGEN_SWEEPS,
        last_change: f64::NAN,
        hint: "the projected eigenproblem did not settle; check the model for members far stiffer or \
               softer than the rest"
            .into(),
    })
}

fn not_finite(what: Iteration) -> StaticsError {
    StaticsError::OutOfRange {
        location: Location::Part(what.to_string()),
        message: "numbers beyond the range of floating point arose; check the units of E, A and I and \
                  the size of the loads"
            .into(),
    }
}

/// Rayleigh-Ritz in the span of the columns of `xbar` (with `kxbar` = K xbar and
/// `axbar` = A xbar): columns scaled to unit energy, directions of negligible energy
/// dropped (`SUBSPACE_RANK`), then the projected A diagonalised in the K-orthonormal basis.
fn rayleigh_ritz(
    xbar: &DMatrix<f64>,
    kxbar: &DMatrix<f64>,
    axbar: &DMatrix<f64>,
    what: Iteration,
) -> Result<Ritz, StaticsError> {
    let kr = symmetric_part(&xbar.tr_mul(kxbar));
    let ar = symmetric_part(&xbar.tr_mul(axbar));
    let kept: Vec<usize> = (0..kr.nrows()).filter(|&j| kr[(j, j)].is_finite() && kr[(j, j)] > 0.0).collect();
    let m = kept.len();
    let n = xbar.nrows();
    let empty = || Ritz {
        values: Vec::new(),
        x: DMatrix::zeros(n, 0),
        kx: DMatrix::zeros(n, 0),
        ax: DMatrix::zeros(n, 0),
    };
    // nalgebra's eigen-decomposition refuses an empty matrix (a panic): nothing is left
    if m == 0 {
        return Ok(empty());
    }
    let scale: Vec<f64> = kept.iter().map(|&j| 1.0 / kr[(j, j)].sqrt()).collect();
    let krs = DMatrix::from_fn(m, m, |r, c| kr[(kept[r], kept[c])] * scale[r] * scale[c]);
    let ars = DMatrix::from_fn(m, m, |r, c| ar[(kept[r], kept[c])] * scale[r] * scale[c]);
    let energy = eigen(krs, what)?;
    let largest = energy.eigenvalues.iter().fold(0.0f64, |a, &v| a.max(v));
    let directions: Vec<usize> =
        (0..m).filter(|&c| energy.eigenvalues[c] > SUBSPACE_RANK * largest && largest > 0.0).collect();
    // basis of unit energy: columns V_c / sqrt(lambda_c) of the scaled subspace
    let r = directions.len();
    if r == 0 {
        return Ok(empty());
    }
    let to_basis = DMatrix::from_fn(m, r, |row, c| {
        let d = directions[c];
        energy.eigenvectors[(row, d)] / energy.eigenvalues[d].sqrt()
    });
    let projected = symmetric_part(&(to_basis.tr_mul(&ars) * &to_basis));
    let ritz = eigen(projected, what)?;
    let mut order: Vec<usize> = (0..r).collect();
    crate::order::sort_by(&mut order, |&a, &b| ritz.eigenvalues[b].total_cmp(&ritz.eigenvalues[a]));
    let values: Vec<f64> = order.iter().map(|&i| ritz.eigenvalues[i]).collect();
    let q = DMatrix::from_fn(r, r, |row, c| ritz.eigenvectors[(row, order[c])]);
    // map from the kept columns of xbar to the Ritz vectors
    let mut t = &to_basis * q;
    for (row, s) in scale.iter().enumerate() {
        for c in 0..r {
            t[(row, c)] *= s;
        }
    }
    let pick = |mat: &DMatrix<f64>| mat.select_columns(kept.iter()) * &t;
    Ok(Ritz { values, x: pick(xbar), kx: pick(kxbar), ax: pick(axbar) })
}

/// Seed of the pseudo-random start vectors.
const RANDOM_SEED: u64 = 0x9E37_79B9_7F4A_7C15;

/// A deterministic pseudo-random number in [-1, 1) from a xorshift state (start vectors
/// must not depend on anything but the model, so results repeat exactly).
fn next_random(state: &mut u64) -> f64 {
    *state ^= *state << 13;
    *state ^= *state >> 7;
    *state ^= *state << 17;
    (*state >> 11) as f64 / (1u64 << 52) as f64 - 1.0
}

/// The p start vectors: |diag A| (Bathe, sec. 11.6.3) and pseudo-random vectors. Not
/// Bathe's unit vectors at the freedoms of largest A_ii / K_ii: in a frame of pin-ended
/// bars split into elements those produce eigenvectors of single bars at once, exactly,
/// which then hold their places in the subspace and keep out a global mode that a
/// random vector would bring in (measured on a braced deck arch: a mode missed for a
/// hundred iterations, caught by the Sturm check).
fn start_vectors(n: usize, a: &Operand, p: usize, state: &mut u64) -> DMatrix<f64> {
    let mut x = DMatrix::zeros(n, p);
    for i in 0..n {
        x[(i, 0)] = a.diagonal(i).abs();
    }
    for c in 1..p {
        for i in 0..n {
            x[(i, c)] = next_random(state);
        }
    }
    x
}

/// The Sturm check of converged pairs (Bathe, sec. 11.6.4): the number of eigenvalues
/// mu > mu_q / (1 - STURM_MARGIN) of the pencil, the negative pivots of K - sigma A with
/// sigma = (1 - STURM_MARGIN) / mu_q, must equal the number of found values above that
/// bound; more means the subspace has missed a mode larger than the smallest one found
/// (the iteration then goes on, the other directions restarted from random vectors and
/// given `RESTART_ITERATIONS` before the next check). A vanishing pivot moves sigma down
/// by STURM_MARGIN once more; two in a row count as missed (the iteration goes on).
fn none_missed(k: &BandMatrix, a: &Operand, found: &[f64]) -> Result<bool, StaticsError> {
    let Some(&smallest) = found.last() else { return Ok(true) };
    let mut sigma = (1.0 - STURM_MARGIN) / smallest;
    for _ in 0..2 {
        let shifted = match a {
            Operand::Band(b) => k.minus_scaled(sigma, b)?,
            Operand::Diagonal(d) => k.minus_scaled_diagonal(sigma, d),
        };
        if let Some(count) = shifted.negative_pivots() {
            let expected = found.iter().filter(|&&mu| mu * sigma > 1.0).count();
            return Ok(count == expected);
        }
        sigma *= 1.0 - STURM_MARGIN;
    }
    Ok(false)
}

/// Whether the spectrum of the pencil is known to be non-negative (A positive
/// semi-definite, as a mass matrix): then 0 is the lower end of the filter's interval.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Spectrum {
    /// A may be indefinite (minus a geometric stiffness).
    Indefinite,
    /// A is positive semi-definite (a lumped mass).
    NonNegative,
}

/// The Chebyshev filter of degree `degree` applied to the columns of `x`
/// (with `w` = K^-1 A x already at hand): T_m((Op - c) / e) x with Op = K^-1 A, c and e
/// the centre and half-width of the damped interval [lower, upper], by the three-term
/// recurrence (Zhou & Saad, J. Comput. Phys. 219, 2006; Saad, Numerical Methods for
/// Large Eigenvalue Problems, 2nd ed., sec. 7.4). Each column of both iterates is scaled
/// by the same factor after every step, which keeps the numbers near 1 and the
/// directions unchanged.
fn chebyshev_filter(
    factor: &LdlFactor,
    a: &Operand,
    x: &DMatrix<f64>,
    w: &DMatrix<f64>,
    (lower, upper): (f64, f64),
    degree: usize,
) -> Result<DMatrix<f64>, StaticsError> {
    let c = (upper + lower) / 2.0;
    let e = (upper - lower) / 2.0;
    let mut previous = x.clone();
    let mut current = (w - x * c) / e;
    for _ in 1..degree {
        let op = solve_columns(factor, a.times(&current)?)?;
        let next = (op - &current * c) * (2.0 / e) - &previous;
        previous = current;
        current = next;
        for j in 0..current.ncols() {
            let size = current.column(j).amax();
            if size > 0.0 && size.is_finite() {
                current.column_mut(j).scale_mut(1.0 / size);
                previous.column_mut(j).scale_mut(1.0 / size);
            }
        }
    }
    Ok(current)
}

/// The interval [lower, upper] of mu the filter damps, from the Ritz values (descending)
/// and the lowest Ritz value seen so far: lower a little below the whole spectrum (0
/// for a non-negative one), upper the smallest Ritz value of the subspace (an estimate
/// of the largest eigenvalue the subspace need not hold), kept at least a tenth of the
/// interval from both ends so the filter neither degenerates nor damps the wanted ones.
/// `spread`, the largest |Ritz value|, must be positive. When the smallest wanted Ritz
/// value is not above the lower end (a mass matrix of fewer masses than modes asked:
/// Ritz values at zero, or rounding below it), the interval spans a tenth of `spread`.
fn filter_interval(values: &[f64], wanted: usize, lowest_seen: f64, spectrum: Spectrum) -> (f64, f64) {
    let top = values[wanted.min(values.len()) - 1];
    let bottom = values[values.len() - 1];
    let spread = values[0].abs().max(bottom.abs());
    let lower = match spectrum {
        Spectrum::NonNegative => 0.0,
        Spectrum::Indefinite => lowest_seen.min(0.0) - LOWER_MARGIN * spread,
    };
    let span = if top > lower { top - lower } else { FILTER_EDGE * spread };
    let upper = bottom.clamp(lower + FILTER_EDGE * span, lower + (1.0 - FILTER_EDGE) * span);
    (lower, upper)
}

/// The filter's degree: the highest up to `CHEBYSHEV_DEGREE` whose gain on the largest
/// Ritz value over the smallest wanted one stays within `FILTER_GAIN`, at least 1; and
/// once the pairs' residuals are known to fall by `rate` per degree (measured over the
/// last filter), no higher than what takes the worst of them, `worst`, to
/// `EIGEN_RESIDUAL / FILTER_MARGIN`.
///
/// Why a cap: a Ritz vector of a smaller wanted mode still holds a little of the larger
/// ones, and the filter grows that part by the ratio of their gains. Wanted modes far
/// apart (a beam's omega^2 run as n^4) would have the subspace collapse onto the first
/// mode within one filter of degree 8 (a ratio of 1e19, beyond double precision);
/// wanted modes close together (a braced frame's bar modes), where plain steps are
/// slow, keep the full degree.
///
/// Why the measured rate: the last iteration's filter need only finish the job, and each
/// degree costs a product and a back-substitution per vector. The rate is measured, not
/// taken from the Chebyshev polynomial's gain at the Ritz values: unwanted modes beyond
/// the damped interval (the most negative, not yet seen) grow too, and on a braced deck
/// arch the residuals fell about 4 times per degree where the polynomial promised 16.
fn filter_degree(
    values: &[f64],
    wanted: usize,
    (lower, upper): (f64, f64),
    worst: f64,
    rate: Option<f64>,
) -> usize {
    let c = (upper + lower) / 2.0;
    let e = (upper - lower) / 2.0;
    let largest = (values[0] - c) / e;
    let smallest = (values[wanted.min(values.len()) - 1] - c) / e;
    // T_m(x) = cosh(m acosh x) for x >= 1; both are above the interval (x > 1)
    let gain = |m: usize, x: f64| (m as f64 * x.max(1.0).acosh()).cosh();
    let capped = (1..=CHEBYSHEV_DEGREE)
        .rev()
        .find(|&m| gain(m, largest) <= FILTER_GAIN * gain(m, smallest))
        .unwrap_or(1);
    match rate.filter(|r| r.is_finite() && *r > 1.0) {
        Some(rate) => {
            let needed = (FILTER_MARGIN * worst / EIGEN_RESIDUAL).ln() / rate.ln();
            (needed.ceil().max(1.0) as usize).min(capped)
        }
        None => capped,
    }
}

/// The `wanted` largest positive eigenvalues mu of A x = mu K x (fewer when the pencil has
/// fewer), by Chebyshev-filtered subspace iteration on the banded factors of K (module
/// doc). `k` is K and `factor` its LDL^T factors. `warm`, the subspace a similar
/// problem ended with (`Modes::subspace`, n rows), starts the iteration near the
/// answer; the answer does not depend on it beyond the convergence tolerance.
///
/// Errors: `NoConvergence` (`what`) when the pairs do not meet `EIGEN_RESIDUAL` within
/// `MAX_SUBSPACE_ITERATIONS`, with the worst relative residual as the last change;
/// `OutOfRange` when numbers beyond floating point arise.
pub(crate) fn subspace_iteration(
    k: &BandMatrix,
    factor: &LdlFactor,
    a: &Operand,
    spectrum: Spectrum,
    wanted: usize,
    warm: Option<&DMatrix<f64>>,
    what: Iteration,
) -> Result<Modes, StaticsError> {
    let n = k.order();
    if n == 0 || wanted == 0 || a.order() != n {
        return Ok(Modes::none(0));
    }
    let warm = warm.filter(|w| w.nrows() == n);
    let guard = if warm.is_some() { WARM_GUARD_VECTORS } else { COLD_GUARD_VECTORS };
    let p = n.min((2 * wanted).max(wanted + guard));
    let mut state = RANDOM_SEED;
    let mut start = start_vectors(n, a, p, &mut state);
    // a warm start: the previous subspace in all columns but the last, which stays
    // random (the Sturm check catches what the old subspace lacks either way)
    if let Some(previous) = warm {
        for c in 0..previous.ncols().min(p - 1) {
            start.set_column(c, &previous.column(c));
        }
    }
    // one plain step first: the Ritz values of K^-1 A X bound the spectrum for the filter
    let mut xbar = solve_columns(factor, a.times(&start)?)?;
    let mut counts: Vec<usize> = Vec::new();
    let mut worst = f64::INFINITY;
    let mut lowest_seen = 0.0f64;
    // after a restart the fresh directions need a few filters before the next check
    let mut next_check = 0;
    // the worst residual before the last filter and its degree, while every wanted pair
    // is held
    let mut last_filter: Option<(f64, usize)> = None;
    for iteration in 1..=MAX_SUBSPACE_ITERATIONS {
        let kxbar = band_times(k, &xbar)?;
        let axbar = a.times(&xbar)?;
        let ritz = rayleigh_ritz(&xbar, &kxbar, &axbar, what)?;
        let scale = ritz.values.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        if scale == 0.0 || !scale.is_finite() {
            // A vanishes on the whole subspace: no mode within reach has mu other than 0
            return Ok(Modes::none(iteration));
        }
        // the values are sorted, so the positive ones come first
        let positives = ritz.values.iter().take_while(|&&v| v > EIGENVALUE_NOISE * scale).count().min(wanted);
        lowest_seen = lowest_seen.min(ritz.values[ritz.values.len() - 1]);
        let mut x = ritz.x;
        // K^-1 A x: the residuals and the filter's first step
        let mut w = solve_columns(factor, ritz.ax.clone())?;
        // residual of pair i: r = K^-1 A x - mu x, K r = A x - mu K x
        worst = 0.0;
        for i in 0..positives {
            let mu = ritz.values[i];
            let r: DVector<f64> = w.column(i) - x.column(i) * mu;
            let kr: DVector<f64> = ritz.ax.column(i) - ritz.kx.column(i) * mu;
            worst = worst.max(r.dot(&kr).max(0.0).sqrt() / mu);
        }
        if !worst.is_finite() {
            return Err(not_finite(what));
        }
        counts.push(positives);
        let settled = positives == wanted
            || (counts.len() >= SETTLE_ITERATIONS
                && counts[counts.len() - SETTLE_ITERATIONS..].iter().all(|&c| c == positives));
        if positives > 0 && worst <= EIGEN_RESIDUAL && settled && iteration >= next_check {
            if none_missed(k, a, &ritz.values[..positives])? {
                return Ok(Modes {
                    values: ritz.values[..positives].to_vec(),
                    vectors: (0..positives).map(|i| x.column(i).iter().copied().collect()).collect(),
                    iterations: iteration,
                    subspace: x,
                });
            }
            // a mode was missed: the directions beyond the pairs found start afresh from
            // random vectors, which hold every mode
            let fresh = start_vectors(n, a, x.ncols(), &mut state);
            let fresh_w = solve_columns(factor, a.times(&fresh)?)?;
            for c in positives..x.ncols() {
                x.set_column(c, &fresh.column(c));
                w.set_column(c, &fresh_w.column(c));
            }
            next_check = iteration + RESTART_ITERATIONS;
            last_filter = None;
        }
        if positives == 0 && iteration >= EMPTY_ITERATIONS {
            return Ok(Modes::none(iteration));
        }
        let interval = filter_interval(&ritz.values, wanted, lowest_seen, spectrum);
        let rate = last_filter
            .filter(|_| positives == wanted)
            .map(|(before, degree)| (before / worst).powf(1.0 / degree as f64));
        let degree = filter_degree(&ritz.values, wanted, interval, worst, rate);
        last_filter = (positives == wanted).then_some((worst, degree));
        xbar = chebyshev_filter(factor, a, &x, &w, interval, degree)?;
    }
    Err(StaticsError::NoConvergence {
        what,
        iterations: MAX_SUBSPACE_ITERATIONS,
        last_change: worst,
        hint: "ask for fewer modes, or use the dense solver on a smaller model; members far softer than \
               the rest slow the search"
            .into(),
    })
}

/// The same eigenpairs as [`subspace_iteration`] from dense matrices (module doc): the
/// oracle the tests compare against.
///
/// Errors: `OutOfRange` above `MAX_DENSE_FREEDOMS` free freedoms, or when K is not
/// positive definite in the dense Cholesky factorisation; `NoConvergence` when the
/// dense eigen-decomposition does not settle.
pub(crate) fn dense(
    k: &BandMatrix,
    a: &Operand,
    wanted: usize,
    what: Iteration,
) -> Result<Modes, StaticsError> {
    let n = k.order();
    if n > MAX_DENSE_FREEDOMS {
        return Err(StaticsError::OutOfRange {
            location: Location::Part("dense eigensolver".into()),
            message: format!(
                "the model has {n} free freedoms; the dense solver takes at most {MAX_DENSE_FREEDOMS}: use the \
                 subspace solver or fewer parts per member"
            ),
        });
    }
    if n == 0 || wanted == 0 || a.order() != n {
        return Ok(Modes::none(0));
    }
    let kd = DMatrix::from_fn(n, n, |i, j| k.get(i, j));
    let ad = DMatrix::from_fn(n, n, |i, j| a.entry(i, j));
    let refused = || StaticsError::OutOfRange {
        location: Location::Part("dense eigensolver".into()),
        message: "the stiffness matrix is not positive definite in the dense factorisation; use the \
                  subspace solver"
            .into(),
    };
    let l = kd.cholesky().ok_or_else(refused)?.l();
    let half = l.solve_lower_triangular(&ad).ok_or_else(refused)?;
    let c = l.solve_lower_triangular(&half.transpose()).ok_or_else(refused)?;
    let decomposition = eigen(symmetric_part(&c), what)?;
    let scale = decomposition.eigenvalues.iter().fold(0.0f64, |m, v| m.max(v.abs()));
    let mut order: Vec<usize> = (0..n).collect();
    crate::order::sort_by(&mut order, |&x, &y| {
        decomposition.eigenvalues[y].total_cmp(&decomposition.eigenvalues[x])
    });
    let chosen: Vec<usize> = order
        .into_iter()
        .take_while(|&i| decomposition.eigenvalues[i] > EIGENVALUE_NOISE * scale)
        .take(wanted)
        .collect();
    let mut vectors = Vec::with_capacity(chosen.len());
    for &i in &chosen {
        let z = decomposition.eigenvectors.column(i).into_owned();
        let x = l.tr_solve_lower_triangular(&z).ok_or_else(refused)?;
        vectors.push(x.iter().copied().collect());
    }
    Ok(Modes {
        values: chosen.iter().map(|&i| decomposition.eigenvalues[i]).collect(),
        vectors,
        iterations: 0,
        subspace: DMatrix::zeros(0, 0),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The n x n second-difference matrix tridiag(-1, 2, -1) in band form.
    fn second_difference(n: usize) -> BandMatrix {
        let mut a = BandMatrix::zeros(n, 1);
        for i in 0..n {
            a.add(i, i, 2.0).expect("in band");
            if i > 0 {
                a.add(i, i - 1, -1.0).expect("in band");
            }
        }
        a
    }

    /// The filter's degree: the full degree while the residuals' rate is unknown (or
    /// shows no progress); once known, the least degree that takes the worst residual
    /// FILTER_MARGIN below the tolerance at that rate (1e-8 falling 4 times per degree:
    /// 1e-8 * 4^-m <= 1e-10 first at m = 4, since 4^3 = 64 < 100 <= 4^4), and never above
    /// the full degree (1e-3 at that rate would take 12).
    #[test]
    fn the_last_filter_is_no_higher_than_the_tolerance_needs() {
        // wanted values close together: the gain cap leaves the full degree
        let values = [1.0, 0.99, 0.98, 0.5, 0.2, 0.1];
        let interval = filter_interval(&values, 3, -0.2, Spectrum::Indefinite);
        assert_eq!(filter_degree(&values, 3, interval, 1e-3, None), CHEBYSHEV_DEGREE);
        assert_eq!(filter_degree(&values, 3, interval, 1e-8, None), CHEBYSHEV_DEGREE);
        assert_eq!(filter_degree(&values, 3, interval, 1e-8, Some(0.9)), CHEBYSHEV_DEGREE);
        assert_eq!(filter_degree(&values, 3, interval, 1e-8, Some(f64::INFINITY)), CHEBYSHEV_DEGREE);
        assert_eq!(filter_degree(&values, 3, interval, 1e-8, Some(4.0)), 4);
        assert_eq!(filter_degree(&values, 3, interval, 1e-3, Some(4.0)), CHEBYSHEV_DEGREE);
        // already converged: one degree (the iteration stops on the next check anyway)
        assert_eq!(filter_degree(&values, 3, interval, 1e-12, Some(4.0)), 1);
    }

    /// K = tridiag(-1, 2, -1) and A = I: mu = 1 / lambda with the closed form
    /// lambda_j = 2 - 2 cos(j pi / (n + 1)) of the second-difference matrix (any text on
    /// finite differences, e.g. Strang, Introduction to Applied Mathematics, sec. 1.5).
    #[test]
    fn second_difference_eigenvalues_have_the_closed_form() {
        let n = 40;
        let k = second_difference(n);
        let factor = LdlFactor::new(&k).expect("positive definite");
        let ones = vec![1.0; n];
        let a = Operand::Diagonal(&ones);
        let iterative =
            subspace_iteration(&k, &factor, &a, Spectrum::NonNegative, 4, None, Iteration::Vibration)
                .expect("converges");
        let oracle = dense(&k, &a, 4, Iteration::Vibration).expect("dense");
        for j in 0..4 {
            let lambda = 2.0 - 2.0 * ((j + 1) as f64 * std::f64::consts::PI / (n + 1) as f64).cos();
            assert!((iterative.values[j] * lambda - 1.0).abs() < 1e-10, "{j}: {}", iterative.values[j]);
            assert!((oracle.values[j] * lambda - 1.0).abs() < 1e-10, "{j}: {}", oracle.values[j]);
        }
        // started from its own answer the iteration stops at once with the same values;
        // started from the answer of another problem (masses growing along the chain) it
        // still finds this one's
        let again = subspace_iteration(
            &k,
            &factor,
            &a,
            Spectrum::NonNegative,
            4,
            Some(&iterative.subspace),
            Iteration::Vibration,
        )
        .expect("converges");
        assert_eq!(again.iterations, 1);
        let graded: Vec<f64> = (0..n).map(|i| 1.0 + i as f64).collect();
        let other = subspace_iteration(
            &k,
            &factor,
            &Operand::Diagonal(&graded),
            Spectrum::NonNegative,
            4,
            None,
            Iteration::Vibration,
        )
        .expect("converges");
        let warmed = subspace_iteration(
            &k,
            &factor,
            &a,
            Spectrum::NonNegative,
            4,
            Some(&other.subspace),
            Iteration::Vibration,
        )
        .expect("converges");
        for j in 0..4 {
            assert!((again.values[j] / iterative.values[j] - 1.0).abs() < 1e-12);
            assert!((warmed.values[j] / iterative.values[j] - 1.0).abs() < 1e-12);
        }
    }

    /// An indefinite A = diag(-9, -8, ..., 1, 2) against K = I: eigenvalues are the
    /// diagonal; the positive ones (2 and 1) must come out, in order, whatever the
    /// larger negative ones do (the filter damps them), and nothing else.
    #[test]
    fn positive_eigenvalues_come_out_past_larger_negative_ones() {
        let n = 30;
        let mut k = BandMatrix::zeros(n, 0);
        for i in 0..n {
            k.add(i, i, 1.0).expect("in band");
        }
        let factor = LdlFactor::new(&k).expect("positive definite");
        // eighteen negative values up to -9 in magnitude, zeros, then 1 and 2
        let d: Vec<f64> = (0..n)
            .map(|i| {
                if i < 18 {
                    -9.0 + 0.5 * i as f64
                } else if i == 28 {
                    1.0
                } else if i == 29 {
                    2.0
                } else {
                    0.0
                }
            })
            .collect();
        let a = Operand::Diagonal(&d);
        for wanted in [1, 2, 5] {
            let m =
                subspace_iteration(&k, &factor, &a, Spectrum::Indefinite, wanted, None, Iteration::Buckling)
                    .expect("converges");
            let expected: Vec<f64> = [2.0, 1.0].into_iter().take(wanted).collect();
            assert_eq!(m.values.len(), expected.len(), "wanted {wanted}: {:?}", m.values);
            for (v, e) in m.values.iter().zip(&expected) {
                assert!((v - e).abs() < 1e-12, "wanted {wanted}: {:?}", m.values);
            }
            // the eigenvector of 2 is the last unit vector
            assert!((m.vectors[0][29].abs() - 1.0).abs() < 1e-9);
        }
        let none: Vec<f64> = d.iter().map(|v| v.min(0.0)).collect();
        let m = subspace_iteration(
            &k,
            &factor,
            &Operand::Diagonal(&none),
            Spectrum::Indefinite,
            3,
            None,
            Iteration::Buckling,
        )
        .expect("ends");
        assert!(m.values.is_empty(), "{:?}", m.values);
    }

    /// A mass on one freedom of five springs in a chain (K the second-difference matrix):
    /// one mode, mu = (K^-1)_22 = 2 * 4 / 6 (the inverse of the second-difference matrix
    /// of order 5, (K^-1)_ij = i (6 - j) / 6 for i <= j, 1-based, worked by hand), however
    /// many are asked for; A = 0 gives none.
    #[test]
    fn fewer_modes_than_asked_when_a_has_low_rank() {
        let k = second_difference(5);
        let factor = LdlFactor::new(&k).expect("positive definite");
        let mut mass = vec![0.0; 5];
        mass[1] = 1.0;
        for solver in [true, false] {
            let a = Operand::Diagonal(&mass);
            let m = if solver {
                subspace_iteration(&k, &factor, &a, Spectrum::NonNegative, 3, None, Iteration::Vibration)
            } else {
                dense(&k, &a, 3, Iteration::Vibration)
            }
            .expect("ends");
            assert_eq!(m.values.len(), 1, "{:?}", m.values);
            assert!((m.values[0] - 8.0 / 6.0).abs() < 1e-12, "{:?}", m.values);
        }
        let zero = vec![0.0; 5];
        let m = subspace_iteration(
            &k,
            &factor,
            &Operand::Diagonal(&zero),
            Spectrum::NonNegative,
            2,
            None,
            Iteration::Vibration,
        )
        .expect("ends");
        assert!(m.values.is_empty());
    }

    #[test]
    fn band_product_matches_the_dense_product() {
        let mut a = BandMatrix::zeros(5, 2);
        let mut dense = DMatrix::<f64>::zeros(5, 5);
        for i in 0..5usize {
            for j in i.saturating_sub(2)..=i {
                let v = 1.0 + i as f64 * 0.7 - j as f64 * 0.3;
                a.add(i, j, v).expect("in band");
                dense[(i, j)] = v;
                dense[(j, i)] = v;
            }
        }
        let x = DMatrix::from_fn(5, 2, |i, j| (i as f64 - 2.0) * (j as f64 + 1.0));
        let y = band_times(&a, &x).expect("sizes agree");
        assert!((y - &dense * &x).abs().max() < 1e-12);
    }
}
