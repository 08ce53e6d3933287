/**
 * The coefficients of RODAS, the stiffly accurate, L-stable Rosenbrock method of order 4 with an
 * embedded method of order 3: Hairer & Wanner, Solving Ordinary Differential Equations II (2nd ed.,
 * Springer 1996), §IV.7, written in the variables uᵢ that spare the Jacobian products. The values,
 * those of the continuous output included, are the authors' Fortran code rodas.f (subroutine ROCOE,
 * METH = 1; output function CONTRO), digit for digit.
 *
 * Stage i solves (I/(hγ) − J) uᵢ = f(t + cᵢh, y₀ + Σⱼ aᵢⱼ uⱼ) + Σⱼ (cᵢⱼ/h) uⱼ + h·dᵢ·∂f/∂t; stages 5
 * and 6 are taken at t + h, the embedded solution is y₀ + Σⱼ a₅ⱼuⱼ + u₅ and the solution adds u₆,
 * so u₆ is the error estimate. The dense output is
 *   y(t₀ + θh) = (1 − θ)y₀ + θ(y₁ + (1 − θ)(Σⱼ d₂ⱼuⱼ + θ Σⱼ d₃ⱼuⱼ)).
 */
export const RODAS = {
	gamma: 0.25,

	/** the stages' times t + cᵢh (cᵢⱼ below are the coupling coefficients; rodas.f's names) */
	c2: 0.386,
	c3: 0.21,
	c4: 0.63,

	d1: 0.25,
	d2: -0.1043,
	d3: 0.1035,
	d4: -0.03620000000000023,

	a21: 1.544,
	a31: 0.9466785280815826,
	a32: 0.2557011698983284,
	a41: 3.314825187068521,
	a42: 2.896124015972201,
	a43: 0.9986419139977817,
	a51: 1.221224509226641,
	a52: 6.019134481288629,
	a53: 12.53708332932087,
	a54: -0.687886036105895,

	c21: -5.6688,
	c31: -2.430093356833875,
	c32: -0.2063599157091915,
	c41: -0.1073529058151375,
	c42: -9.594562251023355,
	c43: -20.47028614809616,
	c51: 7.496443313967647,
	c52: -10.24680431464352,
	c53: -33.99990352819905,
	c54: 11.7089089320616,
	c61: 8.083246795921522,
	c62: -7.981132988064893,
	c63: -31.52159432874371,
	c64: 16.31930543123136,
	c65: -6.058818238834054,

	/** dense output, first correction: Σⱼ d₂ⱼuⱼ */
	d21: 10.12623508344586,
	d22: -7.487995877610167,
	d23: -34.80091861555747,
	d24: -7.992771707568823,
	d25: 1.025137723295662,
	/** dense output, second correction: Σⱼ d₃ⱼuⱼ */
	d31: -0.6762803392801253,
	d32: 6.087714651680015,
	d33: 16.43084320892478,
	d34: 24.76722511418386,
	d35: -6.594389125716872
} as const;

/** The embedded method's order plus one: the power of h in the error estimate. */
export const ERROR_ESTIMATE_ORDER = 4;
