"""Times SciPy's LSODA in-process on the 14-day microbial fed-batch runs of the culture model, for comparison
with the library's `npm run bench` case "simulation: 14-day microbial fed-batch ...".

The model is simulation-reference.py's, written from the model's equations independently of the TypeScript
code (Monod growth, Pirt maintenance, the film-theory O2 balance, exhaustion and O2 limitation as located
regime switches); here its Radau is swapped for LSODA at the library's tolerances (rtol = atol = 1e-8). Its DO
is always integrated (the library may solve it at quasi-steady state; these runs never do). The time is the
median of repeated runs inside one Python process, output at the requested times included, as the bench
times the library.

Run from the repository root:
  python3 tests/chemistry/reference/fedbatch_lsoda.py
"""
import importlib.util
import pathlib
import time

import numpy as np
import scipy
import scipy.integrate

HERE = pathlib.Path(__file__).parent
spec = importlib.util.spec_from_file_location("simulation_reference", HERE / "simulation-reference.py")
reference = importlib.util.module_from_spec(spec)
spec.loader.exec_module(reference)

METHOD = "LSODA"
RTOL = ATOL = 1e-8
REPETITIONS = 20
CASE_NAMES = [
    "constant-feed fed-batch to the Pirt ceiling, 14 days",
    "exponential then capped feed with an O2 balance and O2-limited growth, 14 days",
]


def run_once(template, counts):
    def counted_solve_ivp(*args, **kwargs):
        kwargs.update(method=METHOD, rtol=RTOL, atol=ATOL)
        sol = scipy.integrate.solve_ivp(*args, **kwargs)
        counts["evaluations"] += sol.nfev
        counts["steps"] += len(sol.t) - 1
        return sol

    reference.solve_ivp = counted_solve_ivp
    case = reference.Case(template.name, template.request, template.note)
    return case.run()


def main():
    print(f"scipy {scipy.__version__} solve_ivp {METHOD}, rtol {RTOL}, atol {ATOL}; median of {REPETITIONS} runs")
    for template in reference.CASES:
        if template.name not in CASE_NAMES:
            continue
        counts = {"evaluations": 0, "steps": 0}
        result = run_once(template, counts)
        times_ms = []
        for _ in range(REPETITIONS):
            start = time.perf_counter()
            run_once(template, {"evaluations": 0, "steps": 0})
            times_ms.append((time.perf_counter() - start) * 1000)
        print(
            f"{template.name}: median {np.median(times_ms):.1f} ms, "
            f"{counts['steps']} steps, {counts['evaluations']} evaluations (nfev), "
            f"X(336 h) = {result['biomassGPerL'][-1]:.6g} g/L"
        )


if __name__ == "__main__":
    main()
