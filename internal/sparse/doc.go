// Package sparse holds the linear algebra of the layout solver on plain
// slices: an LU factorisation by Gaussian elimination with partial pivoting
// that skips the zeros of a sparse matrix, its factors kept by rows of their
// non-zero entries, the Woodbury solve of a low-rank update of a factored
// matrix, and the step of iterative refinement. It knows nothing of
// layouts, shafts or loops: the solver assembles its torque systems and
// hands them over as row-major float64 slices. It is internal: nothing here
// is part of the public API.
//
// # LU factorisation
//
// Factor computes P·A = L·U of an n × n row-major A in place by the
// unblocked algorithm of LAPACK dgetf2 (first largest pivot in the column,
// multipliers scaled by the reciprocal of the pivot) and skips the zero
// entries of the pivot row and column, which leaves the arithmetic on the
// non-zero ones unchanged. Solve solves with those factors. Factors keeps
// the same factors by rows of their non-zero entries (L strictly below the
// diagonal, U strictly above, the diagonal apart), so a solve with a matrix
// of two or three entries a row costs a few operations a row.
//
// Source: Matrix Computations, 4th ed., Johns Hopkins (2013), algorithm
// 3.4.1 (Gaussian elimination with partial pivoting); LAPACK Users' Guide,
// 3rd ed., SIAM (1999) (dgetf2).
//
// # Low-rank updates
//
// When A changes only by a low-rank term, A(δ) = A + U·Δ·Vᵀ with Δ
// diagonal, U selecting columns of the identity scaled by nothing and V
// selecting columns, the solution follows from the factors of A by the
// Woodbury identity:
//
//	y = A⁻¹·b,  W = A⁻¹·U
//	(I + Δ·Vᵀ·W)·s = Δ·Vᵀ·y,  x = y − W·s
//
// so that only a system of the rank of the update is solved. By the matrix
// determinant lemma det A(δ) = det A · det(I + Δ·Vᵀ·W): A(δ) is singular
// exactly when that small system is.
//
// Source: Matrix Computations (2013), section 2.1.4 (the
// Sherman–Morrison–Woodbury formula).
//
// # Refinement
//
// One step of iterative refinement computes r = b − A·x and the correction
// d = A⁻¹·r with the same factors and adds it to x; each step shrinks the
// error by about the machine epsilon times the condition number. Correct
// applies a correction and says whether it was negligible.
//
// Source: Matrix Computations (2013), section 3.5.3 (iterative refinement).
package sparse
