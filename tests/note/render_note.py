#!/usr/bin/python3
"""The design note in a real browser.

Usage: render_note.py HUSHGAIN SOURCE_DIR

Writes `hushgain note` for an example stage, then has headless Chromium
render it to PNG and to PDF with every network request logged. Fails when
Chromium reports an error or exits non-zero, when the PNG is blank (fewer
than 20 distinct pixel rows), when the PDF is not a whole PDF file, or when
the page asked for any resource that is not the note itself (the net log
holds a request for a URL other than the note's file:// URL). Static check
too: the HTML names no http(s) URL outside the SVG namespace declarations.

Chromium is Debian's `chromium` (scripts/setup installs it). When it is
missing the test is skipped (exit 77) with a message, except under CI (the
CI environment variable set), where a missing browser is a failure.
"""
import json
import os
import re
import shutil
import struct
import subprocess
import sys
import tempfile
import zlib


def fail(message):
    print("FAIL: " + message)
    sys.exit(1)


def png_rows(path):
    """The distinct raw scanlines of a non-interlaced PNG (filter bytes
    included): a blank page gives a handful, a page of text hundreds."""
    data = open(path, "rb").read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        fail(path + ": not a PNG")
    pos, idat, width, height, depth, ctype = 8, b"", 0, 0, 0, 0
    while pos < len(data):
        (length,) = struct.unpack(">I", data[pos:pos + 4])
        kind = data[pos + 4:pos + 8]
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            width, height, depth, ctype = struct.unpack(">IIBB", body[:10])
        elif kind == b"IDAT":
            idat += body
        elif kind == b"IEND":
            break
        pos += 12 + length
    channels = {0: 1, 2: 3, 4: 2, 6: 4}.get(ctype, 1)
    stride = 1 + width * channels * depth // 8
    raw = zlib.decompress(idat)
    if len(raw) != stride * height:
        fail(path + ": PNG data does not match its header")
    return len({raw[i:i + stride] for i in range(0, len(raw), stride)}), height


def main():
    hushgain, source = sys.argv[1], sys.argv[2]
    chromium = shutil.which("chromium")
    if not chromium:
        print("chromium is not installed (Debian package chromium; "
              "scripts/setup installs it): design note rendering not checked")
        sys.exit(1 if os.environ.get("CI") else 77)
    with tempfile.TemporaryDirectory(prefix="hushgain-note-") as tmp:
        note = os.path.join(tmp, "note.html")
        stage = os.path.join(source, "examples", "geophone-preamp.json")
        run = subprocess.run([hushgain, "note", stage, "-o", note],
                             capture_output=True, text=True)
        if run.returncode != 0:
            fail("hushgain note exited %d: %s" % (run.returncode, run.stderr))
        html = open(note, encoding="utf-8").read()
        urls = set(re.findall(r"https?://[^\s\"'<>)]+", html))
        urls -= {"http://www.w3.org/2000/svg", "http://www.w3.org/1999/xlink"}
        if urls:
            fail("the note names external URLs: " + ", ".join(sorted(urls)))
        for pattern in (r"<link\b", r"<script\b[^>]*\bsrc=", r"@import",
                        r"url\(", r"<img\b", r"<iframe\b"):
            if re.search(pattern, html, re.I):
                fail("the note holds a reference to load: " + pattern)

        png = os.path.join(tmp, "note.png")
        pdf = os.path.join(tmp, "note.pdf")
        net = os.path.join(tmp, "net.json")
        common = [chromium, "--headless=new", "--no-sandbox", "--disable-gpu",
                  "--disable-background-networking", "--disable-sync",
                  "--disable-component-update", "--no-first-run",
                  "--disable-default-apps", "--disable-extensions",
                  "--user-data-dir=" + os.path.join(tmp, "profile")]
        url = "file://" + note
        shot = subprocess.run(common + ["--log-net-log=" + net,
                                        "--net-log-capture-mode=Everything",
                                        "--window-size=1200,2400",
                                        "--screenshot=" + png, url],
                              capture_output=True, text=True, timeout=120)
        if shot.returncode != 0 or not os.path.exists(png):
            fail("chromium --screenshot failed: " + shot.stderr[-2000:])
        printed = subprocess.run(common + ["--print-to-pdf=" + pdf,
                                           "--no-pdf-header-footer", url],
                                 capture_output=True, text=True, timeout=120)
        if printed.returncode != 0 or not os.path.exists(pdf):
            fail("chromium --print-to-pdf failed: " + printed.stderr[-2000:])

        distinct, height = png_rows(png)
        if distinct < 20:
            fail("the rendered page looks blank: %d distinct rows of %d"
                 % (distinct, height))
        pdf_bytes = open(pdf, "rb").read()
        if not pdf_bytes.startswith(b"%PDF-") or b"%%EOF" not in pdf_bytes[-64:]:
            fail("the printed PDF is not a whole PDF file")

        # Requests the page made carry its origin as initiator ("null" for a
        # file:// page); the browser's own background traffic (update
        # checks, dictionaries) is initiated by "not an origin" and is not
        # the note's doing.
        log = json.load(open(net))
        start_job = log["constants"]["logEventTypes"]["URL_REQUEST_START_JOB"]
        requested = set()
        for event in log.get("events", []):
            params = event.get("params", {})
            if (event.get("type") == start_job and "url" in params and
                    params.get("initiator") != "not an origin"):
                requested.add(params["url"])
        if requested:
            fail("the page requested: " + ", ".join(sorted(requested)))
        print("design note rendered: %d distinct rows in the PNG, %d-byte PDF, "
              "no request from the page" % (distinct, len(pdf_bytes)))


if __name__ == "__main__":
    main()
