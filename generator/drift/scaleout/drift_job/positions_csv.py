"""Reads a particle-position CSV (plain or gzip) with columns particle, time, lon, lat and an
optional status in blocks of lines, with the checks of generator/drift/positions-csv.ts: particle
a whole number >= 0 written with at most 15 digits, time an ISO 8601 date-time, lon -180..180,
lat -90..90, status drifting or ashore (or empty), a particle's repeated time (against its
previous kept position in the file) left out as a duplicate. Rows are numbered as lines of the
file, the header being row 1.

A block is first read by pandas' C parser with numbers read exactly (round_trip); a block with
anything unusual (a quote, an empty line, a bad or missing value, a duplicate, a cut-off last
line) is read again line by line by `_checked_block`, which reports every left-out row. A gzip
file cut short gives its positions up to the cut and then the built-in reader's message, naming the
row where reading stopped."""
import csv
import gzip
import io
import math
import re
import zlib

import numpy as np
import pandas as pd

from . import issues as msg
from .times import parse_date_time

STATUSES = ("drifting", "ashore")
NUMBER = re.compile(r"[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?\Z", re.ASCII)
WHOLE = re.compile(r"[0-9]{1,15}\Z", re.ASCII)
NOT_FINITE = re.compile(r"[+-]?(nan|inf|infinity)\Z", re.IGNORECASE)
BLOCK_BYTES = 32 << 20


class Block:
    """Good positions of one block of lines, in file order."""

    def __init__(self, particle, time_ms, lon, lat, ashore, line):
        self.particle, self.time_ms, self.lon, self.lat, self.ashore, self.line = particle, time_ms, lon, lat, ashore, line


def plain_number(text):
    if not text or not NUMBER.match(text):
        return math.nan
    return float(text)


def _split(text, delimiter):
    if '"' not in text:
        return text.split(delimiter)
    try:
        return next(csv.reader([text], delimiter=delimiter))
    except (csv.Error, StopIteration):
        return text.split(delimiter)


class PositionsReader:
    def __init__(self, file, delimiter=","):
        self.file = file
        self.delimiter = delimiter
        self.header = None
        self.columns = None
        self.width = 0
        self.usable = True
        self.issues = []
        self.read = 0
        self.excluded = 0
        self.last_time = {}
        self.time_cache = {}

    # -- header ------------------------------------------------------------------------------
    def take_header(self, text):
        cells = _split(text, self.delimiter)
        self.header = [c.strip() for c in cells]
        self.width = len(cells)
        self.columns = {name: (self.header.index(name) if name in self.header else -1) for name in ("particle", "time", "lon", "lat", "status")}
        for name in ("particle", "time", "lon", "lat"):
            if self.columns[name] < 0:
                self.issues.append(msg.header_missing_column(self.file, name, self.delimiter.join(cells)))
                self.usable = False

    def _time(self, text):
        value = self.time_cache.get(text)
        if value is None:
            value = parse_date_time(text)
            if len(self.time_cache) > 50_000:
                self.time_cache.clear()
            self.time_cache[text] = value
        return value

    # -- line-by-line path ---------------------------------------------------------------------
    def _reject(self, issue):
        self.issues.append(issue)
        self.excluded += 1

    def _reject_coordinate(self, line, name, text, limit):
        expected = f"a number −{limit}..{limit}"
        if NOT_FINITE.match(text.strip()):
            self._reject(msg.value_not_finite(self.file, line, name, text, expected))
        else:
            self._reject(msg.value_wrong_type(self.file, line, name, text, expected))

    def _checked_row(self, cells, line, is_last, ends_with_newline, out):
        f, c = self.file, self.columns
        self.read += 1
        if not self.usable:
            self.excluded += 1
            return
        if len(cells) != self.width:
            truncated = is_last and not ends_with_newline and len(cells) < self.width
            make = msg.row_truncated if truncated else msg.row_wrong_length
            self._reject(make(f, line, len(cells), self.width, self.delimiter.join(cells)))
            return
        particle_text, time_text, lon_text, lat_text = cells[c["particle"]], cells[c["time"]], cells[c["lon"]], cells[c["lat"]]
        if particle_text == "" or time_text == "" or lon_text == "" or lat_text == "":
            name = "particle" if particle_text == "" else "time" if time_text == "" else "lon" if lon_text == "" else "lat"
            self._reject(msg.value_missing(f, line, name))
            return
        if not WHOLE.match(particle_text):
            self._reject(msg.value_wrong_type(f, line, "particle", particle_text, "a whole number ≥ 0"))
            return
        particle = int(particle_text)
        time_ms = self._time(time_text)
        if math.isnan(time_ms):
            self._reject(msg.value_wrong_type(f, line, "time", time_text, "an ISO 8601 date-time such as 2026-09-01T00:00:00Z"))
            return
        lon = plain_number(lon_text)
        if not (-180 <= lon <= 180):
            self._reject_coordinate(line, "lon", lon_text, 180)
            return
        lat = plain_number(lat_text)
        if not (-90 <= lat <= 90):
            self._reject_coordinate(line, "lat", lat_text, 90)
            return
        ashore = False
        if c["status"] >= 0:
            status = cells[c["status"]]
            if status == "ashore":
                ashore = True
            elif status not in ("drifting", ""):
                self._reject(msg.value_not_allowed(f, line, "status", status, STATUSES))
                return
        if self.last_time.get(particle) == time_ms:
            value = f"{particle_text}+{time_text}"
            self._reject(msg.duplicate_key(f, line, "particle+time", value, line - 1))
            return
        self.last_time[particle] = time_ms
        out.append((particle, time_ms, lon, lat, ashore, line))

    def _checked_block(self, text, first_line, ends_with_newline):
        out = []
        lines = text.split("\n")
        if ends_with_newline:
            lines.pop()
        for k, raw in enumerate(lines):
            line = first_line + k
            if raw.endswith("\r"):
                raw = raw[:-1]
            if raw == "":
                continue
            is_last = (not ends_with_newline) and k == len(lines) - 1
            self._checked_row(_split(raw, self.delimiter), line, is_last, not is_last, out)
        if not out:
            return None
        particle, time_ms, lon, lat, ashore, line = zip(*out)
        return Block(np.array(particle, dtype=np.int64), np.array(time_ms, dtype=np.float64), np.array(lon, dtype=np.float64),
                     np.array(lat, dtype=np.float64), np.array(ashore, dtype=bool), np.array(line, dtype=np.int64))

    # -- fast path -------------------------------------------------------------------------------
    def _fast_block(self, data, first_line):
        """The block read by pandas, or None when it needs the line-by-line checks."""
        if b'"' in data or b"\n\n" in data or b"\n\r\n" in data or data.startswith((b"\n", b"\r\n")):
            return None
        names = [f"c{k}" for k in range(self.width)]
        c = self.columns
        # Text columns as categories: the C parser keeps each distinct text once (a time is shared
        # by every particle of a time step), so only the distinct texts are checked here.
        dtypes = {name: "category" for name in names}
        dtypes[names[c["lon"]]] = np.float64
        dtypes[names[c["lat"]]] = np.float64
        try:
            frame = pd.read_csv(io.BytesIO(data), header=None, names=names, dtype=dtypes, na_filter=False, sep=self.delimiter,
                                float_precision="round_trip", engine="c", quoting=csv.QUOTE_NONE, skip_blank_lines=False, encoding="utf-8", encoding_errors="replace")
        except (ValueError, pd.errors.ParserError):
            return None
        n = len(frame)
        if n == 0:
            return None
        lon = frame[names[c["lon"]]].to_numpy(dtype=np.float64)
        lat = frame[names[c["lat"]]].to_numpy(dtype=np.float64)
        if not (np.all((lon >= -180) & (lon <= 180)) and np.all((lat >= -90) & (lat <= 90))):
            return None

        def codes_and_texts(name):
            column = frame[names[c[name]]]
            return column.cat.codes.to_numpy(), list(column.cat.categories)

        particle_codes, particle_texts = codes_and_texts("particle")
        if (particle_codes < 0).any() or any(not isinstance(t, str) or not WHOLE.match(t) for t in particle_texts):
            return None
        particle = np.array([int(t) for t in particle_texts], dtype=np.int64)[particle_codes]
        time_codes, time_texts = codes_and_texts("time")
        time_values = np.array([self._time(t) if isinstance(t, str) else math.nan for t in time_texts], dtype=np.float64)
        if (time_codes < 0).any() or np.isnan(time_values).any():
            return None
        time_ms = time_values[time_codes]
        ashore = np.zeros(n, dtype=bool)
        if c["status"] >= 0:
            status_codes, status_texts = codes_and_texts("status")
            if (status_codes < 0).any() or any(t not in ("drifting", "ashore", "") for t in status_texts):
                return None
            ashore = np.array([t == "ashore" for t in status_texts], dtype=bool)[status_codes]
        # Duplicates: a particle's time equal to that of its previous position in the file.
        order = np.argsort(particle, kind="stable")
        sp, st = particle[order], time_ms[order]
        first = np.ones(n, dtype=bool)
        first[1:] = sp[1:] != sp[:-1]
        if np.any(~first[1:] & (st[1:] == st[:-1])):
            return None
        if self.last_time:
            starts = np.nonzero(first)[0]
            previous = np.array([self.last_time.get(int(p), math.nan) for p in sp[starts]], dtype=np.float64)
            if np.any(previous == st[starts]):
                return None
        last = np.ones(n, dtype=bool)
        last[:-1] = sp[1:] != sp[:-1]
        self.last_time.update(zip(sp[last].tolist(), st[last].tolist()))
        self.read += n
        return Block(particle, time_ms, lon, lat, ashore, np.arange(first_line, first_line + n, dtype=np.int64))

    def block(self, data, first_line, ends_with_newline):
        if self.usable and ends_with_newline:
            fast = self._fast_block(data, first_line)
            if fast is not None:
                return fast
        return self._checked_block(data.decode("utf-8", errors="replace"), first_line, ends_with_newline)


class Gunzip:
    """Gzip (RFC 1952, members one after another) read piece by piece: a file cut short gives every
    byte before the cut, then EOFError("unexpected end of file"), the words of Node's zlib."""

    def __init__(self, path):
        self.raw = open(path, "rb")
        self.inflate = zlib.decompressobj(16 + zlib.MAX_WBITS)
        self.error = None

    def read(self, size):
        if self.error is not None:
            raise self.error
        pieces, n = [], 0
        while n < size:
            if self.inflate.eof:
                data = self.inflate.unused_data or self.raw.read(1 << 18)
                if not data:
                    break  # the end of the last member
                self.inflate = zlib.decompressobj(16 + zlib.MAX_WBITS)
            else:
                data = self.raw.read(1 << 18)
                if not data:
                    self.error = EOFError("unexpected end of file")
                    break
            try:
                piece = self.inflate.decompress(data)
            except zlib.error as error:  # "Error -3 while decompressing data: incorrect header check"
                raise OSError(str(error).split(": ", 1)[-1]) from None
            pieces.append(piece)
            n += len(piece)
        if not pieces and self.error is not None:
            raise self.error
        return b"".join(pieces)

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.raw.close()


def read_positions(resource, block_bytes=BLOCK_BYTES):
    """Yields (reader, Block) for each block of good positions; the reader holds the issues."""
    reader = PositionsReader(resource.path, resource.delimiter)
    gz = resource.compression in ("gz", "gzip")
    line_no = 0
    rest = b""
    saw_bom = False
    try:
        handle = Gunzip(resource.absolute_path) if gz else open(resource.absolute_path, "rb")
    except OSError as error:
        reader.issues.append(msg.csv_unreadable(resource.path, 1, error.strerror or str(error)))
        return reader, iter(())

    def blocks():
        nonlocal line_no, rest, saw_bom
        try:
            with handle:
                while True:
                    try:
                        chunk = handle.read(block_bytes)
                    except (EOFError, OSError, gzip.BadGzipFile, Exception) as error:  # noqa: B014
                        reader.issues.append(msg.csv_unreadable(resource.path, line_no + 1, str(error) or type(error).__name__))
                        return
                    if not chunk:
                        break
                    data = rest + chunk
                    cut = data.rfind(b"\n")
                    if cut < 0:
                        rest = data
                        continue
                    body, rest = data[: cut + 1], data[cut + 1:]
                    # Header: the first line that is not blank.
                    while reader.header is None and body:
                        nl = body.find(b"\n")
                        first, body = body[:nl], body[nl + 1:]
                        line_no += 1
                        text = first.decode("utf-8", errors="replace").rstrip("\r")
                        if text.startswith("\ufeff"):
                            text, saw_bom = text[1:], True
                        if text.strip() != "":
                            reader.take_header(text)
                    if not body:
                        continue
                    count = body.count(b"\n")
                    block = reader.block(body, line_no + 1, True)
                    line_no += count
                    if block is not None:
                        yield block
            if rest not in (b"", b"\r"):
                line_no += 1
                last = rest.decode("utf-8", errors="replace")
                if last.endswith("\r"):
                    last = last[:-1]
                if reader.header is None:
                    if last.startswith("\ufeff"):
                        last, saw_bom = last[1:], True
                    if last.strip() != "":
                        reader.take_header(last)
                else:
                    block = reader._checked_block(last, line_no, False)
                    if block is not None:
                        yield block
            if reader.header is None:
                reader.issues.append(msg.file_empty(resource.path))
        except OSError as error:
            reader.issues.append(msg.csv_unreadable(resource.path, line_no + 1, str(error)))

    return reader, blocks()
