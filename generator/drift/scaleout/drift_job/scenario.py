"""Reads what the job needs from a scenario folder: the resources of datapackage.json (role, path,
compression, delimiter) and the drift settings and seasons of the settings file, with the same
defaults as generator/scenario/settings.ts (arrival distance 2 km, zone distance 4 km, 25
particles per zone, four meteorological seasons)."""
import json
import os
import re
from dataclasses import dataclass, field

from .issues import JobError

DEFAULT_SEASONS = [
    {"id": "winter", "label": "Winter", "months": [12, 1, 2]},
    {"id": "spring", "label": "Spring", "months": [3, 4, 5]},
    {"id": "summer", "label": "Summer", "months": [6, 7, 8]},
    {"id": "autumn", "label": "Autumn", "months": [9, 10, 11]},
]
DEFAULT_DRIFT = {"arrivalDistanceKm": 2, "zoneDistanceKm": 4, "zoneMinParticles": 25}
SLUG = re.compile(r"^[a-z0-9][a-z0-9-]{0,62}$")
DRIFT_ROLES = ("drift-positions", "drift-trajectories")


@dataclass
class Resource:
    name: str
    role: str
    path: str
    absolute_path: str
    compression: str | None
    delimiter: str
    raw: dict


@dataclass
class Scenario:
    folder: str
    descriptor: dict
    resources: list
    seasons: list
    drift: dict
    settings_file: str
    segments: Resource | None = None
    positions: list = field(default_factory=list)
    trajectories: list = field(default_factory=list)


def _load_settings(path, file):
    try:
        with open(path, encoding="utf-8") as handle:
            text = handle.read()
    except OSError as error:
        raise JobError(f"{file} row (none), column (all): the settings file cannot be read ({error.strerror})")
    try:
        if file.lower().endswith((".yaml", ".yml")):
            import yaml
            return yaml.safe_load(text)
        return json.loads(text)
    except Exception as error:  # any parser failure is a bad settings file
        raise JobError(f"{file} row (none), column (all): the settings cannot be parsed ({error})")


def _check_seasons(seasons, file):
    if not isinstance(seasons, list) or not seasons:
        raise JobError(f"{file} row (none), column seasons: expected a list of seasons")
    for k, season in enumerate(seasons):
        months = season.get("months") if isinstance(season, dict) else None
        if not isinstance(season, dict) or not isinstance(season.get("id"), str) or not SLUG.match(season["id"]):
            raise JobError(f"{file} row (none), column seasons.{k}.id: expected a lower-case slug")
        if not isinstance(months, list) or not months or any(not isinstance(m, int) or isinstance(m, bool) or m < 1 or m > 12 for m in months):
            raise JobError(f"{file} row (none), column seasons.{k}.months: expected months 1..12")
    return [{"id": s["id"], "months": list(s["months"])} for s in seasons]


def _check_drift(drift, file):
    if drift is None:
        drift = {}
    if not isinstance(drift, dict):
        raise JobError(f"{file} row (none), column drift: expected an object")
    result = dict(DEFAULT_DRIFT)
    for key in DEFAULT_DRIFT:
        if key in drift:
            value = drift[key]
            if isinstance(value, bool) or not isinstance(value, (int, float)) or not value > 0:
                raise JobError(f"{file} row (none), column drift.{key}: {json.dumps(value)} is not a positive number")
            if key == "zoneMinParticles" and int(value) != value:
                raise JobError(f"{file} row (none), column drift.{key}: {json.dumps(value)} is not a whole number")
            result[key] = value
    return result


def read_scenario(folder):
    folder = os.path.abspath(folder)
    descriptor_path = os.path.join(folder, "datapackage.json")
    try:
        with open(descriptor_path, encoding="utf-8") as handle:
            descriptor = json.load(handle)
    except (OSError, ValueError) as error:
        raise JobError(f"datapackage.json row (none), column (all): the descriptor cannot be read ({error})")
    resources = []
    for k, raw in enumerate(descriptor.get("resources") or []):
        if not isinstance(raw, dict) or not isinstance(raw.get("path"), str):
            continue
        path = raw["path"]
        if os.path.isabs(path) or ".." in path.replace("\\", "/").split("/"):
            raise JobError(f"datapackage.json row (none), column resources.{k}.path: {json.dumps(path)} is not a path inside the scenario folder")
        compression = raw.get("compression")
        if compression is None and path.endswith(".gz"):
            compression = "gz"
        dialect = raw.get("dialect") or {}
        resources.append(Resource(
            name=str(raw.get("name", "")), role=str(raw.get("role", "")), path=path,
            absolute_path=os.path.join(folder, path), compression=compression,
            delimiter=str(dialect.get("delimiter", ",")), raw=raw,
        ))
    settings = next((r for r in resources if r.role == "settings"), None)
    if settings is None:
        raise JobError("datapackage.json row (none), column resources: no resource with role \"settings\"")
    values = _load_settings(settings.absolute_path, settings.path)
    if not isinstance(values, dict):
        raise JobError(f"{settings.path} row (none), column (all): expected an object")
    seasons = _check_seasons(values.get("seasons", DEFAULT_SEASONS), settings.path)
    drift = _check_drift(values.get("drift"), settings.path)
    scenario = Scenario(folder=folder, descriptor=descriptor, resources=resources, seasons=seasons, drift=drift, settings_file=settings.path)
    scenario.segments = next((r for r in resources if r.role == "segments"), None)
    scenario.positions = [r for r in resources if r.role == "drift-positions"]
    scenario.trajectories = [r for r in resources if r.role == "drift-trajectories"]
    return scenario
