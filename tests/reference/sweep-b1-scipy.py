"""Independent reference for Tropline's b1 sweep: SciPy's solve_ivp (its own DOP853 and its
own event location) on the Hastings & Powell (1991, Ecology 72:896-903) chain.

For b1 = 2.0, 2.1, ..., 6.2 (a1 = 5, a2 = 0.1, b2 = 2, d1 = 0.4, d2 = 0.01) the script integrates
from (0.76, 0.16, 9.9) over a transient of 5000, then records every local maximum of the top
level z over a window of 5000 as an event dz/dt = 0 crossed downwards, at rtol = atol = 1e-8.
Output: sweep-b1-scipy.json beside this file. Run: python3 tests/reference/sweep-b1-scipy.py
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import solve_ivp

A1, A2, B2, D1, D2 = 5.0, 0.1, 2.0, 0.4, 0.01
TRANSIENT, WINDOW, TOL = 5000.0, 5000.0, 1e-8


def rhs(b1):
    def f(_t, s):
        x, y, z = s
        f1 = A1 * x / (1 + b1 * x)
        f2 = A2 * y / (1 + B2 * y)
        return [x * (1 - x) - f1 * y, f1 * y - f2 * z - D1 * y, f2 * z - D2 * z]
    return f


def maxima(b1):
    f = rhs(b1)
    start = solve_ivp(f, (0, TRANSIENT), [0.76, 0.16, 9.9], method="DOP853", rtol=TOL, atol=TOL)
    event = lambda t, s: f(t, s)[2]
    event.direction = -1
    run = solve_ivp(f, (0, WINDOW), start.y[:, -1], method="DOP853", rtol=TOL, atol=TOL,
                    events=event)
    return [float(v[2]) for v in run.y_events[0]]


values = [round(2.0 + 0.1 * i, 10) for i in range(43)]
out = {
    "source": "scipy.integrate.solve_ivp DOP853 with events, scipy " + scipy.__version__,
    "transient": TRANSIENT, "window": WINDOW, "tolerance": TOL,
    "points": [{"b1": b1, "maxima": maxima(b1)} for b1 in values],
}
with open(os.path.join(os.path.dirname(__file__), "sweep-b1-scipy.json"), "w") as fh:
    json.dump(out, fh, indent=1)
