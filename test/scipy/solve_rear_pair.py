#!/usr/bin/env python3
"""Independent solve of a leaning rear pair with SciPy (scipy.optimize.least_squares, 'trf').

Reads JSON on stdin: the rear pair's design points, the rear tyre, and a list of frame poses
(rotation as 3 rows, translation) taken from a solved pose. Shares no code with Tiltbench and
uses other unknowns: the carrier's slide along the frame's z, the two members' angles about
their pivot axes, and each rear upright as a free rigid body (rotation vector and translation,
6 parameters). The constraints are written from the physical description:
  - the upright's lower joint on the lower member's outer joint (3 rows),
  - the upright's upper joint on the upper member's outer joint (3 rows),
  - the upright turns relative to the lower member only about that member's pivot axis
    (the axis direction, as carried by both bodies, equal: 3 rows of rank 2),
  - the tyre (a torus: crown circle of radius R - r, swept by r) touches z = 0: its lowest
    point sits (R - r) sqrt(1 - n_z^2) + r below the wheel centre, n the unit spin axis.
Prints JSON: per pose, the largest residual and the posed rear points, spin axes and contacts.
"""
import json
import math
import sys

import numpy as np
from scipy.optimize import least_squares
from scipy.spatial.transform import Rotation


def axis_rotation(axis, angle):
    a = np.asarray(axis, float)
    return Rotation.from_rotvec(a / np.linalg.norm(a) * angle).as_matrix()


def solve(doc, pose):
    Rf = np.array(pose['rotation'], float)
    tf = np.array(pose['translation'], float)
    up = {k: np.array(doc['upper'][k], float) for k in ('pivot', 'axis')}
    lo = {k: np.array(doc['lower'][k], float) for k in ('pivot', 'axis')}
    sides = ('left', 'right')
    U = {s: np.array(doc['upper']['outer'][s], float) for s in sides}
    L = {s: np.array(doc['lower']['outer'][s], float) for s in sides}
    W = {s: np.array(doc['wheelCentre'][s], float) for s in sides}
    R, r = doc['rolling'], doc['crown']
    ez = np.array([0.0, 0.0, 1.0])
    ey = np.array([0.0, 1.0, 0.0])

    def member(level, theta, s_slide):
        m = up if level == 'upper' else lo
        Rm = axis_rotation(m['axis'], theta)
        rot = Rf @ Rm
        return lambda p: Rf @ (Rm @ (p - m['pivot']) + m['pivot'] + s_slide * ez) + tf, rot

    def unpack(x):
        s_slide, th_u, th_l = x[0], x[1], x[2]
        bodies = {}
        for i, s in enumerate(sides):
            w = x[3 + 6 * i: 6 + 6 * i]
            t = x[6 + 6 * i: 9 + 6 * i]
            Ru = Rotation.from_rotvec(w).as_matrix()
            bodies[s] = (Ru, t)
        return s_slide, th_u, th_l, bodies

    def residuals(x):
        s_slide, th_u, th_l, bodies = unpack(x)
        place_u, _ = member('upper', th_u, s_slide)
        place_l, rot_l = member('lower', th_l, s_slide)
        rows = []
        for s in sides:
            Ru, t = bodies[s]
            place = lambda p: Ru @ p + t
            rows.extend(place(L[s]) - place_l(L[s]))
            rows.extend(place(U[s]) - place_u(U[s]))
            a = lo['axis'] / np.linalg.norm(lo['axis'])
            rows.extend(1000.0 * (Ru @ a - rot_l @ a))
            C = place(W[s])
            n = Ru @ ey
            rows.append(C[2] - (R - r) * math.sqrt(max(0.0, 1.0 - n[2] ** 2)) - r)
        return np.array(rows)

    # Start: everything moved with the frame (members and uprights at their design angles).
    w0 = Rotation.from_matrix(Rf).as_rotvec()
    x0 = np.concatenate([[0.0, 0.0, 0.0], w0, tf, w0, tf])
    sol = least_squares(residuals, x0, method='trf', xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=2000)
    s_slide, th_u, th_l, bodies = unpack(sol.x)
    out = {'maxResidual': float(np.max(np.abs(residuals(sol.x)))), 'slideMm': float(s_slide), 'wheels': {}, 'points': {}}
    for s in sides:
        Ru, t = bodies[s]
        C = Ru @ W[s] + t
        n = Ru @ ey
        d = -ez + n[2] * n
        d = d / np.linalg.norm(d)
        contact = C + (R - r) * d - r * ez
        out['wheels'][s] = {'centre': C.tolist(), 'spinAxis': n.tolist(), 'contactPoint': contact.tolist()}
        out['points'][f'vehicle.rear.upper.outerJoint.{s}'] = (Ru @ U[s] + t).tolist()
        out['points'][f'vehicle.rear.lower.outerJoint.{s}'] = (Ru @ L[s] + t).tolist()
        out['points'][f'vehicle.rear.wheelCentre.{s}'] = C.tolist()
    return out


def main():
    doc = json.load(sys.stdin)
    print(json.dumps([solve(doc, p) for p in doc['poses']]))


if __name__ == '__main__':
    main()
