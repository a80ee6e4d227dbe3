#!/usr/bin/python3
"""Writes the HDF5 fixtures of the correlation-file tests into tests/data/ (run with /usr/bin/python3).

The files are written with h5py (Debian python3-h5py), i.e. by a program other than siiplan, following
the layout documented in io/correlation_h5.hpp:
  corr_h5py.h5            a complete, valid correlation file (1 run, 40 frames x 32 bins, a noiseless
                          bunching peak of area 0.25 ps at delay 0, zero-baseline correlation 0.25 ps,
                          so every chunk reduces to |V|^2 = 1 exactly up to float32 rounding)
  corr_missing_target.h5  the same without the run's 'target' attribute (a pair missing its metadata)
  corr_truncated.h5       the valid file cut to half its length (an interrupted copy)
  foreign.h5              an HDF5 file of another program (no 'format' attribute)
  not_hdf5.h5             a text file with an .h5 name
The peak shape is the bin-averaged unit-area Gaussian of io/astro correlation.hpp, computed with
scipy.special.ndtr (Phi).
"""
import os
import sys

import h5py
import numpy as np
from scipy.special import ndtr

out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(os.path.dirname(__file__), "..", "tests", "data")


def write_valid(path, with_target=True):
    fwhm = 500e-12
    step = fwhm / 4
    nb, nf = 32, 40
    delay = (np.arange(nb) - nb // 2) * step
    sigma = fwhm / (2 * np.sqrt(2 * np.log(2)))
    h = (ndtr((delay + step / 2) / sigma) - ndtr((delay - step / 2) / sigma)) / step
    area = 0.25e-12
    with h5py.File(path, "w") as f:
        f.attrs["format"] = "siiplan-correlation"
        f.attrs["format_version"] = np.int32(1)
        f.attrs["creator"] = "make_correlation_fixtures.py (h5py %s)" % h5py.__version__
        s = f.create_group("site")
        s.attrs["name"] = "fixture site"
        s.attrs["lat_rad"] = np.radians(35.0)
        s.attrs["lon_east_rad"] = np.radians(-110.0)
        s.attrs["height_m"] = 2000.0
        s.attrs["dut1_s"] = 0.0
        runs = f.create_group("runs")
        runs.attrs["count"] = np.int32(1)
        g = runs.create_group("run_0000")
        g.attrs["telescope_1"] = "A"
        g.attrs["telescope_2"] = "B"
        g.attrs["telescope_1_enu_m"] = np.array([0.0, 0.0, 0.0])
        g.attrs["telescope_2_enu_m"] = np.array([30.0, 10.0, 0.0])
        g.attrs["telescope_1_diameter_m"] = 4.0
        g.attrs["telescope_2_diameter_m"] = 4.0
        if with_target:
            g.attrs["target"] = "fixture star"
        g.attrs["target_ra_rad"] = 0.0
        g.attrs["target_dec_rad"] = np.radians(20.0)
        g.attrs["lambda_m"] = 420e-9
        g.attrs["bandwidth_m"] = 1e-9
        g.attrs["filter_profile"] = "top-hat"
        g.attrs["timing_fwhm_s"] = fwhm
        g.attrs["detection_mode"] = "photon-counting"
        g.attrs["delay_tracked_online"] = np.int32(1)
        g.attrs["frame_s"] = 10.0
        g.attrs["background_1_hz"] = 0.0
        g.attrs["background_2_hz"] = 0.0
        g.attrs["zero_baseline_s"] = area
        g.attrs["zero_baseline_err_s"] = 0.0
        g.create_dataset("frame_start_mjd", data=61000.3 + np.arange(nf) * 10.0 / 86400.0)
        g.create_dataset("delay_s", data=delay)
        corr = np.tile(area * h, (nf, 1))
        # a tiny alternating off-peak pattern so that the off-peak scatter is not zero
        corr += 1e-6 * ((-1.0) ** np.arange(nb))[None, :] * (h < 1e-6 * h.max())[None, :]
        g.create_dataset("correlation", data=corr.astype(np.float32))
        g.create_dataset("rate_hz", data=np.full((nf, 2), 1e7))


write_valid(os.path.join(out, "corr_h5py.h5"))
write_valid(os.path.join(out, "corr_missing_target.h5"), with_target=False)
with open(os.path.join(out, "corr_h5py.h5"), "rb") as f:
    data = f.read()
with open(os.path.join(out, "corr_truncated.h5"), "wb") as f:
    f.write(data[: len(data) // 2])
with h5py.File(os.path.join(out, "foreign.h5"), "w") as f:
    f.create_dataset("images", data=np.zeros((4, 4)))
    f.attrs["instrument"] = "some camera"
with open(os.path.join(out, "not_hdf5.h5"), "w") as f:
    f.write("this is not an HDF5 file\n")
print("wrote fixtures to", out, "with h5py", h5py.__version__, "numpy", np.__version__)
