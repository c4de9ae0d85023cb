// Package numeric holds the scalar numerics that several powersplit packages
// share and that gonum does not provide: a bracketed scalar root finder, a
// bracketed scalar minimiser and a bilinear interpolator on a rectilinear
// 2-D grid. It is internal: nothing here is part of the public API.
//
// # Root finding
//
// Brent finds a zero of a continuous f on a bracket [a, b] with
// f(a)·f(b) ≤ 0 by Brent's method: inverse quadratic interpolation or the
// secant step where they make progress, bisection where they do not, so the
// bracket shrinks at least as fast as bisection every few steps and the method
// converges superlinearly on smooth functions.
//
// Source: Algorithms for Minimization without Derivatives, Prentice-Hall
// (1973), chapter 4 (procedure zero); Computer Methods for Mathematical
// Computations, Prentice-Hall (1977), section 7.2 (zeroin).
//
// # Minimisation
//
// Minimize finds a local minimum of f on [a, b] by Brent's combination of
// golden-section search and successive parabolic interpolation. On a
// unimodal f the result is the minimum to within tol.
//
// Source: Algorithms for Minimization without Derivatives (1973), chapter 5
// (procedure localmin); Computer Methods for Mathematical Computations
// (1977), section 8.2 (fmin).
//
// # Grid interpolation
//
// Grid2 interpolates a table z[i][j] = f(xs[i], ys[j]) bilinearly on the cell
// xs[i] ≤ x ≤ xs[i+1], ys[j] ≤ y ≤ ys[j+1]:
//
//	f(x, y) ≈ (1−u)(1−v)·z₀₀ + u(1−v)·z₁₀ + (1−u)v·z₀₁ + uv·z₁₁,
//	u = (x − xᵢ)/(xᵢ₊₁ − xᵢ),  v = (y − yⱼ)/(yⱼ₊₁ − yⱼ).
//
// It reproduces any function of the form a + bx + cy + dxy exactly. A point
// outside the axes is an ErrOutOfRange, never a silent clamp.
//
// Every function here is allocation-free and returns an error, never NaN,
// for NaN input or a NaN function value.
package numeric
