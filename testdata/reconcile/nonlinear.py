#!/usr/bin/env python3
"""Reference answers for the reconciliation of plants whose balances run through IAPWS-IF97.

Each case below is a small plant with measured flows, pressures, temperatures, a duty or a shaft
power (a value and its 95 % half-width, sigma = half-width / 1.96). The reconciled values
minimise sum(((y - m)/sigma)^2) subject to the plant's mass and energy balances, with
enthalpies from Debian's python3-iapws (IAPWS97). The minimisation is scipy's SLSQP (Debian
python3-scipy), polished by successive linearisation of the balances (numpy); the covariance of
the reconciled values is Sigma - Sigma A^T (A Sigma A^T)^-1 A Sigma with A the balances'
Jacobian at the solution, and every derived value's uncertainty (a turbine's isentropic
efficiency) follows from it by its gradient. Nothing here uses hmb's code. The output,
nonlinear.json beside this script, holds each case's plant and its answers;
thermo/reconcile's tests build the same plants and compare.

    /usr/bin/python3 testdata/reconcile/nonlinear.py [OUT.json]

The plants and their numbers are invented test cases.
"""

import json
import math
import os
import sys
import tempfile

import numpy as np
from iapws import IAPWS97
from scipy.optimize import minimize

Z95 = 1.96  # two-sided 95 % coverage factor of the normal distribution (GUM, Table G.1)
BAR = 1e5


def h_pt(p, t):
    """Specific enthalpy, J/kg, at p (Pa) and T (K)."""
    return IAPWS97(P=p / 1e6, T=t).h * 1e3


def s_pt(p, t):
    return IAPWS97(P=p / 1e6, T=t).s * 1e3


def h_ps(p, s):
    return IAPWS97(P=p / 1e6, s=s / 1e3).h * 1e3


# A case: the plant in hmb's terms (streams with givens, units with ports and parameters), the
# measured quantities in the order of the vector y, and the balances g(y) = 0 over them.
def mixing():
    p = 5 * BAR
    plant = {
        "streams": {
            "A": {"flow": [8.0, 0.12], "p": [p, 0], "T": [273.15 + 140, 1.0]},
            "B": {"flow": [4.0, 0.06], "p": [p, 0], "T": [273.15 + 40, 1.0]},
            "C": {"flow": [12.15, 0.18], "T": [273.15 + 106.7, 1.0]},
        },
        "units": [{"kind": "mixer", "name": "M1", "ports": ["in A", "in B", "out C"]}],
    }
    names = ["A flow", "A T", "B flow", "B T", "C flow", "C T"]

    def g(y):
        ma, ta, mb, tb, mc, tc = y
        return np.array([ma + mb - mc, (ma * h_pt(p, ta) + mb * h_pt(p, tb) - mc * h_pt(p, tc)) / 1e3])
    return plant, names, g, {}


def turbine():
    plant = {
        "streams": {
            "MS": {"flow": [20.0, 0.2], "p": [40 * BAR, 0.2 * BAR], "T": [273.15 + 400, 2.0]},
            "EX": {"p": [5 * BAR, 0.025 * BAR], "T": [273.15 + 200, 2.0]},
        },
        "units": [{"kind": "turbine", "name": "T1", "ports": ["in MS", "out EX"],
                   "params": {"power": [7.1e6, 0.071e6]}}],
    }
    names = ["MS flow", "MS p", "MS T", "EX p", "EX T", "T1 power"]

    def g(y):
        m, p1, t1, p2, t2, w = y
        return np.array([(m * (h_pt(p1, t1) - h_pt(p2, t2)) - w) / 1e3])

    def efficiency(y):
        m, p1, t1, p2, t2, w = y
        h1, h2 = h_pt(p1, t1), h_pt(p2, t2)
        return (h1 - h2) / (h1 - h_ps(p2, s_pt(p1, t1)))
    return plant, names, g, {"T1 efficiency": efficiency}


def heater():
    p = 12 * BAR
    plant = {
        "streams": {
            "FW1": {"flow": [15.0, 0.15], "p": [p, 0], "T": [273.15 + 105, 0.5]},
            "FW2": {"flow": [15.2, 0.15], "T": [273.15 + 150, 0.5]},
        },
        "units": [{"kind": "heater", "name": "H1", "ports": ["in FW1", "out FW2"],
                   "params": {"duty": [2.95e6, 0.06e6]}}],
    }
    names = ["FW1 flow", "FW1 T", "FW2 flow", "FW2 T", "H1 duty"]

    def g(y):
        m1, t1, m2, t2, q = y
        return np.array([m1 - m2, (m1 * (h_pt(p, t2) - h_pt(p, t1)) - q) / 1e3])
    return plant, names, g, {}


CASES = {"mixing": mixing, "turbine": turbine, "heater": heater}


def measured(plant, names):
    """The measured values and half-widths in the order of names ("A flow", "T1 power")."""
    m, u = [], []
    for n in names:
        who, what = n.split()
        if who in plant["streams"]:
            v = plant["streams"][who][what]
        else:
            v = next(x for x in plant["units"] if x["name"] == who)["params"][what]
        m.append(v[0])
        u.append(v[1])
    return np.array(m), np.array(u)


def jacobian(f, y, rel=1e-7):
    f0 = f(y)
    jac = np.zeros((len(f0), len(y)))
    for j in range(len(y)):
        d = rel * max(abs(y[j]), 1.0)
        yp, ym = y.copy(), y.copy()
        yp[j] += d
        ym[j] -= d
        jac[:, j] = (f(yp) - f(ym)) / (2 * d)
    return jac


def reconcile(plant, names, g, derived):
    m, u = measured(plant, names)
    sd = u / Z95
    sigma = np.diag(sd ** 2)
    res = minimize(lambda y: float(np.sum(((y - m) / sd) ** 2)), m, method="SLSQP",
                   constraints=[{"type": "eq", "fun": g}], options={"ftol": 1e-14, "maxiter": 500})
    y = res.x
    # Successive linearisation: y = m - Sigma A^T (A Sigma A^T)^-1 (g(y) + A (m - y)).
    for _ in range(20):
        a = jacobian(g, y)
        step = m - sigma @ a.T @ np.linalg.solve(a @ sigma @ a.T, g(y) + a @ (m - y))
        done = np.max(np.abs(step - y) / sd) < 1e-12
        y = step
        if done:
            break
    a = jacobian(g, y)
    k = sigma @ a.T @ np.linalg.inv(a @ sigma @ a.T) @ a @ sigma
    cov = sigma - k
    v = y - m
    out = {"redundancy": int(np.linalg.matrix_rank(a)), "chi2": float(np.sum((v / sd) ** 2)),
           "scipy_success": bool(res.success), "measurements": {}, "derived": {}}
    for i, n in enumerate(names):
        out["measurements"][n] = {
            "measured": float(m[i]), "reconciled": float(y[i]),
            "u_reconciled": float(Z95 * math.sqrt(max(cov[i, i], 0.0))),
            "test": float(abs(v[i]) / math.sqrt(k[i, i])) if k[i, i] > 1e-12 * sigma[i, i] else None,
        }
    for n, f in derived.items():
        grad = jacobian(lambda z: np.array([f(z)]), y)[0]
        out["derived"][n] = {"value": float(f(y)), "u": float(Z95 * math.sqrt(grad @ cov @ grad))}
    return out


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "nonlinear.json")
    import iapws
    import scipy
    doc = {"generator": "testdata/reconcile/nonlinear.py (iapws %s, scipy %s, numpy %s)" % (
        iapws.__version__, scipy.__version__, np.__version__), "cases": {}}
    for name, case in CASES.items():
        plant, names, g, derived = case()
        doc["cases"][name] = {"plant": plant, "answer": reconcile(plant, names, g, derived)}
    text = json.dumps(doc, indent=1, sort_keys=True) + "\n"
    fd, tmp = tempfile.mkstemp(dir=os.path.dirname(path), prefix=".nonlinear-", suffix=".json")
    with os.fdopen(fd, "w") as f:
        f.write(text)
    os.replace(tmp, path)


if __name__ == "__main__":
    main()
