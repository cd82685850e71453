# Strict XML check of SVG texts with the standard library's parser (xml.etree.ElementTree,
# Python docs): for each text, whether it parses, its root tag, and the text and data-* attributes it holds.
import json, sys
import xml.etree.ElementTree as ET
out = []
for svg in json.load(sys.stdin):
    try:
        root = ET.fromstring(svg.encode("utf-8"))
    except ET.ParseError as e:
        out.append({"ok": False, "error": str(e)})
        continue
    texts = ["".join(el.itertext()) for el in root.iter("{http://www.w3.org/2000/svg}text")]
    variables = sorted(el.get("data-variable") for el in root.iter() if el.get("data-variable") is not None)
    edges = sorted({(el.get("data-from"), el.get("data-to"), el.get("data-kind")) for el in root.iter() if el.get("data-edge") is not None})
    groups = sorted(el.get("data-members") for el in root.iter() if el.get("data-group") is not None)
    links = [el.get(a) for el in root.iter() for a in el.keys() if a.endswith("href")]
    out.append({"ok": True, "root": root.tag, "texts": texts, "variables": variables, "edges": [list(e) for e in edges], "groups": groups, "hrefs": links})
json.dump(out, sys.stdout)
