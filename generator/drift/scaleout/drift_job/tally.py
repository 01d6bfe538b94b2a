"""The tally of drift-tally.ts as mergeable pieces, so that files can be read on different Dask
workers and their pieces merged in any order:
- arrivals: the distinct (season, particle, segment) triples of positions within the arrival
  distance of a segment (the nearest one); counted per segment and season at the end, a particle
  counts once per segment and season;
- ends: per season and particle, its first appearance in reading order and its last position
  (latest time; among equal times the later one in reading order, as `>=` does in drift-tally.ts),
  with the ashore flag of that position.
Reading order is (file number, row) for every file, in the order datapackage.json lists them."""
import numpy as np
import pandas as pd

ORDER_SHIFT = 40  # rows (or observations) per file below 2^40


class Piece:
    def __init__(self, arrivals=None, ends=None, issues=None, outside=None, errors=False):
        self.arrivals = arrivals if arrivals is not None else pd.DataFrame({"season": np.zeros(0, np.int64), "particle": np.zeros(0, np.int64), "segment": np.zeros(0, np.int64)})
        self.ends = ends if ends is not None else pd.DataFrame({c: np.zeros(0, t) for c, t in (("season", np.int64), ("particle", np.int64), ("first", np.int64), ("time", np.float64), ("order", np.int64), ("lon", np.float64), ("lat", np.float64), ("ashore", bool))})
        self.issues = issues or []
        self.outside = outside or {}
        self.errors = errors


def _merge_ends(ends):
    ends = ends.sort_values(["season", "particle", "time", "order"], kind="stable")
    first = ends.groupby(["season", "particle"], sort=False)["first"].min()
    last = ends.drop_duplicates(["season", "particle"], keep="last").set_index(["season", "particle"])
    last["first"] = first
    return last.reset_index()


def piece_of_positions(particle, time_ms, lon, lat, ashore, order, calendar, matcher):
    """A piece from positions of one file (good positions only, in reading order)."""
    season = calendar.codes(time_ms)
    inside = season >= 0
    outside = int((~inside).sum())
    particle, time_ms, lon, lat, ashore, order, season = (a[inside] for a in (particle, time_ms, lon, lat, ashore, order, season))
    segment = matcher.nearest(lon, lat)
    near = segment >= 0
    arrivals = pd.DataFrame({"season": season[near], "particle": particle[near], "segment": segment[near]}).drop_duplicates()
    ends = pd.DataFrame({"season": season, "particle": particle, "first": order, "time": time_ms, "order": order, "lon": lon, "lat": lat, "ashore": ashore})
    piece = Piece(arrivals, _merge_ends(ends))
    piece.outside_count = outside
    return piece


def merge(pieces):
    pieces = [p for p in pieces if p is not None]
    arrivals = pd.concat([p.arrivals for p in pieces], ignore_index=True).drop_duplicates()
    ends = _merge_ends(pd.concat([p.ends for p in pieces], ignore_index=True))
    issues = [i for p in pieces for i in p.issues]
    outside = {}
    for p in pieces:
        for file, count in p.outside.items():
            outside[file] = outside.get(file, 0) + count
    return Piece(arrivals, ends, issues, outside, any(p.errors for p in pieces))


def tables(piece, calendar, segment_ids):
    """The drift-arrivals rows (every segment for every season with positions, seasons oldest
    first, segments in file order) and the end-of-season positions of drifting particles (per
    season, in order of each particle's first position in the season)."""
    codes = sorted(set(piece.ends["season"].tolist()) | set(piece.arrivals["season"].tolist()), key=lambda c: (calendar.start(c), calendar.season_id(c)))
    counts = piece.arrivals.groupby(["season", "segment"]).size()
    arrivals = []
    for code in codes:
        season = calendar.season_id(code)
        for s, segment_id in enumerate(segment_ids):
            arrivals.append((segment_id, season, int(counts.get((code, s), 0))))
    ends = piece.ends[~piece.ends["ashore"]]
    ends = ends.assign(rank=ends["season"].map({c: k for k, c in enumerate(codes)})).sort_values(["rank", "first"], kind="stable")
    end_rows = [(calendar.season_id(c), lon, lat) for c, lon, lat in zip(ends["season"].tolist(), ends["lon"].tolist(), ends["lat"].tolist())]
    return arrivals, end_rows
