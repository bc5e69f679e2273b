#!/usr/bin/python3
"""
Independent pose solver for the balance-beam lean linkage cross-check
(test/core/solver/scipy-leanLinkage.test.ts), solved with SciPy's least_squares ('trf').

The physical description, written afresh from the design file's words (not from the
TypeScript template): the split-wishbone front end of solve_design.py (each upright a free
rigid body, two wishbone angles per side, bell crank by a fixed ratio, tyres as tori on the
ground z = 0), plus
  frame: rolled by the lean about the x axis, then shifted by an unknown (0, y, z);
  carrier: slid along the line from its spring mount to the frame's by -heave (the heave input
    is the spring's extension), so the rocker pivot moves with it;
  rocker: turned by an unknown angle about its axis through its pivot;
  push links: |rocker joint - wishbone joint| = design length, per side (2 equations);
  the mean y of the two tyres' lowest points is 0 (1 equation).
Unknowns 16 + 3, equations 16 + 3.

Usage: solve_lean_linkage.py input.json -> JSON on stdout.
input.json: {"design": <ResolvedDesign>, "poses": [{"leanDeg", "handlebarDeg", "heaveMm"}, ...]}
Output: {"poses": [{"ok", "maxResidual", "points": {id: [x, y, z]}, "rockerDeg", "frame": [y, z]}]}
"""
import json
import math
import os
import sys

import numpy as np
from scipy.optimize import least_squares

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from solve_design import SIDES, Model, lowest_tyre_point, rot_about, vec  # noqa: E402


class LeanModel(Model):
    def __init__(self, d):
        super().__init__(d)
        ll = d["leanLinkage"]
        self.frame_mount = vec(ll["carrier"]["frameMount"])
        self.carrier_mount = vec(ll["carrier"]["carrierMount"])
        slide = self.frame_mount - self.carrier_mount
        self.slide = slide / np.linalg.norm(slide)
        self.pivot = vec(ll["rocker"]["pivot"])
        self.rocker_axis = vec(ll["rocker"]["axis"])
        self.on = ll["pushLinks"]["on"]
        self.link = {}
        for s in SIDES:
            j = vec(ll["rocker"]["linkJoint"][s])
            a = vec(ll["pushLinks"]["armJoint"][s])
            self.link[s] = {"joint": j, "arm": a, "length": float(np.linalg.norm(j - a))}

    def rocker_point(self, p, rho, heave):
        """A rocker point in frame coordinates: turned about the pivot, then slid with the carrier."""
        shift = -heave * self.slide
        return self.pivot + shift + rot_about(self.rocker_axis, rho).apply(p - self.pivot)

    def world(self, F, y, zf, p):
        return F.apply(p) + np.array([0.0, y, zf])

    def residuals(self, z, lean, hb, heave):
        F = self.frame(lean)
        C = self.crank(hb)
        y, zf, rho = z[16], z[17], z[18]
        out = []
        contact_y = 0.0
        for i, s in enumerate(SIDES):
            x = z[8 * i: 8 * i + 8]
            phi = {"lower": x[0], "upper": x[1]}
            R, t = self.upright(x[2:8])
            S = self.side[s]
            W = S["wish"]
            U = lambda p: R.apply(p) + t
            for level in ("lower", "upper"):
                out.extend(U(W[level]["outer"]) - self.wishbone_point(s, level, phi[level], W[level]["outer"]))
            inner = self.crank_pivot + C.apply(S["inner"] - self.crank_pivot)
            out.append(np.linalg.norm(U(S["arm"]) - inner) - S["tieRod"])
            c = self.world(F, y, zf, U(S["centre"]))
            a = F.apply(R.apply(S["spin"]))
            out.append(c[2] - (self.R - self.r) * math.sqrt(max(0.0, 1 - a[2] ** 2)) - self.r)
            contact_y += lowest_tyre_point(c, a, self.R, self.r)[1] / 2
            L = self.link[s]
            arm = self.wishbone_point(s, self.on, phi[self.on], L["arm"])
            out.append(np.linalg.norm(self.rocker_point(L["joint"], rho, heave) - arm) - L["length"])
        out.append(contact_y)
        return np.array(out)

    def report(self, z, lean, hb, heave):
        F = self.frame(lean)
        C = self.crank(hb)
        y, zf, rho = z[16], z[17], z[18]
        Wd = lambda p: self.world(F, y, zf, p)
        pts = {}
        for i, s in enumerate(SIDES):
            x = z[8 * i: 8 * i + 8]
            phi = {"lower": x[0], "upper": x[1]}
            R, t = self.upright(x[2:8])
            S = self.side[s]
            W = S["wish"]
            for level in ("upper", "lower"):
                pts[f"frontEnd.{level}.frontPivot.{s}"] = Wd(W[level]["front"])
                pts[f"frontEnd.{level}.rearPivot.{s}"] = Wd(W[level]["rear"])
                pts[f"frontEnd.{level}.outerJoint.{s}"] = Wd(R.apply(W[level]["outer"]) + t)
            pts[f"upright.steeringArmJoint.{s}"] = Wd(R.apply(S["arm"]) + t)
            pts[f"upright.wheelCentre.{s}"] = Wd(R.apply(S["centre"]) + t)
            pts[f"steering.tieRodJoint.{s}"] = Wd(self.crank_pivot + C.apply(S["inner"] - self.crank_pivot))
            L = self.link[s]
            pts[f"leanLinkage.rocker.linkJoint.{s}"] = Wd(self.rocker_point(L["joint"], rho, heave))
            pts[f"leanLinkage.pushLinks.armJoint.{s}"] = Wd(self.wishbone_point(s, self.on, phi[self.on], L["arm"]))
        pts["leanLinkage.rocker.pivot"] = Wd(self.rocker_point(self.pivot, rho, heave))
        pts["leanLinkage.carrier.carrierMount"] = Wd(self.carrier_mount - heave * self.slide)
        pts["leanLinkage.carrier.frameMount"] = Wd(self.frame_mount)
        return {k: v.tolist() for k, v in pts.items()}

    def solve(self, lean, hb, heave):
        """Continuation from the design pose (all unknowns zero) in steps of at most 2 degrees or 2 mm."""
        z = np.zeros(19)
        n = max(1, math.ceil(max(abs(lean), abs(hb), abs(heave)) / 2.0))
        for k in range(1, n + 1):
            f = k / n
            sol = least_squares(
                self.residuals, z, args=(f * lean, f * hb, f * heave), method="trf", jac="2-point",
                xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=4000,
            )
            z = sol.x
        res = self.residuals(z, lean, hb, heave)
        return z, float(np.max(np.abs(res)))


def main():
    with open(sys.argv[1], encoding="utf8") as f:
        job = json.load(f)
    model = LeanModel(job["design"])
    out = []
    for p in job["poses"]:
        z, worst = model.solve(p["leanDeg"], p["handlebarDeg"], p["heaveMm"])
        out.append({
            "ok": bool(worst < 1e-9),
            "maxResidual": worst,
            "points": model.report(z, p["leanDeg"], p["handlebarDeg"], p["heaveMm"]),
            "rockerDeg": math.degrees(z[18]),
            "frame": [z[16], z[17]],
        })
    json.dump({"poses": out, "scipy": __import__("scipy").__version__}, sys.stdout)


if __name__ == "__main__":
    main()
