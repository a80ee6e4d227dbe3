#!/usr/bin/python3
"""Malformed input files for the bad-input suite (tests/cli/badinput_tests.cmake) and seeds for the
fuzz corpora (tests/fuzz/corpus/).

Every file is small and written byte by byte here, so that CRLF line endings, non-UTF-8 bytes, very long
lines and truncated binaries are exactly what the test names say. Binary files come from independent
writers: FITS from astropy.io.fits (Debian python3-astropy 5.2.1), HDF5 from h5py (Debian python3-h5py
3.7.0). The HDF5 layouts follow io/correlation_h5.hpp and io/plan_h5.hpp only as far as each case needs
(a truncated file is a complete small file cut in the middle).

Writes into tests/data/bad/ (and the fuzz seeds into tests/fuzz/corpus/fuzz_*/):
  site-*.ini, array-*.csv, instrument-*.ini, catalog-*.csv, catalog-*.fits, vis2-*.csv, oifits-*.fits,
  corr-*.h5, plan-*.h5 (see the table CASES below and the functions for binary files).

The plan.h5 seed (tests/fuzz/corpus/fuzz_plan_h5/plan.h5) is not written here: it is the plan.h5 of
  siiplan night --site catalogs-demo/site.ini --array catalogs-demo/array-small.csv
      --instrument catalogs-demo/instrument-small.ini --date 2026-03-14 --catalog catalogs-demo/targets.csv
so that the fuzzer starts from a complete plan.

Run: /usr/bin/python3 scripts/make_bad_inputs.py   (deterministic: same bytes every run)
"""
import io
import os
import shutil

import h5py
import numpy as np
from astropy.io import fits

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
BAD = os.path.join(ROOT, "tests", "data", "bad")
CORPUS = os.path.join(ROOT, "tests", "fuzz", "corpus")

SITE = """[site]
name = Bad Input Test Site
latitude_deg = -27.3125
longitude_deg = -68.8410
height_m = 2710
"""

ARRAY = """name,east_m,north_m,up_m,diameter_m
A,0,0,0,0.6
B,20,0,0,0.6
C,0,25,0,0.8
"""

INSTRUMENT = """[instrument]
mode = photon-counting
wavelength_nm = 450
bandwidth_nm = 2
efficiency = 0.2
timing_fwhm_ps = 500
fov_arcsec = 5
max_rate_mhz = 20
dark_rate_hz = 300
zero_baseline = calibrated
"""

CATALOG = """name,ra,dec,mag_v,diameter_mas,priority
Alpha,05:55:10.3,+07:24:25,0.5,5.0,1
Beta,06:23:57.1,-52:41:44,-0.7,6.0,2
"""

VIS2 = """baseline_m,wavelength_nm,vis2,vis2_err
10,443,0.84,0.03
30,443,0.68,0.03
60,443,0.35,0.03
"""


def crlf(text):
    return text.replace("\n", "\r\n")


# name -> bytes (text cases). "ok" in a name means the case must be accepted (exit 0).
CASES = {
    # site INI
    "site-empty.ini": "",
    "site-no-latitude.ini": SITE.replace("latitude_deg = -27.3125\n", ""),
    "site-no-section.ini": SITE.replace("[site]\n", ""),
    "site-nonnumeric-height.ini": SITE.replace("height_m = 2710", "height_m = high"),
    "site-nan-latitude.ini": SITE.replace("-27.3125", "nan"),
    "site-inf-longitude.ini": SITE.replace("-68.8410", "inf"),
    "site-latitude-91.ini": SITE.replace("-27.3125", "-91"),
    "site-ok-unknown-key.ini": SITE + "dome_colour = white\n",
    "site-ok-crlf.ini": crlf(SITE),
    "site-non-utf8.ini": SITE.replace("Bad Input Test Site", "Cerro Vidr\xedo").encode("latin-1"),
    "site-ok-long-comment.ini": "# " + "x" * 70000 + "\n" + SITE,
    "site-long-value.ini": SITE.replace("height_m = 2710", "height_m = " + "9" * 70000),
    # array CSV
    "array-empty.csv": "",
    "array-header-only.csv": "name,east_m,north_m,up_m,diameter_m\n",
    "array-no-diameter.csv": "name,east_m,north_m,up_m\nA,0,0,0\nB,20,0,0\n",
    "array-ok-extra-column.csv": ARRAY.replace("diameter_m\n", "diameter_m,mount_type\n")
                                     .replace("0.6\n", "0.6,alt-az\n").replace("0.8\n", "0.8,equatorial\n"),
    "array-nan-east.csv": ARRAY.replace("B,20,", "B,nan,"),
    "array-inf-north.csv": ARRAY.replace("C,0,25,", "C,0,inf,"),
    "array-zero-diameter.csv": ARRAY.replace("B,20,0,0,0.6", "B,20,0,0,0"),
    "array-negative-diameter.csv": ARRAY.replace("C,0,25,0,0.8", "C,0,25,0,-0.8"),
    "array-duplicate-name.csv": ARRAY.replace("C,0,25", "A,0,25"),
    "array-coincident.csv": ARRAY.replace("C,0,25,0", "C,20,0,0.001"),
    "array-too-many-fields.csv": ARRAY.replace("B,20,0,0,0.6", "B,20,0,0,0.6,7"),
    "array-ok-crlf.csv": crlf(ARRAY),
    "array-non-utf8.csv": ARRAY.replace("B,20", "B\xe9ta,20").encode("latin-1"),
    "array-ok-long-line.csv": "# " + "y" * 70000 + "\n" + ARRAY,
    "array-one-telescope.csv": "name,east_m,north_m,up_m,diameter_m\nA,0,0,0,0.6\n",
    # instrument INI
    "instrument-empty.ini": "",
    "instrument-no-mode.ini": INSTRUMENT.replace("mode = photon-counting\n", ""),
    "instrument-bad-mode.ini": INSTRUMENT.replace("photon-counting", "quantum"),
    "instrument-efficiency-0.ini": INSTRUMENT.replace("efficiency = 0.2", "efficiency = 0"),
    "instrument-efficiency-1.5.ini": INSTRUMENT.replace("efficiency = 0.2", "efficiency = 1.5"),
    "instrument-efficiency-negative.ini": INSTRUMENT.replace("efficiency = 0.2", "efficiency = -0.2"),
    "instrument-efficiency-nan.ini": INSTRUMENT.replace("efficiency = 0.2", "efficiency = nan"),
    "instrument-zero-bandwidth.ini": INSTRUMENT.replace("bandwidth_nm = 2", "bandwidth_nm = 0"),
    "instrument-negative-fov.ini": INSTRUMENT.replace("fov_arcsec = 5", "fov_arcsec = -5"),
    "instrument-ok-crlf.ini": crlf(INSTRUMENT),
    "instrument-ok-unknown-key.ini": INSTRUMENT + "cryostat = none\n",
    # catalog CSV
    "catalog-empty.csv": "",
    "catalog-no-dec.csv": "name,ra,mag_v\nAlpha,05:55:10.3,0.5\n",
    "catalog-ra-361.csv": CATALOG.replace("05:55:10.3", "361.0"),
    "catalog-dec-minus-91.csv": CATALOG.replace("-52:41:44", "-91:00:00"),
    "catalog-duplicate-name.csv": CATALOG.replace("Beta,", "Alpha,"),
    "catalog-nonnumeric-mag.csv": CATALOG.replace("-0.7", "bright"),
    "catalog-nan-diameter.csv": CATALOG.replace("6.0,2", "NaN,2"),
    "catalog-inf-mag.csv": CATALOG.replace(",0.5,", ",inf,"),
    "catalog-zero-diameter.csv": CATALOG.replace("5.0,1", "0,1"),
    "catalog-negative-priority.csv": CATALOG.replace("6.0,2", "6.0,-2"),
    "catalog-unknown-model.csv": CATALOG.replace("priority\n", "priority,model\n")
                                        .replace(",1\n", ",1,ud\n").replace(",2\n", ",2,donut\n"),
    # found by fuzz_catalog: a sexagesimal field too long for an int (was std::out_of_range, exit 1)
    "catalog-ra-huge-hours.csv": CATALOG.replace("06:23:57.1", "1" * 40 + "06:23:57.1"),
    # found by fuzz_catalog: minutes too large for an int ("hh:mm.m" form; was undefined behaviour)
    "catalog-ra-huge-minutes.csv": CATALOG.replace("06:23:57.1", "06:2344444444444444444444444"),
    "catalog-ok-extra-column.csv": CATALOG.replace("priority\n", "priority,spectral_type\n")
                                          .replace(",1\n", ",1,K2III\n").replace(",2\n", ",2,A9II\n"),
    "catalog-ok-crlf.csv": crlf(CATALOG),
    "catalog-ok-bom.csv": "\ufeff" + CATALOG,
    "catalog-non-utf8.csv": CATALOG.replace("Beta", "B\xeata").encode("latin-1"),
    "catalog-ok-long-line.csv": CATALOG.replace("priority\n", "priority,note\n")
                                       .replace(",1\n", ",1," + "z" * 70000 + "\n").replace(",2\n", ",2,\n"),
    # measurement CSV (fit)
    "vis2-no-err.csv": "baseline_m,wavelength_nm,vis2\n10,443,0.84\n",
    "vis2-negative-err.csv": VIS2.replace("30,443,0.68,0.03", "30,443,0.68,-0.03"),
    "vis2-zero-err.csv": VIS2.replace("60,443,0.35,0.03", "60,443,0.35,0"),
    "vis2-nonnumeric.csv": VIS2.replace("0.68", "high"),
    "vis2-inf.csv": VIS2.replace("0.35", "inf"),
    "vis2-header-only.csv": "baseline_m,wavelength_nm,vis2,vis2_err\n",
    "vis2-ok-crlf.csv": crlf(VIS2),
    "vis2-ok.csv": VIS2,
    "not-fits.fits": "this is a text file, not FITS\n",
    "not-hdf5.h5": "this is a text file, not HDF5\n",
}


def write(name, data):
    if isinstance(data, str):
        data = data.encode("utf-8")
    with open(os.path.join(BAD, name), "wb") as f:
        f.write(data)
    return data


def fits_bytes(hdul):
    buf = io.BytesIO()
    hdul.writeto(buf, output_verify="ignore")
    return buf.getvalue()


def catalog_fits_files():
    names = np.array(["Alpha", "Beta"])
    ra = np.array([88.7929, 95.9880])
    dec = np.array([7.4069, -52.6956])
    mag = np.array([0.5, -0.7])

    def table(cols, extname="TARGETS"):
        return fits.HDUList([fits.PrimaryHDU(), fits.BinTableHDU.from_columns(cols, name=extname)])

    good = table([fits.Column("name", "8A", array=names), fits.Column("ra", "D", array=ra),
                  fits.Column("dec", "D", array=dec), fits.Column("mag_v", "D", array=mag)])
    data = write("catalog-ok.fits", fits_bytes(good))
    write("catalog-truncated.fits", data[: len(data) - 2880 + 100])   # cut inside the table HDU
    write("catalog-no-table.fits", fits_bytes(fits.HDUList([fits.PrimaryHDU(np.zeros((4, 4), np.float32))])))
    write("catalog-no-ra.fits", fits_bytes(table([fits.Column("name", "8A", array=names),
                                                  fits.Column("dec", "D", array=dec)])))
    write("catalog-numeric-name.fits", fits_bytes(table([fits.Column("name", "J", array=np.array([1, 2])),
                                                         fits.Column("ra", "D", array=ra),
                                                         fits.Column("dec", "D", array=dec)])))
    write("catalog-dec-out.fits", fits_bytes(table([fits.Column("name", "8A", array=names),
                                                    fits.Column("ra", "D", array=ra),
                                                    fits.Column("dec", "D", array=np.array([7.4, 95.0]))])))
    # A column name that is not a quoted string (FITS 4.0 §7.3.2): cfitsio 4.2 would copy its 70 characters
    # into a 70-byte buffer and abort; siiplan's own header check refuses it first.
    i = data.index(b"TTYPE4  =")
    write("catalog-unquoted-ttype.fits", data[:i] + b"TTYPE4  = " + b"x" * 70 + data[i + 80:])
    write("catalog-nan-ra.fits", fits_bytes(table([fits.Column("name", "8A", array=names),
                                                   fits.Column("ra", "D", array=np.array([np.nan, 95.9])),
                                                   fits.Column("dec", "D", array=dec)])))
    return data


def oifits_files():
    # A FITS file that is not OIFITS (an image and an unrelated table), and a truncated real OIFITS file.
    other = fits.HDUList([fits.PrimaryHDU(np.zeros((8, 8), np.float32)),
                          fits.BinTableHDU.from_columns([fits.Column("FLUX", "D", array=np.arange(3.0))],
                                                        name="SPECTRUM")])
    write("oifits-not-oifits.fits", fits_bytes(other))
    with open(os.path.join(ROOT, "tests", "data", "astropy_v2.oifits"), "rb") as f:
        good = f.read()
    write("oifits-truncated.oifits", good[: len(good) // 2 + 1000])
    return good


def h5_bytes(fill):
    buf = io.BytesIO()
    with h5py.File(buf, "w", libver=("earliest", "v110"), track_order=False) as f:
        fill(f)
    return buf.getvalue()


def corr_fill(f, drop=None, version=1):
    f.attrs["format"] = "siiplan-correlation"
    f.attrs["format_version"] = np.int32(version)
    f.attrs["creator"] = "scripts/make_bad_inputs.py"
    s = f.create_group("site")
    for k, v in {"name": "Bad Input Test Site", "lat_rad": -0.4767, "lon_east_rad": -1.2015,
                 "height_m": 2710.0, "dut1_s": 0.0}.items():
        s.attrs[k] = v
    runs = f.create_group("runs")
    runs.attrs["count"] = np.int32(1)
    r = runs.create_group("run_0000")
    attrs = {"telescope_1": "A", "telescope_2": "B",
             "telescope_1_enu_m": np.array([0.0, 0.0, 0.0]), "telescope_2_enu_m": np.array([20.0, 0.0, 0.0]),
             "telescope_1_diameter_m": 0.6, "telescope_2_diameter_m": 0.6,
             "target": "Alpha", "target_ra_rad": 1.5497, "target_dec_rad": 0.1293,
             "lambda_m": 450e-9, "bandwidth_m": 2e-9, "filter_profile": "gaussian", "timing_fwhm_s": 500e-12,
             "detection_mode": "photon-counting", "delay_tracked_online": np.int32(1), "frame_s": 1.0,
             "background_1_hz": 300.0, "background_2_hz": 300.0}
    for k, v in attrs.items():
        if k != drop:
            r.attrs[k] = v
    n_frames, n_bins = 64, 32
    rng = np.random.default_rng(1)
    r["frame_start_mjd"] = 61113.1 + np.arange(n_frames) / 86400.0
    r["delay_s"] = (np.arange(n_bins) - n_bins / 2) * 125e-12
    r["correlation"] = (rng.normal(0, 1e-4, (n_frames, n_bins))).astype(np.float32)
    r["rate_hz"] = np.full((n_frames, 2), 5e6)


def plan_fill(f, drop_array=False):
    f.attrs["format"] = "siiplan-plan"
    f.attrs["format_version"] = np.int32(1)
    f.attrs["date"] = "2026-03-14"
    f.attrs["night_start_mjd_utc"] = 61113.05
    f.attrs["night_end_mjd_utc"] = 61113.40
    f.attrs["slot_s"] = 300.0
    f.attrs["siiplan_version"] = "0.1.0"
    s = f.create_group("site")
    for k, v in {"name": "Bad Input Test Site", "lat_rad": -0.4767, "lon_east_rad": -1.2015, "height_m": 2710.0,
                 "pressure_hpa": 0.0, "temperature_c": 10.0, "humidity": 0.5, "dut1_s": 0.0, "utc_offset_h": -3.0,
                 "min_altitude_rad": 0.35}.items():
        s.attrs[k] = v
    s.attrs["extinction_mag_per_airmass"] = np.array([0.45, 0.22, 0.12, 0.08, 0.05])
    if not drop_array:
        a = f.create_group("array")
        a.create_dataset("name", data=["A", "B"], dtype=h5py.string_dtype())
        for k, v in {"east_m": [0.0, 20.0], "north_m": [0.0, 0.0], "up_m": [0.0, 0.0], "diameter_m": [0.6, 0.6],
                     "area_m2": [0.28, 0.28], "min_altitude_rad": [np.nan, np.nan]}.items():
            a[k] = np.array(v)
        a["pairs"] = np.array([[0, 1]], dtype=np.int32)
    f.create_group("blocks").attrs["count"] = np.int32(0)
    f["filler"] = np.arange(4096, dtype=np.float64)   # so that the cut falls well inside the file


def hdf5_files():
    corr = write("corr-truncated-source.h5", h5_bytes(corr_fill))
    os.remove(os.path.join(BAD, "corr-truncated-source.h5"))
    write("corr-truncated.h5", corr[: len(corr) // 2])
    write("corr-missing-target.h5", h5_bytes(lambda f: corr_fill(f, drop="target")))
    write("corr-version-99.h5", h5_bytes(lambda f: corr_fill(f, version=99)))
    write("corr-other-program.h5", h5_bytes(lambda f: f.create_dataset("images", data=np.zeros((4, 4)))))
    plan = h5_bytes(plan_fill)
    write("plan-truncated.h5", plan[: len(plan) // 2])
    write("plan-no-array.h5", h5_bytes(lambda f: plan_fill(f, drop_array=True)))
    return corr, plan


def seed(harness, name, data):
    d = os.path.join(CORPUS, harness)
    os.makedirs(d, exist_ok=True)
    if isinstance(data, str):
        data = data.encode("utf-8")
    with open(os.path.join(d, name), "wb") as f:
        f.write(data)


def main():
    os.makedirs(BAD, exist_ok=True)
    for name, data in CASES.items():
        write(name, data)
    fits_catalog = catalog_fits_files()
    oifits = oifits_files()
    corr, _ = hdf5_files()
    # Fuzz seeds: one valid file per reader (small), plus a CRLF variant for the text readers.
    seed("fuzz_site", "site.ini", SITE)
    seed("fuzz_site", "site-crlf.ini", crlf(SITE))
    seed("fuzz_array", "array.csv", ARRAY)
    seed("fuzz_array", "array-geodetic.csv",
         "name,latitude_deg,longitude_deg,height_m,diameter_m,area_m2\nA,-27.3125,-68.8410,2710,0.6,0.25\n"
         "B,-27.3124,-68.8409,2711,0.8,\n")
    seed("fuzz_instrument", "instrument.ini", INSTRUMENT)
    seed("fuzz_instrument", "instrument-analog.ini",
         INSTRUMENT.replace("photon-counting", "analog").replace("timing_fwhm_ps = 500", "electronic_bandwidth_mhz = 200"))
    seed("fuzz_catalog", "catalog.csv", CATALOG)
    seed("fuzz_catalog", "catalog-models.csv", "name,ra,dec,model,diameter_mas,limb_u\nA,10.5,-3,ld-linear,2.0,0.4\n"
         "B,11:00:00,+45:00:00,ud,1.5,\n")
    seed("fuzz_catalog_fits", "catalog.fits", fits_catalog)
    seed("fuzz_vis2_csv", "vis2.csv", VIS2)
    seed("fuzz_vis2_csv", "vis2-uv.csv", "u_m,v_m,wavelength_nm,vis2,vis2_err,pair,mjd,flag\n"
         "10,5,443,0.8,0.03,A-B,61113.1,0\n-3,20,443,0.5,0.04,A-C,61113.2,1\n")
    seed("fuzz_oifits", "v2.oifits", oifits)
    with open(os.path.join(ROOT, "tests", "data", "astropy_v1.oifits"), "rb") as f:
        seed("fuzz_oifits", "v1.oifits", f.read())
    seed("fuzz_correlation_h5", "corr.h5", corr)


if __name__ == "__main__":
    main()
