import { O2_MOLAR_MASS_G_PER_MOL } from '../oxygen';
// The culture model's description for the simulation page (Markdown), kept beside the model it describes.

export const SIMULATION_MODEL_HELP = `## The culture model

**States**: biomass X (g/L), substrate S (g/L), product P (g/L), volume V (L) and, when an oxygen
block is given, dissolved oxygen C (mg/L).

**Growth** (Monod 1949): μ = μmax · S/(Ks + S) · C/(K_O + C). The oxygen factor (the multiplicative
"double Monod" form) applies only when K_O > 0 and an oxygen balance is solved. With K_O = 0, growth
does not slow as DO falls; when DO reaches 0 with the demand above the maximum transfer kLa·C*, DO is
held at 0 and growth runs only as fast as transfer supplies oxygen (the oxygen-limited regime, OTR =
OUR at DO = 0): μ = min(μmax·S/(Ks + S), Yx/O2·(kLa·C* − m_O·X)/(1000·X)). The run goes on; it leaves
this regime when the demand at full growth falls below kLa·C* again (the substrate runs short, or the
culture is diluted).

**Balances**
- Biomass: dX/dt = μX − (F_in/V)·X. With perfusion the harvest stream passes a cell-retention device
  that holds back a fraction R of the cells and the bleed leaves with the culture's full biomass:
  dX/dt = μX − [b + (D − b)(1 − R)]·X.
- Substrate (maintenance after Pirt 1965, Proc. R. Soc. Lond. B 163:224): dS/dt = −(μ/Yx/s + m_s)·X +
  (F_in/V)(S_f − S), with maintenance drawn in full while any substrate is left. When S reaches 0 and
  the substrate arriving, Σ Fᵢ·S_f,i/V (or D·S_f), is less than m_s·X, the culture is exhausted: S is
  held at 0, μ = 0, and what arrives is spent on maintenance at once (biomass neither grows nor decays
  in this model; only dilution lowers it). It leaves exhaustion as soon as the supply at S = 0 exceeds
  m_s·X (a feed starts or speeds up, a bolus or a draw-fill refill brings substrate). A constant feed
  can therefore never carry more biomass than F·S_f/m_s, the Pirt ceiling, which X·V approaches from
  below. Both switches are located as events, so each stretch of the run has a smooth right-hand side.
- Product (Luedeking & Piret 1959): dP/dt = (αμ + β)·X − (F_in/V)·P. Product passes the retention device.
- Volume: dV/dt = F_in − F_out.
- Oxygen (film theory): dC/dt = kLa(C* − C) − OUR with OUR = 1000·μX/Yx/O2 + m_O·X in mg O2/L/h
  (Yx/O2 in g biomass per g O2, m_O in mg O2 per g biomass per h). OUR and the maximum transfer rate
  kLa·C* are reported in mmol/L/h (O2 = ${O2_MOLAR_MASS_G_PER_MOL.toFixed(3)} g/mol). Dilution of dissolved O2 by the feed is
  neglected (D ≪ kLa); a bolus or a draw-fill refill arrives air-saturated.
- DO is integrated as a state while it changes on a time scale the integrator can follow. Where it
  relaxes more than 1000 times faster than the culture can change (λ = kLa + ∂OUR/∂C above
  1000·max(μmax, D), as at O2 limitation with high biomass, where DO settles in milliseconds), the
  balance is solved at quasi-steady state instead, kLa(C* − C) = OUR(C); the lag this neglects, 1/λ
  against the culture's time scale, is 0.1 % or less. The result lists these stretches
  (quasiSteadyOxygenH); when one starts at t = 0 the given initial DO is replaced by the quasi-steady
  value.
- Without an oxygen block no oxygen balance is solved: the DO and OTR series are null and growth is
  never oxygen-limited; given Yx/O2 all the same, the OUR series is the O2 demand of the simulated growth
  (1000·μX/Yx/O2, transfer unlimited), which says what the vessel would have to supply. With an oxygen
  block, Yx/O2 is required.

**Modes**
- batch: no flows.
- fedBatch: F_out = 0; the feed follows one of the strategies below from its start time (or several
  feeds do, see below).
- chemostat: F_in = F_out = D·V, constant volume. Before the feed start time the vessel runs as a batch.
- perfusion: medium flows through at D·V; a bleed b·V leaves with the culture; the rest leaves through
  the retention device.
- drawFill: the vessel runs as a batch; every N hours (from the feed start time) a fraction of the
  volume is withdrawn and replaced with fresh medium, which scales X and P by (1 − fraction) and mixes S
  towards the medium's substrate.
- In chemostat, perfusion and draw-fill runs the feed block describes the fresh medium (its substrate,
  and its start time); the flow itself is set by the mode. A maximum working volume stops only
  fed-batch runs: the other modes keep the volume constant.

**Feeding strategies** (fed-batch; each starts at startH, with an optional bolus of feed at that time)
- constant: F = rate.
- linear: F = F0 + slope·(t − t0), never below 0 and never above the maximum rate if one is given.
- exponential: F = (μset/Yx/s + m_s)·X0·V0·e^{μset(t − t0)}/(S_f − S), X0·V0 at the feed start (textbook
  form; it holds S, and so μ, constant at μset once S is at the matching level).
- substrateStat: the feed meets the measured uptake and corrects the error proportionally,
  F = [q_S·X + k(S_set − S)]·V/(S_f − S) with k = 10·μmax, limited to 0 … maximum rate. While S is above
  the setpoint the law asks for a negative rate, so the feed stays off; below it S settles on the
  setpoint about ten times faster than the culture grows.
- doStat: F = F_max/(1 + e^{−(C − C_set)/w}), F_max the maximum rate, w = 1 % of C*: the feed runs
  at full rate while DO is well above the setpoint and is cut smoothly as DO falls below it (a steep
  logistic keeps the integrator's error control working). At steady control the biomass growth rate per volume is capped
  near Yx/O2·kLa·(C* − C_set).
- expression: F(t) is any arithmetic expression of t (h), X, S, P, V and DO (or C), with the usual math
  functions; assignments, function definitions and unknown names are refused. A negative or
  non-finite value stops the run with an error.

**Several feeds** (fed-batch): up to 8 streams, each with its own strategy, start time, bolus, maximum
rate and substrate concentration, and an optional label that names it in the events. Their rates add
up: F_in = Σ Fᵢ dilutes X and P and fills the vessel, and each brings its own substrate,
dS/dt = −q_S·X + Σ (Fᵢ/V)(S_f,i − S). A stream may carry none of the modelled substrate (S_f = 0, e.g.
an amino-acid feed; it then only dilutes), except exponential and substrate-stat streams, which need
S_f above the initial S. Each stream's law is the one above, computed for that stream alone: an
exponential stream meets the uptake by itself, and a substrate-stat stream sees only the uptake, so
the substrate the other streams bring (or their dilution) is left to its proportional term, which
leaves S off the setpoint by that supply divided by k. The result lists each stream's rate over time
and its delivered volume (bolus included), integrated with the run.

**Events**
- substrateExhausted: S falls below S_ex = min(1 % of Ks, 0.001 g/L), where growth is at most ~1 % of
  μmax (a report only: maintenance goes on drawing down to S = 0).
- oxygenLimited: DO falls below 5 % of saturation, so transfer runs at ≥ 95 % of its maximum kLa·C*.
- oxygenDepleted: DO reaches zero with the demand beyond kLa·C*; from there growth runs at what
  transfer supplies (see Growth), and the result lists these stretches (oxygenLimitedH). With K_O > 0 this
  happens only when maintenance alone asks for more than kLa·C*; growth then stops.
- maxVolumeReached: the volume reaches the maximum working volume; the run stops there (a later
  stream's bolus that would go beyond it is cut to the room left).
- feedStarted: a feed stream (named by its label when it has one) starts after t = 0 or with a bolus,
  or continuous operation starts after a batch phase.
- washout: in chemostat, perfusion or draw-fill runs, X falls below 1 % of its value when continuous
  operation began.

**Numerics**: the stiff integrator RODAS (a Rosenbrock method of order 4 with an embedded order-3 error
estimate; Hairer & Wanner) with adaptive steps, absolute and relative tolerance 1e-8 on every state, and
its continuous output at the requested times. Feed starts (each
stream's), boluses and draws split the run into segments integrated one after another, and each
segment into stretches at the located switches into and out of exhaustion, O2 limitation and the
quasi-steady DO balance. Checked against an independent stiff integrator (SciPy's Radau at relative
tolerance 1e-10, run on the same equations): X, S and V agree within 1 % over 14-day
fed-batch, chemostat and perfusion runs. Values at an
output time that coincides with a draw or bolus are those just after it. A run the integrator cannot
follow (more than 200 000 steps in one stretch, a step that shrinks to nothing, more than 2000 regime
switches in one segment, a non-finite value, or a concentration below −1e-6) fails with an error rather
than returning numbers.
`;
