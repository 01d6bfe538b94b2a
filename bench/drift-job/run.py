#!/usr/bin/python3
"""Drift-job benchmark: the built-in drift reader against the Dask drift job on 1 and 2 local
workers, on synthetic drift output written to disk (streamed, never held in memory), for each size
given (default 10^7 and 10^8 positions over 2,000 segments), side by side in one run, and how
each run's time grows from the smallest size to the largest.

  /usr/bin/python3 bench/drift-job/run.py [--sizes 10000000,100000000] [--segments 2000]
                   [--files-per-10m 2] [--work /tmp/wrackline-drift-bench] [--keep]

Data: the synthetic coast of bench/ingest (segments of about 2 km, 8 vertices, running north from
20 deg N), particles released in batches, one CSV file per batch of particles (as drift models
write one file per release or run), daily positions from 2025-12-01 for 100 days (winter into
spring); a third of the particles drift 0-5 km off the coast, the others 0.1-3 deg offshore.
The largest size is written once; a smaller size uses its first files. Everything is synthetic
and nothing here is a real place. Prints wall time and peak memory (resident set of the whole
process tree, sampled every 0.2 s) of each run, and checks that the three give the same tables.
"""
import argparse
import json
import math
import os
import shutil
import subprocess
import sys
import threading
import time

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))
DAYS = 100
START = np.datetime64("2025-12-01")


def coast_point(km):
    lat = 20 + km / 111.195
    lon = 0.05 * np.sin(km / 7) + 0.02 * np.sin(km / 1.3)
    return lon, lat


def write_segments(path, count):
    features = []
    for s in range(count):
        km = s * 2 + np.arange(8) * 2 / 7
        lon, lat = coast_point(km)
        coordinates = [[round(float(x), 6), round(float(y), 6)] for x, y in zip(lon, lat)]
        features.append({"type": "Feature", "properties": {"id": f"seg-{s}", "name": f"Segment {s}", "kind": "beach", "shellfish": "none"},
                         "geometry": {"type": "LineString", "coordinates": coordinates}})
    with open(path, "w") as handle:
        json.dump({"type": "FeatureCollection", "features": features}, handle)


def _digits(values, width):
    """Whole numbers >= 0 as fixed-width ASCII digit columns (uint8, len(values) x width)."""
    out = np.empty((values.size, width), dtype=np.uint8)
    v = values.astype(np.int64).copy()
    for k in range(width - 1, -1, -1):
        out[:, k] = 48 + v % 10
        v //= 10
    return out


def write_batch(path, first_particle, particles, segments, seed):
    """particles x DAYS rows: particle,time,lon,lat (fixed width, 5 decimals), day after day."""
    rng = np.random.default_rng(seed)
    ids = np.arange(first_particle, first_particle + particles)
    km = rng.random(particles) * segments * 2
    lon0, lat = coast_point(km)
    near = ids % 3 == 0
    lon = np.where(near, lon0 - rng.random(particles) * 5 / 80, -0.1 - rng.random(particles) * 2.9)
    pid = _digits(ids, 8)
    with open(path, "wb") as handle:
        handle.write(b"particle,time,lon,lat\n")
        for d in range(DAYS):
            lon = lon + (rng.random(particles) - 0.5) * 0.02
            lat = lat + (rng.random(particles) - 0.5) * 0.02
            day = str(START + np.timedelta64(d, "D")) + "T00:00:00Z"
            rows = np.empty((particles, 47), dtype=np.uint8)
            rows[:, 0:8] = pid
            rows[:, 8] = ord(",")
            rows[:, 9:29] = np.frombuffer(day.encode(), dtype=np.uint8)
            rows[:, 29] = ord(",")
            lon_fixed = np.round(np.abs(lon) * 1e5).astype(np.int64)
            rows[:, 30] = np.where(lon < 0, ord("-"), ord("+"))
            rows[:, 31:32] = _digits(lon_fixed // 100000, 1)
            rows[:, 32] = ord(".")
            rows[:, 33:38] = _digits(lon_fixed % 100000, 5)
            rows[:, 38] = ord(",")
            lat_fixed = np.round(lat * 1e5).astype(np.int64)
            rows[:, 39:41] = _digits(lat_fixed // 100000, 2)
            rows[:, 41] = ord(".")
            rows[:, 42:47] = _digits(lat_fixed % 100000, 5)
            handle.write(np.concatenate([rows, np.full((particles, 1), 10, dtype=np.uint8)], axis=1).tobytes())


def scenario(folder, files, data_dir):
    os.makedirs(os.path.join(folder, "drift"), exist_ok=True)
    shutil.copyfile(os.path.join(data_dir, "segments.geojson"), os.path.join(folder, "segments.geojson"))
    for name in files:
        target = os.path.join(folder, "drift", name)
        if not os.path.exists(target):
            os.link(os.path.join(data_dir, name), target)
    settings = {"invented": True, "region": {"id": "bench", "name": "Bench coast (synthetic)"},
                "publisher": {"role": "publisher", "name": "Bench"}, "authorities": [{"role": "publisher", "name": "Bench"}],
                "publications": [{"season": "2026-spring", "date": "2026-06-01"}]}
    with open(os.path.join(folder, "scenario.json"), "w") as handle:
        json.dump(settings, handle)
    resources = [{"name": "settings", "role": "settings", "path": "scenario.json", "format": "json"},
                 {"name": "segments", "role": "segments", "path": "segments.geojson", "format": "geojson"}]
    for k, name in enumerate(files):
        resources.append({"name": f"positions-{k}", "role": "drift-positions", "path": f"drift/{name}", "format": "csv",
                          "dialect": {"delimiter": ",", "header": True}})
    with open(os.path.join(folder, "datapackage.json"), "w") as handle:
        json.dump({"name": "drift-bench", "resources": resources}, handle, indent=1)


def tree_rss(pid):
    """Resident memory in bytes of a process and all its descendants (from /proc)."""
    children = {}
    total = 0
    for entry in os.listdir("/proc"):
        if not entry.isdigit():
            continue
        try:
            with open(f"/proc/{entry}/stat") as handle:
                fields = handle.read().rsplit(")", 1)[1].split()
            children.setdefault(int(fields[1]), []).append(int(entry))
        except OSError:
            continue
    stack = [pid]
    while stack:
        p = stack.pop()
        try:
            with open(f"/proc/{p}/statm") as handle:
                total += int(handle.read().split()[1]) * os.sysconf("SC_PAGE_SIZE")
        except OSError:
            pass
        stack.extend(children.get(p, []))
    return total


def measured(command, log):
    started = time.monotonic()
    process = subprocess.Popen(command, cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    peak = [0]

    def sample():
        while process.poll() is None:
            peak[0] = max(peak[0], tree_rss(process.pid))
            time.sleep(0.2)

    sampler = threading.Thread(target=sample, daemon=True)
    sampler.start()
    out, err = process.communicate()
    wall = time.monotonic() - started
    sampler.join()
    if process.returncode != 0:
        log(f"FAILED ({process.returncode}): {' '.join(command)}\n{err[-3000:]}")
        raise SystemExit(1)
    return wall, peak[0] / 2**20, out, err


def same(a, b):
    with open(a, "rb") as x, open(b, "rb") as y:
        return x.read() == y.read()


RUNS = ("built-in reader", "Dask job, 1 worker", "Dask job, 2 workers")


def table(results, sizes):
    """Side by side: one row per size, wall time and peak memory of each run."""
    lines = ["| positions | " + " | ".join(f"{r}: wall, peak memory" for r in RUNS) + " | job tables equal to built-in |",
             "|---:|" + "---:|" * len(RUNS) + "---|"]
    for size in sizes:
        row = results[size]
        cells = [f"{row[r][0]:.1f} s, {row[r][1]:,.0f} MiB" if r in row else "—" for r in RUNS]
        lines.append(f"| {row['positions']:,} | " + " | ".join(cells) + f" | {row.get('equal', '—')} |")
    return "\n".join(lines)


def growth(results, sizes):
    """How each run's time grows from the smallest to the largest size."""
    if len(sizes) < 2:
        return []
    a, b = results[sizes[0]], results[sizes[-1]]
    factor = b["positions"] / a["positions"]
    return [f"{r}: x{factor:.0f} positions took x{b[r][0] / a[r][0]:.1f} the time ({a[r][0]:.1f} s -> {b[r][0]:.1f} s)" for r in RUNS if r in a and r in b]


def main():
    parser = argparse.ArgumentParser(description="Built-in drift reader against the Dask drift job, side by side.")
    parser.add_argument("--sizes", default="10000000,100000000", help="position counts, comma-separated (default 10^7 and 10^8)")
    parser.add_argument("--segments", type=int, default=2000)
    parser.add_argument("--files-per-10m", type=int, default=2, help="files per 10 million positions (one file per batch of particles); smaller files when the smallest size needs them")
    parser.add_argument("--work", default="/tmp/wrackline-drift-bench")
    parser.add_argument("--keep", action="store_true", help="keep the generated files")
    args = parser.parse_args()
    sizes = sorted(int(float(s)) for s in args.sizes.split(","))
    log = lambda text: print(text, flush=True)  # noqa: E731
    data = os.path.join(args.work, "data")
    os.makedirs(data, exist_ok=True)
    largest = max(sizes)
    # Files of equal size, small enough that every size is a whole number of them.
    per_file = min(sizes[0], largest // max(1, round(largest / 1e7 * args.files_per_10m)))
    particles = max(1, per_file // DAYS)
    files = math.ceil(largest / (particles * DAYS))
    log(f"{time.strftime('%Y-%m-%d %H:%M', time.gmtime())} UTC; machine: {os.cpu_count()} cores, load average {'/'.join(f'{x:.2f}' for x in os.getloadavg())} (1/5/15 min); python {sys.version.split()[0]}")
    t0 = time.monotonic()
    write_segments(os.path.join(data, "segments.geojson"), args.segments)
    names = [f"positions-{k:03d}.csv" for k in range(files)]
    for k, name in enumerate(names):
        path = os.path.join(data, name)
        if not os.path.exists(path):
            write_batch(path, k * particles, particles, args.segments, 11 + k)
    gb = sum(os.path.getsize(os.path.join(data, n)) for n in names) / 2**30
    log(f"wrote {files} files x {particles * DAYS:,} positions ({particles:,} particles x {DAYS} days), {gb:.2f} GiB, {args.segments} segments, in {time.monotonic() - t0:.0f} s")
    results = {}
    job = ["/usr/bin/python3", os.path.join(ROOT, "generator/drift/scaleout/run-drift-job.py")]
    try:
        for size in sizes:
            count = max(1, size // (particles * DAYS))
            folder = os.path.join(args.work, f"scenario-{size}")
            scenario(folder, names[:count], data)
            row = results[size] = {"positions": count * particles * DAYS}
            out_builtin = os.path.join(args.work, f"builtin-{size}")
            wall, peak, out, _ = measured(["npx", "tsx", "bench/drift-job/builtin-tally.ts", folder, out_builtin], log)
            row[RUNS[0]] = (wall, peak)
            log(f"{row['positions']:>13,} positions ({count} files)  {RUNS[0]:<20} {wall:8.1f} s {peak:8,.0f} MiB   {out.strip()}")
            equal = []
            for workers, name in ((1, RUNS[1]), (2, RUNS[2])):
                out_job = os.path.join(args.work, f"job-{size}-{workers}")
                wall, peak, _, err = measured(job + ["--scenario", folder, "--out", out_job, "--workers", str(workers)], log)
                equal.append(all(same(os.path.join(out_builtin, f), os.path.join(out_job, "drift", f)) for f in ("drift-arrivals.csv", "drift-end-positions.csv")))
                row[name] = (wall, peak)
                log(f"{row['positions']:>13,} positions ({count} files)  {name:<20} {wall:8.1f} s {peak:8,.0f} MiB   tables equal: {'yes' if equal[-1] else 'NO'}; {err.strip().splitlines()[-1]}")
                shutil.rmtree(out_job, ignore_errors=True)
            row["equal"] = "yes" if all(equal) else "NO"
            shutil.rmtree(out_builtin, ignore_errors=True)
    finally:
        if not args.keep:
            shutil.rmtree(args.work, ignore_errors=True)
    log(f"\nwall time and peak memory (resident set of the process tree); load average at the end {'/'.join(f'{x:.2f}' for x in os.getloadavg())}\n")
    log(table(results, sizes))
    for line in growth(results, sizes):
        log(line)


if __name__ == "__main__":
    main()
