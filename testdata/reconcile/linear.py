#!/usr/bin/env python3
"""Reference answers for the reconciliation of linear flow networks.

Each network below is a set of tees and mixing chambers whose mass flows are measured (a value and
its 95 % half-width, sigma = half-width / 1.96), exact, or unknown. The weighted least-squares
reconciliation of such a network has a closed form. With A the incidence matrix of the balances
over the measured flows, Sigma the measurements' covariance and m their values,

    x = m - Sigma A^T (A Sigma A^T)^-1 A m                (all flows measured)

and, with unknown flows, A is first projected on the left null space of their columns (P A_u = 0),
exact flows moving to the constant side. The covariance of the reconciled values is
Sigma - Sigma A^T (A Sigma A^T)^-1 A Sigma; the corrections' is the subtracted term. This script
computes all of it with numpy (Debian python3-numpy), nothing from hmb, and writes linear.json
beside it; thermo/reconcile's tests build the same networks and compare.

    /usr/bin/python3 testdata/reconcile/linear.py [OUT.json]

The networks and their numbers are invented test cases.
"""

import json
import math
import os
import sys
import tempfile

import numpy as np

Z95 = 1.96  # two-sided 95 % coverage factor of the normal distribution (GUM, Table G.1)

# A network: units (kind, name, inlets, outlets) and flows: ("m", value, half-width) measured,
# ("x", value) exact, None unknown. Feeds (streams no unit makes) get an exact state in the test.
NETWORKS = {
    "tee": {
        "units": [("splitter", "T1", ["A"], ["B", "C"])],
        "flows": {"A": ("m", 10.0, 0.2), "B": ("m", 6.3, 0.12), "C": ("m", 3.9, 0.1)},
    },
    "header": {
        "units": [
            ("mixer", "M1", ["A", "B"], ["C"]),
            ("splitter", "S1", ["C"], ["D", "E"]),
            ("mixer", "M2", ["D", "F"], ["G"]),
        ],
        "flows": {
            "A": ("m", 12.0, 0.24), "B": ("m", 8.1, 0.16), "C": ("m", 19.5, 0.3),
            "D": ("m", 11.2, 0.2), "E": ("m", 8.6, 0.2), "F": ("m", 2.05, 0.05),
            "G": ("m", 13.0, 0.3),
        },
    },
    "unmeasured": {
        "units": [
            ("mixer", "M1", ["A", "B"], ["C"]),
            ("splitter", "S1", ["C"], ["D", "E"]),
        ],
        "flows": {"A": ("m", 5.0, 0.1), "B": ("m", 3.0, 0.09), "C": None,
                  "D": ("m", 4.4, 0.1), "E": ("m", 3.8, 0.08)},
    },
    "exact": {
        "units": [("mixer", "M1", ["A", "B"], ["C"])],
        "flows": {"A": ("x", 4.0), "B": ("m", 2.2, 0.05), "C": ("m", 6.05, 0.1)},
    },
    "district": {
        "units": [
            ("splitter", "S1", ["H"], ["U1", "U2", "U3", "U4"]),
            ("mixer", "M1", ["U1", "U2"], ["R1"]),
            ("splitter", "S2", ["U3"], ["V1", "V2"]),
            ("mixer", "M2", ["R1", "V1", "V2", "U4"], ["RET"]),
        ],
        "flows": {
            "H": ("m", 40.0, 0.6), "U1": ("m", 9.8, 0.2), "U2": ("m", 10.4, 0.2),
            "U3": None, "U4": ("m", 7.7, 0.15), "R1": ("m", 20.6, 0.4),
            "V1": ("m", 6.1, 0.12), "V2": ("m", 5.6, 0.12), "RET": ("m", 39.0, 0.8),
        },
    },
}


def reconcile(net):
    names = list(net["flows"])
    col = {n: i for i, n in enumerate(names)}
    a = np.zeros((len(net["units"]), len(names)))
    for r, (_, _, ins, outs) in enumerate(net["units"]):
        for s in ins:
            a[r, col[s]] += 1.0
        for s in outs:
            a[r, col[s]] -= 1.0
    meas = [n for n in names if net["flows"][n] and net["flows"][n][0] == "m"]
    exact = [n for n in names if net["flows"][n] and net["flows"][n][0] == "x"]
    free = [n for n in names if not net["flows"][n]]
    am = a[:, [col[n] for n in meas]]
    ae = a[:, [col[n] for n in exact]]
    au = a[:, [col[n] for n in free]]
    m = np.array([net["flows"][n][1] for n in meas])
    e = np.array([net["flows"][n][1] for n in exact])
    sigma = np.diag([(net["flows"][n][2] / Z95) ** 2 for n in meas])
    c = ae @ e if exact else np.zeros(a.shape[0])
    if free:
        # Left null space of A_u: the balances' combinations that no unknown flow enters.
        u, s, _ = np.linalg.svd(au)
        rank = int(np.sum(s > 1e-12 * s[0]))
        p = u[:, rank:].T
        ar, cr = p @ am, p @ c
    else:
        ar, cr = am, c
    # Independent rows only (a redundant balance would make A Sigma A^T singular).
    u, s, _ = np.linalg.svd(ar)
    rank = int(np.sum(s > 1e-12 * s[0]))
    keep = u[:, :rank].T
    ar, cr = keep @ ar, keep @ cr
    s_a = ar @ sigma @ ar.T
    k = sigma @ ar.T @ np.linalg.inv(s_a)
    resid = ar @ m + cr
    x = m - k @ resid
    cov_v = k @ ar @ sigma
    cov_x = sigma - cov_v
    chi2 = float(resid @ np.linalg.solve(s_a, resid))
    out = {"redundancy": rank, "chi2": chi2, "measurements": {}, "unknown": {}}
    for i, n in enumerate(meas):
        var_v = cov_v[i, i]
        out["measurements"][n] = {
            "measured": float(m[i]),
            "reconciled": float(x[i]),
            "u_reconciled": float(Z95 * np.sqrt(max(cov_x[i, i], 0.0))),
            "test": float(abs(x[i] - m[i]) / np.sqrt(var_v)) if var_v > 1e-12 * sigma[i, i] else None,
        }
    if free:
        # The unknown flows from the balances at the reconciled values: A_u x_u = -(A_m x + c).
        pinv = np.linalg.pinv(au)
        xu = -pinv @ (am @ x + c)
        g = -pinv @ am
        cov_u = g @ cov_x @ g.T
        for i, n in enumerate(free):
            out["unknown"][n] = {"reconciled": float(xu[i]), "u_reconciled": float(Z95 * np.sqrt(max(cov_u[i, i], 0.0)))}
    return out


# Power of the tests against one gross error, for thermo/reconcile's simulation: the true flows of
# the header network (consistent with its balances), and for each meter the probability that an
# error of GROSS standard deviations on it (plus the usual noise on every meter) fails the global
# test and puts that meter first among the normalised corrections (or level with it), by Monte
# Carlo over the closed form above.
SIMULATION = {"network": "header", "gross": 8.0, "draws": 5000,
              "truth": {"A": 12.0, "B": 8.0, "C": 20.0, "D": 11.5, "E": 8.5, "F": 2.0, "G": 13.5}}


def power(net, sim):
    names = list(net["flows"])
    col = {n: i for i, n in enumerate(names)}
    a = np.zeros((len(net["units"]), len(names)))
    for r, (_, _, ins, outs) in enumerate(net["units"]):
        for s in ins:
            a[r, col[s]] += 1.0
        for s in outs:
            a[r, col[s]] -= 1.0
    sd = np.array([net["flows"][n][2] / Z95 for n in names])
    sigma = np.diag(sd ** 2)
    s_a = a @ sigma @ a.T
    k = sigma @ a.T @ np.linalg.inv(s_a) @ a
    cov_v = k @ sigma
    rank = np.linalg.matrix_rank(a)
    limit = chi2_95(rank)
    rng = np.random.default_rng(13)
    out = {}
    for b, name in enumerate(names):
        hit = 0
        for _ in range(sim["draws"]):
            e = sd * rng.standard_normal(len(names))
            e[b] += sim["gross"] * sd[b]
            v = -k @ e
            t = np.abs(v) / np.sqrt(np.diag(cov_v))
            chi = float((v / sd) @ (v / sd))
            top = int(np.argmax(t))
            if chi > limit and (top == b or abs(t[top] - t[b]) <= 1e-9 * t[top]):
                hit += 1
        out[name] = hit / sim["draws"]
    return out


def chi2_95(k):
    """95 % quantile of chi-square with k degrees of freedom, by bisection on its CDF (the
    regularised lower incomplete gamma function, summed as its series)."""
    def cdf(x):
        a, term, total = k / 2.0, 1.0 / (k / 2.0), 1.0 / (k / 2.0)
        n = 1
        while term > 1e-17 * total:
            term *= (x / 2.0) / (a + n)
            total += term
            n += 1
        return total * np.exp(-x / 2.0 + a * np.log(x / 2.0) - math.lgamma(a))
    lo, hi = 0.0, 10.0 * k + 50.0
    for _ in range(200):
        mid = (lo + hi) / 2
        if cdf(mid) < 0.95:
            lo = mid
        else:
            hi = mid
    return (lo + hi) / 2


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "linear.json")
    doc = {"generator": "testdata/reconcile/linear.py (numpy " + np.__version__ + ")", "networks": {}}
    for name, net in NETWORKS.items():
        doc["networks"][name] = {
            "units": [{"kind": k, "name": n, "in": i, "out": o} for k, n, i, o in net["units"]],
            "flows": {s: (None if f is None else {"kind": f[0], "value": f[1], "tol": f[2] if len(f) > 2 else 0.0})
                      for s, f in net["flows"].items()},
            "answer": reconcile(net),
        }
    sim = dict(SIMULATION)
    sim["chi2_95"] = chi2_95(reconcile(NETWORKS[sim["network"]])["redundancy"])
    sim["p_found_first"] = power(NETWORKS[sim["network"]], sim)
    doc["simulation"] = sim
    text = json.dumps(doc, indent=1, sort_keys=True) + "\n"
    fd, tmp = tempfile.mkstemp(dir=os.path.dirname(path), prefix=".linear-", suffix=".json")
    with os.fdopen(fd, "w") as f:
        f.write(text)
    os.replace(tmp, path)


if __name__ == "__main__":
    main()
