"""Reads CF trajectory files (NetCDF-3 or NetCDF-4) in slices of observations, with the layout
detection and checks of generator/drift/cf-trajectories.ts: CF Conventions (since 1.6),
chapter 9 "Discrete Sampling Geometries" and Appendix H.4 (orthogonal and incomplete
multidimensional, contiguous and indexed ragged arrays). Unused storage (_FillValue,
missing_value, the default fills, NaN) is skipped; a longitude 180..360 is shifted by -360; a
position with a bad longitude, latitude, time or trajectory index is reported with its row (the
observation's position in the file, from 1), trajectory and observation, and left out."""
import math
import os
import re

import numpy as np

from . import issues as msg
from .issues import js_number
from .times import parse_date_time

SLICE = 4_000_000
UNIT_MS = {
    **{u: 1000 for u in ("s", "sec", "secs", "second", "seconds")},
    **{u: 60_000 for u in ("min", "mins", "minute", "minutes")},
    **{u: 3_600_000 for u in ("h", "hr", "hrs", "hour", "hours")},
    **{u: 86_400_000 for u in ("d", "day", "days")},
}
TIME_UNITS = re.compile(r"^\s*([a-zA-Z]+)\s+since\s+(.+?)\s*\Z", re.ASCII)
REFERENCE = re.compile(r"^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ](\d{1,2}):(\d{1,2})(?::(\d{1,2}(?:\.\d+)?))?)?\s*(Z|UTC|[+-]\d{1,2}(?::?\d{2})?)?\Z", re.ASCII | re.IGNORECASE)


class NotUsable(Exception):
    def __init__(self, issue):
        super().__init__(issue.message)
        self.issue = issue


def _text(value):
    return value.strip() if isinstance(value, str) else None


def json_string(value):
    import json
    return json.dumps(value, ensure_ascii=False)


def parse_time_units(units):
    m = TIME_UNITS.match(units)
    if not m:
        return f"time units {json_string(units)} are not \"<unit> since <date>\""
    per_unit = UNIT_MS.get(m[1].lower())
    if per_unit is None:
        return f"time unit {json_string(m[1])} is not seconds, minutes, hours or days"
    ref = REFERENCE.match(m[2])
    if not ref:
        return f"time reference {json_string(m[2])} is not a date"
    pad = lambda v, n=2: (v or "0").rjust(n, "0")  # noqa: E731
    zone = ref[7] or "Z"
    if zone.lower() == "utc":
        zone = "Z"
    elif zone not in ("Z", "z"):
        sign, digits = zone[0], zone[1:].replace(":", "", 1)
        zone = f"{sign}{pad(digits if len(digits) <= 2 else digits[:-2])}:{'00' if len(digits) <= 2 else digits[-2:]}"
    else:
        zone = "Z"
    whole, _, fraction = (ref[6] or "0").partition(".")
    iso = f"{ref[1]}-{pad(ref[2])}-{pad(ref[3])}T{pad(ref[4])}:{pad(ref[5])}:{pad(whole)}{'.' + fraction if fraction else ''}{zone}"
    epoch = parse_date_time(iso)
    if math.isnan(epoch):
        return f"time reference {json_string(m[2])} is not a valid date"
    return per_unit, epoch


def _numbers(value):
    if value is None:
        return []
    array = np.atleast_1d(np.asarray(value))
    if array.dtype.kind in "iuf":
        return [float(v) for v in array]
    return []


class Variable:
    def __init__(self, var):
        self.var = var
        self.name = var.name
        self.dimensions = list(var.dimensions)
        self.shape = list(var.shape)
        self.attributes = {k: var.getncattr(k) for k in var.ncattrs()}
        var.set_auto_maskandscale(False)

    def read(self, start=None, stop=None):
        data = self.var[:] if start is None else self.var[start:stop]
        return np.asarray(data).astype(np.float64)

    def missing(self, values):
        marks = _numbers(self.attributes.get("_FillValue")) + _numbers(self.attributes.get("missing_value"))
        out = np.isnan(values) | (np.abs(values) >= 9.9e36) | (values == -2147483647)
        for m in marks:
            out |= (values == m) | (np.abs(values - m) <= abs(m) * 1e-7)
        return out


def _find(variables, standard_name, names, units):
    for v in variables:
        if _text(v.attributes.get("standard_name")) == standard_name:
            return v
    for v in variables:
        if units.search(_text(v.attributes.get("units")) or "") and len(v.shape) > 0:
            return v
    for v in variables:
        if v.name.lower() in names:
            return v
    return None


class TrajectoryFile:
    """Layout and variables of one CF trajectory file, checked as the built-in reader checks them."""

    def __init__(self, path, file):
        import netCDF4

        self.file = file
        try:
            size = os.path.getsize(path)
            self.dataset = netCDF4.Dataset(path, "r")
            self.format = "netcdf4" if self.dataset.data_model.startswith("NETCDF4") else "netcdf3"
            if self.format == "netcdf3":
                needed = _classic_size(path)
                if needed > size:
                    raise ValueError(f"the file has {size} bytes but its header describes {needed}")
        except (OSError, ValueError, RuntimeError) as error:
            raise NotUsable(msg.netcdf_unreadable(file, str(error)))
        ds = self.dataset
        self.variables = [Variable(v) for v in ds.variables.values()]
        attrs = {k: ds.getncattr(k) for k in ds.ncattrs()}
        feature_type = _text(attrs.get("featureType")) or _text(attrs.get("feature_type"))
        lon = _find(self.variables, "longitude", ("lon", "longitude"), re.compile(r"^degrees?_?(east|e)$", re.I))
        lat = _find(self.variables, "latitude", ("lat", "latitude"), re.compile(r"^degrees?_?(north|n)$", re.I))
        time = _find(self.variables, "time", ("time", "t"), re.compile(r"\bsince\b", re.I))
        bad = lambda column, reason: NotUsable(msg.netcdf_not_trajectory(file, column, reason))  # noqa: E731
        if feature_type is not None and feature_type.lower() != "trajectory":
            raise bad("featureType", f"featureType is {json_string(feature_type)}; expected \"trajectory\"")
        if lon is None:
            raise bad("lon", 'no longitude variable (standard_name "longitude" or units "degrees_east")')
        if lat is None:
            raise bad("lat", 'no latitude variable (standard_name "latitude" or units "degrees_north")')
        if time is None:
            raise bad("time", 'no time variable (standard_name "time" or units "<unit> since <date>")')
        if lon.dimensions != lat.dimensions:
            raise bad("lat", f"longitude {json_string(lon.dimensions)} and latitude {json_string(lat.dimensions)} have different dimensions")
        units = parse_time_units(_text(time.attributes.get("units")) or "")
        if isinstance(units, str):
            raise bad(time.name, units)
        calendar = (_text(time.attributes.get("calendar")) or "standard").lower()
        if calendar not in ("standard", "gregorian", "proleptic_gregorian"):
            raise bad(time.name, f"calendar {json_string(calendar)} is not supported; expected the standard (Gregorian) calendar")
        self.ms_per_unit, self.epoch_ms = units
        self.lon, self.lat, self.time = lon, lat, time
        count = next((v for v in self.variables if _text(v.attributes.get("sample_dimension")) is not None), None)
        index = next((v for v in self.variables if _text(v.attributes.get("instance_dimension")) is not None), None)
        ident = next((v for v in self.variables if _text(v.attributes.get("cf_role")) == "trajectory_id"), None)
        self.index_variable = index
        if count is not None and len(lon.dimensions) == 1:
            self.layout = "contiguous-ragged"
            sample = _text(count.attributes.get("sample_dimension"))
            if lon.dimensions[0] != sample and self.format == "netcdf3":
                raise bad(count.name, f"sample_dimension {json_string(sample)} is not the dimension of longitude {json_string(lon.dimensions[0])}")
            sizes = count.read()
            total = lon.shape[0]
            start = 0
            for t, size in enumerate(sizes):
                if not float(size).is_integer() or size < 0 or start + size > total:
                    raise bad(count.name, f"count {js_number(size)} of trajectory {t} does not fit the {total} observations (counts so far add up to {start})")
                start += int(size)
            self.trajectories = len(sizes)
            self.row_starts = np.concatenate([[0], np.cumsum(sizes.astype(np.int64))])
        elif index is not None and len(lon.dimensions) == 1:
            self.layout = "indexed-ragged"
            instance = _text(index.attributes.get("instance_dimension")) or ""
            self.trajectories = ds.dimensions[instance].size if instance in ds.dimensions else (ident.shape[0] if ident is not None else 0)
        elif len(lon.dimensions) == 2:
            id_dimension = ident.dimensions[0] if ident is not None and ident.dimensions else None
            self.trajectory_axis = 1 if id_dimension is not None and lon.dimensions[1] == id_dimension and lon.dimensions[0] != id_dimension else 0
            self.trajectories = lon.shape[self.trajectory_axis]
            observations = lon.shape[1 - self.trajectory_axis]
            self.stride = lon.shape[1]
            if len(time.dimensions) == 1:
                self.layout = "orthogonal"
                if time.shape[0] != observations:
                    raise bad(time.name, f"time has {time.shape[0]} values but there are {observations} observations per trajectory")
            elif time.dimensions == lon.dimensions:
                self.layout = "incomplete"
            else:
                raise bad(time.name, f"time dimensions {json_string(time.dimensions)} fit neither the orthogonal nor the incomplete multidimensional layout")
        else:
            raise bad(lon.name, f"longitude has {len(lon.dimensions)} dimensions and no count or index variable; expected one of the four CF trajectory layouts")
        if feature_type is None and self.layout != "orthogonal":
            raise bad("featureType", "the global attribute featureType (or feature_type) is missing; expected \"trajectory\"")
        self.status = next((v for v in self.variables if v.name.lower() == "status" and v.dimensions == lon.dimensions), None)
        self.ashore_values = set()
        if self.status is not None:
            meanings = (_text(self.status.attributes.get("flag_meanings")) or "").split()
            values = _numbers(self.status.attributes.get("flag_values"))
            for i, meaning in enumerate(meanings):
                if re.match(r"^(ashore|stranded|beached|landed)$", meaning, re.I) and i < len(values):
                    self.ashore_values.add(values[i])

    def close(self):
        try:
            self.dataset.close()
        except Exception:  # a damaged file may fail to close; nothing more to report
            pass

    def slices(self):
        """(first flat index, last flat index + 1) of each slice of observations."""
        if len(self.lon.shape) == 1:
            total = self.lon.shape[0]
            step = SLICE
        else:
            total = self.lon.shape[0] * self.lon.shape[1]
            step = max(1, SLICE // max(1, self.lon.shape[1])) * self.lon.shape[1]
        return [(a, min(total, a + step)) for a in range(0, total, step)] if total else []

    def _read(self, variable, a, b):
        if len(variable.shape) == 1:
            return variable.read(a, b)
        row = variable.shape[1]
        return variable.read(a // row, b // row).ravel()

    def positions(self, a, b, issues):
        """Good positions of flat indices a..b-1: (trajectory, time_ms, lon, lat, ashore, k)."""
        x = self._read(self.lon, a, b)
        y = self._read(self.lat, a, b)
        k = np.arange(a, b, dtype=np.int64)
        if self.layout == "contiguous-ragged":
            trajectory = np.searchsorted(self.row_starts, k, side="right") - 1
            trajectory = np.where(trajectory < self.trajectories, trajectory, -1)
            observation = k - self.row_starts[np.maximum(trajectory, 0)]
            tv = self.time.read(a, b)
        elif self.layout == "indexed-ragged":
            index = self.index_variable.read(a, b)
            valid = (np.floor(index) == index) & (index >= 0) & (index < self.trajectories)
            trajectory = np.where(valid, index, -1).astype(np.int64)
            observation = None
            tv = self.time.read(a, b)
        else:
            if self.trajectory_axis == 0:
                trajectory, observation = k // self.stride, k % self.stride
            else:
                trajectory, observation = k % self.stride, k // self.stride
            tv = self.time.read()[observation] if self.layout == "orthogonal" else self._read(self.time, a, b)
        used = ~(self.lon.missing(x) | self.lat.missing(y) | self.time.missing(tv))
        lon_fixed = np.where((x > 180) & (x <= 360), x - 360, x)
        time_ms = self.epoch_ms + tv * self.ms_per_unit
        bad_index = trajectory < 0
        bad_lon = ~bad_index & ~((lon_fixed >= -180) & (lon_fixed <= 180))
        bad_lat = ~bad_index & ~bad_lon & ~((y >= -90) & (y <= 90))
        bad_time = ~bad_index & ~bad_lon & ~bad_lat & ~np.isfinite(time_ms)
        bad = used & (bad_index | bad_lon | bad_lat | bad_time)
        if bad.any():
            if observation is None:
                observation = self._indexed_ordinals(a, b)
            raw_index = self.index_variable.read(a, b) if self.index_variable is not None and self.layout == "indexed-ragged" else None
            for i in np.nonzero(bad)[0]:
                row, t, o = int(k[i]) + 1, int(trajectory[i]), int(observation[i]) if trajectory[i] >= 0 else 0
                if bad_index[i]:
                    name = self.index_variable.name if self.index_variable is not None else "trajectory"
                    value = js_number(raw_index[i]) if raw_index is not None else ""
                    issue = msg.netcdf_value_invalid(self.file, row, t, o, name, value, f"a trajectory index 0..{self.trajectories - 1}")
                elif bad_lon[i]:
                    issue = msg.netcdf_value_invalid(self.file, row, t, o, self.lon.name, js_number(x[i]), "a longitude −180..360")
                elif bad_lat[i]:
                    issue = msg.netcdf_value_invalid(self.file, row, t, o, self.lat.name, js_number(y[i]), "a latitude −90..90")
                else:
                    issue = msg.netcdf_value_invalid(self.file, row, t, o, self.time.name, js_number(tv[i]), "a finite time")
                issues.append(issue)
        good = used & ~bad
        if self.status is not None and self.ashore_values:
            status = self._read(self.status, a, b)
            ashore = np.isin(status, list(self.ashore_values))
        else:
            ashore = np.zeros(b - a, dtype=bool)
        return trajectory[good], time_ms[good], lon_fixed[good], y[good], ashore[good], k[good], int(used.sum()), int(bad.sum())

    def _indexed_ordinals(self, a, b):
        index = self.index_variable.read(0, b)
        ordinal = np.zeros(b, dtype=np.int64)
        seen = {}
        for j, t in enumerate(index.tolist()):
            if float(t).is_integer() and 0 <= t < self.trajectories:
                ordinal[j] = seen.get(t, 0)
                seen[t] = ordinal[j] + 1
        return ordinal[a:b]


def _classic_size(path):
    """Bytes a NetCDF classic (CDF-1/2/5) file needs according to its header: the end of its last
    variable (NetCDF Users Guide, "File Format Specifications", classic format)."""
    import struct

    with open(path, "rb") as handle:
        data = handle.read(1 << 24)
    if data[:3] != b"CDF":
        return 0
    version = data[3]
    pos = 4
    big = version == 5
    offset_size = 8 if version in (2, 5) else 4

    def number():
        nonlocal pos
        if big:
            value = struct.unpack(">q", data[pos:pos + 8])[0]
            pos += 8
        else:
            value = struct.unpack(">i", data[pos:pos + 4])[0]
            pos += 4
        return value

    def tag():
        nonlocal pos
        value = struct.unpack(">i", data[pos:pos + 4])[0]
        pos += 4
        return value

    def name():
        nonlocal pos
        n = number()
        pos += (n + 3) // 4 * 4
        return n

    sizes = {1: 1, 2: 1, 3: 2, 4: 4, 5: 4, 6: 8, 7: 1, 8: 2, 9: 4, 10: 4, 11: 8, 12: 8}

    def attributes():
        nonlocal pos
        tag()
        count = number()
        for _ in range(count):
            name()
            kind = tag()
            n = number()
            pos += (n * sizes.get(kind, 1) + 3) // 4 * 4

    records = number()
    tag()
    dims = []
    for _ in range(number()):
        name()
        dims.append(number())
    attributes()
    tag()
    needed = 0
    record_vars = []
    for _ in range(number()):
        name()
        ids = [number() for _ in range(number())]
        attributes()
        tag()
        vsize = number()
        begin = struct.unpack(">q" if offset_size == 8 else ">i", data[pos:pos + offset_size])[0]
        pos += offset_size
        is_record = bool(ids) and dims[ids[0]] == 0
        if is_record:
            record_vars.append((begin, vsize))
        else:
            needed = max(needed, begin + vsize)
    if record_vars and records > 0:
        step = sum(v for _, v in record_vars) if len(record_vars) > 1 else record_vars[0][1]
        for begin, vsize in record_vars:
            needed = max(needed, begin + (records - 1) * step + vsize)
    return needed
