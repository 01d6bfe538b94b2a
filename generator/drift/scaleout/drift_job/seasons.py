"""Which season a position falls in, as generator/read/season-calendar.ts and drift-tally.ts
decide it: the UTC day of the position, its calendar month, the first season listing that month;
a season whose months wrap past December takes the year of its last month (winter 2026 =
December 2025 to February 2026)."""
import numpy as np

DAY_MS = 86_400_000
# Dates JavaScript can represent: +-8.64e15 ms from 1970 (ECMA-262, Time Values and Time Range).
MAX_DAYS = 100_000_000


class SeasonCalendar:
    def __init__(self, seasons):
        self.seasons = seasons
        self.season_of_month = np.full(13, -1, dtype=np.int64)
        self.year_offset = np.zeros(13, dtype=np.int64)
        for month in range(1, 13):
            for k, season in enumerate(seasons):
                if month in season["months"]:
                    self.season_of_month[month] = k
                    last = season["months"][-1]
                    self.year_offset[month] = -1 if month > last else 0
                    break

    def codes(self, time_ms):
        """Season code per time (season year * 64 + season index), or -1 outside every season."""
        day = np.floor(time_ms / DAY_MS)
        ok = np.isfinite(day) & (np.abs(day) <= MAX_DAYS)
        days = np.where(ok, day, 0).astype("int64").astype("datetime64[D]")
        years = days.astype("datetime64[Y]").astype(np.int64) + 1970
        months = days.astype("datetime64[M]").astype(np.int64) % 12 + 1
        index = self.season_of_month[months]
        season_year = years - self.year_offset[months]
        codes = season_year * 64 + index
        return np.where(ok & (index >= 0), codes, -1)

    def season_id(self, code):
        code = int(code)
        return f"{code // 64}-{self.seasons[code % 64]['id']}"

    def start(self, code):
        """First day of a season (YYYY-MM-DD), as seasonRange() gives it, for ordering."""
        code = int(code)
        year, season = code // 64, self.seasons[code % 64]
        first, last = season["months"][0], season["months"][-1]
        first_year = year + (-1 if first > last else 0)
        return f"{first_year:04d}-{first:02d}-01"
