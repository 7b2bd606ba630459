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
//!   iteration (Bathe, Finite Element Procedures, sec. 11.6): X' = K^-1 A X by the banded
//!   factors (one back-substitution per vector), then the projected problem
//!   X'^T A X' q = mu X'^T K X' q solved densely. The subspace holds
//!   max(2 q, q + 8) vectors for q modes asked (Bathe's choice); its start vectors are
//!   |diag A|, unit vectors at the freedoms of largest |A_ii| / K_ii and one
//!   pseudo-random vector. A pair is accepted when its residual meets
//!   `tolerance::EIGEN_RESIDUAL`.
//!
//!   The iteration favours the largest |mu|: for buckling, members in tension give
//!   negative mu (the load reversed), which can crowd the positive ones out of the
//!   subspace. When they do (or while fewer positive pairs than asked have appeared),
//!   each step is shifted, X' = (K^-1 A + s I) X with s a little over half the gap
//!   between the most negative Ritz value's magnitude and the smallest wanted positive
//!   one, so every positive mu + s exceeds every |mu + s| of a negative one. The shift
//!   changes the polynomial the subspace is filtered by, never the Rayleigh-Ritz answer.
//! - [`dense`]: the oracle for tests and small models: Cholesky K = L L^T of the dense
//!   matrix, C = L^-1 A L^-T, its symmetric eigen-decomposition (nalgebra) and
//!   x = L^-T z. O(n^3); refused above `MAX_DENSE_FREEDOMS`.

use crate::error::{Iteration, Location, StaticsError};
use crate::frame::banded::{BandMatrix, LdlFactor};
use crate::tolerance::{EIGENVALUE_NOISE, EIGEN_RESIDUAL, SUBSPACE_RANK};
use nalgebra::{DMatrix, DVector, SymmetricEigen};

/// Most iterations the subspace iteration runs before it reports that it did not
/// converge. The test models converge in 5 to 60; a strongly shifted step (tension
/// crowding out compression) converges at a ratio near 0.85, so 400 leaves room.
pub const MAX_SUBSPACE_ITERATIONS: usize = 400;

/// The subspace iteration concludes that the pencil has no positive eigenvalue when
/// none has appeared after this many iterations (the shift makes any positive one grow
/// against the rest by at least 0.55 / 0.45 per step, so 40 steps amplify it by 1e3 in
/// the worst case and far more in practice).
pub const EMPTY_ITERATIONS: usize = 40;

/// When fewer positive pairs than asked exist, their number must stay the same for this
/// many iterations before the search stops.
const SETTLE_ITERATIONS: usize = 5;

/// Shift over half the gap that lets positive eigenvalues dominate negative ones (see the
/// module doc): 0.55 rather than 0.5 so the Ritz estimate of the most negative value,
/// which is never larger in magnitude than the true one, may fall a little short.
const SHIFT_FACTOR: f64 = 0.55;

/// Spare directions the subspace keeps beyond the positive pairs and the negative ones
/// larger in magnitude; with fewer, the iteration is shifted.
const SPARE_DIRECTIONS: usize = 2;

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
}

fn band_times(b: &BandMatrix, x: &DMatrix<f64>) -> Result<DMatrix<f64>, StaticsError> {
    let (n, p) = x.shape();
    let mut y = DMatrix::zeros(n, p);
    for j in 0..p {
        b.mul_into(&x.as_slice()[j * n..(j + 1) * n], &mut y.as_mut_slice()[j * n..(j + 1) * n])?;
    }
    Ok(y)
}

/// K^-1 y for every column of `y`, in place.
fn solve_columns(factor: &LdlFactor, mut y: DMatrix<f64>) -> Result<DMatrix<f64>, StaticsError> {
    let n = y.nrows();
    for j in 0..y.ncols() {
        factor.solve_in_place(&mut y.as_mut_slice()[j * n..(j + 1) * n])?;
    }
    Ok(y)
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
    let scale: Vec<f64> = kept.iter().map(|&j| 1.0 / kr[(j, j)].sqrt()).collect();
    let krs = DMatrix::from_fn(m, m, |r, c| kr[(kept[r], kept[c])] * scale[r] * scale[c]);
    let ars = DMatrix::from_fn(m, m, |r, c| ar[(kept[r], kept[c])] * scale[r] * scale[c]);
    let energy = eigen(krs, what)?;
    let largest = energy.eigenvalues.iter().fold(0.0f64, |a, &v| a.max(v));
    let directions: Vec<usize> =
        (0..m).filter(|&c| energy.eigenvalues[c] > SUBSPACE_RANK * largest && largest > 0.0).collect();
    // basis of unit energy: columns V_c / sqrt(lambda_c) of the scaled subspace
    let r = directions.len();
    let to_basis = DMatrix::from_fn(m, r, |row, c| {
        let d = directions[c];
        energy.eigenvectors[(row, d)] / energy.eigenvalues[d].sqrt()
    });
    let projected = symmetric_part(&(to_basis.tr_mul(&ars) * &to_basis));
    let ritz = eigen(projected, what)?;
    let mut order: Vec<usize> = (0..r).collect();
    order.sort_by(|&a, &b| ritz.eigenvalues[b].total_cmp(&ritz.eigenvalues[a]));
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

/// A deterministic pseudo-random number in [-1, 1) from a xorshift state (start vectors
/// must not depend on anything but the model, so results repeat exactly).
fn next_random(state: &mut u64) -> f64 {
    *state ^= *state << 13;
    *state ^= *state >> 7;
    *state ^= *state << 17;
    (*state >> 11) as f64 / (1u64 << 52) as f64 - 1.0
}

/// The p start vectors (Bathe, sec. 11.6.3): |diag A|, unit vectors at the freedoms of
/// largest |A_ii| / K_ii, and at least one pseudo-random vector.
fn start_vectors(k: &BandMatrix, a: &Operand, p: usize) -> DMatrix<f64> {
    let n = k.order();
    let mut x = DMatrix::zeros(n, p);
    for i in 0..n {
        x[(i, 0)] = a.diagonal(i).abs();
    }
    let mut ratios: Vec<(usize, f64)> = (0..n)
        .map(|i| (i, a.diagonal(i).abs() / k.get(i, i)))
        .filter(|(_, r)| r.is_finite() && *r > 0.0)
        .collect();
    ratios.sort_by(|a, b| b.1.total_cmp(&a.1).then(a.0.cmp(&b.0)));
    let units = p.saturating_sub(2).min(ratios.len());
    for (c, (i, _)) in ratios.iter().take(units).enumerate() {
        x[(*i, c + 1)] = 1.0;
    }
    let mut state = 0x9E37_79B9_7F4A_7C15u64;
    for c in (units + 1)..p {
        for i in 0..n {
            x[(i, c)] = next_random(&mut state);
        }
    }
    x
}

/// The shift of the next step (module doc): zero while the subspace has room for the
/// negative Ritz values larger in magnitude than the smallest wanted positive one and
/// every wanted pair has appeared; otherwise a little over half their gap.
fn shift_for(values: &[f64], positives: usize, wanted: usize) -> f64 {
    let smallest_wanted = if positives > 0 { values[positives - 1] } else { 0.0 };
    let most_negative = values.iter().fold(0.0f64, |m, &v| m.min(v));
    let crowding = values.iter().filter(|&&v| v < -smallest_wanted).count();
    if positives == wanted && positives + crowding + SPARE_DIRECTIONS <= values.len() {
        0.0
    } else {
        (SHIFT_FACTOR * (-most_negative - smallest_wanted)).max(0.0)
    }
}

/// The `wanted` largest positive eigenvalues mu of A x = mu K x (fewer when the pencil has
/// fewer), by subspace iteration on the banded factors of K (module doc). `k` is K and
/// `factor` its LDL^T factors.
///
/// Errors: `NoConvergence` (`what`) when the pairs do not meet `EIGEN_RESIDUAL` within
/// `MAX_SUBSPACE_ITERATIONS`, with the worst relative residual as the last change;
/// `OutOfRange` when numbers beyond floating point arise.
pub(crate) fn subspace_iteration(
    k: &BandMatrix,
    factor: &LdlFactor,
    a: &Operand,
    wanted: usize,
    what: Iteration,
) -> Result<Modes, StaticsError> {
    let n = k.order();
    if n == 0 || wanted == 0 || a.order() != n {
        return Ok(Modes { values: Vec::new(), vectors: Vec::new(), iterations: 0 });
    }
    let p = n.min((2 * wanted).max(wanted + 8));
    let start = start_vectors(k, a, p);
    let mut xbar = solve_columns(factor, a.times(&start)?)?;
    let mut counts: Vec<usize> = Vec::new();
    let mut worst = f64::INFINITY;
    for iteration in 1..=MAX_SUBSPACE_ITERATIONS {
        let kxbar = band_times(k, &xbar)?;
        let axbar = a.times(&xbar)?;
        let ritz = rayleigh_ritz(&xbar, &kxbar, &axbar, what)?;
        let scale = ritz.values.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        // the values are sorted, so the positive ones come first
        let positives = ritz.values.iter().take_while(|&&v| v > EIGENVALUE_NOISE * scale).count().min(wanted);
        let shift = shift_for(&ritz.values, positives, wanted);
        let mut next = solve_columns(factor, ritz.ax.clone())?;
        next += &ritz.x * shift;
        // residual of pair i: r = K^-1 A x - mu x = next_i - (mu + s) x_i, K r = A x - mu K x
        worst = 0.0;
        for i in 0..positives {
            let mu = ritz.values[i];
            let r: DVector<f64> = next.column(i) - ritz.x.column(i) * (mu + shift);
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
        if positives > 0 && worst <= EIGEN_RESIDUAL && settled {
            return Ok(Modes {
                values: ritz.values[..positives].to_vec(),
                vectors: (0..positives).map(|i| ritz.x.column(i).iter().copied().collect()).collect(),
                iterations: iteration,
            });
        }
        if positives == 0 && iteration >= EMPTY_ITERATIONS {
            return Ok(Modes { values: Vec::new(), vectors: Vec::new(), iterations: iteration });
        }
        xbar = next;
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
        return Ok(Modes { values: Vec::new(), vectors: Vec::new(), iterations: 0 });
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
    order.sort_by(|&x, &y| decomposition.eigenvalues[y].total_cmp(&decomposition.eigenvalues[x]));
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
        let iterative = subspace_iteration(&k, &factor, &a, 4, Iteration::Vibration).expect("converges");
        let oracle = dense(&k, &a, 4, Iteration::Vibration).expect("dense");
        for j in 0..4 {
            let lambda = 2.0 - 2.0 * ((j + 1) as f64 * std::f64::consts::PI / (n + 1) as f64).cos();
            assert!((iterative.values[j] * lambda - 1.0).abs() < 1e-10, "{j}: {}", iterative.values[j]);
            assert!((oracle.values[j] * lambda - 1.0).abs() < 1e-10, "{j}: {}", oracle.values[j]);
        }
    }

    /// An indefinite A = diag(-9, -8, ..., 1, 2) against K = I: eigenvalues are the
    /// diagonal; the positive ones (2 and 1) must come out, in order, whatever the
    /// larger negative ones do (the shifted iteration), and nothing else.
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
            let m = subspace_iteration(&k, &factor, &a, wanted, Iteration::Buckling).expect("converges");
            let expected: Vec<f64> = [2.0, 1.0].into_iter().take(wanted).collect();
            assert_eq!(m.values.len(), expected.len(), "wanted {wanted}: {:?}", m.values);
            for (v, e) in m.values.iter().zip(&expected) {
                assert!((v - e).abs() < 1e-12, "wanted {wanted}: {:?}", m.values);
            }
            // the eigenvector of 2 is the last unit vector
            assert!((m.vectors[0][29].abs() - 1.0).abs() < 1e-9);
        }
        let none: Vec<f64> = d.iter().map(|v| v.min(0.0)).collect();
        let m =
            subspace_iteration(&k, &factor, &Operand::Diagonal(&none), 3, Iteration::Buckling).expect("ends");
        assert!(m.values.is_empty(), "{:?}", m.values);
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
