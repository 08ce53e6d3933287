"""Reference values for the chemostat and batch with Pirt maintenance, computed independently of the
TypeScript library: SciPy root finders, a bounded scalar minimiser and an ODE integrator on the model's
balances, never the closed forms the library uses.

Model (Monod 1949 growth; Pirt 1965 maintenance, Proc. R. Soc. Lond. B 163:224):
  mu = mu_max*S/(Ks + S),  dX/dt = (mu - D)*X,  dS/dt = D*(S0 - S) - (mu/Y + m)*X

Run from the repository root:
  python3 tests/chemistry/reference/chemostat-maintenance.py > tests/chemistry/reference/chemostat-maintenance.json
"""
import json
import math

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq, minimize_scalar

TIGHT = dict(xtol=1e-15, rtol=4 * np.finfo(float).eps, maxiter=500)


def monod(c, s):
    return c["muMaxPerH"] * s / (c["ksGPerL"] + s)


def steady_state(c, d):
    """Solve the two balances at dX/dt = dS/dt = 0 with X > 0 by root finding on S."""
    s0, y, m = c["feedSubstrateGPerL"], c["yieldXS"], c["maintenanceGPerGH"]
    if monod(c, s0) <= d:
        return {"substrateGPerL": s0, "biomassGPerL": 0.0, "productivityGPerLH": 0.0, "washout": True}
    # biomass balance with X > 0: mu(S) = D
    s = brentq(lambda s: monod(c, s) - d, 0.0, s0, **TIGHT)
    # substrate balance: D*(S0 - S) = (mu/Y + m)*X
    x = d * (s0 - s) / (monod(c, s) / y + m)
    return {"substrateGPerL": s, "biomassGPerL": x, "productivityGPerLH": d * x, "washout": False}


def critical_dilution(c):
    # washout where the only steady state left is X = 0: the largest D with mu(S0) > D
    return monod(c, c["feedSubstrateGPerL"])


def optimal_dilution(c):
    d_crit = critical_dilution(c)

    def productivity(d):
        return steady_state(c, d)["productivityGPerLH"]

    bounded = minimize_scalar(lambda d: -productivity(d), bounds=(0.0, d_crit), method="bounded",
                              options={"xatol": 1e-12})
    # Sharper: the root of d(D*X)/dD by central differences of the numerically solved steady state,
    # bracketed around the bounded minimiser's answer.
    h = 1e-6 * d_crit

    def slope(d):
        return (productivity(d + h) - productivity(d - h)) / (2 * h)

    lo, hi = bounded.x - 1e-3 * d_crit, min(bounded.x + 1e-3 * d_crit, d_crit - 2 * h)
    root = brentq(slope, lo, hi, xtol=1e-14, rtol=1e-13)
    return bounded.x, root


def batch(c):
    """Monod batch with maintenance to the given conversion, by event detection in solve_ivp."""
    y, m, x0, s0 = c["yieldXS"], c["maintenanceGPerGH"], c["inoculumGPerL"], c["substrateGPerL"]
    s_end = (1 - c["conversion"]) * s0

    def rhs(_t, state):
        x, s = state
        mu = monod(c, max(s, 0.0))
        return [mu * x, -(mu / y + m) * x]

    def reached(_t, state):
        return state[1] - s_end

    reached.terminal = True
    reached.direction = -1
    sol = solve_ivp(rhs, (0.0, 1e4), [x0, s0], method="DOP853", rtol=1e-13, atol=1e-14, events=reached)
    t_end = float(sol.t_events[0][0])
    x_end = float(sol.y_events[0][0][0])
    return {"growthTimeH": t_end, "finalBiomassGPerL": x_end}


cultures = {
    "pageDefaults": {"muMaxPerH": 0.6, "ksGPerL": 0.05, "yieldXS": 0.5, "feedSubstrateGPerL": 20.0,
                     "maintenanceGPerGH": 0.05, "dilutionsPerH": [0.05, 0.3, 0.55]},
    "slowerCulture": {"muMaxPerH": 0.5, "ksGPerL": 0.2, "yieldXS": 0.5, "feedSubstrateGPerL": 10.0,
                      "maintenanceGPerGH": 0.1, "dilutionsPerH": [0.1, 0.4]},
    "maintenanceHeavy": {"muMaxPerH": 0.05, "ksGPerL": 0.1, "yieldXS": 0.4, "feedSubstrateGPerL": 5.0,
                         "maintenanceGPerGH": 0.02, "dilutionsPerH": [0.01, 0.03]},
}

out = {
    "generatedBy": "tests/chemistry/reference/chemostat-maintenance.py",
    "method": {
        "steadyState": "scipy.optimize.brentq on mu(S) = D, then the substrate balance D(S0 - S) = (mu/Y + m)X",
        "optimalDilution": "scipy.optimize.minimize_scalar (bounded Brent) on -D*X, refined by brentq on the central-difference slope",
        "batch": "scipy.integrate.solve_ivp DOP853 (rtol 1e-13) with a terminal event at S = (1 - conversion)*S0",
    },
    "versions": {"scipy": scipy.__version__, "numpy": np.__version__},
    "chemostat": {},
    "batch": {},
}
for name, c in cultures.items():
    bounded, root = optimal_dilution(c)
    out["chemostat"][name] = {
        "input": {k: v for k, v in c.items() if k != "dilutionsPerH"},
        "points": [{"dilutionPerH": d, **steady_state(c, d)} for d in c["dilutionsPerH"]],
        "criticalDilutionPerH": critical_dilution(c),
        "optimalDilutionPerH": root,
        "optimalDilutionBoundedBrentPerH": bounded,
        "optimalProductivityGPerLH": steady_state(c, root)["productivityGPerLH"],
    }

batches = {
    "testCulture": {"muMaxPerH": 0.5, "ksGPerL": 0.2, "yieldXS": 0.5, "substrateGPerL": 10.0,
                    "inoculumGPerL": 0.1, "conversion": 0.99, "maintenanceGPerGH": 0.05},
    "pageDefaults": {"muMaxPerH": 0.6, "ksGPerL": 0.05, "yieldXS": 0.5, "substrateGPerL": 20.0,
                     "inoculumGPerL": 0.1, "conversion": 0.99, "maintenanceGPerGH": 0.05},
}
for name, c in batches.items():
    out["batch"][name] = {"input": c, **batch(c)}

print(json.dumps(out, indent="\t"))
