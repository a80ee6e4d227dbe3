// Reduction of correlation functions to calibrated squared visibilities.
//
// Steps, per run (astro/correlation.hpp conventions):
//   1. Rate drops: a frame is rejected when a telescope's rate falls below rate_drop_fraction of that
//      telescope's median over the run, or to its recorded background (telescope lost, cloud).
//   2. Dilution: each frame's correlation is multiplied by N1 N2/((N1-b1)(N2-b2)) (b = recorded
//      background rate), which undoes the (1-a)^2 loss of the correlation to uncorrelated light
//      (sensitivity.md §1.3), and weighted by w = T (N1-b1)^2 (N2-b2)^2/(N1 N2), the inverse of its
//      variance up to a constant (correlation_bin_variance).
//   3. Delay alignment: unless the delay was tracked online, each frame is shifted by the whole-bin part
//      of its predicted geometric delay w/c (geometry module, frame mid-time); the sub-bin remainder
//      goes into the fitted response (ResponseMixture). A residual fixed offset per run is searched by
//      scanning the matched-filter SNR over +-offset_search_s in the stack of all frames, and applied
//      when it is significant (SNR >= offset_snr, SNR above that at the predicted position by >= 4,
//      |offset| > 5 sigma of its position, and no excess of SNR >= 3 at the predicted delay over what
//      the offset structure itself puts there; otherwise the far structure is treated as spurious, step 4).
//      Offsets belong to telescopes: the runs where the star was found fix one offset per telescope
//      (least squares), which then realigns every run of those telescopes, faint ones included.
//   4. Spurious structures: a second significant peak (SNR >= spurious_snr) at a fixed instrumental
//      delay more than 3 FWHM from the star's delays is reported and its bins masked in every frame.
//      Per chunk, a chi^2 of the peak-region residuals far above its expectation flags the chunk.
//   5. Chunks: frames are averaged over chunk_s (default: the time in which |V|^2 of the expected
//      diameter changes by vis2_step, or the projected baseline by 1 % without one; at most
//      max_chunk_s). Each chunk's (u,v) and time are the means over its frames with the same weights.
//   6. Amplitude: one-parameter fit with the known shape, error from the off-peak scatter (fit_amplitude).
//   7. Calibration: |V|^2 = area / A0 with A0 the zero-baseline correlation: recorded in the file,
//      supplied, or measured on a calibrator star of known model. Its error is common to every point
//      calibrated with it: reported separately as a correlated error (vis2_cal_err = |V|^2 err(A0)/A0).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "astro/correlation.hpp"
#include "astro/models.hpp"

namespace siiplan::astro {

struct ReduceOptions {
  double chunk_s = NAN;              // NaN: automatic (see above)
  double max_chunk_s = 1800;
  double vis2_step = 0.01;           // automatic chunks: largest |V|^2 change within a chunk
  double rate_drop_fraction = 0.5;   // frame rejected below this fraction of the median rate
  double min_good_fraction = 0.5;    // chunk flagged when fewer of its frames survive
  double offset_search_s = NAN;      // NaN: +-10 timing FWHM (within the delay window)
  double offset_snr = 5;             // a residual offset is applied only with at least this SNR
  double spurious_snr = 6;           // a second structure is reported from this SNR on
};

struct ZeroBaselineSpec {
  // Nominal: tau_c/2 of each run's filter (models.md §1.9 with c0 = 1), no calibration at all: the
  // |V|^2 then carry the unknown zero-baseline factor c0, to be fitted (instrument zero_baseline = free).
  enum class Source { File, Supplied, Calibrator, Nominal } source = Source::File;
  double value_s = NAN, err_s = NAN;            // Supplied
  std::string calibrator;                       // Calibrator: target name in the file
  Model calibrator_model{ModelKind::UniformDisk, {1e-12}};
};

struct Vis2Point {
  std::size_t run = 0;
  double mjd = NAN;                  // weighted mean frame mid-time (UTC)
  double int_time_s = 0;             // frames used x frame length
  double u_m = 0, v_m = 0;           // weighted mean projected baseline
  double area_s = NAN, area_err_s = NAN;   // fitted peak area
  double vis2 = NAN, vis2_err = NAN; // calibrated |V|^2 and its statistical error
  double vis2_cal_err = NAN;         // correlated error from the zero-baseline correlation
  int frames_used = 0, frames_total = 0;
  std::string flag;                  // empty: good; otherwise the reasons, "; "-separated
};

struct RunSummary {
  std::string pair, target;
  double chunk_s = 0;
  long frames = 0, frames_rate_drop = 0;
  double offset_s = 0, offset_snr = 0;     // best residual offset found and its SNR
  double snr_at_prediction = 0;            // SNR of the stack at the predicted delay
  bool offset_applied = false;
  bool offset_from_night = false;          // applied from the night's per-telescope offsets
  double spurious_delay_s = NAN, spurious_snr = 0;   // instrumental delay of a second structure
  int chunks = 0, chunks_flagged = 0, chunks_empty = 0;
  double zero_baseline_s = NAN, zero_baseline_err_s = NAN;
};

struct Reduction {
  std::vector<Vis2Point> points;
  std::vector<RunSummary> runs;
  std::string zero_baseline_source;   // "file", "supplied", "calibrator NAME", "nominal ..."
};

// Reduces every run. Throws InputError when no zero-baseline correlation is available (the file has
// none and none is supplied), when the calibrator is not in the file or has no usable chunk, or when
// a run's delay axis cannot hold the timing response.
Reduction reduce_correlations(const CorrelationSet& data, const ReduceOptions& options, const ZeroBaselineSpec& zero,
                              bool* dubious = nullptr);

}  // namespace siiplan::astro
