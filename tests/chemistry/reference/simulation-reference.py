"""Reference trajectories for the culture simulation, computed independently of the TypeScript library
with SciPy's implicit Radau integrator (rtol 1e-10, atol 1e-12) and its event location. Written from the
model's equations (Monod 1949 growth, Pirt 1965 maintenance, the film-theory O2 balance), not from the
library's code; DO is always integrated here (the library may solve it at quasi-steady state).

Regimes, as the model help states them:
- Pirt maintenance draws in full at any S > 0. When S reaches 0 with a supply below m_s*X, S is held at 0,
  mu = 0 and the supply is spent on maintenance; it leaves that regime when the supply at S = 0 exceeds
  m_s*X again.
- Without K_O, growth is not slowed by DO until DO reaches 0 with a demand above kLa*C*; DO is then held
  at 0 and mu = min(mu(S), Yx/O2*(kLa*C* - m_O*X)/(1000*X)); it leaves when the demand at full growth
  falls below kLa*C*.

Run from the repository root:
  python3 tests/chemistry/reference/simulation-reference.py > tests/chemistry/reference/simulation-reference.json
"""
import json
import math

import numpy as np
import scipy
from scipy.integrate import solve_ivp

RTOL = 1e-10
ATOL = 1e-12
X, S, P, V, C = range(5)


class Case:
    def __init__(self, name, request, note):
        self.name = name
        self.request = request
        self.note = note
        k = request["kinetics"]
        self.mu_max = k["muMaxPerH"]
        self.ks = k["ksGPerL"]
        self.y_xs = k["yieldXS"]
        self.m_s = k.get("maintenanceGPerGH", 0.0)
        self.alpha = k.get("alpha", 0.0)
        self.beta = k.get("beta", 0.0)
        o = request.get("oxygen")
        self.oxygen = o is not None
        if self.oxygen:
            self.kla = o["kLaPerH"]
            self.c_star = o["saturationMgPerL"]
            self.m_o = o.get("maintenanceMgPerGH", 0.0)
            self.y_xo = k["yieldXO2"]
            self.k_o = k.get("koMgPerL", 0.0)
        self.mode = request["mode"]
        feeds = request.get("feeds") or ([request["feed"]] if "feed" in request else [])
        self.feeds = feeds
        self.start_h = min([f.get("startH", 0.0) for f in feeds], default=0.0)
        self.exhausted = False
        self.o2_limited = False
        self.feed_anchor = {}
        # feeds started so far (by segment, so the integrator never sees a law switch on inside a step)
        self.active = set()
        self.continuous = False

    # --- rates -------------------------------------------------------------------------------------
    def mu_substrate(self, s):
        s = max(s, 0.0)
        return self.mu_max * s / (self.ks + s)

    def mu(self, y):
        if self.exhausted:
            return 0.0
        mu = self.mu_substrate(y[S])
        if not self.oxygen:
            return mu
        if self.k_o > 0:
            if self.o2_limited:
                return 0.0
            c = max(y[C], 0.0)
            return mu * c / (self.k_o + c)
        if self.o2_limited:
            spare = self.kla * self.c_star - self.m_o * y[X]
            limit = max(spare, 0.0) * self.y_xo / (1000.0 * y[X])
            return min(mu, limit)
        return mu

    def feed_rates(self, t, y, uptake):
        rates = []
        for i, f in enumerate(self.feeds):
            if self.mode != "fedBatch" or i not in self.active:
                rates.append(0.0)
                continue
            strategy = f["strategy"]
            fmax = f.get("maxRateLPerH", math.inf)
            t0 = f.get("startH", 0.0)
            if strategy == "constant":
                rate = f["rateLPerH"]
            elif strategy == "linear":
                rate = min(max(f["rateLPerH"] + f["slopeLPerH2"] * (t - t0), 0.0), fmax)
            elif strategy == "exponential":
                x0v0 = self.feed_anchor[i]
                demand = (f["muSetPerH"] / self.y_xs + self.m_s) * x0v0
                rate = min(demand * math.exp(f["muSetPerH"] * (t - t0)) / (f["substrateGPerL"] - y[S]), fmax)
            else:
                raise ValueError(strategy)
            rates.append(rate)
        return rates

    def flows(self, t, y, uptake):
        """(inflow L/h, substrate supply g/L/h at the current S, cell removal 1/h, dilution 1/h)."""
        if self.mode == "fedBatch":
            rates = self.feed_rates(t, y, uptake)
            d = sum(rates) / y[V]
            supply = sum(r * (f["substrateGPerL"] - y[S]) for r, f in zip(rates, self.feeds)) / y[V]
            return sum(rates), supply, d, d
        if self.mode in ("chemostat", "perfusion") and self.continuous:
            d = self.request["dilutionPerH"]
            removal = d
            if self.mode == "perfusion":
                pf = self.request["perfusion"]
                removal = pf["bleedPerH"] + (d - pf["bleedPerH"]) * (1 - pf["retentionEfficiency"])
            return 0.0, d * (self.request["feed"]["substrateGPerL"] - y[S]), removal, d
        return 0.0, 0.0, 0.0, 0.0

    def substrate_surplus_at_zero(self, t, y):
        at_zero = y.copy()
        at_zero[S] = 0.0
        maintenance = self.m_s * y[X]
        _, supply, _, _ = self.flows(t, at_zero, maintenance)
        return supply - maintenance

    def oxygen_surplus_at_zero(self, y):
        growth = 0.0 if (self.k_o > 0 or self.exhausted) else 1000.0 * self.mu_substrate(y[S]) * y[X] / self.y_xo
        return self.kla * self.c_star - growth - self.m_o * y[X]

    def rhs(self, t, y):
        y = y.copy()
        if self.exhausted:
            y[S] = 0.0
        if self.oxygen and self.o2_limited:
            y[C] = 0.0
        mu = self.mu(y)
        uptake = (mu / self.y_xs + self.m_s) * y[X]
        inflow, supply, removal, d = self.flows(t, y, uptake)
        dy = np.zeros(5)
        dy[X] = mu * y[X] - removal * y[X]
        dy[S] = 0.0 if self.exhausted else -uptake + supply
        dy[P] = (self.alpha * mu + self.beta) * y[X] - d * y[P]
        dy[V] = inflow
        if self.oxygen and not self.o2_limited:
            our = 1000.0 * mu * y[X] / self.y_xo + self.m_o * y[X]
            dy[C] = self.kla * (self.c_star - y[C]) - our
        return dy

    # --- regime switches as terminal events ----------------------------------------------------------
    def events(self):
        evs = []
        if self.exhausted:
            def leave_exhaustion(t, y):
                return self.substrate_surplus_at_zero(t, y)
            leave_exhaustion.direction = 1
            evs.append(("leave exhaustion", leave_exhaustion))
        else:
            def reach_zero_substrate(t, y):
                return y[S]
            reach_zero_substrate.direction = -1
            evs.append(("exhaustion", reach_zero_substrate))
        if self.oxygen:
            if self.o2_limited:
                def leave_o2(t, y):
                    return self.oxygen_surplus_at_zero(y)
                leave_o2.direction = 1
                evs.append(("leave O2 limit", leave_o2))
            else:
                def reach_zero_do(t, y):
                    return y[C]
                reach_zero_do.direction = -1
                evs.append(("O2 limit", reach_zero_do))
        for _, e in evs:
            e.terminal = True
        return evs

    def apply(self, name, t, y):
        if name == "exhaustion":
            if self.substrate_surplus_at_zero(t, y) < 0:
                self.exhausted = True
            y[S] = 0.0
        elif name == "leave exhaustion":
            self.exhausted = False
        elif name == "O2 limit":
            if self.oxygen_surplus_at_zero(y) < 0:
                self.o2_limited = True
            y[C] = 0.0
        elif name == "leave O2 limit":
            self.o2_limited = False
            y[C] = 0.0
        return y

    # --- the run -------------------------------------------------------------------------------------
    def run(self):
        r = self.request
        init = r["initial"]
        y = np.array([init["biomassGPerL"], init["substrateGPerL"], init.get("productGPerL", 0.0),
                      init["volumeL"], init.get("dissolvedOxygenMgPerL", self.c_star if self.oxygen else 0.0)])
        end_h = r["endH"]
        times = np.arange(0.0, end_h + 1e-9, r["outputEveryH"])
        # segments split at feed starts (laws change there); the exponential law anchors X*V at its start
        edges = sorted({0.0, end_h, *[f.get("startH", 0.0) for f in self.feeds], self.start_h})
        edges = [e for e in edges if 0.0 <= e <= end_h]
        out = {}
        switches = []
        for a, b in zip(edges[:-1], edges[1:]):
            for i, f in enumerate(self.feeds):
                if abs(f.get("startH", 0.0) - a) < 1e-12:
                    self.active.add(i)
                    if f["strategy"] == "exponential":
                        self.feed_anchor[i] = y[X] * y[V]
            if a >= self.start_h - 1e-12:
                self.continuous = True
            # a limited regime ends where a new supply starts (the library settles it the same way)
            if self.exhausted and self.substrate_surplus_at_zero(a, y) > 0:
                self.exhausted = False
            t = a
            guard = 0
            while t < b - 1e-12:
                guard += 1
                if guard > 1000:
                    raise RuntimeError("regime chatter")
                evs = self.events()
                sol = solve_ivp(self.rhs, (t, b), y, method="Radau", rtol=RTOL, atol=ATOL, dense_output=True,
                                events=[e for _, e in evs])
                if sol.status < 0:
                    raise RuntimeError(sol.message)
                t_end = sol.t[-1]
                for tt in times:
                    if t - 1e-12 <= tt <= t_end + 1e-12 and tt not in out:
                        state = sol.sol(min(max(tt, t), t_end)).copy()
                        if self.exhausted:
                            state[S] = 0.0
                        if self.oxygen and self.o2_limited:
                            state[C] = 0.0
                        out[tt] = state
                y = sol.y[:, -1].copy()
                if sol.status == 1:
                    fired = [k for k, te in enumerate(sol.t_events) if len(te) > 0]
                    name = evs[fired[0]][0]
                    y = self.apply(name, t_end, y)
                    switches.append([name, t_end])
                t = t_end
        ts = sorted(out)
        return {
            "name": self.name,
            "note": self.note,
            "request": r,
            "t": ts,
            "biomassGPerL": [float(max(out[t][X], 0.0)) for t in ts],
            "substrateGPerL": [float(max(out[t][S], 0.0)) for t in ts],
            "volumeL": [float(out[t][V]) for t in ts],
            "dissolvedOxygenMgPerL": [float(max(out[t][C], 0.0)) for t in ts] if self.oxygen else None,
            "regimeChanges": switches,
        }


MICROBE = {"muMaxPerH": 0.5, "ksGPerL": 0.1, "yieldXS": 0.45, "maintenanceGPerGH": 0.02}

CASES = [
    Case(
        "constant-feed fed-batch to the Pirt ceiling, 14 days",
        {
            "mode": "fedBatch",
            "kinetics": MICROBE,
            "initial": {"biomassGPerL": 2, "substrateGPerL": 1, "volumeL": 2},
            "feed": {"strategy": "constant", "substrateGPerL": 400, "rateLPerH": 0.02},
            "endH": 336,
            "outputEveryH": 4,
        },
        "X*V approaches F*S_f/m_s = 400 g from below and never passes it",
    ),
    Case(
        "exponential then capped feed with an O2 balance and O2-limited growth, 14 days",
        {
            "mode": "fedBatch",
            "kinetics": {**MICROBE, "yieldXO2": 1.0},
            "initial": {"biomassGPerL": 0.5, "substrateGPerL": 10, "volumeL": 5},
            "feed": {"strategy": "exponential", "substrateGPerL": 500, "muSetPerH": 0.2, "maxRateLPerH": 0.03,
                     "startH": 10},
            "oxygen": {"kLaPerH": 150, "saturationMgPerL": 7, "maintenanceMgPerGH": 1},
            "endH": 336,
            "outputEveryH": 4,
        },
        "the exponential feed outgrows transfer: DO reaches 0 and growth follows kLa*C*; the capped feed then "
        "lets maintenance dominate",
    ),
    Case(
        "chemostat at low dilution with maintenance, 14 days",
        {
            "mode": "chemostat",
            "kinetics": {**MICROBE, "maintenanceGPerGH": 0.05},
            "initial": {"biomassGPerL": 1, "substrateGPerL": 5, "volumeL": 1},
            "feed": {"strategy": "constant", "substrateGPerL": 10, "startH": 5},
            "dilutionPerH": 0.03,
            "endH": 336,
            "outputEveryH": 4,
        },
        "settles on X = D*Y*(S0 - S)/(D + m_s*Y) (Pirt 1965)",
    ),
    Case(
        "perfusion at low bleed with maintenance, 14 days",
        {
            "mode": "perfusion",
            "kinetics": {"muMaxPerH": 0.04, "ksGPerL": 0.2, "yieldXS": 0.5, "maintenanceGPerGH": 0.01},
            "initial": {"biomassGPerL": 0.5, "substrateGPerL": 4, "volumeL": 2},
            "feed": {"strategy": "constant", "substrateGPerL": 8, "startH": 48},
            "dilutionPerH": 0.04,
            "perfusion": {"retentionEfficiency": 0.98, "bleedPerH": 0.005},
            "endH": 336,
            "outputEveryH": 4,
        },
        "maintenance dominates at the low specific growth the bleed sets",
    ),
    Case(
        "batch to exhaustion with maintenance",
        {
            "mode": "batch",
            "kinetics": MICROBE,
            "initial": {"biomassGPerL": 0.1, "substrateGPerL": 10, "volumeL": 1},
            "endH": 30,
            "outputEveryH": 0.5,
        },
        "S reaches 0 at a finite time and stays there; X then stays constant",
    ),
    Case(
        "linear feed below maintenance, then above it",
        {
            "mode": "fedBatch",
            "kinetics": MICROBE,
            "initial": {"biomassGPerL": 20, "substrateGPerL": 0.5, "volumeL": 2},
            "feed": {"strategy": "linear", "substrateGPerL": 200, "rateLPerH": 0.002, "slopeLPerH2": 0.0002,
                     "startH": 2},
            "endH": 60,
            "outputEveryH": 0.5,
        },
        "the feed meets maintenance only after its ramp: S is held at 0 in between",
    ),
]


def main():
    result = {
        "generatedBy": "tests/chemistry/reference/simulation-reference.py",
        "integrator": f"scipy {scipy.__version__} solve_ivp Radau, rtol {RTOL}, atol {ATOL}, numpy {np.__version__}",
        "cases": [case.run() for case in CASES],
    }
    print(json.dumps(result, indent=1))


if __name__ == "__main__":
    main()
