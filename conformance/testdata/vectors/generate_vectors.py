#!/usr/bin/python3
"""Conformance vectors for ports of the ellipse core, one JSON file per ellipse.

    /usr/bin/python3 conformance/testdata/vectors/generate_vectors.py

rewrites conformance/testdata/vectors/*.json next to this file.  The math
lives in ellipse/testdata/generate_reference.py and is imported from there.
Deterministic: fixed seeds, fixed precision (mpmath, mp.dps = 30).
See README.md in this folder for the meaning of every field.
"""

import math
import os
import random
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.dont_write_bytecode = True    # no __pycache__ inside the repo
sys.path.insert(0, os.path.normpath(os.path.join(HERE, "..", "..", "..", "ellipse", "testdata")))

import mpmath                                   # noqa: E402
from mpmath import mp, mpf                      # noqa: E402
import generate_reference as ref                # noqa: E402
from generate_reference import R, check, rel_err  # noqa: E402

SCRIPT = "conformance/testdata/vectors/generate_vectors.py"

# name, centre, (rx, ry), rotation, division count, offset of the second division
CASES = [
    ("round", (0.0, 0.0), (25.0, 25.0), 0.0, 72, -5.0),
    ("ordinary", (0.0, 0.0), (40.0, 25.0), 0.0, 200, 3.0),
    ("flat", (0.0, 0.0), (5.0, 50.0), 0.0, 360, -0.25),
    ("nearly_flat", (0.0, 0.0), (100.0, 0.01), 0.0, 400, 2.0),
    ("nearly_round", (-10.5, 7.25), (30.0, 29.97), -1.1, 100, -20.0),
    ("rotated_offset_centre", (123.25, -47.5), (20.0, 35.0), 0.6, 250, -8.0),
]

PERIMETER_TOL_REL = 1e-13
LENGTH_TOL_REL = 1e-13
EPS_SCALE = 1e-15       # allowance per unit of |t| (or of accumulated length) for doubles
POINT_TOL_REL = 1e-12   # absolute tolerance for points and distances, times the size
DISTANCE_DPS = ref.DPS + 50


def tol(x):
    """Round a tolerance up to two significant digits, as a float."""
    x = float(x)
    e = math.floor(math.log10(x)) - 1
    m = math.ceil(x / 10.0 ** e - 1e-9)
    return float("%de%d" % (m, e))


def arc_entries(rx, ry, rng):
    a = max(rx, ry)
    out = []
    for t0, t1 in ref.arc_pairs(rng):
        if t0 == t1:
            continue
        s = ref.arc(rx, ry, t0, t1)
        # Doubles cannot represent t to better than ~1 ulp of |t|, and an
        # arc length built from s(0, t) differences carries ~eps times the
        # lengths involved; allow for that on top of the relative floor.
        cond = EPS_SCALE * (max(abs(t0), abs(t1)) + 2 * math.pi) * a / float(abs(s))
        out.append({"t0": t0, "t1": t1, "s": R(s), "tol_rel": tol(max(LENGTH_TOL_REL, cond))})
    return out


def param_entries(rx, ry, P, rng):
    out = []
    for s in ref.inverse_targets(P, rng):
        t = ref.param_at(rx, ry, s)
        v = ref.speed(rx, ry, t)
        # error in s of a double evaluation, divided by the speed there
        ta = 1e-13 + 8e-16 * abs(float(t)) + 2 * EPS_SCALE * (abs(s) + float(P)) / float(v)
        out.append({"s": s, "t": R(t), "tol_abs": tol(ta)})
    return out


def division(cx, cy, theta, rx, ry, n, d):
    P = ref.perimeter(rx, ry)
    L = P + 2 * mp.pi * mpf(d)
    pts = []
    prev = None
    for k in range(n):
        s = k * L / n
        if (4 * k) % n == 0:
            # exactly a quarter point (each quarter has length L/4): use the
            # exact vertex instead of cos/sin of a rounded multiple of pi/2
            q = 4 * k // n
            t = q * mp.pi / 2
            c, sn = ((1, 0), (0, 1), (-1, 0), (0, -1))[q]
            ox, oy = (mpf(rx) + d) * c, (mpf(ry) + d) * sn
        else:
            t = ref.param_at(rx, ry, s, d)
            ox, oy = ref.own_point(rx, ry, t, d)
        x, y = ref.to_world(cx, cy, theta, ox, oy)
        if prev is not None:
            check(t > prev[0], "division parameters increase")
            chord = mpmath.hypot(x - prev[1], y - prev[2])
            check(chord <= L / n * (1 + mpf(10) ** -25), "chord not longer than arc")
            check(chord >= L / n * mpf("0.5"), "chord close to arc")
        check(abs(ref.offset_arc(rx, ry, d, 0, t) - s) <= mpf(10) ** -25 * L, "division residual")
        prev = (t, x, y)
        pts.append({"t": R(t), "s": R(s), "x": R(x), "y": R(y)})
    a, b = max(rx, ry), min(rx, ry)
    size = max(a, abs(cx), abs(cy), abs(d))
    # slowest point of the divided curve: b for d >= 0, b (1 + d a / b^2) for d < 0
    vmin = b if d >= 0 else b * (1 + d * a / (b * b))
    check(vmin > 0, "offset inside the limit")
    tol_t = 1e-13 + 8e-16 * 2 * math.pi + 8 * EPS_SCALE * float(L) / vmin
    return {"count": n, "offset": d, "length": R(L),
            "tol_abs": tol(POINT_TOL_REL * size), "tol_t": tol(tol_t), "points": pts}


def signed_distance_quartic(rx, ry, u1, u2):
    """Run at 30 extra digits: near an evolute cusp the roots coalesce."""
    with mp.workdps(ref.DPS + 30):
        return +_signed_distance_quartic(rx, ry, u1, u2)


def _signed_distance_quartic(rx, ry, u1, u2):
    """Independent signed distance (not a scan): the foot point is
    (rx^2 u1/(rx^2+l), ry^2 u2/(ry^2+l)) with l a real root of
    rx^2 u1^2 (ry^2+l)^2 + ry^2 u2^2 (rx^2+l)^2 - (rx^2+l)^2 (ry^2+l)^2 = 0,
    plus the two axis branches l = -rx^2, l = -ry^2."""
    rx, ry, u1, u2 = mpf(rx), mpf(ry), mpf(u1), mpf(u2)
    S = max(rx, ry)                     # work at unit size
    rx, ry, u1, u2 = rx / S, ry / S, u1 / S, u2 / S
    A, B = rx * rx, ry * ry
    # polynomial coefficients in l, highest degree first
    p1 = [1, 2 * B, B * B]                    # (B + l)^2
    p2 = [1, 2 * A, A * A]                    # (A + l)^2
    prod = [0] * 5
    for i, ci in enumerate(p2):
        for j, cj in enumerate(p1):
            prod[i + j] += ci * cj
    poly = [-c for c in prod]
    for i, c in enumerate(p1):
        poly[2 + i] += A * u1 * u1 * c
    for i, c in enumerate(p2):
        poly[2 + i] += B * u2 * u2 * c
    cands = []
    roots = []
    for steps in (200, 2000):
        try:
            roots = mpmath.polyroots(poly, maxsteps=steps, extraprec=600)
            break
        except mp.NoConvergence:
            continue
    for r in roots:
        if abs(mpmath.im(r)) > mpf(10) ** -10 * (A + abs(r)):
            continue
        l = mpmath.re(r)
        if A + l == 0 or B + l == 0:
            continue
        cands.append((A * u1 / (A + l) / rx, B * u2 / (B + l) / ry))
    # axis branches
    for (la, den_x, den_y) in ((-A, None, B - A), (-B, A - B, None)):
        if den_y is not None and den_y != 0:          # x free, y fixed
            ys = B * u2 / den_y / ry
            if abs(ys) <= 1:
                xs = mpmath.sqrt(1 - ys * ys)
                cands += [(xs, ys), (-xs, ys)]
        if den_x is not None and den_x != 0:          # y free, x fixed
            xs = A * u1 / den_x / rx
            if abs(xs) <= 1:
                ys = mpmath.sqrt(1 - xs * xs)
                cands += [(xs, ys), (xs, -ys)]
    cands += [(1, 0), (-1, 0), (0, 1), (0, -1)]
    best = None
    for cx_, cy_ in cands:
        t = mpmath.atan2(cy_, cx_)                  # project onto the curve
        c, s = mpmath.cos_sin(t)
        dist = mpmath.hypot(u1 - rx * c, u2 - ry * s)
        if best is None or dist < best:
            best = dist
    lev = (u1 / rx) ** 2 + (u2 / ry) ** 2 - 1
    best *= S
    return -best if lev < 0 else best


def distance_points_own(rx, ry):
    """Probe points in the ellipse's own frame (mpf pairs)."""
    rx, ry = mpf(rx), mpf(ry)
    A, B = max(rx, ry), min(rx, ry)
    pts = []

    def on(t, eps=0):
        t = mpf(t)
        x, y = ref.own_point(rx, ry, t)
        if eps:
            c, s = mpmath.cos_sin(t)
            v = ref.speed(rx, ry, t)
            x += eps * ry * c / v
            y += eps * rx * s / v
        return x, y

    for t in (0, 0.3, math.pi / 2, 2.0, math.pi, 4.0, 3 * math.pi / 2, 5.9):
        pts.append(on(t))                               # on the curve
    for t, eps in ((0.7, 1e-9), (0.7, -1e-9), (2.6, 1e-9), (2.6, -1e-9),
                   (4.4, 1e-3), (4.4, -1e-3), (0, -1e-9), (math.pi / 2, 1e-9)):
        pts.append(on(t, eps * A))                      # just outside / inside
    for ang, r in ((0.25, 1e3), (1.9, 1e3), (3.3, 1e3), (5.0, 1e3), (0.8, 1e6)):
        c, s = mpmath.cos_sin(mpf(ang))
        pts.append((r * A * c, r * A * s))              # far outside
    pts.append((mpf(0), mpf(0)))                        # centre
    pts += [(rx / 2, 0), (-rx * mpf("0.9"), 0), (0, ry / 2), (0, -ry * mpf("0.99"))]
    pts += [(rx * mpf("1.5"), 0), (-rx * mpf("1.0001"), 0), (0, 2 * ry), (0, -ry * mpf("1.5"))]
    pts += [(rx / 2, mpf("1e-12") * A), (-rx * mpf("0.3"), -mpf("1e-9") * A),
            (mpf("1e-12") * A, ry / 2), (rx * mpf("1.5"), mpf("1e-10") * A),
            (mpf("1e-10") * A, -2 * ry)]                # just off an axis
    # evolute cusps on the own axes and centres of curvature
    if rx != ry:
        if rx > ry:
            xc = (rx * rx - ry * ry) / rx
            pts += [(xc + mpf("1e-6") * A, 0), (xc - mpf("1e-6") * A, 0), (-xc, mpf("1e-6") * A)]
        else:
            yc = (ry * ry - rx * rx) / ry
            pts += [(0, yc + mpf("1e-6") * A), (0, yc - mpf("1e-6") * A), (mpf("1e-6") * A, -yc)]
    for t in (0, math.pi / 2, 0.7, 3.9):
        t = mpf(t)
        x, y = ref.own_point(rx, ry, t)
        c, s = mpmath.cos_sin(t)
        v = ref.speed(rx, ry, t)
        rho = 1 / ref.curvature(rx, ry, t)
        cx_, cy_ = x - rho * ry * c / v, y - rho * rx * s / v
        pts.append((cx_, cy_))
        pts.append((cx_ + mpf("1e-6") * A, cy_ - mpf("1e-6") * A))
    return pts


def distance_entries(cx, cy, theta, rx, ry):
    out = []
    seen = set()
    for ox, oy in distance_points_own(rx, ry):
        wx, wy = ref.to_world(cx, cy, theta, mpf(ox), mpf(oy))
        x, y = float(wx), float(wy)
        if (x, y) in seen:
            continue
        seen.add((x, y))
        # Extra digits here: points ~1e-16 (or, on an axis, ~1e-32) off the
        # curve still get 20 correct significant digits.
        with mp.workdps(DISTANCE_DPS):
            u1, u2 = ref.to_own(cx, cy, theta, x, y)
            d, tf = ref.signed_distance_own(rx, ry, u1, u2)
        scale = max(mpf(rx), mpf(ry), mpmath.hypot(u1, u2))
        closed = ref.signed_distance_axis_check(rx, ry, u1, u2)
        if closed is not None:
            check(abs(closed - d) <= mpf(10) ** -25 * scale,
                  "axis closed form %r %r: %s vs %s" % (x, y, d, closed))
        if rx != ry:
            q = signed_distance_quartic(rx, ry, u1, u2)
            check(abs(q - d) <= mpf(10) ** -22 * scale,
                  "quartic check %r %r: %s vs %s" % (x, y, d, q))
        size = max(rx, ry, abs(cx), abs(cy), float(mpmath.hypot(u1, u2)))
        out.append({"x": x, "y": y, "d": R(d), "tol_abs": tol(POINT_TOL_REL * size)})
    return out


def build(idx, name, centre, axes, theta, n, d_off):
    cx, cy = centre
    rx, ry = axes
    rng = random.Random(7000 + idx)
    P = ref.perimeter(rx, ry)
    if rx == ry:
        check(rel_err(P, 2 * mp.pi * mpf(rx)) < mpf(10) ** -28, "circle perimeter")
    check(rel_err(P, ref.quad_arc(rx, ry, 0, 2 * mp.pi)) < mpf(10) ** -24, "perimeter quad")
    check(-mpf(d_off) < ref.inward_limit(rx, ry), "offset within the inward limit")
    doc = {
        "source": ref.source_line(SCRIPT),
        "ellipse": {"center": [cx, cy], "semi_axes": [rx, ry], "rotation_rad": theta},
        "perimeter": {"value": R(P), "tol_rel": PERIMETER_TOL_REL},
        "arc_lengths": arc_entries(rx, ry, rng),
        "params_at_arc_length": param_entries(rx, ry, P, rng),
        "division": division(cx, cy, theta, rx, ry, n, 0.0),
        "division_offset": division(cx, cy, theta, rx, ry, n, d_off),
        "signed_distances": distance_entries(cx, cy, theta, rx, ry),
    }
    # spot checks by quadrature
    for e in doc["arc_lengths"][::5]:
        q = ref.quad_arc(rx, ry, e["t0"], e["t1"])
        check(abs(q - mpf(e["s"].text)) <= mpf(10) ** -19 * abs(q), "arc quad")
    return doc


def main():
    for i, case in enumerate(CASES):
        doc = build(i, *case)
        path = os.path.join(HERE, case[0] + ".json")
        size = ref.write_json(path, doc)
        check(size < 200000, "file too large")
        print("wrote %s (%d bytes)" % (path, size), file=sys.stderr)


if __name__ == "__main__":
    main()
