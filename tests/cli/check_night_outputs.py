#!/usr/bin/python3
# Reads back the outputs of `siiplan night` with independent parsers (Python's csv, h5py, html.parser)
# and checks their structure: usage  check_night_outputs.py OUTDIR
import csv
import html.parser
import sys

import h5py

out = sys.argv[1]
with open(f"{out}/schedule.csv", newline="") as f:
    rows = list(csv.DictReader(f))
assert rows, "schedule.csv has no block"
assert list(rows[0].keys()) == ["target", "start_utc", "end_utc", "alt_start_deg", "alt_end_deg", "airmass_max",
                                "moon_sep_deg", "predicted_sigma_theta_pct"], rows[0].keys()
for r in rows:
    assert r["start_utc"] < r["end_utc"]
    assert float(r["alt_start_deg"]) >= 25 and float(r["alt_end_deg"]) >= 25, r
    assert 1 <= float(r["airmass_max"]) < 2.4, r
with open(f"{out}/baselines.csv", newline="") as f:
    base = list(csv.DictReader(f))
assert base and set(base[0]) == {"target", "pair", "baseline_min_m", "baseline_max_m", "pa_min_deg", "pa_max_deg",
                                 "vis2_min", "vis2_max", "snr", "verdict"}
assert {b["target"] for b in base} == {r["target"] for r in rows}
with h5py.File(f"{out}/plan.h5", "r") as h:
    assert h.attrs["format"] in ("siiplan-plan", b"siiplan-plan")
    n_pairs = h["array/pairs"].shape[0]
    blocks = h["blocks"]
    assert blocks.attrs["count"] == len(rows) == len(blocks)
    for k in range(len(rows)):
        b = blocks[f"block_{k:04d}"]
        n = b["mjd_utc"].shape[0]
        for name in ("u_m", "v_m", "w_m", "vis2", "sigma_vis2", "usable"):
            assert b[name].shape == (n_pairs, n), (name, b[name].shape)
        t = b.attrs["target"]
        assert (t.decode() if isinstance(t, bytes) else t) == rows[k]["target"]


class Checker(html.parser.HTMLParser):
    void = {"meta", "br", "img", "hr", "input", "link"}

    def __init__(self):
        super().__init__()
        self.stack = []

    def handle_starttag(self, tag, attrs):
        if tag not in self.void:
            self.stack.append(tag)

    def handle_startendtag(self, tag, attrs):
        pass

    def handle_endtag(self, tag):
        if tag in self.void:
            return
        assert self.stack and self.stack[-1] == tag, f"</{tag}> closes <{self.stack[-1] if self.stack else None}>"
        self.stack.pop()


page = open(f"{out}/report.html", encoding="utf-8").read()
c = Checker()
c.feed(page)
c.close()
assert not c.stack, f"unclosed: {c.stack}"
assert "http://" not in page.replace("http://www.w3.org/2000/svg", "") and "https://" not in page, "network reference"
assert "<svg" in page and "Safety" in page
print(f"ok: {len(rows)} blocks, {len(base)} target-pair rows, {n_pairs} pairs")
