#!/usr/bin/env python3
"""Opens a coilspin HTML report in headless Chromium (Debian package chromium) and checks it.

Usage: browser_check.py REPORT.html WORK_DIR

1. The page as a browser runs it (--dump-dom after its scripts): no console message
   of any kind and no uncaught error (Chromium's own log, --enable-logging=stderr
   --v=0, prints every console call and uncaught exception as a CONSOLE line); the
   page's problem box empty; every chart element drawn (data-charts-drawn equals
   the number of chart elements in the file); no resource fetched
   (data-resources-fetched, from the Resource Timing API) with host names made
   unresolvable (--host-resolver-rules), so nothing could come from a network.
2. A screenshot of the whole page (--screenshot at the page's height): inside each
   chart's canvas the grey levels vary (standard deviation above 8 of 255) and at
   least 1 % of the pixels differ from the canvas's most common colour: drawn
   lines, not a blank area (PIL, Debian python3-pil).
Exits 77 (skipped) when chromium is not installed, 1 when a check fails.
"""
import collections
import html.parser
import os
import re
import shutil
import subprocess
import sys

SKIP = 77
WIDTH = 1000
MIN_STDDEV = 8.0
MIN_DRAWN_FRACTION = 0.01


def chromium():
    for name in ("chromium", "chromium-browser", "chromium-headless-shell"):
        path = shutil.which(name)
        if path:
            return path
    return None


def run(browser, args, workdir):
    command = [browser, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--hide-scrollbars",
               "--host-resolver-rules=MAP * ~NOTFOUND", f"--user-data-dir={workdir}/profile",
               "--enable-logging=stderr", "--v=0"] + args
    return subprocess.run(command, capture_output=True, text=True, timeout=120, cwd=workdir)


class BodyAttributes(html.parser.HTMLParser):
    def __init__(self):
        super().__init__()
        self.body = {}
        self.problems = []
        self._in_problems = False

    def handle_starttag(self, tag, attrs):
        if tag == "body":
            self.body = dict(attrs)
        if tag == "div" and dict(attrs).get("id") == "report-problems":
            self._in_problems = True
        if self._in_problems and tag == "li":
            self.problems.append("")

    def handle_endtag(self, tag):
        if tag == "div":
            self._in_problems = False

    def handle_data(self, data):
        if self._in_problems and self.problems:
            self.problems[-1] += data


def main():
    report, workdir = os.path.abspath(sys.argv[1]), os.path.abspath(sys.argv[2])
    browser = chromium()
    if not browser:
        print("SKIPPED: chromium is not installed (Debian package chromium; bash .ci/setup installs it)")
        return SKIP
    os.makedirs(workdir, exist_ok=True)
    failures = []
    text = open(report, encoding="utf-8").read()
    expected = len(re.findall(r'<div class="chart[ "]', text))
    url = "file://" + report

    dom = run(browser, [f"--window-size={WIDTH},900", "--dump-dom", url], workdir)
    console = [line for line in dom.stderr.splitlines() if ":CONSOLE" in line]
    print(f"console lines: {len(console)}")
    for line in console:
        print("  " + line)
    if console:
        failures.append("console messages")
    page = BodyAttributes()
    page.feed(dom.stdout)
    drawn = int(page.body.get("data-charts-drawn", "-1"))
    fetched = int(page.body.get("data-resources-fetched", "-1"))
    print(f"charts in the file: {expected}, drawn: {drawn}; resources fetched: {fetched}; "
          f"problems listed: {len(page.problems)}")
    if expected == 0 or drawn != expected:
        failures.append("charts drawn")
    if fetched != 0:
        failures.append("resources fetched")
    if page.problems:
        failures.append("problems listed: " + "; ".join(page.problems))
    boxes = [tuple(int(v) for v in b.split(",")) for b in page.body.get("data-chart-boxes", "").split(";") if b]
    height = int(page.body.get("data-page-height", "0"))

    if boxes and height > 0:
        from PIL import Image, ImageStat
        shot = os.path.join(workdir, "report.png")
        run(browser, [f"--window-size={WIDTH},{height}", f"--screenshot={shot}", url], workdir)
        image = Image.open(shot).convert("RGB")
        print(f"screenshot {image.size[0]}x{image.size[1]}: {shot}")
        blank = 0
        for (x, y, w, h) in boxes:
            if y + h > image.size[1] or w <= 0 or h <= 0:
                failures.append(f"chart at y={y} outside the screenshot")
                continue
            area = image.crop((x, y, x + w, y + h))
            stddev = ImageStat.Stat(area.convert("L")).stddev[0]
            colours = collections.Counter(area.getdata())
            background = colours.most_common(1)[0][1]
            drawn_fraction = 1.0 - background / (w * h)
            if stddev < MIN_STDDEV or drawn_fraction < MIN_DRAWN_FRACTION:
                blank += 1
                print(f"  blank? chart at ({x},{y}) {w}x{h}: stddev {stddev:.1f}, drawn {100 * drawn_fraction:.1f} %")
        print(f"plot areas checked: {len(boxes)}, blank: {blank}")
        if blank:
            failures.append("blank plot areas")
    else:
        failures.append("no chart boxes recorded by the page")
    print("all checks passed" if not failures else "FAILED: " + ", ".join(failures))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
