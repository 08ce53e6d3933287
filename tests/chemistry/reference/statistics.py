"""Reference χ² and Student t values for tests/chemistry/statistics.test.ts.

Run from the repository root:
    python3 tests/chemistry/reference/statistics.py > tests/chemistry/reference/statistics.json

Independent of the product's code: scipy.stats.chi2 and scipy.stats.t (SciPy's own special functions).
"""
import json

from scipy.stats import chi2
from scipy.stats import t as student_t

PROBABILITIES = [0.01, 0.05, 0.1, 0.5, 0.9, 0.95, 0.975, 0.99, 0.999]
CHI_SQUARE_DEGREES = [1, 2, 3, 4, 5, 7, 10, 15, 20, 30, 50, 100, 250, 1000]
T_DEGREES = [1, 2, 3, 4, 5, 7, 10, 15, 20, 30, 50, 100]
T975_TABLE_DEGREES = [101, 150, 250, 500, 1000, 5000]
CDF_POINTS = [0.1, 0.5, 1.0, 2.0, 3.841459, 5.0, 10.0, 20.0, 50.0, 120.0]

out = {
    "source": "scipy.stats.chi2 / scipy.stats.t, scipy " + __import__("scipy").__version__,
    "chiSquareQuantile": [
        {"probability": p, "degreesOfFreedom": k, "value": float(chi2.ppf(p, k))}
        for k in CHI_SQUARE_DEGREES
        for p in PROBABILITIES
    ],
    "chiSquareCdf": [
        {"x": x, "degreesOfFreedom": k, "value": float(chi2.cdf(x, k))}
        for k in CHI_SQUARE_DEGREES
        for x in CDF_POINTS
    ],
    "studentTQuantile": [
        {"probability": p, "degreesOfFreedom": k, "value": float(student_t.ppf(p, k))}
        for k in T_DEGREES
        for p in PROBABILITIES
    ],
    "studentT975": [
        {"degreesOfFreedom": k, "value": float(student_t.ppf(0.975, k))} for k in T975_TABLE_DEGREES
    ],
}
print(json.dumps(out, indent=1))
