"""Great-circle distances on a spherical Earth, vectorised with numpy, written operation for
operation as generator/drift/geodesy.ts so that the two paths take the same decisions.

Radius: mean Earth radius R1 = 6371.0088 km (Moritz 1980, Geodetic Reference System 1980).
Haversine formula: Sinnott 1984, "Virtues of the Haversine", Sky and Telescope 68(2):159.
Point-to-arc distance: cross-track distance to the great circle through the arc's ends when the
foot of the perpendicular falls inside the arc, else the distance to the nearer end (spherical
trigonometry on unit vectors; common practice).
Sines, cosines and arcsines come from portable_math (the steps of portable-math.ts), not from
numpy, whose last bits differ from Node's.
"""
import math

import numpy as np

from .portable_math import asin, cos, sin

EARTH_RADIUS_KM = 6371.0088
TO_RADIANS = math.pi / 180
# Kilometres per degree of latitude (2 pi R / 360), as segment-index.ts computes it.
KM_PER_DEGREE_LAT = (2 * math.pi * EARTH_RADIUS_KM) / 360


def haversine_km(lon1, lat1, lon2, lat2):
    phi1 = lat1 * TO_RADIANS
    phi2 = lat2 * TO_RADIANS
    d_phi = phi2 - phi1
    d_lambda = (lon2 - lon1) * TO_RADIANS
    sin_half_phi = sin(d_phi / 2)
    sin_half_lambda = sin(d_lambda / 2)
    a = sin_half_phi * sin_half_phi + cos(phi1) * cos(phi2) * (sin_half_lambda * sin_half_lambda)
    return 2 * EARTH_RADIUS_KM * asin(np.minimum(1, np.sqrt(a)))


def _to_vector(lon, lat):
    lam = lon * TO_RADIANS
    phi = lat * TO_RADIANS
    cos_phi = cos(phi)
    return cos_phi * cos(lam), cos_phi * sin(lam), sin(phi)


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


def point_to_arc_km(p_lon, p_lat, a_lon, a_lat, b_lon, b_lat):
    """Shortest great-circle distance in km from points P to arcs A-B (arrays of equal length)."""
    px, py, pz = _to_vector(p_lon, p_lat)
    ax, ay, az = _to_vector(a_lon, a_lat)
    bx, by, bz = _to_vector(b_lon, b_lat)
    nx = ay * bz - az * by
    ny = az * bx - ax * bz
    nz = ax * by - ay * bx
    norm = hypot3(nx, ny, nz)
    to_ends = np.minimum(haversine_km(p_lon, p_lat, a_lon, a_lat), haversine_km(p_lon, p_lat, b_lon, b_lat))
    degenerate = norm < 1e-15
    safe_norm = np.where(degenerate, 1.0, norm)
    nx = nx / safe_norm
    ny = ny / safe_norm
    nz = nz / safe_norm
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
    inside = (afx * nx + afy * ny + afz * nz >= 0) & (fbx * nx + fby * ny + fbz * nz >= 0)
    cross = np.abs(asin(np.maximum(-1, np.minimum(1, sin_cross)))) * EARTH_RADIUS_KM
    return np.where(degenerate | ~inside, to_ends, cross)
