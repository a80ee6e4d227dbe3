#!/usr/bin/python3
"""OIFITS files written by an independent writer (astropy.io.fits) for tests/io/oifits_test.cpp and the
CLI tests. Table layouts follow OIFITS v2 (Duvert, Young & Hummel 2017, A&A 597, A8, Tables 3-6) and,
for the v1 file, Pauls, Young, Cotton & Monnier 2005 (PASP 117, 1255).

Writes into tests/data/:
  astropy_v2.oifits        2 targets (ALPHA_TEST, BETA_TEST), 3 stations, one OI_WAVELENGTH with 2 channels
                           (440 nm / 10 nm, 520 nm / 12 nm, stored as float32), one OI_VIS2 with 4 rows;
                           row 3 channel 2 is flagged, row 4 belongs to BETA_TEST. Also an OI_T3 table that
                           the reader must skip. Values: see ROWS below (the C++ test repeats them).
  astropy_v1.oifits        the same first 3 rows in OIFITS v1 form: OI_REVN = 1, no OI_ARRAY, no ARRNAME,
                           TIME in seconds, no CONTENT keyword.
  astropy_no_vis2.oifits   OI_TARGET + OI_WAVELENGTH + OI_ARRAY only (no squared visibilities).
  astropy_bad_nwave.oifits VIS2DATA/VIS2ERR/FLAG 3 wide while OI_WAVELENGTH has 2 rows.
  astropy_bad_type.oifits  VIS2DATA stored as text (TFORM 16A).
  astropy_all_flagged.oifits  every FLAG true.

Run: /usr/bin/python3 scripts/make_ref_oifits.py   (Debian python3-astropy 5.2.1)
"""
import os

import astropy
import numpy as np
from astropy.io import fits

DATA = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "tests", "data")

# target_id, mjd, int_time_s, u_m, v_m, sta1, sta2, vis2[2], vis2_err[2], flag[2]
ROWS = [
    (1, 60310.25, 600.0, 30.5, -12.25, 1, 2, [0.81, 0.77], [0.02, 0.025], [False, False]),
    (1, 60310.30, 600.0, -45.0, 60.0, 1, 3, [0.35, -0.015], [0.03, 0.03], [False, False]),
    (1, 60311.20, 900.0, 100.0, 0.0, 2, 3, [0.05, 0.9], [0.01, 0.05], [False, True]),
    (2, 60311.40, 300.0, 10.0, 10.0, 1, 2, [0.95, 0.93], [0.02, 0.02], [False, False]),
]


def primary(v2=True):
    h = fits.PrimaryHDU()
    if v2:
        h.header["CONTENT"] = "OIFITS2"
        h.header["ORIGIN"] = "astropy test writer"
        h.header["TELESCOP"] = "TESTARRAY"
        h.header["INSTRUME"] = "TESTSII"
        h.header["OBSERVER"] = "NOBODY"
        h.header["OBJECT"] = "MULTI"
        h.header["INSMODE"] = "TEST"
    return h


def target_table(revn=2):
    cols = [
        fits.Column("TARGET_ID", "I", array=[1, 2]),
        fits.Column("TARGET", "16A", array=["ALPHA_TEST", "BETA_TEST"]),
        fits.Column("RAEP0", "D", unit="deg", array=[83.5, 201.25]),
        fits.Column("DECEP0", "D", unit="deg", array=[-5.5, 12.75]),
        fits.Column("EQUINOX", "E", unit="year", array=[2000.0, 2000.0]),
        fits.Column("RA_ERR", "D", unit="deg", array=[0.0, 0.0]),
        fits.Column("DEC_ERR", "D", unit="deg", array=[0.0, 0.0]),
        fits.Column("SYSVEL", "D", unit="m/s", array=[0.0, 0.0]),
        fits.Column("VELTYP", "8A", array=["LSR", "LSR"]),
        fits.Column("VELDEF", "8A", array=["OPTICAL", "OPTICAL"]),
        fits.Column("PMRA", "D", unit="deg/year", array=[1e-6, 0.0]),
        fits.Column("PMDEC", "D", unit="deg/year", array=[-2e-6, 0.0]),
        fits.Column("PMRA_ERR", "D", unit="deg/year", array=[0.0, 0.0]),
        fits.Column("PMDEC_ERR", "D", unit="deg/year", array=[0.0, 0.0]),
        fits.Column("PARALLAX", "E", unit="deg", array=[0.0, 0.0]),
        fits.Column("PARA_ERR", "E", unit="deg", array=[0.0, 0.0]),
        fits.Column("SPECTYP", "16A", array=["B2III", "A0V"]),
    ]
    if revn == 2:
        cols.append(fits.Column("CATEGORY", "3A", array=["SCI", "CAL"]))
    t = fits.BinTableHDU.from_columns(cols, name="OI_TARGET")
    t.header["OI_REVN"] = revn
    return t


def array_table():
    t = fits.BinTableHDU.from_columns([
        fits.Column("TEL_NAME", "16A", array=["TA", "TB", "TC"]),
        fits.Column("STA_NAME", "16A", array=["PADA", "PADB", "PADC"]),
        fits.Column("STA_INDEX", "I", array=[1, 2, 3]),
        fits.Column("DIAMETER", "E", unit="m", array=[12.0, 12.0, 6.5]),
        fits.Column("STAXYZ", "3D", unit="m", array=[[0.0, 0.0, 0.0], [30.0, -12.0, 1.5], [-45.0, 60.0, 0.0]]),
        fits.Column("FOV", "D", unit="arcsec", array=[1.0, 1.0, 1.0]),
        fits.Column("FOVTYPE", "6A", array=["FWHM", "FWHM", "FWHM"]),
    ], name="OI_ARRAY")
    t.header["OI_REVN"] = 2
    t.header["ARRNAME"] = "TESTARRAY"
    t.header["FRAME"] = "GEOCENTRIC"
    t.header["ARRAYX"] = 1000.0
    t.header["ARRAYY"] = 2000.0
    t.header["ARRAYZ"] = 3000.0
    return t


def wave_table(revn=2):
    t = fits.BinTableHDU.from_columns([
        fits.Column("EFF_WAVE", "E", unit="m", array=np.array([440e-9, 520e-9], dtype=np.float32)),
        fits.Column("EFF_BAND", "E", unit="m", array=np.array([10e-9, 12e-9], dtype=np.float32)),
    ], name="OI_WAVELENGTH")
    t.header["OI_REVN"] = revn
    t.header["INSNAME"] = "TESTSII_2CH"
    return t


def vis2_table(rows, width=2, revn=2, arrname=True, text_vis2=False, all_flagged=False):
    n = len(rows)
    pad = lambda v, fill: [list(x) + [fill] * (width - len(x)) for x in v]
    vis2 = pad([r[7] for r in rows], 0.5)
    cols = [
        fits.Column("TARGET_ID", "I", array=[r[0] for r in rows]),
        fits.Column("TIME", "D", unit="s", array=[(r[1] % 1) * 86400.0 if revn == 1 else 0.0 for r in rows]),
        fits.Column("MJD", "D", unit="day", array=[r[1] for r in rows]),
        fits.Column("INT_TIME", "D", unit="s", array=[r[2] for r in rows]),
        (fits.Column("VIS2DATA", "16A", array=[str(v[0]) for v in vis2]) if text_vis2
         else fits.Column("VIS2DATA", "%dD" % width, array=vis2)),
        fits.Column("VIS2ERR", "%dD" % width, array=pad([r[8] for r in rows], 0.1)),
        fits.Column("UCOORD", "D", unit="m", array=[r[3] for r in rows]),
        fits.Column("VCOORD", "D", unit="m", array=[r[4] for r in rows]),
        fits.Column("STA_INDEX", "2I", array=[[r[5], r[6]] for r in rows]),
        fits.Column("FLAG", "%dL" % width, array=[[True] * width if all_flagged else list(r[9]) + [False] * (width - 2)
                                                  for r in rows]),
    ]
    t = fits.BinTableHDU.from_columns(cols, name="OI_VIS2")
    t.header["OI_REVN"] = revn
    t.header["DATE-OBS"] = "2024-01-03"
    if arrname:
        t.header["ARRNAME"] = "TESTARRAY"
    t.header["INSNAME"] = "TESTSII_2CH"
    return t


def t3_table():
    t = fits.BinTableHDU.from_columns([
        fits.Column("TARGET_ID", "I", array=[1]),
        fits.Column("T3PHI", "2D", unit="deg", array=[[1.0, 2.0]]),
    ], name="OI_T3")
    t.header["OI_REVN"] = 2
    t.header["INSNAME"] = "TESTSII_2CH"
    return t


def write(name, hdus):
    fits.HDUList(hdus).writeto(os.path.join(DATA, name), overwrite=True, output_verify="exception")
    print("wrote", name)


def main():
    write("astropy_v2.oifits", [primary(), target_table(), array_table(), wave_table(), vis2_table(ROWS), t3_table()])
    write("astropy_v1.oifits", [primary(v2=False), target_table(1), wave_table(1),
                                vis2_table(ROWS[:3], revn=1, arrname=False)])
    write("astropy_no_vis2.oifits", [primary(), target_table(), array_table(), wave_table()])
    write("astropy_bad_nwave.oifits", [primary(), target_table(), array_table(), wave_table(), vis2_table(ROWS, width=3)])
    write("astropy_bad_type.oifits", [primary(), target_table(), array_table(), wave_table(),
                                      vis2_table(ROWS, text_vis2=True)])
    write("astropy_all_flagged.oifits", [primary(), target_table(), array_table(), wave_table(),
                                         vis2_table(ROWS, all_flagged=True)])
    print("astropy", astropy.__version__)


if __name__ == "__main__":
    main()
