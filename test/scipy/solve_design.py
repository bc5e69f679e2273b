#!/usr/bin/python3
"""
Independent pose solver for the cross-check test (test/core/solver/scipy-crosscheck.test.ts).

Solves the same physical constraints as Tiltbench's TypeScript solver, formulated afresh
and solved with SciPy's scipy.optimize.least_squares (method 'trf'), for a split-wishbone
front end with a bell crank driven by a fixed ratio and both tyres on the ground:

  unknowns per side: the two wishbone angles about their pivot axes, and the upright as a
  free rigid body (rotation vector + translation, 6 parameters, relative to design);
  frame: rotated by the lean about the x axis through the origin (heave 0);
  bell crank: rotated by ratio * handlebar about its axis through its pivot;
  equations per side: lower and upper ball joints coincide with their wishbones' ends (3 + 3),
  the tie rod keeps its design length (1), and the tyre (a torus: rolling radius R, crown
  radius r) touches the ground z = 0: centre_z - (R - r) sqrt(1 - a_z^2) - r = 0, a = spin
  axis (1).

Usage: solve_design.py input.json  -> JSON on stdout.
input.json: {"design": <ResolvedDesign>, "poses": [{"leanDeg": .., "handlebarDeg": ..}, ...]}
Output: {"poses": [{"ok": bool, "maxResidual": mm, "points": {id: [x,y,z]},
          "wheels": {"right"|"left": {"centre": [..], "spinAxis": [..], "contactPoint": [..]}}}]}
"""
import json
import math
import sys

import numpy as np
from scipy.optimize import least_squares
from scipy.spatial.transform import Rotation

SIDES = ("right", "left")


def vec(p):
    return np.array([p["x"], p["y"], p["z"]], dtype=float)


def rot_about(axis, angle):
    axis = np.asarray(axis, dtype=float)
    return Rotation.from_rotvec(axis / np.linalg.norm(axis) * angle)


def design_spin_axis(side, toe_deg, camber_deg):
    """Spin axis pointing left (+y), from ISO 8855 toe (toe-in +) and camber (top out +)."""
    t = math.radians(toe_deg)
    g = math.radians(camber_deg)
    s = np.array([0.0, 1.0, 0.0])
    # camber: right wheel's top goes to -y, i.e. rotate the left-pointing axis about +x by +g;
    # left wheel's top goes to +y: about +x by -g.
    s = rot_about([1, 0, 0], g if side == "right" else -g).apply(s)
    # toe-in turns the right wheel's front to +y (heading +toe), the left's to -y (heading -toe)
    s = rot_about([0, 0, 1], t if side == "right" else -t).apply(s)
    return s


def lowest_tyre_point(c, a, R, r):
    """Lowest point of the torus: lowest point of the crown circle, then down by r."""
    a = a / np.linalg.norm(a)
    # orthonormal basis (u, v) of the wheel plane
    helper = np.array([1.0, 0.0, 0.0]) if abs(a[0]) < 0.9 else np.array([0.0, 0.0, 1.0])
    u = np.cross(a, helper)
    u /= np.linalg.norm(u)
    v = np.cross(a, u)
    # z(theta) = c_z + (R - r)(cos(theta) u_z + sin(theta) v_z) is lowest at theta = atan2(-v_z, -u_z)
    th = math.atan2(-v[2], -u[2])
    crown = c + (R - r) * (math.cos(th) * u + math.sin(th) * v)
    return crown - np.array([0.0, 0.0, r])


class Model:
    def __init__(self, d):
        fe = d["frontEnd"]
        if fe["kind"] != "splitWishbones":
            raise SystemExit("solve_design.py handles split wishbones only")
        st = d["steering"]
        if st["kind"] != "bellCrank" or st["input"]["kind"] != "ratio":
            raise SystemExit("solve_design.py handles a bell crank with a ratio input only")
        self.d = d
        self.crank_pivot = vec(st["pivot"])
        self.crank_axis = vec(st["axis"])
        self.ratio = st["input"]["crankDegPerHandlebarDeg"]
        tyre = d["wheels"]["front"]
        self.R = tyre["rollingRadiusMm"]
        self.r = tyre["crownRadiusMm"]
        self.side = {}
        for s in SIDES:
            w = {}
            for level in ("upper", "lower"):
                w[level] = {
                    "front": vec(fe[level]["frontPivot"][s]),
                    "rear": vec(fe[level]["rearPivot"][s]),
                    "outer": vec(fe[level]["outerJoint"][s]),
                }
            up = d["upright"]
            arm = vec(up["steeringArmJoint"][s])
            inner = vec(st["tieRodJoint"][s])
            self.side[s] = {
                "wish": w,
                "arm": arm,
                "inner": inner,
                "tieRod": float(np.linalg.norm(arm - inner)),
                "centre": vec(up["wheelCentre"][s]),
                "spin": design_spin_axis(s, up["staticToeDeg"][s], up["staticCamberDeg"][s]),
            }

    # --- kinematics -------------------------------------------------------------------------
    @staticmethod
    def frame(lean_deg):
        return rot_about([1, 0, 0], math.radians(lean_deg))

    def crank(self, hb_deg):
        return rot_about(self.crank_axis, math.radians(self.ratio * hb_deg))

    def wishbone_point(self, s, level, angle, p):
        w = self.side[s]["wish"][level]
        return w["front"] + rot_about(w["front"] - w["rear"], angle).apply(p - w["front"])

    @staticmethod
    def upright(x):
        """x = [rotvec(3), translation(3)]: design -> frame coordinates."""
        R = Rotation.from_rotvec(x[0:3])
        t = x[3:6]
        return R, t

    def residuals(self, z, lean, hb):
        F = self.frame(lean)
        C = self.crank(hb)
        out = []
        for i, s in enumerate(SIDES):
            x = z[8 * i: 8 * i + 8]
            phi_lower, phi_upper = x[0], x[1]
            R, t = self.upright(x[2:8])
            S = self.side[s]
            W = S["wish"]
            U = lambda p: R.apply(p) + t
            out.extend(U(W["lower"]["outer"]) - self.wishbone_point(s, "lower", phi_lower, W["lower"]["outer"]))
            out.extend(U(W["upper"]["outer"]) - self.wishbone_point(s, "upper", phi_upper, W["upper"]["outer"]))
            inner = self.crank_pivot + C.apply(S["inner"] - self.crank_pivot)
            out.append(np.linalg.norm(U(S["arm"]) - inner) - S["tieRod"])
            c = F.apply(U(S["centre"]))
            a = F.apply(R.apply(S["spin"]))
            out.append(c[2] - (self.R - self.r) * math.sqrt(max(0.0, 1 - a[2] ** 2)) - self.r)
        return np.array(out)

    def report(self, z, lean, hb):
        F = self.frame(lean)
        C = self.crank(hb)
        pts = {}
        wheels = {}
        for i, s in enumerate(SIDES):
            x = z[8 * i: 8 * i + 8]
            R, t = self.upright(x[2:8])
            U = lambda p: F.apply(R.apply(p) + t)
            S = self.side[s]
            W = S["wish"]
            for level in ("upper", "lower"):
                # inner pivots lie on the wishbone's axis: they move with the frame only
                pts[f"frontEnd.{level}.frontPivot.{s}"] = F.apply(W[level]["front"])
                pts[f"frontEnd.{level}.rearPivot.{s}"] = F.apply(W[level]["rear"])
                pts[f"frontEnd.{level}.outerJoint.{s}"] = U(W[level]["outer"])
            pts[f"upright.steeringArmJoint.{s}"] = U(S["arm"])
            pts[f"upright.wheelCentre.{s}"] = U(S["centre"])
            pts[f"steering.tieRodJoint.{s}"] = F.apply(self.crank_pivot + C.apply(S["inner"] - self.crank_pivot))
            c = U(S["centre"])
            a = F.apply(R.apply(S["spin"]))
            wheels[s] = {"centre": c.tolist(), "spinAxis": a.tolist(), "contactPoint": lowest_tyre_point(c, a, self.R, self.r).tolist()}
        pts["steering.pivot"] = F.apply(self.crank_pivot)
        return {k: v.tolist() for k, v in pts.items()}, wheels

    def solve(self, lean, hb):
        """Continuation from the design pose (all unknowns zero) in steps of at most 2 degrees."""
        z = np.zeros(16)
        n = max(1, math.ceil(max(abs(lean), abs(hb)) / 2.0))
        for k in range(1, n + 1):
            f = k / n
            sol = least_squares(
                self.residuals, z, args=(f * lean, f * hb), method="trf", jac="2-point",
                xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=2000,
            )
            z = sol.x
        res = self.residuals(z, lean, hb)
        return z, float(np.max(np.abs(res)))


def main():
    with open(sys.argv[1], encoding="utf8") as f:
        job = json.load(f)
    model = Model(job["design"])
    out = []
    for p in job["poses"]:
        z, worst = model.solve(p["leanDeg"], p["handlebarDeg"])
        pts, wheels = model.report(z, p["leanDeg"], p["handlebarDeg"])
        out.append({"ok": bool(worst < 1e-9), "maxResidual": worst, "points": pts, "wheels": wheels})
    json.dump({"poses": out, "scipy": __import__("scipy").__version__}, sys.stdout)


if __name__ == "__main__":
    main()
