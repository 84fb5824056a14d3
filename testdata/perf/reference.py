#!/usr/bin/python3
"""Vectorised numpy reference of scaleplan's sweep, for testdata/perf/compare.sh.

What it reads (the choice, and why): recomputing a study from its own numbers
would mean re-implementing the exact scale-law solver, the material library
(water density after Tanaka et al. 2001, viscosity after IAPWS 2008) and the
facility catalogue in Python. That is not what this comparison is about, so
the reference starts one step later: from a JSON export of every
combination's limits, written by the Go test helper TestWriteReferenceTerms
(sweep/reference_export_test.go). For every combination it holds the limits as
typed ("design_speed * measuring_time + 3 * hull_length <= tank_length") and,
at every second-axis value, the log-linear form ln v = C + E ln kL of every
name the limits use, plus the similarity conditions evaluated by the exact
solver (a scale they pin, or a condition that fails). The export also holds
scaleplan's own window of every combination, which is only used for the
check, never for the computation.

What it computes, the way a practitioner would with numpy: every name's model
value on the whole grid (second-axis values x kL points) for each
combination, every limit's margin log10(right/left) (or its inverse for a
lower bound) at every point, each limit's feasible interval per axis value
with its edges found by linear interpolation of the margin between the two
grid points around the sign change (exact for a products-of-powers limit,
whose margin is linear in log kL), the window (intersection), the similarity
conditions, the best axis value (largest model, then widest window) and, with
--workbook, the map sheets (margin and limiting limit of every combination at
every grid scale, at its chosen axis value) through openpyxl's write-only
mode. Limitations: constants with units in a limit and limits whose feasible
set is not one interval per axis value are reported as unsupported.

Usage: reference.py TERMS.json [--out WINDOWS.json] [--workbook MAPS.xlsx]
       reference.py check TERMS.json WINDOWS.json RUN.json
The check compares the reference's window of every combination with
scaleplan's (edges set by a products-of-powers limit or the sweep's range to
1e-9 relative; edges scaleplan finds by bisection to its 0.1 % tolerance) and
each strategy's recommended window printed by `scaleplan run --json`.
"""

import json
import math
import re
import sys

import numpy as np

# SI units a limit's constant may carry (scaleplan writes the tolerance
# limits of substitute strategies as "kinematic_viscosity >= 1.5e-06
# m^2/s"): the value is then already in SI, as the model values are, and
# the unit is dropped. Any other unit leaves the limit unsupported.
SI_UNITS = {"m", "s", "kg", "m/s", "m^2/s", "kg/m^3", "Pa", "Pa s", "Pa·s", "N", "N/m"}
CONSTANT_WITH_UNIT = re.compile(r"^([-+]?[0-9.]+(?:[eE][-+]?[0-9]+)?)\s+(\S.*)$")


def compile_side(text):
    """A limit side as a Python expression over numpy arrays."""
    m = CONSTANT_WITH_UNIT.match(text)
    if m and m.group(2) in SI_UNITS:
        text = m.group(1)
    return compile(text.replace("^", "**"), "<limit>", "eval")


def compile_limit(text):
    if "<=" in text:
        left, right = text.split("<=")
        upper = True
    elif ">=" in text:
        left, right = text.split(">=")
        upper = False
    else:
        raise ValueError("not a limit: " + text)
    return compile_side(left.strip()), compile_side(right.strip()), upper


def interval_edges(m, u):
    """Per axis row, the feasible interval of one limit from its margins m
    (rows x points): lo, hi in u, whether the row has any feasible point,
    whether lo/hi are the sweep's own range, and whether the feasible set is
    one interval."""
    ok = m >= 0
    n = m.shape[1]
    anyok = ok.any(axis=1)
    first = np.argmax(ok, axis=1)
    last = n - 1 - np.argmax(ok[:, ::-1], axis=1)
    count = ok.sum(axis=1)
    single = ~anyok | (count == last - first + 1)
    rows = np.arange(m.shape[0])
    f0 = np.maximum(first - 1, 0)
    mf0, mf = m[rows, f0], m[rows, first]
    with np.errstate(divide="ignore", invalid="ignore"):
        t = (0 - mf0) / (mf - mf0)
        lo = np.where(first == 0, u[0], u[f0] + t * (u[first] - u[f0]))
        l1 = np.minimum(last + 1, n - 1)
        ml, ml1 = m[rows, last], m[rows, l1]
        t = (0 - ml) / (ml1 - ml)
        hi = np.where(last == n - 1, u[-1], u[last] + t * (u[l1] - u[last]))
    lo = np.where(np.isfinite(lo), lo, u[f0])
    hi = np.where(np.isfinite(hi), hi, u[last])
    return lo, hi, anyok, first == 0, last == n - 1, single


def sweep_combo(c, u, lnk, keep_margins):
    axes = c["Axis"]
    na = len(axes)
    limits = c["Limits"] or []
    res = {"unsupported": None}
    # Every name's model value at every axis value and grid point.
    names = sorted({n for a in axes for n in a["forms"]})
    C = {n: np.array([a["forms"][n][0] for a in axes]) for n in names}
    E = {n: np.array([a["forms"][n][1] for a in axes]) for n in names}
    values = {n: np.exp(C[n][:, None] + E[n][:, None] * lnk[None, :]) for n in names}
    LO = np.full(na, u[0])
    HI = np.full(na, u[-1])
    loL = ["scale range"] * na
    hiL = ["scale range"] * na
    empty = np.zeros(na, dtype=bool)
    mins = argmins = None
    for j, lim in enumerate(limits):
        try:
            lc, rc, upper = compile_limit(lim["Text"])
            env = {"__builtins__": {}}
            env.update(values)
            left = np.broadcast_to(eval(lc, env), (na, len(u)))
            right = np.broadcast_to(eval(rc, env), (na, len(u)))
        except Exception as e:  # a unit in a constant, an unknown name
            res["unsupported"] = "limit %r: %s" % (lim["Text"], e)
            return res
        num, den = (right, left) if upper else (left, right)
        with np.errstate(divide="ignore", invalid="ignore"):
            m = np.log10(num / den)
        m = np.where((num > 0) & (den > 0) & ~np.isnan(m), m, -np.inf)
        if keep_margins:
            if mins is None:
                mins, argmins = m.copy(), np.zeros(m.shape, dtype=np.int32)
            else:
                lower = m < mins
                mins = np.where(lower, m, mins)
                argmins = np.where(lower, j, argmins)
        lo, hi, anyok, lo_range, hi_range, single = interval_edges(m, u)
        if not single.all():
            res["unsupported"] = "limit %r is feasible on more than one interval" % lim["Name"]
            return res
        empty |= ~anyok
        for i in range(na):
            if not anyok[i]:
                continue
            if not lo_range[i] and lo[i] > LO[i]:
                LO[i], loL[i] = lo[i], lim["Name"]
            if not hi_range[i] and hi[i] < HI[i]:
                HI[i], hiL[i] = hi[i], lim["Name"]
    windows = []
    for i, a in enumerate(axes):
        w = None
        if not empty[i] and LO[i] <= HI[i]:
            w = (LO[i], HI[i], loL[i], hiL[i])
        pins = [x["length"] for x in (a["conditions"] or []) if x.get("pins")]
        if any(x.get("fails") for x in (a["conditions"] or [])):
            w = None
        if pins:
            up = math.log10(pins[0])
            if any(abs(math.log10(p) - up) > 1e-9 for p in pins) or up < u[0] or up > u[-1]:
                w = None
            elif w is not None and w[0] <= up <= w[1]:
                w = (up, up, "similarity", "similarity")
            else:
                w = None
        windows.append(w)
    best = 0
    for i, w in enumerate(windows):
        b = windows[best]
        if w is None:
            continue
        if b is None or w[0] < b[0] or (w[0] == b[0] and (w[1] - w[0]) > (b[1] - b[0])):
            best = i
    res.update(best=best, axis=axes[best]["value"], window=windows[best])
    if keep_margins and mins is not None:
        # Copies: a row view would keep every axis value's margins alive.
        res["margins"], res["limiting"] = mins[best].copy(), argmins[best].copy()
    return res


def write_maps(path, data, results, grid):
    from openpyxl import Workbook

    wb = Workbook(write_only=True)
    strategies = []
    for c, r in zip(data["Combos"], results):
        if not strategies or strategies[-1][0] != c["Strategy"]:
            strategies.append((c["Strategy"], []))
        strategies[-1][1].append((c, r))
    for si, (name, combos) in enumerate(strategies):
        ws = wb.create_sheet(("Map %d " % (si + 1) + re.sub(r"[\[\]:*?/\\']", "_", name))[:31])
        header = ["scale (1:x)", "kL [-]"]
        for c, _ in combos:
            label = c["Medium"] + (" in " + c["Facility"] if c["Facility"] else "")
            header += ["margin [decades] " + label, "limited by (" + label + ")"]
        ws.append(header)
        cols = []
        for c, r in combos:
            if "margins" in r:
                names = [l["Name"] for l in c["Limits"]]
                cols.append((np.round(r["margins"], 3), [names[k] for k in r["limiting"]]))
            else:
                cols.append(None)
        for i, k in enumerate(grid):
            row = ["1:%.4g" % k if k >= 10 else "1:%.3g" % k, float("%.6g" % k)]
            for col in cols:
                if col is None:
                    row += ["", ""]
                    continue
                m = col[0][i]
                lim = col[1][i]
                if not np.isfinite(m):
                    row += ["", lim]
                else:
                    row += [float(m), ("infeasible: " + lim) if m < 0 else lim]
            ws.append(row)
    wb.save(path)


def check(terms_path, ref_path, run_path):
    with open(terms_path) as f:
        data = json.load(f)
    with open(ref_path) as f:
        ref = json.load(f)
    with open(run_path) as f:
        run = json.load(f)
    problems = []
    worst = {"exact": 0.0, "bisected": 0.0}
    axis_ties = 0

    def rel(a, b):
        return abs(a - b) / abs(b)

    for c, r in zip(data["Combos"], ref):
        at = "%s / %s / %s" % (c["Strategy"], c["Medium"], c["Facility"])
        if r.get("unsupported"):
            problems.append(at + ": reference cannot evaluate: " + r["unsupported"])
            continue
        linear = {l["Name"]: l["Linear"] for l in c["Limits"] or []}
        sw, rw = c["ScaleplanWindow"], r["window"]
        if len(sw) != len(rw):
            problems.append("%s: scaleplan has %d intervals, the reference %d" % (at, len(sw), len(rw)))
            continue
        for a, b in zip(sw, rw):
            for edge, label in (("Lo", a["LoLimit"]), ("Hi", a["HiLimit"])):
                kind = "exact" if linear.get(label, True) else "bisected"
                tol = 1e-9 if kind == "exact" else 1e-3
                d = rel(b[edge], a[edge])
                worst[kind] = max(worst[kind], d)
                if d > tol:
                    problems.append("%s: %s edge %r (%s) against the reference's %r: %.3g relative" % (at, edge, a[edge], label, b[edge], d))
        if sw and abs(r["axis"] - c["ScaleplanAxis"]) > 1e-12 * abs(c["ScaleplanAxis"]):
            axis_ties += 1
    # Each strategy's recommended window (largest model first, in sweep order).
    best = {}
    for c, r in zip(data["Combos"], ref):
        w = r.get("window")
        if w and (c["Strategy"] not in best or w[0]["Lo"] < best[c["Strategy"]][0]["Lo"]):
            best[c["Strategy"]] = w
    for study in run:
        for st in study["strategies"]:
            w = best.get(st["name"])
            if st["feasible"] != (w is not None):
                problems.append("%s: feasible %s, reference %s" % (st["name"], st["feasible"], w is not None))
                continue
            if w is None:
                continue
            sw = st["best"]["window"]
            if len(sw) != len(w):
                problems.append("%s: recommended window has %d intervals, the reference's %d" % (st["name"], len(sw), len(w)))
            for a, b in zip(sw, w):
                # run --json prints 12 significant digits.
                for key, edge in (("Lo", "from_kL"), ("Hi", "to_kL")):
                    if rel(b[key], a[edge]) > 1e-9:
                        problems.append("%s: recommended window edge %s %r, the reference's %r" % (st["name"], edge, a[edge], b[key]))
    print("windows of %d combinations compared: largest relative difference %.2g on edges found exactly, %.2g on edges found by bisection" % (len(ref), worst["exact"], worst["bisected"]))
    if axis_ties:
        print("%d combinations chose another second-axis value with the same window (a tie)" % axis_ties)
    for p in problems[:20]:
        print("DIFFERENCE: " + p)
    return 1 if problems else 0


def main(argv):
    if argv[1] == "check":
        return check(argv[2], argv[3], argv[4])
    terms = argv[1]
    out = workbook = None
    if "--out" in argv:
        out = argv[argv.index("--out") + 1]
    if "--workbook" in argv:
        workbook = argv[argv.index("--workbook") + 1]
    with open(terms) as f:
        data = json.load(f)
    grid = np.array(data["Grid"])
    u = np.log10(grid)
    lnk = np.log(grid)
    results = [sweep_combo(c, u, lnk, workbook is not None) for c in data["Combos"]]
    if workbook:
        write_maps(workbook, data, results, grid)
    summary = []
    for c, r in zip(data["Combos"], results):
        s = {k: c[k] for k in ("Strategy", "Case", "Medium", "Material", "Facility")}
        if r.get("unsupported"):
            s["unsupported"] = r["unsupported"]
        else:
            w = r["window"]
            s["axis"] = r["axis"]
            s["window"] = [] if w is None else [{"Lo": 10 ** w[0], "Hi": 10 ** w[1], "LoLimit": w[2], "HiLimit": w[3]}]
        summary.append(s)
    text = json.dumps(summary)
    if out:
        with open(out, "w") as f:
            f.write(text)
    else:
        print(text)


if __name__ == "__main__":
    sys.exit(main(sys.argv))
