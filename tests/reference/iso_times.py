"""Reference for ISO 8601 date-times: Python's datetime.fromisoformat (3.11+).

stdin: list of strings; stdout: per string null (not valid) or
[seconds since 1970 UTC (naive times read as UTC), days since 1970-01-01 of the date as written].
"""
import json
import sys
from datetime import datetime, timezone

out = []
for s in json.load(sys.stdin):
    try:
        d = datetime.fromisoformat(s)
    except ValueError:
        out.append(None)
        continue
    local_day = (d.date() - datetime(1970, 1, 1).date()).days
    if d.tzinfo is None:
        d = d.replace(tzinfo=timezone.utc)
    out.append([d.timestamp(), local_day])
json.dump(out, sys.stdout)
