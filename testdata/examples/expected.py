#!/usr/bin/env python3
"""Independent answers for the example plants in this folder.

Each example's balances are written out here by hand, in the order an engineer would work them,
with water and steam properties from Debian's python3-iapws (IAPWS-IF97, class IAPWS97). The
result, every stream's m, p, T, h, s, x and every unit's duty, shaft power and entropy generation
in SI base units, is written to expected.json beside this script; cmd/hmb/examples_test.go checks
hmb's solved values against it and re-runs this script to check that the JSON is current.

    python3 testdata/examples/expected.py [OUT.json]

Nothing here uses hmb's code: unit conversions and the standard atmosphere are restated from their
published definitions.
"""

import json
import math
import os
import sys
import tempfile

import iapws
from iapws import IAPWS97

# Unit conversions to SI base units. NIST SP 811 (2008), Appendix B: 1 lbm = 0.45359237 kg,
# 1 in = 0.0254 m, standard gravity 9.80665 m/s2 (so 1 psi = 1 lbf/in2), 1 Btu_IT = 1055.05585262 J.
BAR = 1e5
KPA = 1e3
MPA = 1e6
LBM = 0.45359237
PSI = LBM * 9.80665 / 0.0254**2
BTU = 1055.05585262
KW = 1e3
MW = 1e6
T_H = 1000.0 / 3600  # t/h in kg/s
LBM_H = LBM / 3600   # lbm/h in kg/s
BTU_H = BTU / 3600   # Btu/h in W
T0 = 298.15          # K, ambient at which heat lost to the surroundings leaves a unit


def C(t):
    return t + 273.15


def F(t):
    return (t + 459.67) * 5 / 9


def atmosphere_at(z):
    """U.S. Standard Atmosphere 1976, troposphere: geopotential height (eq. 18), pressure (eq. 33a)."""
    r0, g0, m0, rstar, lapse, tb = 6356766.0, 9.80665, 0.0289644, 8.31432, -0.0065, 288.15
    h = r0 * z / (r0 + z)
    return 101325.0 * (tb / (tb + lapse * h)) ** (g0 * m0 / (rstar * lapse))


class Stream:
    """A state point in SI base units, from an IAPWS97 state and a mass flow."""

    def __init__(self, w, m=None, x=None):
        self.w = w
        self.m = m
        self.p = w.P * 1e6
        self.T = w.T
        self.h = w.h * 1e3
        self.s = w.s * 1e3
        # IAPWS97 reports x = 0 or 1 for single-phase states too; only region 4 (on or inside
        # the dome) has a quality.
        self.x = w.x if w.region == 4 else None
        if x is not None:
            self.x = x  # a saturated end stated by its quality: IAPWS97 files x = 0 under region 1

    def json(self):
        return {"m": self.m, "p": self.p, "T": self.T, "h": self.h, "s": self.s, "x": self.x}


def pt(p, T, m=None):
    return Stream(IAPWS97(P=p / 1e6, T=T), m)


def ph(p, h, m=None):
    return Stream(IAPWS97(P=p / 1e6, h=h / 1e3), m)


def px(p, x, m=None):
    return Stream(IAPWS97(P=p / 1e6, x=x), m, x)


def ps(p, s, m=None):
    return Stream(IAPWS97(P=p / 1e6, s=s / 1e3), m)


def sflow(outs, ins):
    """Entropy flow out less entropy flow in, W/K."""
    return sum(o.m * o.s for o in outs) - sum(i.m * i.s for i in ins)


def heated_sgen(i, o):
    """Heater, cooler, boiler: the heat crosses at the stream's mean temperature along its inlet
    isobar, so only the pressure drop generates entropy inside the boundary:
    S_gen = m (s_out - s(p_in, h_out))."""
    return o.m * (o.s - ph(i.p, o.h).s)


def turbine(i, p_out, eta):
    """Adiabatic expansion: h_out = h_in - eta (h_in - h_s), h_s = h(p_out, s_in)."""
    hs = ps(p_out, i.s).h
    o = ph(p_out, i.h - eta * (i.h - hs), i.m)
    return o, {"W": i.m * (i.h - o.h), "S_gen": sflow([o], [i])}


def pump(i, p_out, eta):
    """Adiabatic compression: h_out = h_in + (h_s - h_in) / eta, h_s = h(p_out, s_in)."""
    hs = ps(p_out, i.s).h
    o = ph(p_out, i.h + (hs - i.h) / eta, i.m)
    return o, {"W": i.m * (o.h - i.h), "S_gen": sflow([o], [i])}


def condensing_turbine():
    ms = pt(60 * BAR, C(480), 12.0)
    ex, t1 = turbine(ms, 0.1 * BAR, 0.86)
    cn = px(ex.p, 0, ms.m)  # condenser hot side: no pressure drop, saturated liquid out
    cw1 = pt(3 * BAR, C(25))
    cw2 = pt(3 * BAR - 0.4 * BAR, C(35))
    q = ms.m * (ex.h - cn.h)
    cw1.m = cw2.m = q / (cw2.h - cw1.h)
    fw, p1 = pump(cn, 8 * BAR, 0.72)
    return {"MS": ms, "EX": ex, "CN": cn, "FW": fw, "CW1": cw1, "CW2": cw2}, {
        "T1": t1,
        "CD": {"Q": q, "S_gen": sflow([cn, cw2], [ex, cw1])},
        "P1": p1,
    }


def deaerator():
    atm = atmosphere_at(450)
    hs = pt(10 * BAR, C(250))
    ls = ph(atm + 0.3 * BAR, hs.h)
    cr = pt(atm + 1.5 * BAR, C(80), 6 * T_H)
    mu = pt(atm + 1.5 * BAR, C(15), 2.5 * T_H)
    fw = px(ls.p, 0)  # the deaerator takes its lowest inlet pressure, the steam's
    loss = 15 * KW
    # mass: m_ls + m_cr + m_mu = m_fw; energy: sum m h = m_fw h_fw + loss
    ls.m = (cr.m * (fw.h - cr.h) + mu.m * (fw.h - mu.h) + loss) / (ls.h - fw.h)
    hs.m = ls.m
    fw.m = ls.m + cr.m + mu.m
    return {"HS": hs, "LS": ls, "CR": cr, "MU": mu, "FW": fw}, {
        "PRV": {"S_gen": sflow([ls], [hs])},
        "DA": {"S_gen": sflow([fw], [ls, cr, mu]) + loss / T0},
    }


def flash_recovery():
    atm = 14.2 * PSI
    c1 = px(150 * PSI + atm, 0, 9000 * LBM_H)
    v2 = px(15 * PSI + atm, 1)
    l3 = px(v2.p, 0)
    v2.m = c1.m * (c1.h - l3.h) / (v2.h - l3.h)
    l3.m = c1.m - v2.m
    return {"C1": c1, "V2": v2, "L3": l3}, {"F1": {"S_gen": sflow([v2, l3], [c1])}}


def desuperheater_spray():
    hp = pt(40 * BAR, C(400), 20 * T_H)
    sw = pt(60 * BAR, C(105))
    js = pt(hp.p, C(260))  # the outlet is at the steam pressure
    loss = 5 * KW
    sw.m = (hp.m * (hp.h - js.h) - loss) / (js.h - sw.h)
    js.m = hp.m + sw.m
    return {"HP": hp, "SW": sw, "JS": js}, {"DSH": {"S_gen": sflow([js], [hp, sw]) + loss / T0}}


def prv_station():
    atm = 14.6 * PSI
    hdr = pt(175 * PSI + atm, F(450), 12000 * LBM_H)
    a = pt(hdr.p, hdr.T, 7000 * LBM_H)
    b = pt(hdr.p, hdr.T, hdr.m - a.m)
    a2 = ph(50 * PSI + atm, hdr.h, a.m)
    b2 = ph(15 * PSI + atm, hdr.h, b.m)
    return {"HDR": hdr, "A": a, "B": b, "A2": a2, "B2": b2}, {
        "TEE": {"S_gen": sflow([a, b], [hdr])},
        "PRV1": {"S_gen": sflow([a2], [a])},
        "PRV2": {"S_gen": sflow([b2], [b])},
    }


def simple_rankine():
    p_cond = 15 * KPA
    fw1 = px(p_cond, 0, 8.0)  # condenser outlet at the exhaust pressure
    fw2, fp = pump(fw1, 4 * MPA, 0.75)
    ms = pt(4 * MPA - 0.2 * MPA, C(440), fw1.m)
    ex, tg = turbine(ms, p_cond, 0.80)
    qb = ms.m * (ms.h - fw2.h)
    qc = ex.m * (ex.h - fw1.h)
    return {"FW1": fw1, "FW2": fw2, "MS": ms, "EX": ex}, {
        "FP": fp,
        "B1": {"Q": qb, "S_gen": heated_sgen(fw2, ms)},
        "TG": tg,
        "CD": {"Q": qc, "S_gen": heated_sgen(ex, fw1)},
    }


def reheat_rankine():
    ms = pt(12 * MPA, C(540), 50.0)
    crh, hpt = turbine(ms, 2.5 * MPA, 0.87)
    hrh = pt(crh.p - 0.15 * MPA, C(540), ms.m)
    lx, lpt = turbine(hrh, 8 * KPA, 0.89)
    cn = px(lx.p, 0, ms.m)
    sw1 = pt(2 * BAR, C(18))
    sw2 = pt(2 * BAR - 0.5 * BAR, C(28))
    qcd = lx.m * (lx.h - cn.h)
    sw1.m = sw2.m = qcd / (sw2.h - sw1.h)
    fw, bfp = pump(cn, ms.p + 0.6 * MPA, 0.80)  # the boiler's pressure drop sets the discharge
    return {"MS": ms, "CRH": crh, "HRH": hrh, "LX": lx, "CN": cn, "FW": fw, "SW1": sw1, "SW2": sw2}, {
        "SG": {"Q": ms.m * (ms.h - fw.h), "S_gen": heated_sgen(fw, ms)},
        "HPT": hpt,
        "RH": {"Q": hrh.m * (hrh.h - crh.h), "S_gen": heated_sgen(crh, hrh)},
        "LPT": lpt,
        "CD": {"Q": qcd, "S_gen": sflow([cn, sw2], [lx, sw1])},
        "BFP": bfp,
    }


def waste_to_energy_cycle():
    ms = pt(42 * BAR, C(405), 28.0)
    x, hps = turbine(ms, 3.6 * BAR, 0.81)
    fw1 = px(x.p, 0, ms.m)  # the deaerator runs at its inlets' pressure, 3.6 bar
    # Both turbine and pump outlets depend only on their inlets' state, not on the flow: work the
    # states first, then the split from the deaerator's balances:
    #   m_bld + m_cn2 = m_fw1,  m_bld h_x + m_cn2 h_cn2 = m_fw1 h_fw1
    ex_state, _ = turbine(Stream(x.w, 1.0), 0.14 * BAR, 0.78)
    cn_state = px(ex_state.p, 0, 1.0)
    cn2_state, _ = pump(cn_state, 3.6 * BAR, 0.70)
    m_lp = ms.m * (x.h - fw1.h) / (x.h - cn2_state.h)
    bld = Stream(x.w, ms.m - m_lp)
    lpi = Stream(x.w, m_lp)
    exh, lps = turbine(lpi, 0.14 * BAR, 0.78)
    cn = px(exh.p, 0, m_lp)
    cn2, cep = pump(cn, 3.6 * BAR, 0.70)
    fw2, bfp = pump(fw1, ms.p + 3 * BAR, 0.76)  # the boiler's 3 bar drop sets the discharge
    return {"MS": ms, "X": x, "BLD": bld, "LPI": lpi, "EXH": exh, "CN": cn, "CN2": cn2, "FW1": fw1, "FW2": fw2}, {
        "HPS": hps,
        "TEE": {"S_gen": sflow([bld, lpi], [x])},
        "LPS": lps,
        "ACC": {"Q": exh.m * (exh.h - cn.h), "S_gen": heated_sgen(exh, cn)},
        "CEP": cep,
        "DA": {"S_gen": sflow([fw1], [bld, cn2])},
        "BFP": bfp,
        "SG": {"Q": ms.m * (ms.h - fw2.h), "S_gen": heated_sgen(fw2, ms)},
    }


def hp_feed_heater():
    ext = pt(14 * BAR, C(265))
    drn = px(ext.p, 0)  # the drain leaves saturated at the shell pressure
    fwi = pt(52 * BAR, C(138), 24.0)
    fwo = pt(fwi.p - 0.6 * BAR, C(186), fwi.m)
    q = fwi.m * (fwo.h - fwi.h)
    ext.m = drn.m = q / (ext.h - drn.h)
    drf = ph(4.2 * BAR, drn.h, drn.m)
    return {"EXT": ext, "DRN": drn, "DRF": drf, "FWI": fwi, "FWO": fwo}, {
        "HPH": {"Q": q, "S_gen": sflow([drn, fwo], [ext, fwi])},
        "LCV": {"S_gen": sflow([drf], [drn])},
    }


def process_heater():
    atm = 14.5 * PSI
    w1 = pt(45 * PSI + atm, F(140), 30000 * LBM_H)
    w2 = pt(w1.p - 3 * PSI, F(185), w1.m)
    q = 900e3 * BTU_H
    w3 = ph(w2.p - 4 * PSI, w2.h - q / w2.m, w1.m)
    return {"W1": w1, "W2": w2, "W3": w3}, {
        "HX1": {"Q": w1.m * (w2.h - w1.h), "S_gen": heated_sgen(w1, w2)},
        "WASH": {"Q": q, "S_gen": heated_sgen(w2, w3)},
    }


def mixer(ins, p_out, loss=0.0):
    m = sum(i.m for i in ins)
    o = ph(p_out, (sum(i.m * i.h for i in ins) - loss) / m, m)
    return o, {"S_gen": sflow([o], ins) + loss / T0}


def steam_header():
    pb = pt(11 * BAR, C(330), 6.5)
    whb = px(11 * BAR, 0.94, 1.6)
    hdr, hm = mixer([pb, whb], 11 * BAR - 0.3 * BAR)
    lpm = ph(4 * BAR, hdr.h, hdr.m)
    return {"PB": pb, "WHB": whb, "HDR": hdr, "LPM": lpm}, {
        "HM": hm,
        "PRV": {"S_gen": sflow([lpm], [hdr])},
    }


def district_heat_blend():
    hw = pt(8 * BAR, C(150), 0.9)
    rt = pt(8 * BAR, C(45), 3.6)
    bw, bv = mixer([hw, rt], 8 * BAR - 0.25 * BAR, 1.5 * KW)
    return {"HW": hw, "RT": rt, "BW": bw}, {"BV": bv}


def steam_injection():
    atm = atmosphere_at(120)
    st = px(3.5 * BAR, 1, 0.6)
    cl = pt(3.5 * BAR, C(18), 1.8)
    mx, inj = mixer([st, cl], 3.5 * BAR)
    vnt = px(atm, 1)  # the vented tank runs at the site atmosphere
    hl = px(atm, 0)
    vnt.m = mx.m * (mx.h - hl.h) / (vnt.h - hl.h)
    hl.m = mx.m - vnt.m
    return {"ST": st, "CL": cl, "MX": mx, "VNT": vnt, "HL": hl}, {
        "INJ": inj,
        "HLT": {"S_gen": sflow([vnt, hl], [mx])},
    }


def metered_turbine():
    """Plant readings reconciled: weighted least squares over the readings subject to the header's
    mass balance and the turbine's energy balance, solved by testdata/reconcile/nonlinear.py's
    reconcile (scipy SLSQP, polished by successive linearisation; numpy)."""
    sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "reconcile"))
    import numpy as np
    from nonlinear import reconcile

    def h_pt(p, t):
        return IAPWS97(P=p / 1e6, T=t).h * 1e3

    plant = {
        "streams": {
            "MS": {"flow": [18.1, 0.015 * 18.1], "p": [42 * BAR, 0.3 * BAR], "T": [C(410), 2.0]},
            "BP": {"p": [4.5 * BAR, 0.05 * BAR], "T": [C(195.5), 2.0]},
            "PM1": {"flow": [7.25, 0.02 * 7.25]},
            "PM2": {"flow": [6.05, 0.02 * 6.05]},
            "DRY": {"flow": [5.15, 0.02 * 5.15]},
        },
        "units": [{"kind": "turbine", "name": "TG1", "params": {"power": [7.15 * MW, 0.01 * 7.15 * MW]}}],
    }
    names = ["MS flow", "MS p", "MS T", "BP p", "BP T", "PM1 flow", "PM2 flow", "DRY flow", "TG1 power"]

    def g(y):
        m, p1, t1, p2, t2, m1, m2, m3, w = y
        return np.array([m1 + m2 + m3 - m, (m * (h_pt(p1, t1) - h_pt(p2, t2)) - w) / 1e3])

    ans = reconcile(plant, names, g, {})
    y = {n: ans["measurements"][n]["reconciled"] for n in names}
    ms = pt(y["MS p"], y["MS T"], y["MS flow"])
    bp = pt(y["BP p"], y["BP T"], y["MS flow"])
    branches = {n: pt(y["BP p"], y["BP T"], y[n + " flow"]) for n in ("PM1", "PM2", "DRY")}
    streams = {"MS": ms, "BP": bp, **branches}
    units = {
        "TG1": {"W": y["TG1 power"], "S_gen": sflow([bp], [ms])},
        "HDR": {"S_gen": sflow(list(branches.values()), [bp])},
    }
    rec = {"redundancy": ans["redundancy"], "chi2": ans["chi2"], "measurements": [
        {"name": n.split()[0], "property": n.split()[1], **ans["measurements"][n]} for n in names]}
    return streams, units, rec


def boiler_house():
    """A boiler with blowdown and a deaerator with a vent, in a loop through the feed pump.

    Every state follows from the givens without the flows (the deaerator's tank at its lowest
    inlet's pressure, the steam's 0.2 barg; blowdown saturated at the drum pressure, the steam
    outlet's; flash steam and drain saturated at 0.5 barg), so the flows are one linear system:
    the boiler's mass balance with its 4 % blowdown, the header's split, and the deaerator's
    mass and energy balances with its 0.5 % vent and 10 kW heat loss."""
    atm = 101325.0
    ms = pt(atm + 10 * BAR, C(220))
    ls = ph(atm + 0.2 * BAR, ms.h)
    ls0 = ph(ms.p, ms.h)
    ps_ = ph(ms.p, ms.h, 12 * T_H)
    cr = pt(atm + 1 * BAR, C(85), 8 * T_H)
    mu = pt(atm + 3 * BAR, C(12))
    dw = px(ls.p, 0)  # tank at the lowest inlet pressure, the heating steam's
    vt = px(ls.p, 1)
    bd = px(ms.p, 0)  # drum at the steam outlet pressure
    fs = px(atm + 0.5 * BAR, 1)
    bl = px(fs.p, 0)
    fw = ph(atm + 12 * BAR, dw.h + (ps(atm + 12 * BAR, dw.s).h - dw.h) / 0.70)  # the pump, before its flow is known
    loss = 10 * KW
    rate, vent = 0.04, 0.005
    q = (bd.h - bl.h) / (fs.h - bl.h)  # share of the blowdown that flashes
    # Unknowns: a = LS flow, b = MU flow, f = feedwater flow. Then MS = (1 - rate) f,
    # BD = rate f, FS = q BD, VT = vent f.
    #   header:          (1 - rate) f = PS + a
    #   deaerator mass:  CR + b + q rate f + a = (1 + vent) f
    #   deaerator energy: CR h_cr + b h_mu + q rate f h_fs + a h_ls = vent f h_vt + f h_dw + loss
    rows = [
        [-1.0, 0.0, 1 - rate, ps_.m],
        [1.0, 1.0, q * rate - 1 - vent, -cr.m],
        [ls.h, mu.h, q * rate * fs.h - vent * vt.h - dw.h, loss - cr.m * cr.h],
    ]
    a, b, f = solve3(rows)
    for s_, m in ((ls, a), (ls0, a), (mu, b), (dw, f), (fw, f), (ms, (1 - rate) * f), (bd, rate * f),
                  (fs, q * rate * f), (bl, (1 - q) * rate * f), (vt, vent * f)):
        s_.m = m
    duty = ms.m * ms.h + bd.m * bd.h - fw.m * fw.h
    fp = {"W": dw.m * (fw.h - dw.h), "S_gen": sflow([fw], [dw])}
    # Boiler without T_boundary: only the pressure drop inside the fluid counts (heated_sgen),
    # for each outlet.
    b1 = {"Q": duty, "S_gen": ms.m * (ms.s - ph(fw.p, ms.h).s) + bd.m * (bd.s - ph(fw.p, bd.h).s)}
    return {"DW": dw, "FW": fw, "MS": ms, "PS": ps_, "LS0": ls0, "LS": ls, "BD": bd, "FS": fs, "BL": bl,
            "CR": cr, "MU": mu, "VT": vt}, {
        "FP": fp,
        "B1": b1,
        "SH": {"S_gen": sflow([ps_, ls0], [ms])},
        "PRV": {"S_gen": sflow([ls], [ls0])},
        "BFT": {"S_gen": sflow([fs, bl], [bd])},
        "DA": {"S_gen": sflow([vt, dw], [cr, mu, fs, ls]) + loss / T0},
    }


def solve3(rows):
    """Solves three linear equations, each row [c1, c2, c3, rhs], by Cramer's rule."""
    def det(m):
        return (m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
                + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]))
    a = [r[:3] for r in rows]
    d = det(a)
    out = []
    for k in range(3):
        m = [r[:3] for r in rows]
        for i in range(3):
            m[i][k] = rows[i][3]
        out.append(det(m) / d)
    return out
def dairy_plant(fw_m=6.0, ts_m=4.5, eta=0.78, ms_T=C(400), power=None):
    """Boiler, splitter, back-pressure turbine, letdown valve, header mixer, attemperator."""
    fw = pt(42 * BAR, C(105), fw_m)
    ms = pt(40 * BAR, ms_T, fw_m)
    if power is not None:  # the turbine's flow follows from its power: W = m (h_in - h_out)
        per_kg, _ = turbine(pt(ms.p, ms.T, 1.0), 10 * BAR, eta)
        ts_m = power / (ms.h - per_kg.h)
    ts = pt(ms.p, ms.T, ts_m)
    by = pt(ms.p, ms.T, fw_m - ts_m)
    ex, t1 = turbine(ts, 10 * BAR, eta)
    ls = ph(10 * BAR, by.h, by.m)  # a valve conserves h
    hd = ph(10 * BAR, (ex.m * ex.h + ls.m * ls.h) / fw_m, fw_m)  # both inlets at 10 bar
    sw = pt(30 * BAR, C(105))
    ps = pt(hd.p, C(200))  # the attemperator's outlet is at its steam inlet's pressure
    sw.m = hd.m * (hd.h - ps.h) / (ps.h - sw.h)
    ps.m = hd.m + sw.m
    streams = {"FW": fw, "MS": ms, "TS": ts, "BY": by, "EX": ex, "LS": ls, "HD": hd, "SW": sw, "PS": ps}
    units = {
        "B1": {"Q": fw.m * (ms.h - fw.h), "S_gen": heated_sgen(fw, ms)},
        "SP": {"S_gen": sflow([ts, by], [ms])},
        "T1": {"W": t1["W"], "S_gen": t1["S_gen"]},
        "PRV": {"S_gen": sflow([ls], [by])},
        "HM": {"S_gen": sflow([hd], [ex, ls])},
        "DSH": {"S_gen": sflow([ps], [hd, sw])},
    }
    return streams, units


def dairy_loads():
    """The base, its three cases and the points of its sweep of the boiler's load."""
    streams, units = dairy_plant()
    cases = {}
    for name, args in [("low", dict(fw_m=4.0, ts_m=3.0, eta=0.72)), ("dispatch", dict(power=600 * KW)), ("fouled", dict(ms_T=C(370)))]:
        cs, cu = dairy_plant(**args)
        cases[name] = {"streams": {n: s.json() for n, s in cs.items()}, "units": cu}
    points = []
    for k in range(7):  # FW flow from 5 kg/s to 8 kg/s step 0.5 kg/s
        m = 5.0 + 0.5 * k
        ps_, pu = dairy_plant(fw_m=m)
        points.append({"value": m, "results": {
            "SW flow": ps_["SW"].m, "PS flow": ps_["PS"].m, "HD T": ps_["HD"].T, "B1 duty": pu["B1"]["Q"]}})
    return streams, units, None, {"cases": cases, "sweeps": {"load": points}}


EXAMPLES = {
    "boiler_house.hmb": boiler_house,
    "condensing_turbine.hmb": condensing_turbine,
    "deaerator.hmb": deaerator,
    "flash_recovery.hmb": flash_recovery,
    "desuperheater_spray.hmb": desuperheater_spray,
    "prv_station.hmb": prv_station,
    "simple_rankine.hmb": simple_rankine,
    "reheat_rankine.hmb": reheat_rankine,
    "waste_to_energy_cycle.hmb": waste_to_energy_cycle,
    "hp_feed_heater.hmb": hp_feed_heater,
    "process_heater.hmb": process_heater,
    "steam_header.hmb": steam_header,
    "district_heat_blend.hmb": district_heat_blend,
    "steam_injection.hmb": steam_injection,
    "metered_turbine.hmb": metered_turbine,
    "dairy_loads.hmb": dairy_loads,
}


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "expected.json")
    files = {}
    for name, calc in EXAMPLES.items():
        streams, units, *rec = calc()
        for n, s in streams.items():
            if s.m is None or not all(math.isfinite(v) for v in (s.m, s.p, s.T, s.h, s.s)):
                raise SystemExit("%s: stream %s not fully solved" % (name, n))
        files[name] = {
            "streams": {n: s.json() for n, s in streams.items()},
            "units": units,
        }
        if rec and rec[0] is not None:  # a metered plant: its readings' reconciliation
            files[name]["reconciliation"] = rec[0]
        if len(rec) > 1:  # cases and sweeps, each worked as the base is
            files[name].update(rec[1])
    doc = {
        "generator": "testdata/examples/expected.py, python3-iapws %s" % iapws.__version__,
        "units": "SI base: m kg/s, p Pa, T K, h J/kg, s J/(kg K), x fraction (null single phase), Q and W in W, S_gen in W/K; a sweep's value and results in the same",
        "files": files,
    }
    text = json.dumps(doc, indent=1, sort_keys=True) + "\n"
    # Written through a temporary file and a rename, so a reader never sees half a file.
    fd, tmp = tempfile.mkstemp(dir=os.path.dirname(os.path.abspath(out)), prefix=".expected-", suffix=".json")
    with os.fdopen(fd, "w") as f:
        f.write(text)
    os.replace(tmp, out)


if __name__ == "__main__":
    main()
