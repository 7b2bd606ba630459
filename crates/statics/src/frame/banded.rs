//! Banded LDL^T factorisation of a symmetric positive (semi-)definite matrix.
//!
//! Stiffness matrices of structures numbered along their length have a narrow band, so
//! the work is n b^2 instead of n^3 / 3 (Bathe, Finite Element Procedures, sec. 8.2.2).
//! A pivot that collapses relative to its own diagonal entry marks a mechanism; the
//! matching null vector of the leading block is returned so the caller can name what
//! moves.

use crate::error::{Location, StaticsError};
use crate::tolerance::{PIVOT_TOLERANCE, ROUNDING_MARGIN};

/// A symmetric matrix stored by its lower band.
#[derive(Debug, Clone)]
pub(crate) struct BandMatrix {
    n: usize,
    bandwidth: usize,
    data: Vec<f64>,
}

impl BandMatrix {
    /// A zero n x n matrix whose entries (i, j) vanish for |i - j| > bandwidth.
    pub(crate) fn zeros(n: usize, bandwidth: usize) -> Self {
        BandMatrix { n, bandwidth, data: vec![0.0; n * (bandwidth + 1)] }
    }
    /// Half bandwidth.
    pub(crate) fn bandwidth(&self) -> usize {
        self.bandwidth
    }
    /// The strictly lower band column by column (`LdlFactor::columns`' layout).
    fn columns_below_diagonal(&self) -> Vec<f64> {
        let bw = self.bandwidth;
        let mut columns = vec![0.0; self.n * bw];
        for k in 0..self.n {
            for i in k.saturating_sub(bw)..k {
                columns[i * bw + (k - i - 1)] = self.data[self.idx(k, i)];
            }
        }
        columns
    }
    /// Storage index of entry (i, j), j <= i <= j + bandwidth. Only for indices the
    /// caller has proven inside the band (the factorisation's loops); `add` checks.
    fn idx(&self, i: usize, j: usize) -> usize {
        debug_assert!(j <= i && i - j <= self.bandwidth);
        i * (self.bandwidth + 1) + (i - j)
    }
    /// Adds `value` to entry (i, j) (and so to (j, i)).
    ///
    /// Errors (`OutOfRange`, the matrix unchanged) when (i, j) lies outside the matrix or
    /// outside its band: stored by rows of the band, such an entry would otherwise land
    /// on another one. Checked in every build.
    pub(crate) fn add(&mut self, i: usize, j: usize, value: f64) -> Result<(), StaticsError> {
        let (i, j) = if i >= j { (i, j) } else { (j, i) };
        if i >= self.n || i - j > self.bandwidth {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("banded stiffness matrix".into()),
                message: format!(
                    "entry ({i}, {j}) lies outside the matrix of order {} and half bandwidth {}; the \
                     equations were numbered inconsistently, a defect of the solver: please report the model",
                    self.n, self.bandwidth
                ),
            });
        }
        let k = self.idx(i, j);
        self.data[k] += value;
        Ok(())
    }
    /// Order of the matrix (number of equations).
    pub(crate) fn order(&self) -> usize {
        self.n
    }
    /// y = A x for the symmetric matrix A, in its own units times those of x: the
    /// single-vector product [`BandMatrix::mul_rows_into`] is checked against.
    ///
    /// Errors (`OutOfRange`, `y` unchanged) when `x` or `y` does not have one entry per
    /// equation.
    #[cfg(test)]
    pub(crate) fn mul_into(&self, x: &[f64], y: &mut [f64]) -> Result<(), StaticsError> {
        if x.len() != self.n || y.len() != self.n {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("matrix product".into()),
                message: format!(
                    "vectors of {} and {} entries for a matrix of order {}; pass one entry per equation",
                    x.len(),
                    y.len(),
                    self.n
                ),
            });
        }
        y.fill(0.0);
        for i in 0..self.n {
            let lo = i.saturating_sub(self.bandwidth);
            let row = &self.data[i * (self.bandwidth + 1)..(i + 1) * (self.bandwidth + 1)];
            // row[i - j] holds entry (i, j)
            let mut yi = row[0] * x[i];
            for j in lo..i {
                let v = row[i - j];
                yi += v * x[j];
                y[j] += v * x[i];
            }
            y[i] += yi;
        }
        Ok(())
    }
    /// This matrix minus `sigma` times `other` (a matrix of the same order; the band is
    /// the wider of the two), in the units of this one.
    ///
    /// Errors (`OutOfRange`) when the orders differ.
    pub(crate) fn minus_scaled(&self, sigma: f64, other: &BandMatrix) -> Result<BandMatrix, StaticsError> {
        if other.n != self.n {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("matrix difference".into()),
                message: format!(
                    "matrices of order {} and {}; both must belong to the same equations",
                    self.n, other.n
                ),
            });
        }
        let mut out = BandMatrix::zeros(self.n, self.bandwidth.max(other.bandwidth));
        for (source, factor) in [(self, 1.0), (other, -sigma)] {
            for i in 0..self.n {
                for j in i.saturating_sub(source.bandwidth)..=i {
                    let k = out.idx(i, j);
                    out.data[k] += factor * source.data[source.idx(i, j)];
                }
            }
        }
        Ok(out)
    }
    /// This matrix minus `sigma` times the diagonal matrix `diagonal` (one entry per
    /// equation; missing entries count as zero).
    pub(crate) fn minus_scaled_diagonal(&self, sigma: f64, diagonal: &[f64]) -> BandMatrix {
        let mut out = self.clone();
        for (i, d) in diagonal.iter().enumerate().take(self.n) {
            let k = out.idx(i, i);
            out.data[k] -= sigma * d;
        }
        out
    }
    /// The number of negative pivots of the LDL^T factorisation without pivoting, which
    /// by Sylvester's law of inertia is the number of negative eigenvalues; for
    /// K - sigma A it counts the eigenvalues lambda < sigma of K x = lambda A x (the
    /// Sturm sequence property, Bathe, Finite Element Procedures, sec. 8.2.5). `None`
    /// when a pivot vanishes or is not finite (sigma on an eigenvalue of a leading
    /// block): the caller moves sigma a little and asks again. O(n b^2).
    pub(crate) fn negative_pivots(&self) -> Option<usize> {
        let mut l = self.clone();
        let mut d = vec![0.0; self.n];
        let mut negative = 0;
        for j in 0..self.n {
            let dj = l.pivot(j, &d, |_, _| ());
            if dj == 0.0 || !dj.is_finite() {
                return None;
            }
            if dj < 0.0 {
                negative += 1;
            }
            d[j] = dj;
            l.eliminate_below(j, &d);
        }
        Some(negative)
    }
    /// Step j of the LDL^T factorisation on a matrix whose columns before j already hold
    /// L and whose later columns still hold A: the pivot d_j = A_jj - sum_k L_jk^2 d_k,
    /// k = j - b..j in increasing k (`d` holds the pivots before j). `each` sees every
    /// term's L_jk and k. Shared by the factorisation and the Sturm count, so both run
    /// the same sums in the same order.
    fn pivot(&self, j: usize, d: &[f64], mut each: impl FnMut(f64, usize)) -> f64 {
        let stride = self.bandwidth + 1;
        let lo = j.saturating_sub(self.bandwidth);
        // row j holds L_jk at offset j - k: offsets j - lo down to 1 are k = lo..j
        let count = j - lo;
        let row = &self.data[j * stride..j * stride + count + 1];
        let pivots = &d[lo..j];
        let mut dj = row[0];
        for t in 0..count {
            let ljk = row[count - t];
            dj -= ljk * ljk * pivots[t];
            each(ljk, lo + t);
        }
        dj
    }
    /// Step j of the LDL^T factorisation below the diagonal, after `pivot` (d_j in
    /// `d[j]`): L_ij = (A_ij - sum_k L_ik L_jk d_k) / d_j for i = j + 1..=j + b, k in
    /// increasing order from the first column both rows reach, and L_jj = 1.
    fn eliminate_below(&mut self, j: usize, d: &[f64]) {
        let n = self.n;
        let bw = self.bandwidth;
        let stride = bw + 1;
        let dj = d[j];
        let (head, tail) = self.data.split_at_mut((j + 1) * stride);
        head[j * stride] = 1.0;
        let row_j = &head[j * stride..];
        let hi = (j + bw).min(n.saturating_sub(1));
        for (i, row_i) in ((j + 1)..=hi).zip(tail.chunks_exact_mut(stride)) {
            let first = i.saturating_sub(bw);
            let count = j - first;
            // row i holds L_ik at offset i - k, row j L_jk at j - k: k = first..j is
            // offsets i - first down to i - j + 1, and j - first down to 1
            let off = i - j;
            let (li, lj, pivots) = (&row_i[off + 1..=off + count], &row_j[1..=count], &d[first..j]);
            let mut v = row_i[off];
            for t in 0..count {
                v -= li[count - 1 - t] * lj[count - 1 - t] * pivots[t];
            }
            row_i[off] = v / dj;
        }
    }
    /// The first stored entry (i, j), by rows, that is not a finite number.
    pub(crate) fn first_non_finite(&self) -> Option<(usize, usize)> {
        let k = self.data.iter().position(|v| !v.is_finite())?;
        let (i, offset) = (k / (self.bandwidth + 1), k % (self.bandwidth + 1));
        // entries left of column 0 are never written: they stay 0
        Some((i, i - offset))
    }
    /// Entry (i, j).
    pub(crate) fn get(&self, i: usize, j: usize) -> f64 {
        let (i, j) = if i >= j { (i, j) } else { (j, i) };
        if i - j > self.bandwidth {
            0.0
        } else {
            self.data[self.idx(i, j)]
        }
    }
}

#[cfg(test)]
thread_local! {
    /// Test-only count of the factorisations run on this thread, so tests can show that
    /// one factorisation serves many right-hand sides.
    pub(crate) static FACTORISATIONS: std::cell::Cell<usize> = const { std::cell::Cell::new(0) };
}

/// The factors L (unit lower, banded) and D of A = L D L^T.
#[derive(Debug, Clone)]
pub(crate) struct LdlFactor {
    l: BandMatrix,
    d: Vec<f64>,
    /// L's columns below the diagonal, each contiguous: entry `i * bandwidth + (k - i - 1)`
    /// holds L_ki for k = i + 1..=i + bandwidth (zero past the last equation). The
    /// back-substitution runs down a column of L; read from the band's rows it would
    /// skip a row's length between terms.
    columns: Vec<f64>,
}

/// Why a factorisation failed: the pivot of some equation j collapsed; `null_vector` is a
/// vector v (length n, zero beyond j, `v[j] = 1`) with A v = 0 up to rounding.
#[derive(Debug, Clone)]
pub(crate) struct SingularPivot {
    /// A null vector of A (A positive semi-definite); its last non-zero entry, 1, is at
    /// the equation whose pivot vanished.
    pub(crate) null_vector: Vec<f64>,
}

impl LdlFactor {
    /// Factorises `a`. Fails at the first pivot below `PIVOT_TOLERANCE` times its diagonal.
    pub(crate) fn new(a: &BandMatrix) -> Result<Self, SingularPivot> {
        #[cfg(test)]
        FACTORISATIONS.with(|c| c.set(c.get() + 1));
        let mut l = a.clone();
        let mut d = vec![0.0; a.n];
        for j in 0..a.n {
            let diag = a.get(j, j).abs();
            // rounding carried into this pivot: each term's multiplier L_jk was divided by
            // d_k, so its error grows with K_kk / d_k (see ROUNDING_MARGIN)
            let mut carried = diag;
            let dj = l.pivot(j, &d, |ljk, k| carried += ljk * ljk * a.get(k, k).abs());
            let noise = ROUNDING_MARGIN * f64::EPSILON * carried;
            if dj.is_nan() || dj <= PIVOT_TOLERANCE * diag || dj <= noise || !dj.is_finite() {
                return Err(SingularPivot { null_vector: null_vector(&l, &d, j) });
            }
            d[j] = dj;
            l.eliminate_below(j, &d);
        }
        let columns = l.columns_below_diagonal();
        Ok(LdlFactor { l, d, columns })
    }

    /// An upper bound of the rounding of this factorisation over the smallest eigenvalue
    /// of the matrix it factorised: below 1 the factorised matrix is certainly not
    /// singular, well below 1 it is certainly not near singular. Dimensionless.
    ///
    /// The argument. The computed factors are the exact factors of A + dA with
    /// |dA| <= gamma |L| |D| |L^T| entry by entry, gamma = (b + 1) eps / (1 - (b + 1) eps)
    /// for half bandwidth b, since every inner product has at most b + 1 terms (the
    /// backward error of Gaussian elimination with U = D L^T: Higham, Accuracy and
    /// Stability of Numerical Algorithms, 2nd ed., Thm. 9.3, from memory). So
    /// ||dA||_2 <= gamma || |L| |D| |L^T| ||_inf (a symmetric matrix: the 2-norm is at
    /// most the largest row sum), computed here in O(n b).
    ///
    /// The smallest eigenvalue of L D L^T from the factors: its inverse is
    /// sum_j x_j x_j^T / d_j with x_j = L^-T e_j (row j of L^-1), so
    /// 1 / lambda_min <= trace = sum_j |x_j|^2 / d_j. The rows obey
    /// x_j = e_j - sum_k L_jk x_k over the band, so their inner products with the b rows
    /// before them follow from those rows' own (a window of b + 1 rows), O(n b^2) in all:
    /// the cost of the factorisation itself. |x_j|^2 is the pivot growth: each earlier
    /// pivot d_k much smaller than its diagonal makes the rows after it long, and every
    /// rounding error of the factors reaches pivot j through x_j (d_j moves by
    /// x_j^T dA x_j). A per-pivot estimate such as eps * (K_jj + sum L_jk^2 K_kk) misses
    /// that carried growth.
    ///
    /// Returned: gamma * || |L| |D| |L^T| ||_inf * trace (`backward_error_norm`,
    /// `inverse_trace`). When it is r < 1, A itself has
    /// lambda_min(A) >= lambda_min(L D L^T) - ||dA|| >= (1/r - 1) ||dA|| > 0 (first order
    /// in eps). Infinite when the bound cannot be formed (a non-finite entry).
    pub(crate) fn rounding_over_smallest_eigenvalue(&self) -> f64 {
        let unit = (self.l.bandwidth + 1) as f64 * f64::EPSILON;
        let gamma = unit / (1.0 - unit);
        let ratio = gamma * self.backward_error_norm() * self.inverse_trace();
        if ratio.is_finite() {
            ratio
        } else {
            f64::INFINITY
        }
    }

    /// || |L| |D| |L^T| ||_inf, the largest row sum: row i is sum_k |L_ik| d_k c_k with
    /// c_k the sum of column k of |L|. O(n b).
    fn backward_error_norm(&self) -> f64 {
        let n = self.l.n;
        let bw = self.l.bandwidth;
        let column_weight: Vec<f64> = (0..n)
            .map(|k| {
                let hi = (k + bw).min(n - 1);
                self.d[k] * (k..=hi).map(|m| self.l.data[self.l.idx(m, k)].abs()).sum::<f64>()
            })
            .collect();
        (0..n)
            .map(|i| {
                (i.saturating_sub(bw)..=i)
                    .map(|k| self.l.data[self.l.idx(i, k)].abs() * column_weight[k])
                    .sum()
            })
            .fold(0.0, f64::max)
    }

    /// trace((L D L^T)^-1) = sum_j |x_j|^2 / d_j, x_j row j of L^-1, from a window of the
    /// inner products of the last b + 1 rows: x_j = e_j - sum_k L_jk x_k. O(n b^2).
    fn inverse_trace(&self) -> f64 {
        let n = self.l.n;
        let bw = self.l.bandwidth;
        let w = bw + 1;
        // gram[p * w + q]: inner product of the rows held in slots p and q; row k is held
        // in slot k % w while it is in the window
        let mut gram = vec![0.0; w * w];
        // per row j, for the window rows k = lo + t: L_jk, their slot, x_j . x_k
        let mut multipliers = vec![0.0; bw];
        let mut slots = vec![0usize; bw];
        let mut with_window = vec![0.0; bw];
        let mut trace = 0.0;
        for j in 0..n {
            let lo = j.saturating_sub(bw);
            let count = j - lo;
            for (t, k) in (lo..j).enumerate() {
                multipliers[t] = self.l.data[self.l.idx(j, k)];
                slots[t] = k % w;
            }
            // x_j . x_m = -sum_k L_jk (x_k . x_m) for m < j (x_m has no entry j)
            for tm in 0..count {
                let row = &gram[slots[tm] * w..(slots[tm] + 1) * w];
                let mut s = 0.0;
                for tk in 0..count {
                    s -= multipliers[tk] * row[slots[tk]];
                }
                with_window[tm] = s;
            }
            // x_j . x_j = 1 - sum_k L_jk (x_j . x_k)
            let mut own = 1.0;
            for t in 0..count {
                own -= multipliers[t] * with_window[t];
            }
            // at least 1 in exact arithmetic (e_j is orthogonal to the window's rows); less
            // is cancellation among long rows, which carry the trace themselves
            let own = own.max(1.0);
            let slot = j % w;
            for t in 0..count {
                gram[slot * w + slots[t]] = with_window[t];
                gram[slots[t] * w + slot] = with_window[t];
            }
            gram[slot * w + slot] = own;
            trace += own / self.d[j];
        }
        trace
    }

    /// Solves A x = b in place: on entry `b` holds the right-hand side, on return x.
    ///
    /// Errors (`OutOfRange`, `b` unchanged) when `b` does not have one entry per equation.
    pub(crate) fn solve_in_place(&self, b: &mut [f64]) -> Result<(), StaticsError> {
        let n = self.l.n;
        if b.len() != n {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("right-hand side".into()),
                message: format!(
                    "has {} entries but the factorised matrix has order {n}; pass one entry per equation",
                    b.len()
                ),
            });
        }
        let bw = self.l.bandwidth;
        let stride = bw + 1;
        let data = &self.l.data;
        // The loops below run over slices (no index arithmetic or bounds check per term)
        // and sum in the same order as the textbook's loops over k, so the results are
        // the same to the last bit; this solve is the inner loop of every static solve
        // and influence line (the eigenvalue iteration takes its vectors together:
        // `solve_rows_in_place`). It is not that block solve with one column: measured,
        // an edit's analysis took 18% longer so (0.431 -> 0.510 ms at 16 panels).
        // L y = b: row i of the band holds L_ik at offset i - k, the terms k = lo..i taken
        // in increasing k
        for i in 0..n {
            let lo = i.saturating_sub(bw);
            let row = &data[i * stride + 1..=i * stride + (i - lo)];
            let (done, rest) = b.split_at_mut(i);
            let mut s = rest[0];
            for (l, bk) in row.iter().rev().zip(&done[lo..]) {
                s -= l * bk;
            }
            rest[0] = s;
        }
        for (bi, di) in b.iter_mut().zip(&self.d) {
            *bi /= di;
        }
        // L^T x = z: column i of L below the diagonal, L_ki for k = i + 1..=hi
        for i in (0..n).rev() {
            let hi = (i + bw).min(n - 1);
            let (head, tail) = b.split_at_mut(i + 1);
            let mut s = head[i];
            for (l, bk) in self.columns[i * bw..i * bw + (hi - i)].iter().zip(tail.iter()) {
                s -= l * bk;
            }
            head[i] = s;
        }
        Ok(())
    }
}

impl LdlFactor {
    /// Solves A X = B in place for `width` right-hand sides at once: `x` holds B row by
    /// row (entry (i, c) at `i * width + c`, n rows) and on return X. Each column's sums
    /// run in the same order as [`LdlFactor::solve_in_place`]'s, so every column equals
    /// a separate solve to the last bit; taken together, each entry of the factors is
    /// read once per block of four columns (then two, then one), whose entries of the row
    /// being solved stay in registers while the factors run by, and the columns' sums,
    /// independent of each other, overlap in the processor. Measured with callgrind on
    /// the sizing's rib stability of the demo at 16 panels (8 to 11 columns), the blocks
    /// took about 25% fewer instructions than a row of all the columns at a time.
    ///
    /// Errors (`OutOfRange`, `x` unchanged) when `x` does not have `width` entries per
    /// equation. A `width` of 0 is no work.
    pub(crate) fn solve_rows_in_place(&self, x: &mut [f64], width: usize) -> Result<(), StaticsError> {
        let n = self.l.n;
        if x.len() != n * width {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("right-hand sides".into()),
                message: format!(
                    "have {} entries, not {width} for each of the {n} equations of the factorised matrix; \
                     pass one row per equation",
                    x.len()
                ),
            });
        }
        if width == 0 {
            return Ok(());
        }
        let mut first = 0;
        for lanes in lane_blocks(width) {
            match lanes {
                4 => self.solve_lanes::<4>(x, width, first),
                2 => self.solve_lanes::<2>(x, width, first),
                _ => self.solve_lanes::<1>(x, width, first),
            }
            first += lanes;
        }
        Ok(())
    }

    /// [`LdlFactor::solve_rows_in_place`] for the `L` columns from `first` on: their
    /// entries of a row held in registers while the factors' row or column runs by, the
    /// terms taken in the order of [`LdlFactor::solve_in_place`].
    fn solve_lanes<const L: usize>(&self, x: &mut [f64], width: usize, first: usize) {
        let n = self.l.n;
        let bw = self.l.bandwidth;
        let stride = bw + 1;
        let data = &self.l.data;
        // L Y = B: row i less L_ik times row k, k = lo..i in increasing k
        for i in 0..n {
            let lo = i.saturating_sub(bw);
            let (done, rest) = x.split_at_mut(i * width);
            let mut acc = lanes_of::<L>(rest, first);
            let row = &data[i * stride + 1..=i * stride + (i - lo)];
            for (l, xk) in row.iter().rev().zip(done[lo * width..].chunks_exact(width)) {
                let xk = lanes_of::<L>(xk, first);
                for (a, v) in acc.iter_mut().zip(xk) {
                    *a -= l * v;
                }
            }
            rest[first..first + L].copy_from_slice(&acc);
        }
        // Z = D^-1 Y, then L^T X = Z: row i less L_ki times row k, k = i + 1..=hi in
        // increasing k
        for i in (0..n).rev() {
            let hi = (i + bw).min(n - 1);
            let (head, tail) = x.split_at_mut((i + 1) * width);
            let row_i = &mut head[i * width..];
            let mut acc = lanes_of::<L>(row_i, first).map(|v| v / self.d[i]);
            let column = &self.columns[i * bw..i * bw + (hi - i)];
            for (l, xk) in column.iter().zip(tail.chunks_exact(width)) {
                let xk = lanes_of::<L>(xk, first);
                for (a, v) in acc.iter_mut().zip(xk) {
                    *a -= l * v;
                }
            }
            row_i[first..first + L].copy_from_slice(&acc);
        }
    }
}

/// How `width` columns are taken in blocks: fours, then a two and a one as needed.
fn lane_blocks(width: usize) -> impl Iterator<Item = usize> {
    let fours = std::iter::repeat_n(4, width / 4);
    fours.chain((width % 4 >= 2).then_some(2)).chain((width % 2 == 1).then_some(1))
}

/// The `L` entries of `row` from `first` on, as an array (kept in registers).
fn lanes_of<const L: usize>(row: &[f64], first: usize) -> [f64; L] {
    let mut out = [0.0; L];
    out.copy_from_slice(&row[first..first + L]);
    out
}

impl BandMatrix {
    /// Y = A X for the symmetric matrix A and `width` vectors at once, stored row by row
    /// as in [`LdlFactor::solve_rows_in_place`]; each column equals
    /// [`BandMatrix::mul_into`] of that column to the last bit (the same sums in the same
    /// order).
    ///
    /// Errors (`OutOfRange`, `y` unchanged) when `x` or `y` does not have `width` entries
    /// per equation.
    pub(crate) fn mul_rows_into(&self, x: &[f64], y: &mut [f64], width: usize) -> Result<(), StaticsError> {
        let n = self.n;
        if x.len() != n * width || y.len() != n * width {
            return Err(StaticsError::OutOfRange {
                location: Location::Part("matrix product".into()),
                message: format!(
                    "blocks of {} and {} entries for {width} vectors and a matrix of order {n}; pass one \
                     row per equation",
                    x.len(),
                    y.len()
                ),
            });
        }
        if width == 0 {
            return Ok(());
        }
        y.fill(0.0);
        let mut first = 0;
        for lanes in lane_blocks(width) {
            match lanes {
                4 => self.mul_lanes::<4>(x, y, width, first),
                2 => self.mul_lanes::<2>(x, y, width, first),
                _ => self.mul_lanes::<1>(x, y, width, first),
            }
            first += lanes;
        }
        Ok(())
    }

    /// [`BandMatrix::mul_rows_into`] for the `L` columns from `first` on (`y` zeroed), the
    /// terms of each entry added in the order of [`BandMatrix::mul_into`].
    fn mul_lanes<const L: usize>(&self, x: &[f64], y: &mut [f64], width: usize, first: usize) {
        let stride = self.bandwidth + 1;
        for i in 0..self.n {
            let lo = i.saturating_sub(self.bandwidth);
            let row = &self.data[i * stride..(i + 1) * stride];
            let xi = lanes_of::<L>(&x[i * width..], first);
            let mut acc = xi.map(|v| row[0] * v);
            let (before, from_i) = y.split_at_mut(i * width);
            let others = x[lo * width..i * width]
                .chunks_exact(width)
                .zip(before[lo * width..].chunks_exact_mut(width));
            for ((xj, yj), v) in others.zip(row[1..=i - lo].iter().rev()) {
                let xj = lanes_of::<L>(xj, first);
                for (a, w) in acc.iter_mut().zip(xj) {
                    *a += v * w;
                }
                for (t, w) in yj[first..first + L].iter_mut().zip(xi) {
                    *t += v * w;
                }
            }
            for (t, a) in from_i[first..first + L].iter_mut().zip(acc) {
                *t += a;
            }
        }
    }
}

/// Null vector of the leading (index+1) block when pivot `index` vanished: solve
/// L0^T v = e_index by back substitution (then L0 D0 L0^T v = L0 D0 e_index = 0).
fn null_vector(l: &BandMatrix, _d: &[f64], index: usize) -> Vec<f64> {
    let n = l.n;
    let bw = l.bandwidth;
    let mut v = vec![0.0; n];
    v[index] = 1.0;
    for i in (0..index).rev() {
        let hi = (i + bw).min(index);
        let mut s = 0.0;
        for (k, vk) in v.iter().enumerate().take(hi + 1).skip(i + 1) {
            s -= l.data[l.idx(k, i)] * vk;
        }
        v[i] = s;
    }
    v
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The 3 x 3 second-difference matrix [2 -1 0; -1 2 -1; 0 -1 2] in band form.
    fn second_difference() -> BandMatrix {
        let mut a = BandMatrix::zeros(3, 1);
        for i in 0..3 {
            a.add(i, i, 2.0).expect("in band");
        }
        a.add(1, 0, -1.0).expect("in band");
        a.add(2, 1, -1.0).expect("in band");
        a
    }

    #[test]
    fn band_ldl_solves_tridiagonal_system() {
        // [2 -1 0; -1 2 -1; 0 -1 2] x = [1 0 1] has x = [1 1 1]
        let a = second_difference();
        let f = LdlFactor::new(&a).expect("positive definite");
        let mut b = vec![1.0, 0.0, 1.0];
        f.solve_in_place(&mut b).expect("right length");
        for x in b {
            assert!((x - 1.0).abs() < 1e-14);
        }
    }

    #[test]
    fn singular_matrix_reports_null_vector() {
        // a free-free spring pair: [1 -1; -1 1] has null vector [1 1]
        let mut a = BandMatrix::zeros(2, 1);
        a.add(0, 0, 1.0).expect("in band");
        a.add(1, 1, 1.0).expect("in band");
        a.add(1, 0, -1.0).expect("in band");
        let e = LdlFactor::new(&a).expect_err("singular");
        // the second pivot collapses: v = [1, 1]
        assert_eq!(e.null_vector.len(), 2);
        assert!((e.null_vector[0] - 1.0).abs() < 1e-14 && e.null_vector[1] == 1.0);
    }

    /// The 3 x 3 second-difference matrix [2 -1 0; -1 2 -1; 0 -1 2]: its inverse is
    /// [3 2 1; 2 4 2; 1 2 3] / 4 (worked by hand), trace 2.5; its factors have
    /// L = [1; -1/2 1; 0 -2/3 1], D = (2, 3/2, 4/3), so |L| |D| |L^T| = |A| (worked by
    /// hand), largest row sum 4; half bandwidth 1, so gamma = 2 eps / (1 - 2 eps).
    #[test]
    fn rounding_bound_of_the_second_difference_matrix_is_worked_by_hand() {
        let a = second_difference();
        let f = LdlFactor::new(&a).expect("positive definite");
        assert!((f.inverse_trace() - 2.5).abs() < 1e-14, "{}", f.inverse_trace());
        assert!((f.backward_error_norm() - 4.0).abs() < 1e-14, "{}", f.backward_error_norm());
        let gamma = 2.0 * f64::EPSILON / (1.0 - 2.0 * f64::EPSILON);
        let ratio = f.rounding_over_smallest_eigenvalue();
        assert!((ratio / (10.0 * gamma) - 1.0).abs() < 1e-12, "{ratio:e}");
    }

    /// The trace of the inverse from the window of row products against a dense inverse
    /// (nalgebra's LU, independent code) of B^T B + 1e-6 I, B with entries on four
    /// diagonals (half bandwidth 3 for the product) and one small diagonal entry: a pivot
    /// below 1e-3 of its diagonal, so the rows of L^-1 after it are long.
    /// A symmetric positive definite band matrix of half bandwidth 3 (B^T B for a banded
    /// B, one small diagonal entry for a small pivot) and the same matrix dense.
    fn conditioned_band(n: usize) -> (BandMatrix, nalgebra::DMatrix<f64>) {
        let bw = 3;
        let b = nalgebra::DMatrix::<f64>::from_fn(n, n, |r, c| match c as i64 - r as i64 {
            -1 => 1.0,
            0 if r == 6 => 1e-3,
            0 => 1.0 + 0.01 * (r % 3) as f64,
            1 => 0.5,
            2 => -0.25,
            _ => 0.0,
        });
        let dense = b.transpose() * &b + nalgebra::DMatrix::<f64>::identity(n, n) * 1e-6;
        let mut a = BandMatrix::zeros(n, bw);
        for i in 0..n {
            for j in 0..=i {
                if i - j <= bw {
                    a.add(i, j, dense[(i, j)]).expect("in band");
                } else {
                    assert_eq!(dense[(i, j)], 0.0, "({i}, {j}) outside the band");
                }
            }
        }
        (a, dense)
    }

    #[test]
    fn inverse_trace_matches_a_dense_inverse() {
        let n = 14;
        let (a, dense) = conditioned_band(n);
        let f = LdlFactor::new(&a).expect("positive definite");
        let smallest_pivot_ratio = (0..n).map(|j| f.d[j] / dense[(j, j)]).fold(f64::INFINITY, f64::min);
        let trace = dense.clone().try_inverse().expect("regular").trace();
        assert!(smallest_pivot_ratio < 1e-3, "{smallest_pivot_ratio:e}");
        assert!((f.inverse_trace() / trace - 1.0).abs() < 1e-8, "{} against {trace}", f.inverse_trace());
    }

    /// Regression: `add` outside the band was only checked by a `debug_assert`; in a
    /// release build `add(2, 0)` on a half bandwidth of 1 silently added to entry (3, 3)
    /// instead. Now it is an error in every build and nothing is written.
    #[test]
    fn add_outside_the_band_is_an_error_and_writes_nothing() {
        let mut a = BandMatrix::zeros(4, 1);
        for (i, j) in [(2, 0), (0, 2), (3, 0), (4, 4), (4, 3)] {
            match a.add(i, j, 5.0) {
                Err(StaticsError::OutOfRange { location: Location::Part(what), message }) => {
                    assert_eq!(what, "banded stiffness matrix");
                    assert!(message.contains("order 4 and half bandwidth 1"), "{message}");
                }
                other => panic!("({i}, {j}): expected OutOfRange, got {other:?}"),
            }
        }
        for i in 0..4 {
            for j in 0..4 {
                assert_eq!(a.get(i, j), 0.0, "entry ({i}, {j}) was written");
            }
        }
        a.add(3, 2, 1.5).expect("in band");
        assert_eq!((a.get(2, 3), a.get(3, 3)), (1.5, 0.0));
    }

    /// Regression: a right-hand side of the wrong length panicked on an index (too
    /// short) or was silently half solved (too long); now it is an error and `b` is left
    /// as it was.
    #[test]
    fn right_hand_side_of_the_wrong_length_is_an_error() {
        let mut a = BandMatrix::zeros(2, 1);
        a.add(0, 0, 2.0).expect("in band");
        a.add(1, 1, 2.0).expect("in band");
        let f = LdlFactor::new(&a).expect("positive definite");
        for mut b in [vec![1.0], vec![1.0, 2.0, 3.0], vec![]] {
            let before = b.clone();
            match f.solve_in_place(&mut b) {
                Err(StaticsError::OutOfRange { location: Location::Part(what), message }) => {
                    assert_eq!(what, "right-hand side");
                    assert!(message.contains("order 2"), "{message}");
                }
                other => panic!("length {}: expected OutOfRange, got {other:?}", before.len()),
            }
            assert_eq!(b, before);
        }
    }

    /// Several right-hand sides solved and multiplied together (1 to 12 of them) give,
    /// column by column, the single-vector results to the last bit (the same sums in the
    /// same order), and those agree with nalgebra's dense LU solve and product of the same matrix.
    #[test]
    fn block_solves_and_products_equal_the_single_ones_bit_for_bit() {
        // every mix of the kernels' blocks of four, two and one columns
        for width in 1..=12 {
            block_solve_and_product_of_width(width);
        }
    }

    fn block_solve_and_product_of_width(width: usize) {
        let n = 14;
        let (a, dense) = conditioned_band(n);
        let f = LdlFactor::new(&a).expect("positive definite");
        let mut state = 0x2545_F491_4F6C_DD1Du64;
        let mut random = || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            (state >> 11) as f64 / (1u64 << 52) as f64 - 1.0
        };
        let columns: Vec<Vec<f64>> = (0..width).map(|_| (0..n).map(|_| random()).collect()).collect();
        let rows: Vec<f64> = (0..n).flat_map(|i| columns.iter().map(move |c| c[i])).collect();
        let mut solved = rows.clone();
        f.solve_rows_in_place(&mut solved, width).expect("fits");
        let mut product = vec![0.0; n * width];
        a.mul_rows_into(&rows, &mut product, width).expect("fits");
        let lu = dense.clone().lu();
        for (c, column) in columns.iter().enumerate() {
            let mut one = column.clone();
            f.solve_in_place(&mut one).expect("fits");
            let mut times = vec![0.0; n];
            a.mul_into(column, &mut times).expect("fits");
            let rhs = nalgebra::DVector::from_column_slice(column);
            let reference = lu.solve(&rhs).expect("regular");
            let reference_product = &dense * &rhs;
            for i in 0..n {
                assert_eq!(solved[i * width + c].to_bits(), one[i].to_bits(), "solve ({i}, {c})");
                assert_eq!(product[i * width + c].to_bits(), times[i].to_bits(), "product ({i}, {c})");
                assert!((one[i] - reference[i]).abs() <= 1e-9 * reference.amax(), "solve ({i}, {c})");
                assert!((times[i] - reference_product[i]).abs() <= 1e-14, "product ({i}, {c})");
            }
        }
        // blocks of the wrong size are refused and left as they were
        let mut short = vec![1.0; n * width - 1];
        assert!(f.solve_rows_in_place(&mut short, width).is_err());
        assert_eq!(short, vec![1.0; n * width - 1]);
        assert!(a.mul_rows_into(&rows, &mut short, width).is_err());
        assert!(f.solve_rows_in_place(&mut [], 0).is_ok());
    }

    /// The second-difference matrix of order 3 has eigenvalues 2 - sqrt 2, 2, 2 + sqrt 2
    /// (worked by hand from its characteristic polynomial): the count of negative pivots
    /// of A - sigma I is the number of them below sigma.
    #[test]
    fn negative_pivots_count_the_eigenvalues_below_a_shift() {
        let a = second_difference();
        for (sigma, below) in [(0.5, 0), (0.8, 1), (1.9, 1), (2.1, 2), (3.3, 2), (3.5, 3)] {
            assert_eq!(a.minus_scaled_diagonal(sigma, &[1.0; 3]).negative_pivots(), Some(below), "{sigma}");
            let mut identity = BandMatrix::zeros(3, 0);
            for i in 0..3 {
                identity.add(i, i, 1.0).expect("in band");
            }
            let shifted = a.minus_scaled(sigma, &identity).expect("same order");
            assert_eq!(shifted.negative_pivots(), Some(below), "{sigma}");
        }
        // exactly on the middle eigenvalue the first pivot of [0 -1 0; -1 0 -1; 0 -1 0] is 0
        assert_eq!(a.minus_scaled_diagonal(2.0, &[1.0; 3]).negative_pivots(), None);
    }
}
