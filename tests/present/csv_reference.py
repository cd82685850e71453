"""Reference for the RFC 4180 writer: Python's own csv module (excel dialect:
CRLF line ends, minimal quoting, doubled quotes). Reads JSON on stdin:
[{"rows": [[str,...],...], "text": str}, ...]; for each case writes the
module's rendering of rows and its parse of text."""
import csv
import io
import json
import sys

answers = []
for req in json.load(sys.stdin):
    out = io.StringIO(newline="")
    w = csv.writer(out, dialect="excel")
    for row in req["rows"]:
        w.writerow(row)
    parsed = list(csv.reader(io.StringIO(req["text"], newline=""), dialect="excel"))
    answers.append({"written": out.getvalue(), "parsed": parsed})
json.dump(answers, sys.stdout)
