"""ISO 8601 date-times to milliseconds since 1970 (UTC when no offset is given), exactly as
parseDateTime in generator/drift/positions-csv.ts reads them (including JavaScript's Date.UTC,
which reads the years 0 to 99 as 1900 to 1999)."""
import datetime
import math
import re

DATE_TIME = re.compile(r"(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?(Z|[+-]\d{2}:?\d{2})?\Z", re.ASCII)
EPOCH = datetime.date(1970, 1, 1)


def _days_in_month(year, month):
    if month == 12:
        return 31
    return (datetime.date(year, month + 1, 1) - datetime.date(year, month, 1)).days


def parse_date_time(text):
    """Milliseconds since 1970, or NaN when the text is not such a date-time."""
    m = DATE_TIME.match(text)
    if not m:
        return math.nan
    year, month, day = int(m[1]), int(m[2]), int(m[3])
    hour, minute, second = int(m[4] or 0), int(m[5] or 0), int(m[6] or 0)
    if 0 <= year <= 99:
        year += 1900  # Date.UTC(year, ...) with a year 0..99 means 1900 + year
    if month < 1 or month > 12 or day < 1 or day > _days_in_month(year, month) or hour > 23 or minute > 59 or second > 60:
        return math.nan
    days = (datetime.date(year, month, day) - EPOCH).days
    ms = float((((days * 24 + hour) * 60 + minute) * 60 + second) * 1000)
    if m[7]:
        ms += math.floor(float(m[7]) * 1000 + 0.5)  # Math.round
    zone = m[8]
    if zone and zone != "Z":
        sign = -1 if zone.startswith("-") else 1
        digits = zone[1:].replace(":", "", 1)
        ms -= sign * (int(digits[0:2]) * 60 + int(digits[2:4] or 0)) * 60_000
    return ms
