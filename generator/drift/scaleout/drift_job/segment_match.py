"""Nearest segment within the arrival distance, for arrays of positions, with the candidate and
decision rules of generator/drift/segment-index.ts:
- candidate edges are those whose bounding box overlaps the box lon +- dLon, lat +- dLat around the
  position (dLat = distance / km per degree of latitude, dLon widened by the cosine of the
  latitude nearer the pole);
- an edge whose local flat-Earth distance exceeds 1.05 x the distance + 0.05 km is not measured;
- the others are measured by great-circle distance to the arc (geodesy.arc_distance_km); the
  nearest edge within the distance wins, the segment listed first when two are exactly as near.
Candidates are found with a grid of cells (the grid-cell method of docs/scaling.md): every edge is
listed in the cells its widened box covers, and a position looks up its own cell only. Whole
arrays at a time: the edges' unit vectors and great-circle normals are computed once (geodesy.Arcs,
sent to the workers with the matcher), a position's once per block (geodesy.Points), and only
the pairs that pass the two cheap filters are measured."""
import math

import numpy as np

from .geodesy import KM_PER_DEGREE_LAT, Arcs, Points, arc_distance_km


def _search_box(lat, max_km):
    d_lat = max_km / KM_PER_DEGREE_LAT
    cos = np.cos((np.minimum(89.9, np.abs(lat) + d_lat) * math.pi) / 180)
    d_lon = np.minimum(360, d_lat / np.maximum(cos, 1e-6))
    return d_lat, d_lon


class SegmentMatcher:
    def __init__(self, segments, max_km):
        self.max_km = float(max_km)
        self.segment_count = len(segments.ids)
        e = segments.edges
        self.edge_segment = segments.edge_segment
        self.x1, self.y1, self.x2, self.y2 = (np.ascontiguousarray(e[:, k]) for k in range(4))
        self.min_x = np.minimum(self.x1, self.x2)
        self.max_x = np.maximum(self.x1, self.x2)
        self.min_y = np.minimum(self.y1, self.y2)
        self.max_y = np.maximum(self.y1, self.y2)
        self.arcs = Arcs(self.x1, self.y1, self.x2, self.y2)
        d_lat = self.max_km / KM_PER_DEGREE_LAT
        # Cells of half the search distance: an edge is listed in more cells, a position meets
        # fewer edges that are out of reach.
        self.cell = max(d_lat / 2, 1e-4)
        if len(e) == 0:
            self.cell_keys = np.zeros(0, dtype=np.int64)
            return
        # A position reaches an edge only if it lies in the edge's box widened by its own search
        # box; the widest search box near an edge is that at the edge's pole-ward latitude + dLat.
        pole = np.maximum(np.abs(self.min_y), np.abs(self.max_y)) + 2 * d_lat
        _, reach_lon = _search_box(pole, self.max_km)
        reach_lon = reach_lon * 1.001 + 1e-9
        reach_lat = d_lat * 1.001 + 1e-9
        west = float(np.min(self.min_x - reach_lon))
        south = float(np.min(self.min_y - reach_lat))
        self.west, self.south = west, south
        i1 = np.floor((self.min_x - reach_lon - west) / self.cell).astype(np.int64)
        i2 = np.floor((self.max_x + reach_lon - west) / self.cell).astype(np.int64)
        j1 = np.floor((self.min_y - reach_lat - south) / self.cell).astype(np.int64)
        j2 = np.floor((self.max_y + reach_lat - south) / self.cell).astype(np.int64)
        self.rows = int(np.max(j2)) + 2
        self.columns = int(np.max(i2)) + 2
        keys, owners = [], []
        for edge in range(len(e)):
            ii = np.arange(i1[edge], i2[edge] + 1)
            jj = np.arange(j1[edge], j2[edge] + 1)
            k = (ii[:, None] * self.rows + jj[None, :]).ravel()
            keys.append(k)
            owners.append(np.full(k.size, edge, dtype=np.int64))
        keys = np.concatenate(keys)
        owners = np.concatenate(owners)
        order = np.lexsort((owners, keys))
        keys, owners = keys[order], owners[order]
        self.cell_keys, starts = np.unique(keys, return_index=True)
        self.cell_start = starts.astype(np.int64)
        self.cell_count = np.diff(np.append(starts, keys.size)).astype(np.int64)
        self.cell_edges = owners

    def nearest(self, lon, lat):
        """Index of the nearest segment within the distance for each position, or -1."""
        n = lon.size
        best = np.full(n, -1, dtype=np.int64)
        if n == 0 or self.cell_keys.size == 0:
            return best
        i = np.floor((lon - self.west) / self.cell)
        j = np.floor((lat - self.south) / self.cell)
        inside = (i >= 0) & (j >= 0) & (i < self.columns) & (j < self.rows)
        keys = np.where(inside, i, 0).astype(np.int64) * self.rows + np.where(inside, j, 0).astype(np.int64)
        slot = np.searchsorted(self.cell_keys, keys)
        slot = np.minimum(slot, self.cell_keys.size - 1)
        found = inside & (self.cell_keys[slot] == keys)
        points = np.nonzero(found)[0]
        if points.size == 0:
            return best
        # Per position in a listed cell: its search box and flat-Earth scale, computed once.
        plon, plat = lon[points], lat[points]
        d_lat, d_lon = _search_box(plat, self.max_km)
        k_lon = KM_PER_DEGREE_LAT * np.cos((plat * math.pi) / 180)
        counts = self.cell_count[slot[points]]
        starts = self.cell_start[slot[points]]
        total = int(counts.sum())
        pair = np.repeat(np.arange(points.size), counts)  # position (index into points) of each pair
        offsets = np.arange(total, dtype=np.int64) - np.repeat(np.cumsum(counts) - counts, counts)
        edge = self.cell_edges[np.repeat(starts, counts) + offsets]
        # The box search of segment-index.ts.
        qlon, qlat, qd_lon = plon[pair], plat[pair], d_lon[pair]
        keep = ~((self.max_x[edge] < qlon - qd_lon) | (self.max_y[edge] < qlat - d_lat) | (self.min_x[edge] > qlon + qd_lon) | (self.min_y[edge] > qlat + d_lat))
        pair, edge, qlon, qlat = pair[keep], edge[keep], qlon[keep], qlat[keep]
        # The local flat-Earth estimate of segment-index.ts, written in the same order.
        x1, y1, x2, y2 = self.x1[edge], self.y1[edge], self.x2[edge], self.y2[edge]
        q_k_lon = k_lon[pair]
        ax = (x1 - qlon) * q_k_lon
        ay = (y1 - qlat) * KM_PER_DEGREE_LAT
        dx = (x2 - qlon) * q_k_lon - ax
        dy = (y2 - qlat) * KM_PER_DEGREE_LAT - ay
        length2 = dx * dx + dy * dy
        with np.errstate(divide="ignore", invalid="ignore"):
            t = np.where(length2 > 0, np.maximum(0, np.minimum(1, -(ax * dx + ay * dy) / np.where(length2 > 0, length2, 1))), 0)
        px = ax + t * dx
        py = ay + t * dy
        planar = np.sqrt(px * px + py * py)
        keep = ~(planar > self.max_km * 1.05 + 0.05)
        pair, edge = pair[keep], edge[keep]
        if pair.size == 0:
            return best
        # Great-circle distances: each remaining position's unit vector once, then per pair.
        first = np.concatenate(([True], pair[1:] != pair[:-1]))
        measured = Points(plon[pair[first]], plat[pair[first]])
        km = arc_distance_km(measured, np.cumsum(first) - 1, self.arcs, edge)
        keep = km <= self.max_km
        point, edge, km = points[pair[keep]], edge[keep], km[keep]
        if point.size == 0:
            return best
        # Candidates come grouped by position (in increasing order): the nearest per group, and
        # among exactly as near ones the segment listed first.
        segment = self.edge_segment[edge]
        starts = np.nonzero(np.concatenate(([True], point[1:] != point[:-1])))[0]
        nearest_km = np.minimum.reduceat(km, starts)
        group_km = np.repeat(nearest_km, np.diff(np.append(starts, point.size)))
        chosen = np.minimum.reduceat(np.where(km == group_km, segment, np.iinfo(np.int64).max), starts)
        best[point[starts]] = chosen
        return best
