# Measures printed SVG figures with the standard library only (xml.etree.ElementTree,
# Python docs): the printed width in points from the root's width attribute (mm, cm, in,
# pt or px at 96 per inch, as CSS 2.1 defines the absolute units) and its viewBox, and the
# smallest font size of any text on the page in points (font-size inherited from ancestors,
# SVG 1.1 section 10.10: text elements and tspans take the nearest font-size).
# Reads a JSON list of SVG texts on stdin; writes a list of {widthPt, smallestPt, texts}.
import json, re, sys
import xml.etree.ElementTree as ET

UNITS = {"mm": 72 / 25.4, "cm": 720 / 25.4, "in": 72.0, "pt": 1.0, "px": 0.75, "": 0.75}

def length_pt(s):
    m = re.fullmatch(r"\s*([0-9.]+)\s*([a-z]*)\s*", s)
    return float(m.group(1)) * UNITS[m.group(2)]

def local(tag):
    return tag.split("}", 1)[1] if tag.startswith("{") else tag

out = []
for svg in json.load(sys.stdin):
    root = ET.fromstring(svg.encode("utf-8"))
    width_pt = length_pt(root.get("width"))
    vb = [float(x) for x in re.split(r"[\s,]+", root.get("viewBox").strip())]
    scale = width_pt / vb[2]
    sizes = []
    def walk(el, size):
        own = el.get("font-size")
        s = float(own) if own is not None else size
        if local(el.tag) in ("title", "desc"):
            return
        if local(el.tag) in ("text", "tspan") and (el.text or "").strip():
            sizes.append(s)
        for c in el:
            walk(c, s)
    walk(root, 16.0)
    out.append({"widthPt": width_pt, "smallestPt": min(sizes) * scale if sizes else None, "texts": len(sizes)})
json.dump(out, sys.stdout)
