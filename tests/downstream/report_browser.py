"""Downstream check: the HTML reports in a real browser (Debian's chromium, headless, no network).

Runs the demo and the two-axis sweep example, then checks that
- every run wrote a report next to its result (and --no-report writes none; `bandstack report`
  writes one for any result file and refuses a file that is not a result with exit code 2);
- the reports are well-formed XML (Python's xml.etree), carry no script and load nothing from outside;
- headless Chromium loads each report without console messages (a page with a deliberate
  console.error is the control that the detection works), and in the DOM it built every expected
  plot is an <svg> with drawn elements;
- a screenshot (kept as an artefact in the workdir) is not blank.
"""
import html.parser
import os
import shutil
import struct
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET
import zlib

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, bandstack, parse_args, run_study  # noqa: E402

SOURCE = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
SVG = "{http://www.w3.org/2000/svg}"
CHROMIUM_FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                  "--disable-component-update", "--disable-sync", "--no-first-run", "--hide-scrollbars"]
EXPECTED_PLOTS = {
    "equilibrium_demo.html": ["temperature-0", "temperature-1", "lw-heating", "sw-heating", "lw-heating-by-band",
                              "sw-heating-by-band", "spectrum-0", "greenhouse-gas-removal", "greenhouse-gas-addition",
                              "greenhouse-band-removal", "forcing-adjusted", "surface-temperature-change", "feedbacks"],
    "sweep_demo.html": ["temperature", "lw-heating", "spectrum-0", "sweep-map-olr", "sweep-map-surface_temperature",
                        "sweep-map-toa_net_flux", "distribution-olr"],
}
DRAWN = {"path", "rect", "circle", "line", "polyline"}

check = Checks("report_browser")


class PlotCounter(html.parser.HTMLParser):
    """Counts drawn elements inside each <svg data-plot=...> of a DOM dump, and section ids."""

    def __init__(self):
        super().__init__()
        self.plots = {}
        self.sections = set()
        self.current = None
        self.depth = 0

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        if tag == "section" and "id" in attrs:
            self.sections.add(attrs["id"])
        if tag == "svg" and "data-plot" in attrs:
            self.current = attrs["data-plot"]
            self.plots[self.current] = 0
            self.depth = 0
        elif self.current is not None:
            if tag in DRAWN and (tag != "path" or attrs.get("d")):
                self.plots[self.current] += 1

    def handle_endtag(self, tag):
        if tag == "svg":
            self.current = None


def chromium(url, workdir, *extra):
    """Runs headless Chromium with a fresh profile; returns (stdout, console lines from stderr)."""
    exe = shutil.which("chromium")
    if not exe:
        raise SystemExit("report_browser: chromium is not installed (scripts/setup installs it)")
    profile = tempfile.mkdtemp(prefix="profile_", dir=workdir)
    try:
        result = subprocess.run([exe, *CHROMIUM_FLAGS, f"--user-data-dir={profile}", "--enable-logging=stderr",
                                 "--v=0", *extra, url], capture_output=True, text=True, timeout=120)
    finally:
        shutil.rmtree(profile, ignore_errors=True)
    console = [line for line in result.stderr.splitlines() if ":CONSOLE" in line]
    return result.stdout, console


def png_colours(path, max_rows=1600):
    """Distinct RGB colours in the top max_rows rows of an 8-bit RGB/RGBA PNG (PNG specification,
    filters 0-4; from memory). The top of the page holds the header and the first plots."""
    with open(path, "rb") as f:
        data = f.read()
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
    pos, idat, width, height, channels = 8, b"", 0, 0, 0
    while pos < len(data):
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            width, height, depth, colour_type = struct.unpack(">IIBB", body[:10])
            assert depth == 8 and colour_type in (2, 6), "unexpected PNG format"
            channels = 3 if colour_type == 2 else 4
        elif kind == b"IDAT":
            idat += body
        pos += 12 + length
    raw = zlib.decompress(idat)
    stride = width * channels
    previous = bytearray(stride)
    colours = set()
    for y in range(min(height, max_rows)):
        line = raw[y * (stride + 1):(y + 1) * (stride + 1)]
        kind, row = line[0], bytearray(line[1:])
        for i in range(stride):
            a = row[i - channels] if i >= channels else 0
            b = previous[i]
            c = previous[i - channels] if i >= channels else 0
            if kind == 1:
                row[i] = (row[i] + a) & 255
            elif kind == 2:
                row[i] = (row[i] + b) & 255
            elif kind == 3:
                row[i] = (row[i] + (a + b) // 2) & 255
            elif kind == 4:
                p = a + b - c
                pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                row[i] = (row[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
        if y % 4 == 0:  # every fourth row is plenty to tell a drawing from a blank page
            for x in range(0, stride, channels):
                colours.add(bytes(row[x:x + 3]))
        previous = row
    return colours


def check_report(path, workdir):
    name = os.path.basename(path)
    text = open(path, encoding="utf-8").read()
    try:
        root = ET.fromstring(text)
    except ET.ParseError as e:
        check(False, f"{name} is not well-formed XML: {e}")
        return
    check(root.tag == "html", f"{name}: root element is html")
    svgs = {s.get("data-plot"): s for s in root.iter(f"{SVG}svg")}
    check(not list(root.iter("script")), f"{name}: no script element")
    for bad in ("src=", "<link", "url(http", "@import"):
        check(bad not in text, f"{name}: loads nothing from outside ({bad!r} found)")
    check("research tool" in text, f"{name}: the caution line is in the page")
    for plot in EXPECTED_PLOTS[name]:
        check(plot in svgs, f"{name}: plot {plot} in the file")
    for plot, svg in svgs.items():
        titles = [t for t in svg.iter(f"{SVG}title")]
        check(len(titles) >= 2, f"{name}: plot {plot} has hover titles")

    dom, console = chromium("file://" + os.path.abspath(path), workdir, "--dump-dom")
    check(not console, f"{name}: console messages in Chromium: {console[:3]}")
    counter = PlotCounter()
    counter.feed(dom)
    for plot in EXPECTED_PLOTS[name]:
        check(counter.plots.get(plot, 0) >= 5, f"{name}: plot {plot} drawn in the browser DOM "
                                                f"({counter.plots.get(plot, 0)} elements)")
    check("metadata" in counter.sections, f"{name}: run metadata section in the DOM")

    png = os.path.join(workdir, name.replace(".html", ".png"))
    chromium("file://" + os.path.abspath(path), workdir, f"--screenshot={png}", "--window-size=1400,4000")
    if check(os.path.exists(png), f"{name}: screenshot written"):
        colours = png_colours(png)
        check(len(colours) > 50, f"{name}: screenshot shows a drawing ({len(colours)} colours)")


def main():
    args = parse_args()
    demo = os.path.join(args.workdir, "demo")
    bandstack(args.exe, "demo", "--out", demo)
    for stem in ("tarrow_sound_demo", "equilibrium_demo"):
        check(os.path.exists(os.path.join(demo, stem + ".html")), f"demo wrote {stem}.html next to the result")
    sweep = os.path.join(args.workdir, "sweep")
    run_study(args.exe, os.path.join(SOURCE, "examples", "sweep_demo.toml"), sweep)
    check(os.path.exists(os.path.join(sweep, "sweep_demo.html")), "run wrote sweep_demo.html")

    quiet = os.path.join(args.workdir, "no_report")
    os.makedirs(quiet)
    bandstack(args.exe, "run", os.path.join(SOURCE, "examples", "sweep_demo.toml"), "--out", quiet, "--no-report")
    check(not os.path.exists(os.path.join(quiet, "sweep_demo.html")), "--no-report writes no report")
    again = os.path.join(args.workdir, "again.html")
    done = subprocess.run([args.exe, "report", os.path.join(quiet, "sweep_demo.nc"), "--out", again],
                          capture_output=True, text=True)
    check(done.returncode == 0 and os.path.exists(again), "bandstack report writes the requested file")
    check(f"wrote {again}" in done.stdout, "bandstack report says what it wrote")
    not_result = os.path.join(args.workdir, "not_a_result.nc")
    with open(not_result, "w") as f:
        f.write("plain text")
    refused = subprocess.run([args.exe, "report", not_result], capture_output=True, text=True)
    check(refused.returncode == 2 and "not_a_result.nc" in refused.stderr, "a non-result file: exit 2 naming the file")

    # Control: the console detection sees a deliberate error, so a silent report means something.
    control = os.path.join(args.workdir, "control.html")
    with open(control, "w") as f:
        f.write('<!DOCTYPE html><html><body><script>console.error("control")</script></body></html>')
    _, console = chromium("file://" + control, args.workdir, "--dump-dom")
    check(any("control" in line for line in console), "console detection works (control page)")

    check_report(os.path.join(demo, "equilibrium_demo.html"), args.workdir)
    check_report(os.path.join(sweep, "sweep_demo.html"), args.workdir)
    for name in ("equilibrium_demo.html", "sweep_demo.html"):
        path = os.path.join(demo if name.startswith("equilibrium") else sweep, name)
        print(f"report_browser: {name} {os.path.getsize(path)} bytes")
    return check.report()


if __name__ == "__main__":
    sys.exit(main())
