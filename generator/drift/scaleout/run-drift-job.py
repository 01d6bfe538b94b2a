#!/usr/bin/python3
"""Runs the drift job: /usr/bin/python3 generator/drift/scaleout/run-drift-job.py --help"""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))

from drift_job.job import main  # noqa: E402

if __name__ == "__main__":
    sys.exit(main())
