"""Dask job for the heavy drift step of Wrackline: drift-model positions (CSV, CSV.gz and CF
trajectory NetCDF) to the drift-arrivals table and the end-of-season positions, with the same
rules as the built-in reader (generator/drift/drift-tally.ts)."""
