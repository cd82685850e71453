# Strict XML parse of SVG texts with the standard library's parser (xml.etree.ElementTree,
# Python docs): for each text, whether it parses, and its element tree as JSON
# (tag without namespace, namespace, attributes, the element's own text).
import json, sys
import xml.etree.ElementTree as ET

def tree(el):
    ns, _, tag = el.tag[1:].partition("}") if el.tag.startswith("{") else ("", "", el.tag)
    return {"tag": tag, "ns": ns, "attrs": dict(el.attrib), "text": "".join(el.itertext()), "children": [tree(c) for c in el]}

out = []
for svg in json.load(sys.stdin):
    try:
        out.append({"ok": True, "root": tree(ET.fromstring(svg.encode("utf-8")))})
    except ET.ParseError as e:
        out.append({"ok": False, "error": str(e)})
json.dump(out, sys.stdout)
