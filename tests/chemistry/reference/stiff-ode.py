"""Reference values for the stiff integrator's tests (tests/chemistry/ode.test.ts), computed independently
of the TypeScript code with SciPy's implicit Radau IIA integrator at tight tolerances.

- Robertson's chemical kinetics (Robertson 1966; the ROBER problem of the Bari IVP test set):
  y1' = -0.04 y1 + 1e4 y2 y3, y2' = 0.04 y1 - 1e4 y2 y3 - 3e7 y2^2, y3' = 3e7 y2^2, y(0) = (1, 0, 0), at t = 40.
- The Van der Pol oscillator with mu = 1000 (Hairer & Wanner II, §IV.1; MATLAB's vdp1000):
  y1' = y2, y2' = mu (1 - y1^2) y2 - y1, y(0) = (2, 0), at t = 2 and t = 3000.

Run from the repository root:
  python3 tests/chemistry/reference/stiff-ode.py > tests/chemistry/reference/stiff-ode.json
"""
import json

import numpy as np
import scipy
from scipy.integrate import solve_ivp


def robertson(t, y):
    return [
        -0.04 * y[0] + 1e4 * y[1] * y[2],
        0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] ** 2,
        3e7 * y[1] ** 2,
    ]


def robertson_jacobian(t, y):
    return [
        [-0.04, 1e4 * y[2], 1e4 * y[1]],
        [0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]],
        [0.0, 6e7 * y[1], 0.0],
    ]


MU = 1000.0


def van_der_pol(t, y):
    return [y[1], MU * (1 - y[0] ** 2) * y[1] - y[0]]


def van_der_pol_jacobian(t, y):
    return [[0.0, 1.0], [-2 * MU * y[0] * y[1] - 1, MU * (1 - y[0] ** 2)]]


def solve(f, jac, y0, t_end, rtol, atol):
    sol = solve_ivp(f, (0.0, t_end), y0, method="Radau", jac=jac, rtol=rtol, atol=atol)
    if sol.status != 0:
        raise RuntimeError(sol.message)
    return [float(v) for v in sol.y[:, -1]]


def main():
    robertson_settings = {"rtol": 1e-12, "atol": 1e-16}
    vdp_settings = {"rtol": 1e-10, "atol": 1e-10}
    result = {
        "generatedBy": "tests/chemistry/reference/stiff-ode.py",
        "integrator": f"scipy {scipy.__version__} solve_ivp Radau with the analytic Jacobian, numpy {np.__version__}",
        "robertson": {
            **robertson_settings,
            "t": 40.0,
            "y": solve(robertson, robertson_jacobian, [1.0, 0.0, 0.0], 40.0, **robertson_settings),
        },
        "vanDerPol": {
            **vdp_settings,
            "mu": MU,
            "points": [
                {"t": t, "y": solve(van_der_pol, van_der_pol_jacobian, [2.0, 0.0], t, **vdp_settings)}
                for t in (2.0, 3000.0)
            ],
        },
    }
    print(json.dumps(result, indent=1))


if __name__ == "__main__":
    main()
