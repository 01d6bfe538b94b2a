"""Reads the coastline segments of a scenario (GeoJSON FeatureCollection or TopoJSON Topology,
first object) into straight edges, in file order, as generator/read/read-segments.ts and
generator/drift/segment-index.ts see them: every straight piece of a line or polygon ring is an
edge owned by its segment. Features the built-in reader would leave out (no valid id, a repeated
id, a geometry that is not a non-empty line or polygon of valid positions, a line of zero length)
are left out here too and reported; the built-in reader also rejects lines that cross themselves,
checked here with shapely's is_simple."""
import json
import math

import numpy as np

from .issues import Issue, JobError
from .scenario import SLUG


def _topology_features(topology):
    arcs = topology.get("arcs") or []
    transform = topology.get("transform")

    def decoded(arc):
        points = []
        if transform:
            kx, ky = transform["scale"]
            dx, dy = transform["translate"]
            x0 = y0 = 0
            for position in arc:
                x0 += position[0]
                y0 += position[1]
                points.append([x0 * kx + dx, y0 * ky + dy])
        else:
            points = [list(p[:2]) for p in arc]
        return points

    cache = {}

    def arc_points(i):
        key = i if i >= 0 else ~i
        if key not in cache:
            cache[key] = decoded(arcs[key])
        points = list(cache[key])
        return points if i >= 0 else points[::-1]

    def line(indices):
        points = []
        for i in indices:
            if points:
                points.pop()
            points.extend(arc_points(i))
        if len(points) < 2:
            points.append(points[0] if points else None)
        return points

    def ring(indices):
        points = line(indices)
        while len(points) < 4:
            points.append(points[0])
        return points

    def geometry(o):
        kind = o.get("type")
        if kind == "LineString":
            return {"type": kind, "coordinates": line(o["arcs"])}
        if kind == "MultiLineString":
            return {"type": kind, "coordinates": [line(a) for a in o["arcs"]]}
        if kind == "Polygon":
            return {"type": kind, "coordinates": [ring(a) for a in o["arcs"]]}
        if kind == "MultiPolygon":
            return {"type": kind, "coordinates": [[ring(a) for a in p] for p in o["arcs"]]}
        return {"type": kind, "coordinates": None}

    objects = topology.get("objects") or {}
    if not objects:
        return []
    first = next(iter(objects.values()))
    members = first.get("geometries", [first]) if first.get("type") == "GeometryCollection" else [first]
    return [{"type": "Feature", "properties": g.get("properties") or {}, "geometry": geometry(g)} for g in members]


def _lines(geometry):
    kind = geometry.get("type") if isinstance(geometry, dict) else None
    coordinates = geometry.get("coordinates") if isinstance(geometry, dict) else None
    if kind == "LineString":
        return [coordinates], 2, False
    if kind == "MultiLineString":
        return coordinates, 2, False
    if kind == "Polygon":
        return coordinates, 4, True
    if kind == "MultiPolygon":
        return [ring for polygon in (coordinates or []) for ring in (polygon or [])], 4, True
    return None, 0, False


def _valid_line(line, minimum, ring):
    if not isinstance(line, list) or len(line) < minimum:
        return False
    for p in line:
        if not isinstance(p, list) or len(p) < 2 or any(isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) for v in p[:2]):
            return False
        if not (-180 <= p[0] <= 180 and -90 <= p[1] <= 90):
            return False
    return not ring or (line[0][0] == line[-1][0] and line[0][1] == line[-1][1])


class Segments:
    """Segment ids in file order and their edges: edge_segment[e] owns (x1, y1, x2, y2) = edges[e]."""

    def __init__(self, ids, edges, edge_segment):
        self.ids = ids
        self.edges = edges
        self.edge_segment = edge_segment


def read_segments(resource):
    file = resource.path
    try:
        with open(resource.absolute_path, encoding="utf-8") as handle:
            data = json.load(handle)
    except (OSError, ValueError) as error:
        raise JobError(f"{file} row (none), column (all): the segments cannot be read ({error})")
    if isinstance(data, dict) and data.get("type") == "Topology":
        features = _topology_features(data)
    elif isinstance(data, dict) and data.get("type") == "FeatureCollection":
        features = data.get("features") or []
    else:
        raise JobError(f"{file} row (none), column (all): expected a GeoJSON FeatureCollection or a TopoJSON Topology")
    from shapely.geometry import LineString

    ids, edges, owners, issues, seen = [], [], [], [], set()
    for row, feature in enumerate(features, start=1):
        properties = feature.get("properties") if isinstance(feature, dict) else None
        segment_id = properties.get("id") if isinstance(properties, dict) else None
        lines, minimum, ring = _lines(feature.get("geometry") if isinstance(feature, dict) else None)
        problem = None
        if not isinstance(segment_id, str) or not SLUG.match(segment_id):
            problem = "id", "a URL-safe segment id"
        elif segment_id in seen:
            problem = "id", "a segment id used once"
        elif not lines or not all(_valid_line(line, minimum, ring) for line in lines):
            problem = "geometry", "a non-empty LineString, MultiLineString or Polygon of valid positions"
        elif all(all(p[0] == line[0][0] and p[1] == line[0][1] for p in line) for line in lines):
            problem = "geometry", "a line longer than zero"
        elif not all(LineString([tuple(p[:2]) for p in line]).is_simple for line in lines if not ring):
            problem = "geometry", "a line that does not cross itself"
        if problem:
            issues.append(Issue("SegmentLeftOut", file, row, problem[0], None, problem[1], f"{file} row {row}, column {problem[0]}: the segment is left out; expected {problem[1]}"))
            continue
        seen.add(segment_id)
        index = len(ids)
        ids.append(segment_id)
        for line in lines:
            for a, b in zip(line[:-1], line[1:]):
                edges.append((float(a[0]), float(a[1]), float(b[0]), float(b[1])))
                owners.append(index)
    return Segments(ids, np.array(edges, dtype=np.float64).reshape(-1, 4), np.array(owners, dtype=np.int64)), issues
