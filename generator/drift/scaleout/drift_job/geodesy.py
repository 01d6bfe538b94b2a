"""Great-circle distances on a spherical Earth, vectorised with numpy, written operation for
operation as generator/drift/geodesy.ts so that the two paths take the same decisions.

Radius: mean Earth radius R1 = 6371.0088 km (Moritz 1980, Geodetic Reference System 1980).
Haversine formula: Sinnott 1984, "Virtues of the Haversine", Sky and Telescope 68(2):159.
Point-to-arc distance: cross-track distance to the great circle through the arc's ends when the
foot of the perpendicular falls inside the arc, else the distance to the nearer end (spherical
trigonometry on unit vectors; common practice).
Sines, cosines and arcsines come from portable_math (the steps of portable-math.ts), not from
numpy, whose last bits differ from Node's.

For speed, what depends on one point only is computed once per point (its unit vector and the
cosine of its latitude: `Points`), what depends on one arc only once per arc (its ends and the
normal of its great circle: `Arcs`), and per pair of point and arc only the rest; each value is
still computed by the same operations, in the same order, as geodesy.ts computes it.
"""
import math

import numpy as np

from .portable_math import asin, sin, sin_cos

EARTH_RADIUS_KM = 6371.0088
TO_RADIANS = math.pi / 180
# Kilometres per degree of latitude (2 pi R / 360), as segment-index.ts computes it.
KM_PER_DEGREE_LAT = (2 * math.pi * EARTH_RADIUS_KM) / 360


class Points:
    """Points with their unit vectors and the cosine of their latitude (toVector in geodesy.ts)."""

    def __init__(self, lon, lat):
        self.lon = np.asarray(lon, dtype=np.float64)
        self.lat = np.asarray(lat, dtype=np.float64)
        sin_lambda, cos_lambda = sin_cos(self.lon * TO_RADIANS)
        sin_phi, cos_phi = sin_cos(self.lat * TO_RADIANS)
        self.cos_lat = cos_phi
        self.x, self.y, self.z = cos_phi * cos_lambda, cos_phi * sin_lambda, sin_phi

    def take(self, index):
        out = Points.__new__(Points)
        for name in ("lon", "lat", "cos_lat", "x", "y", "z"):
            setattr(out, name, getattr(self, name)[index])
        return out


class Arcs:
    """Arcs A-B: their ends as Points and the unit normal of the great circle through them."""

    def __init__(self, a_lon, a_lat, b_lon, b_lat):
        self.a = Points(a_lon, a_lat)
        self.b = Points(b_lon, b_lat)
        a, b = self.a, self.b
        nx = a.y * b.z - a.z * b.y
        ny = a.z * b.x - a.x * b.z
        nz = a.x * b.y - a.y * b.x
        norm = hypot3(nx, ny, nz)
        self.degenerate = norm < 1e-15  # A and B coincide (or are antipodal)
        safe_norm = np.where(self.degenerate, 1.0, norm)
        self.nx, self.ny, self.nz = nx / safe_norm, ny / safe_norm, nz / safe_norm


def _haversine(p, q):
    """haversineKm of geodesy.ts for Points p and q (arrays of equal length)."""
    phi1 = p.lat * TO_RADIANS
    phi2 = q.lat * TO_RADIANS
    d_phi = phi2 - phi1
    d_lambda = (q.lon - p.lon) * TO_RADIANS
    sin_half_phi = sin(d_phi / 2)
    sin_half_lambda = sin(d_lambda / 2)
    a = sin_half_phi * sin_half_phi + p.cos_lat * q.cos_lat * (sin_half_lambda * sin_half_lambda)
    return 2 * EARTH_RADIUS_KM * asin(np.minimum(1, np.sqrt(a)))


def haversine_km(lon1, lat1, lon2, lat2):
    return _haversine(Points(lon1, lat1), Points(lon2, lat2))


def hypot3(x, y, z):
    """Math.hypot of three numbers as V8 computes it: scaled by the largest magnitude, with a
    compensated (Kahan) sum of the squares."""
    ax, ay, az = np.abs(x), np.abs(y), np.abs(z)
    biggest = np.maximum(np.maximum(ax, ay), az)
    safe = np.where(biggest == 0, 1.0, biggest)
    total = np.zeros_like(biggest)
    compensation = np.zeros_like(biggest)
    for value in (ax, ay, az):
        n = value / safe
        summand = n * n - compensation
        preliminary = total + summand
        compensation = (preliminary - total) - summand
        total = preliminary
    return np.where(biggest == 0, 0.0, np.sqrt(total) * safe)


def arc_distance_km(p, pair_point, arcs, pair_arc):
    """pointToArcKm of geodesy.ts for pairs of a point (Points p, row pair_point) and an arc (Arcs,
    row pair_arc): the cross-track distance where the foot of the perpendicular falls inside the
    arc, else the distance to the nearer end; the arcsine or the two haversines only where they
    are used, and only the values a pair needs gathered for it."""
    a, b = arcs.a, arcs.b
    px, py, pz = p.x[pair_point], p.y[pair_point], p.z[pair_point]
    ax, ay, az, bx, by, bz = a.x[pair_arc], a.y[pair_arc], a.z[pair_arc], b.x[pair_arc], b.y[pair_arc], b.z[pair_arc]
    nx, ny, nz = arcs.nx[pair_arc], arcs.ny[pair_arc], arcs.nz[pair_arc]
    sin_cross = px * nx + py * ny + pz * nz
    fx = px - sin_cross * nx
    fy = py - sin_cross * ny
    fz = pz - sin_cross * nz
    afx = ay * fz - az * fy
    afy = az * fx - ax * fz
    afz = ax * fy - ay * fx
    fbx = fy * bz - fz * by
    fby = fz * bx - fx * bz
    fbz = fx * by - fy * bx
    inside = ~arcs.degenerate[pair_arc] & (afx * nx + afy * ny + afz * nz >= 0) & (fbx * nx + fby * ny + fbz * nz >= 0)
    km = np.empty(sin_cross.shape)
    km[inside] = np.abs(asin(np.maximum(-1, np.minimum(1, sin_cross[inside])))) * EARTH_RADIUS_KM
    ends = np.nonzero(~inside)[0]
    if ends.size:
        q, e = p.take(pair_point[ends]), pair_arc[ends]
        km[ends] = np.minimum(_haversine(q, a.take(e)), _haversine(q, b.take(e)))
    return km


def point_to_arc_km(p_lon, p_lat, a_lon, a_lat, b_lon, b_lat):
    """Shortest great-circle distance in km from points P to arcs A-B (arrays of equal length)."""
    every = np.arange(np.size(p_lon))
    return arc_distance_km(Points(p_lon, p_lat), every, Arcs(a_lon, a_lat, b_lon, b_lat), every)
