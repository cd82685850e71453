"""Reference reading of the HTML report with Python's html.parser: checks
that elements nest and close, and collects what a self-contained, printable
report must (and must not) have. Reads {"html": str} on stdin."""
import json
import sys
from html.parser import HTMLParser

VOID = {"area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source", "track", "wbr"}


class Reader(HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.stack = []
        self.errors = []
        self.ids = []
        self.bands = []  # per band section: number of svg elements inside
        self.scripts = 0
        self.external = []
        self.text = []
        self.titles = []
        self._in_h2 = False

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "script":
            self.scripts += 1
        for k, v in attrs:
            if k.startswith("on"):
                self.external.append(f"{tag} {k}")
            if k in ("src", "href") and v and not v.startswith("#"):
                self.external.append(f"{tag} {k}={v}")
            if k == "href" and v and v.startswith("#") is False:
                pass
        if "id" in a:
            self.ids.append(a["id"])
        if tag == "section" and "band" in (a.get("class") or "").split():
            self.bands.append(0)
        if tag == "svg" and self.bands and any(t == "section" for t, _ in self.stack):
            self.bands[-1] += 1
        if tag == "h2":
            self._in_h2 = True
            self.titles.append("")
        if tag not in VOID:
            self.stack.append((tag, self.getpos()))

    def handle_startendtag(self, tag, attrs):
        # self-closing SVG elements (<path/>): no nesting to track
        for k, v in attrs:
            if k == "id":
                self.ids.append(v)

    def handle_endtag(self, tag):
        if tag in VOID:
            return
        if not self.stack or self.stack[-1][0] != tag:
            self.errors.append(f"</{tag}> at {self.getpos()} closes {self.stack[-1] if self.stack else 'nothing'}")
            return
        self.stack.pop()
        if tag == "h2":
            self._in_h2 = False

    def handle_data(self, data):
        self.text.append(data)
        if self._in_h2:
            self.titles[-1] += data


r = Reader()
r.feed(json.load(sys.stdin)["html"])
r.close()
if r.stack:
    r.errors.append(f"unclosed: {[t for t, _ in r.stack]}")
dupes = sorted({i for i in r.ids if r.ids.count(i) > 1})
json.dump({"errors": r.errors, "duplicateIds": dupes, "bands": r.bands, "scripts": r.scripts, "external": r.external, "text": "".join(r.text), "titles": r.titles}, sys.stdout)
