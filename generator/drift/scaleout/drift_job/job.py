"""The command: reads a scenario's drift files on a Dask cluster and writes, into --out, a scenario
for `wrackline build` with the drift files replaced by what the build needs from them (see
../README.md):

  <out>/datapackage.json                the scenario's descriptor, drift files replaced by:
  <out>/drift/drift-arrivals.csv        segment_id,season,arrivals (role "drift-arrivals")
  <out>/drift/drift-end-positions.csv   season,lon,lat (role "drift-end-positions")
  <out>/drift/drift-job-issues.csv      every problem found and every record left out
  <out>/...                             the scenario's other files, copied unchanged
"""
import argparse
import csv
import json
import os
import shutil
import sys
import time

from .issues import JobError, js_number
from .scenario import read_scenario
from .seasons import SeasonCalendar
from .segment_match import SegmentMatcher
from .segments import read_segments
from .tally import merge, tables


def _files(scenario):
    """(kind, resource, numbers) in the built-in reader's order: CSV files, then trajectory files;
    trajectory files count only when no CSV is listed."""
    jobs = []
    for resource in scenario.positions:
        jobs.append(("positions", resource, len(jobs)))
    counted = not scenario.positions
    for t, resource in enumerate(scenario.trajectories):
        jobs.append(("trajectories", resource, (t, len(jobs), counted)))
    return jobs


def run_file(kind, resource, numbers, calendar, matcher):
    from .files import positions_file_piece, trajectory_file_piece

    if kind == "positions":
        return positions_file_piece(resource, numbers, calendar, matcher)
    t, file_number, counted = numbers
    return trajectory_file_piece(resource, t, file_number, calendar, matcher, counted)


def _tree_merge(client, futures):
    while len(futures) > 1:
        futures = [client.submit(merge, futures[i:i + 4]) if len(futures[i:i + 4]) > 1 else futures[i] for i in range(0, len(futures), 4)]
    return futures[0]


def _package_folder():
    return os.path.dirname(os.path.abspath(__file__))


def start_client(scheduler, workers, threads):
    import dask
    from distributed import Client, LocalCluster

    if scheduler:
        client = Client(scheduler)
        # Workers of a remote cluster may not have this folder: send them the package.
        import shutil
        import tempfile

        folder = tempfile.mkdtemp(prefix="drift-job-")
        archive = shutil.make_archive(os.path.join(folder, "drift_job"), "zip", os.path.dirname(_package_folder()), "drift_job")
        client.upload_file(archive)
        return client, None
    # Every server of the local cluster (scheduler, its dashboard, workers, their status pages,
    # nannies) listens on 127.0.0.1 only, on ports the system picks.
    with dask.config.set({"distributed.nanny.pre-spawn-environ": worker_environment()}):
        cluster = LocalCluster(n_workers=workers, threads_per_worker=threads, processes=True, host="127.0.0.1",
                               dashboard_address="127.0.0.1:0", worker_dashboard_address="127.0.0.1:0", scheduler_port=0, silence_logs=40)
    return Client(cluster), cluster


def worker_environment():
    """The environment distributed gives its worker processes, with glibc's memory settings put
    back near their defaults. distributed sets MALLOC_TRIM_THRESHOLD_=65536, which also freezes
    glibc's mmap threshold at 128 KiB: every numpy array above that is then mapped afresh and
    faulted in page by page, and a block of positions took 4 to 6 times as long (measured, see
    ../README.md). Variables set in the shell that starts the job still win."""
    import dask

    environment = dict(dask.config.get("distributed.nanny.pre-spawn-environ", {}))
    environment["MALLOC_TRIM_THRESHOLD_"] = 64 << 20
    environment["MALLOC_MMAP_THRESHOLD_"] = 32 << 20
    return environment


def run(scenario_dir, out_dir, client):
    scenario = read_scenario(scenario_dir)
    if scenario.segments is None:
        raise JobError("datapackage.json row (none), column resources: no resource with role \"segments\"")
    segments, segment_issues = read_segments(scenario.segments)
    calendar = SeasonCalendar(scenario.seasons)
    matcher = SegmentMatcher(segments, scenario.drift["arrivalDistanceKm"])
    files = _files(scenario)
    if not files:
        raise JobError("datapackage.json row (none), column resources: no drift-positions or drift-trajectories resource to read")
    [calendar_f] = client.scatter([calendar], broadcast=True)
    [matcher_f] = client.scatter([matcher], broadcast=True)
    futures = [client.submit(run_file, kind, resource, numbers, calendar_f, matcher_f, pure=False) for kind, resource, numbers in files]
    piece = _tree_merge(client, futures).result()
    arrivals, ends = tables(piece, calendar, segments.ids)
    issues = segment_issues + piece.issues
    write_outputs(scenario, out_dir, arrivals, ends, issues)
    return piece, issues


def write_outputs(scenario, out_dir, arrivals, ends, issues):
    """Writes a scenario folder for `wrackline build`: the scenario's descriptor and every
    non-drift file (copied unchanged), with the drift files replaced by the two tables."""
    if os.path.realpath(out_dir) == os.path.realpath(scenario.folder):
        raise JobError(f"--out {out_dir}: expected a folder other than the scenario's own")
    os.makedirs(os.path.join(out_dir, "drift"), exist_ok=True)
    with open(os.path.join(out_dir, "drift", "drift-arrivals.csv"), "w", newline="", encoding="utf-8") as handle:
        handle.write("segment_id,season,arrivals\n")
        for segment_id, season, count in arrivals:
            handle.write(f"{segment_id},{season},{count}\n")
    with open(os.path.join(out_dir, "drift", "drift-end-positions.csv"), "w", newline="", encoding="utf-8") as handle:
        handle.write("season,lon,lat\n")
        for season, lon, lat in ends:
            handle.write(f"{season},{js_number(lon)},{js_number(lat)}\n")
    with open(os.path.join(out_dir, "drift", "drift-job-issues.csv"), "w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle)
        writer.writerow(["code", "severity", "file", "row", "column", "value", "expected", "message"])
        for i in issues:
            writer.writerow([i.code, i.severity, i.file, "" if i.row is None else i.row, i.column or "", i.value or "", i.expected, i.message])
    descriptor = json.loads(json.dumps(scenario.descriptor))
    kept = []
    for raw in descriptor.get("resources", []):
        if raw.get("role") in ("drift-positions", "drift-trajectories", "drift-arrivals", "drift-end-positions"):
            continue
        path = raw.get("path")
        if isinstance(path, str):
            target = os.path.join(out_dir, path)
            os.makedirs(os.path.dirname(target), exist_ok=True)
            shutil.copyfile(os.path.join(scenario.folder, path), target)
        kept.append(raw)
    descriptor["resources"] = kept + [
        {"name": "drift-arrivals", "role": "drift-arrivals", "path": "drift/drift-arrivals.csv", "profile": "tabular-data-resource", "format": "csv",
         "mediatype": "text/csv", "encoding": "utf-8",
         "description": "Modelled particles arriving per segment and season, counted by the drift job from the scenario's drift files.",
         "schema": {"fields": [{"name": "segment_id", "type": "string", "constraints": {"required": True}},
                               {"name": "season", "type": "string", "constraints": {"required": True}},
                               {"name": "arrivals", "type": "integer", "constraints": {"required": True, "minimum": 0}}],
                    "primaryKey": ["segment_id", "season"]}},
        {"name": "drift-end-positions", "role": "drift-end-positions", "path": "drift/drift-end-positions.csv", "profile": "tabular-data-resource",
         "format": "csv", "mediatype": "text/csv", "encoding": "utf-8",
         "description": "Last position in each season of every particle still drifting, for the accumulation zones (drift job).",
         "schema": {"fields": [{"name": "season", "type": "string", "constraints": {"required": True}},
                               {"name": "lon", "type": "number", "constraints": {"required": True, "minimum": -180, "maximum": 180}},
                               {"name": "lat", "type": "number", "constraints": {"required": True, "minimum": -90, "maximum": 90}}]}},
    ]
    with open(os.path.join(out_dir, "datapackage.json"), "w", encoding="utf-8") as handle:
        json.dump(descriptor, handle, indent=2, ensure_ascii=False)
        handle.write("\n")


def main(argv=None):
    parser = argparse.ArgumentParser(prog="drift_job", description="Drift arrivals and end-of-season positions on a Dask cluster.")
    parser.add_argument("--scenario", required=True, help="scenario folder (with datapackage.json)")
    parser.add_argument("--out", required=True, help="folder for drift-arrivals.csv, drift-end-positions.csv and issues.csv")
    parser.add_argument("--scheduler", help="address of a running Dask scheduler (tcp://HOST:PORT); default: a local cluster")
    parser.add_argument("--workers", type=int, default=2, help="worker processes of the local cluster (default 2)")
    parser.add_argument("--threads", type=int, default=1, help="threads per local worker (default 1)")
    args = parser.parse_args(argv)
    started = time.monotonic()
    client = cluster = None
    try:
        client, cluster = start_client(args.scheduler, args.workers, args.threads)
        piece, issues = run(args.scenario, args.out, client)
    except JobError as error:
        print(f"drift job: {error}", file=sys.stderr)
        return 1
    finally:
        if client is not None:
            client.close()
        if cluster is not None:
            cluster.close()
    shown = [i for i in issues if i.severity == "error"] + [i for i in issues if i.severity != "error"]
    for issue in shown[:20]:
        print(f"{issue.severity}: {issue.message}", file=sys.stderr)
    if len(shown) > 20:
        print(f"... and {len(shown) - 20} more in {os.path.join(args.out, 'drift', 'drift-job-issues.csv')}", file=sys.stderr)
    errors = sum(1 for i in issues if i.severity == "error")
    print(f"drift job: {len(piece.arrivals)} arrivals (particle, segment, season), {len(piece.ends)} end positions, "
          f"{len(issues)} problem(s), {errors} error(s); {time.monotonic() - started:.1f} s", file=sys.stderr)
    return 1 if errors else 0
