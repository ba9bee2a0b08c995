#!/usr/bin/env python3
"""Opens a report in headless Chromium and checks what a reader would see.

usage: browser_check.py CHROMIUM REPORT.html SCREENSHOT.png PLOT_ID [PLOT_ID ...]

Checks:
  1. A control page that calls console.error is caught by the console check (so the check can
     fail), and a control page that loads an outside image is blocked and logged.
  2. The report logs nothing to the console (no errors, no blocked loads).
  3. In the rendered DOM every expected plot (svg id) is present, has at least one curve path
     with non-empty path data (residual plots: at least three data markers), no path data with
     NaN/Inf, and two axis labels that carry a unit ("/").
  4. The page holds no script, no external stylesheet, font, image or link to a network address.
  5. A full-page screenshot is written (PNG signature, non-trivial size).
  6. No clipped labels: in a copy of the page (the content policy removed, a measuring script
     added; the report itself stays script-free) the rendered box of every SVG text element lies
     inside its plot's box, which is the plot's viewBox as drawn. A control page with one text
     sticking out of its plot proves the measurement can fail.
  7. The pinch marker (g.pw-pinch) comes after every group of data markers in its plot, so it is
     drawn above them.
Only the Python standard library is used. Exit 0 on success, 1 with a message on failure.
"""
import html
import html.parser
import os
import re
import shutil
import subprocess
import sys
import tempfile

FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--disable-default-apps", "--disable-extensions", "--hide-scrollbars",
         "--enable-logging=stderr", "--v=0"]


def run_chromium(chromium, url, extra):
    """Runs chromium with a fresh profile; returns (stdout, stderr)."""
    profile = tempfile.mkdtemp(prefix="pw-chromium-")
    try:
        proc = subprocess.run([chromium, "--user-data-dir=" + profile] + FLAGS + extra + [url],
                              capture_output=True, text=True, timeout=120)
        return proc.stdout, proc.stderr
    finally:
        shutil.rmtree(profile, ignore_errors=True)


MEASURE = """<script>
(function () {
  var out = [];
  var svgs = document.querySelectorAll('svg[id]');
  for (var i = 0; i < svgs.length; i++) {
    var s = svgs[i], r = s.getBoundingClientRect(), n = 0;
    var texts = s.querySelectorAll('text');
    for (var j = 0; j < texts.length; j++) {
      var t = texts[j].getBoundingClientRect();
      if (t.width === 0 && t.height === 0) continue;
      n++;
      if (t.left < r.left - 0.5 || t.right > r.right + 0.5 || t.top < r.top - 0.5 ||
          t.bottom > r.bottom + 0.5)
        out.push('CLIPPED ' + s.id + ': "' + texts[j].textContent + '" [' +
                 [t.left - r.left, t.top - r.top, t.right - r.left, t.bottom - r.top]
                 .map(function (v) { return v.toFixed(1); }).join(', ') + '] in ' +
                 r.width.toFixed(1) + ' x ' + r.height.toFixed(1));
    }
    out.push('MEASURED ' + s.id + ' ' + n);
  }
  var pre = document.createElement('pre');
  pre.id = 'pw-bbox-result';
  pre.textContent = out.join('\\n');
  document.body.appendChild(pre);
})();
</script>"""


def measure_texts(chromium, page, work, name):
    """Returns (clipped, measured) from the text boxes of page: lists of messages and a dict
    svg id -> number of texts measured."""
    with open(page, encoding="utf-8") as f:
        text = f.read()
    text = re.sub(r'<meta http-equiv="Content-Security-Policy"[^>]*>', "", text)
    text = text.replace("</body>", MEASURE + "</body>")
    copy = os.path.join(work, name)
    with open(copy, "w", encoding="utf-8") as f:
        f.write(text)
    dom, _ = run_chromium(chromium, "file://" + copy, ["--window-size=1100,4000", "--dump-dom"])
    m = re.search(r'<pre id="pw-bbox-result">(.*?)</pre>', dom, re.S)
    if not m:
        fail("the measuring script left no result in %s" % name)
    lines = html.unescape(m.group(1)).split("\n")
    clipped = [l for l in lines if l.startswith("CLIPPED")]
    measured = {}
    for l in lines:
        if l.startswith("MEASURED"):
            _, sid, n = l.split(" ")
            measured[sid] = int(n)
    return clipped, measured


def console_lines(stderr):
    return [l for l in stderr.splitlines() if ":CONSOLE" in l]


class Dom(html.parser.HTMLParser):
    """Collects per-svg paths and axis labels, and every tag name with its attributes."""

    def __init__(self):
        super().__init__()
        self.svgs = {}
        self.stack = []       # open svg ids
        self.groups = []      # classes of the open <g> elements
        self.tags = []
        self.in_label = None  # (svg id, class) while inside an axis-label <text>
        self.order = 0        # running index of elements, for drawing order
        self.label_text = ""

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        self.tags.append((tag, a))
        self.order += 1
        if tag == "svg" and a.get("id"):
            self.svgs[a["id"]] = {"paths": [], "labels": [], "markers": 0, "last_points": -1,
                                  "pinch": -1}
            self.stack.append(a["id"])
        cur = self.stack[-1] if self.stack else None
        if tag == "g":
            self.groups.append(a.get("class", ""))
            cls = a.get("class", "").split()
            if cur and "pw-points" in cls:
                self.svgs[cur]["last_points"] = self.order
            if cur and "pw-pinch" in cls:
                self.svgs[cur]["pinch"] = self.order
        elif cur and tag in ("circle", "rect", "path") and self.groups and "pw-points" in self.groups[-1]:
            self.svgs[cur]["markers"] += 1
        if cur and tag == "path":
            self.svgs[cur]["paths"].append((a.get("class", ""), a.get("d", "")))
        if cur and tag == "text" and "pw-axis-label" in a.get("class", ""):
            self.in_label = cur
            self.label_text = ""

    def handle_endtag(self, tag):
        if tag == "g" and self.groups:
            self.groups.pop()
        if tag == "svg" and self.stack:
            self.stack.pop()
        if tag == "text" and self.in_label:
            self.svgs[self.in_label]["labels"].append(self.label_text.strip())
            self.in_label = None

    def handle_data(self, data):
        if self.in_label:
            self.label_text += data


def fail(msg):
    print("browser check: FAIL: " + msg)
    sys.exit(1)


def main():
    if len(sys.argv) < 5:
        print(__doc__)
        return 2
    chromium, report, shot = sys.argv[1], os.path.abspath(sys.argv[2]), sys.argv[3]
    plots = sys.argv[4:]
    work = tempfile.mkdtemp(prefix="pw-browser-")
    try:
        # 1. controls: the console check must see a deliberate error and a blocked outside load
        ctl = os.path.join(work, "control.html")
        with open(ctl, "w") as f:
            f.write("<!DOCTYPE html><html><head><meta charset=\"utf-8\"><title>control</title>"
                    "</head><body><script>console.error('pw-control-error')</script></body></html>")
        _, err = run_chromium(chromium, "file://" + ctl, ["--dump-dom"])
        if not any("pw-control-error" in l for l in console_lines(err)):
            fail("the console check did not see the control page's console.error; cannot trust it")
        ctl2 = os.path.join(work, "control2.html")
        with open(ctl2, "w") as f:
            f.write("<!DOCTYPE html><html><head><meta charset=\"utf-8\"><meta http-equiv="
                    "\"Content-Security-Policy\" content=\"default-src 'none'\"><title>c</title>"
                    "</head><body><img src=\"http://192.0.2.1/x.png\"></body></html>")
        _, err = run_chromium(chromium, "file://" + ctl2, ["--dump-dom"])
        if not console_lines(err):
            fail("an outside image blocked by the content policy was not logged; cannot trust "
                 "the check for fetches")

        # 2. the report: rendered DOM and console
        dom, err = run_chromium(chromium, "file://" + report, ["--dump-dom"])
        bad = console_lines(err)
        if bad:
            fail("console messages while rendering the report:\n  " + "\n  ".join(bad))
        if "<svg" not in dom:
            fail("the rendered DOM holds no svg at all (did the page load?)")

        # 3. plots
        p = Dom()
        p.feed(dom)
        for pid in plots:
            if pid not in p.svgs:
                fail("plot %s is missing from the rendered page (found: %s)"
                     % (pid, ", ".join(sorted(p.svgs))))
            svg = p.svgs[pid]
            curves = [d for cls, d in svg["paths"] if "pw-curve" in cls]
            if "residual" in pid:
                # residual plots show points: one marker per measurement, at least three
                if svg["markers"] < 3:
                    fail("plot %s shows %d data markers" % (pid, svg["markers"]))
            elif not curves or not any(len(d) > 20 for d in curves):
                fail("plot %s has no curve with path data" % pid)
            if "band" in pid:
                # a band plot: several sampled curves, each with path data, under the best fit
                drawn = [d for cls, d in svg["paths"] if "pw-sample" in cls and len(d) > 20]
                if len(drawn) < 5 or not any("pw-central" in cls for cls, _ in svg["paths"]):
                    fail("plot %s shows %d sampled curves and no best fit" % (pid, len(drawn)))
            for d in (d for _, d in svg["paths"]):
                if re.search(r"nan|inf", d, re.I):
                    fail("plot %s has a path with NaN/Inf: %.80s" % (pid, d))
            if len(svg["labels"]) != 2 or not all("/" in l for l in svg["labels"]):
                fail("plot %s: expected two axis labels with units, found %r" % (pid, svg["labels"]))
        print("browser check: %d plots rendered with curves and labelled axes" % len(plots))

        # 4. self-contained
        for tag, a in p.tags:
            if tag in ("script", "link", "img", "iframe", "object", "embed"):
                fail("the page holds a <%s> element" % tag)
            for k, v in a.items():
                if v and k in ("src", "href") and not v.startswith("#"):
                    fail("<%s %s=%r> points outside the page" % (tag, k, v))
        with open(report, encoding="utf-8") as f:
            text = f.read()
        urls = set(re.findall(r"https?://[^\s\"'<>)]+", text)) - {"http://www.w3.org/2000/svg"}
        if urls:
            fail("network addresses in the page: %s" % ", ".join(sorted(urls)))
        if re.search(r"@import|@font-face|url\((?!#)", text):
            fail("the stylesheet refers to an outside resource")

        # 6. no clipped labels; the control first
        ctl3 = os.path.join(work, "control3.html")
        with open(ctl3, "w") as f:
            f.write("<!DOCTYPE html><html><head><meta charset=\"utf-8\"><title>c</title></head><body>"
                    "<svg id=\"plot-control\" viewBox=\"0 0 200 100\" width=\"200\" height=\"100\">"
                    "<text x=\"150\" y=\"50\">a label running out of its plot</text></svg>"
                    "</body></html>")
        clipped, _ = measure_texts(chromium, ctl3, work, "control3_measured.html")
        if not clipped:
            fail("the text-box check did not see the control page's clipped label; cannot trust it")
        clipped, measured = measure_texts(chromium, report, work, "report_measured.html")
        if clipped:
            fail("text outside its plot:\n  " + "\n  ".join(clipped))
        for pid in plots:
            if measured.get(pid, 0) < 4:
                fail("plot %s: only %d text elements measured" % (pid, measured.get(pid, 0)))
        print("browser check: %d text elements, each inside its plot"
              % sum(measured.values()))

        # 7. the pinch marker above the data markers
        for pid, svg in p.svgs.items():
            if svg["pinch"] >= 0 and svg["pinch"] < svg["last_points"]:
                fail("plot %s: the pinch marker is drawn before (under) a group of data markers"
                     % pid)
        if "plot-xy-pinch" in plots:
            for pid in ("plot-xy", "plot-xy-pinch"):
                if p.svgs[pid]["pinch"] < 0:
                    fail("plot %s: no pinch marker" % pid)
            print("browser check: the pinch marker is drawn above the data markers")

        # 5. screenshot
        os.makedirs(os.path.dirname(os.path.abspath(shot)), exist_ok=True)
        run_chromium(chromium, "file://" + report, ["--window-size=1100,7000",
                                                    "--screenshot=" + os.path.abspath(shot)])
        with open(shot, "rb") as f:
            head = f.read(8)
        if head != b"\x89PNG\r\n\x1a\n" or os.path.getsize(shot) < 20000:
            fail("the screenshot %s is missing or empty" % shot)
        print("browser check: screenshot %s" % shot)
        return 0
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    sys.exit(main())
