"""
Independent solution of one feed-design linear program, for tests/chemistry/feed-design.test.ts.

Run:  python3 tests/chemistry/reference/feed-design-lp.py > tests/chemistry/reference/feed-design-lp.json

Least total mass of five candidates in one feed of 2 L so that it brings the grams each nutrient
still needs, within each component's solubility, an osmolality limit and a dissolved-solids limit,
each kept 0.2 % below the stated value (the designer's margin for rounding its lines to 4 figures).
Molar masses from IUPAC 2021 standard atomic weights (Prohaska et al., Pure Appl. Chem. 94:573, 2022);
osmotic coefficients at physiological concentration, 37 °C (KCl 0.92, Na2SO4 0.74, glucose 1.01;
chemistry/REFERENCES.md), used by analogy for NH4Cl (as KCl) and the sulfates (as Na2SO4).
Solved with scipy.optimize.linprog (HiGHS), which shares no code with javascript-lp-solver. The least
total mass is reached by a whole family of mixes here, so the output gives, per component, the range
its mass takes across that family.
"""
import json
import numpy as np
from scipy.optimize import linprog

W = {"H": 1.008, "C": 12.011, "N": 14.007, "O": 15.999, "S": 32.06, "Cl": 35.45, "K": 39.0983}

def mass(formula):
    return sum(W[e] * n for e, n in formula.items())

# id: (elements, ions per unit, phi, solubility g/L at 25 °C)
candidates = {
    "ammonium-chloride": ({"N": 1, "H": 4, "Cl": 1}, 2, 0.92, 395),
    "ammonium-sulfate": ({"N": 2, "H": 8, "S": 1, "O": 4}, 3, 0.74, 764),
    "potassium-chloride": ({"K": 1, "Cl": 1}, 2, 0.92, 355),
    "potassium-sulfate": ({"K": 2, "S": 1, "O": 4}, 3, 0.74, 120),
    "d-glucose": ({"C": 6, "H": 12, "O": 6}, 1, 1.01, 909),
}
ids = list(candidates)
initial_l, feed_l = 10.0, 2.0
# key: (safety factor × demand in g per L of final volume, g already in the basal medium)
needs = {"d-glucose": (40.0, 0.0), "N": (3.0, 3.0), "K": (2.0, 2.0), "S": (0.5, 0.5)}
osm_max, solids_max, keep = 3600.0, 700.0, 1 - 2e-3

def content(cid, key):
    elements = candidates[cid][0]
    if key == cid:
        return 1.0
    if key in W and key in elements:
        return elements[key] * W[key] / mass(elements)
    return 0.0

A_ub, b_ub = [], []
for key, (required, present) in needs.items():
    A_ub.append([-content(c, key) for c in ids])
    b_ub.append(-(required * (initial_l + feed_l) - present))
A_ub.append([1000 * candidates[c][1] * candidates[c][2] / mass(candidates[c][0]) for c in ids])
b_ub.append(osm_max * keep * feed_l)
A_ub.append([1.0] * len(ids))
b_ub.append(solids_max * keep * feed_l)
bounds = [(0, candidates[c][3] * keep * feed_l) for c in ids]
result = linprog(np.ones(len(ids)), A_ub=np.array(A_ub), b_ub=np.array(b_ub), bounds=bounds, method="highs")
assert result.status == 0, result.message
# The least total mass can be reached by many mixes (the optimum is a face, not a point): for each
# component, the least and the most of it among the mixes of least total mass.
A_face = np.vstack([A_ub, np.ones(len(ids))])
b_face = np.append(b_ub, result.fun * (1 + 1e-9))
ranges = {}
for j, c in enumerate(ids):
    unit = np.zeros(len(ids))
    unit[j] = 1
    low = linprog(unit, A_ub=A_face, b_ub=b_face, bounds=bounds, method="highs")
    high = linprog(-unit, A_ub=A_face, b_ub=b_face, bounds=bounds, method="highs")
    assert low.status == 0 and high.status == 0
    ranges[c] = [round(float(low.fun), 6), round(float(-high.fun), 6)]
print(json.dumps({
    "totalMassG": round(float(result.fun), 6),
    "massRangeG": ranges,
    "bindingOsmolalityMOsmPerKg": round(osm_max * keep, 4),
}, indent=2))
