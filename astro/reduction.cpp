// Reduction of correlation functions to calibrated squared visibilities (astro/reduction.hpp).
#include "astro/reduction.hpp"

#include <algorithm>
#include <memory>

#include <Eigen/Dense>

#include "astro/correlation.hpp"
#include "astro/errors.hpp"
#include "astro/sensitivity.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kFwhmPerSigma = 2.3548200450309493;   // 2 sqrt(2 ln 2)

double median(std::vector<double> v) {
  if (v.empty()) return NAN;
  auto mid = v.begin() + std::ptrdiff_t(v.size() / 2);
  std::nth_element(v.begin(), mid, v.end());
  return *mid;
}

// Matched-filter SNR of a response h in c for a FIXED noise scale s (variance of c_k = s^2/W_k), so that
// scans over positions compare like with like: sum W c h / (s sqrt(sum W h^2)).
double matched_snr(const std::vector<double>& c, const std::vector<double>& w, const std::vector<double>& h, double s) {
  double num = 0, den = 0;
  for (std::size_t k = 0; k < c.size(); ++k) {
    num += w[k] * c[k] * h[k];
    den += w[k] * h[k] * h[k];
  }
  return den > 0 && s > 0 ? num / (s * std::sqrt(den)) : -1e300;
}

void add_flag(std::string& flag, const std::string& reason) {
  if (!flag.empty()) flag += "; ";
  flag += reason;
}

// Per-frame quantities of one run.
struct FrameInfo {
  double mid_mjd = 0;
  Uvw uvw;
  double weight = 0;     // inverse-variance weight (0 = rejected)
  double gain = 1;       // dilution correction
  double peak_s = 0;     // predicted peak position on the raw axis
  long shift = 0;        // whole-bin alignment shift
};

// Frames averaged on the aligned axis.
struct Stack {
  std::vector<double> sum_wc, sum_w;
  ResponseMixture mixture;
  double w = 0, wu = 0, wv = 0, wt = 0;
  int frames = 0;
  Stack(const DelayAxis& aligned, double fwhm_s)
      : sum_wc(std::size_t(aligned.bins), 0.0), sum_w(std::size_t(aligned.bins), 0.0), mixture(aligned, fwhm_s) {}
  std::vector<double> mean() const {
    std::vector<double> c(sum_wc.size(), 0.0);
    for (std::size_t j = 0; j < c.size(); ++j) c[j] = sum_w[j] > 0 ? sum_wc[j] / sum_w[j] : 0.0;
    return c;
  }
};

class RunReducer {
 public:
  RunReducer(const Site& site, const CorrelationRun& run, const ReduceOptions& options, bool* dubious)
      : run_(run), opt_(options), fwhm_(run.meta.timing_fwhm_s), nb_(std::size_t(run.delay.bins)),
        raw_ok_(nb_, 1.0) {
    const auto& m = run.meta;
    summary_.pair = m.telescope_1.name + "-" + m.telescope_2.name;
    summary_.target = m.target_name;
    summary_.frames = long(run.frames());
    if (!(fwhm_ >= run.delay.step_s) || run.delay.bins < 16)
      throw InputError("run " + summary_.pair + " " + m.target_name,
                       "the delay axis (" + std::to_string(run.delay.bins) + " bins) cannot hold the timing response",
                       "the correlation needs at least 16 bins no wider than the timing FWHM");
    std::vector<double> mid(run.frames());
    for (std::size_t f = 0; f < run.frames(); ++f) mid[f] = run.frame_start_mjd[f] + 0.5 * run.frame_s / kSecondsPerDay;
    auto uvw = pair_uvw_at(site, m.telescope_1, m.telescope_2, m.target_position, mid, dubious);
    const double med1 = median(run.rate_1_hz), med2 = median(run.rate_2_hz);
    frames_.resize(run.frames());
    long s_min = 0, s_max = 0;
    for (std::size_t f = 0; f < run.frames(); ++f) {
      FrameInfo& fi = frames_[f];
      fi.mid_mjd = mid[f];
      fi.uvw = uvw[f];
      fi.peak_s = m.delay_tracked_online ? 0.0 : uvw[f].delay_s();
      fi.shift = m.delay_tracked_online ? 0 : std::lround(fi.peak_s / run.delay.step_s);
      s_min = f == 0 ? fi.shift : std::min(s_min, fi.shift);
      s_max = f == 0 ? fi.shift : std::max(s_max, fi.shift);
      const double r1 = run.rate_1_hz[f], r2 = run.rate_2_hz[f];
      const double s1 = r1 - m.background_1_hz, s2 = r2 - m.background_2_hz;
      bool dropped = !(r1 >= opt_.rate_drop_fraction * med1) || !(r2 >= opt_.rate_drop_fraction * med2) || !(s1 > 0) ||
                     !(s2 > 0);
      if (dropped) {
        ++summary_.frames_rate_drop;
        continue;
      }
      fi.gain = r1 * r2 / (s1 * s2);
      fi.weight = run.frame_s * r1 * r2 / (fi.gain * fi.gain);
    }
    // Aligned axis: the raw window less the range of whole-bin shifts.
    if (m.delay_tracked_online) {
      aligned_ = run.delay;
    } else {
      int w = std::max(16, run.delay.bins - int(s_max - s_min));
      aligned_ = DelayAxis{-(w / 2) * run.delay.step_s, run.delay.step_s, w};
    }
    base_ = std::lround((run.delay.start_s - aligned_.start_s) / run.delay.step_s);
    base_rest_s_ = run.delay.start_s - aligned_.start_s - double(base_) * run.delay.step_s;
  }

  // Adds frames [f0, f1) to a stack.
  void accumulate(std::size_t f0, std::size_t f1, Stack& st) const {
    for (std::size_t f = f0; f < f1; ++f) {
      const FrameInfo& fi = frames_[f];
      if (!(fi.weight > 0)) continue;
      const float* row = run_.frame(f);
      const long off = base_ - fi.shift;
      for (std::size_t k = 0; k < nb_; ++k) {
        long j = long(k) + off;
        if (j < 0 || j >= aligned_.bins || raw_ok_[k] == 0) continue;
        st.sum_wc[std::size_t(j)] += fi.weight * fi.gain * double(row[k]);
        st.sum_w[std::size_t(j)] += fi.weight;
      }
      st.mixture.add(fi.peak_s - double(fi.shift) * run_.delay.step_s - base_rest_s_, fi.weight);
      st.w += fi.weight;
      st.wu += fi.weight * fi.uvw.u_m;
      st.wv += fi.weight * fi.uvw.v_m;
      st.wt += fi.weight * (fi.mid_mjd - run_.frame_start_mjd.front());
      ++st.frames;
    }
  }

  // Residual fixed offset: scan the matched-filter SNR of the whole-run stack.
  void search_offset() {
    Stack st(aligned_, fwhm_);
    accumulate(0, frames_.size(), st);
    if (st.frames == 0) return;
    const std::vector<double> c = st.mean();
    double half_window = 0.5 * aligned_.bins * aligned_.step_s - 3.0 * fwhm_;
    double search = std::isnan(opt_.offset_search_s) ? 10.0 * fwhm_ : opt_.offset_search_s;
    search = std::max(0.0, std::min(search, half_window));
    std::vector<double> h(std::size_t(aligned_.bins));
    const double step = aligned_.step_s / 4.0;
    st.mixture.evaluate(0.0, h);
    const double scale = fit_amplitude(c, st.sum_w, h).scatter;   // off-peak noise about the prediction
    if (!(scale > 0)) return;
    auto snr_at = [&](double o) {
      st.mixture.evaluate(o, h);
      return matched_snr(c, st.sum_w, h, scale);
    };
    double best_snr = -1e300, best_o = 0;
    for (double o = -search; o <= search + 1e-3 * step; o += step) {
      double snr = snr_at(o);
      if (snr > best_snr) {
        best_snr = snr;
        best_o = o;
      }
    }
    // Refine between grid points: vertex of the parabola through the best point and its neighbours.
    {
      double sm = snr_at(best_o - step), sp = snr_at(best_o + step), den = sm - 2 * best_snr + sp;
      if (den < 0) {
        double o = best_o + 0.5 * step * (sm - sp) / den;
        double snr = snr_at(o);
        if (snr >= best_snr) best_snr = snr, best_o = o;
      }
    }
    summary_.offset_s = best_o;
    summary_.offset_snr = best_snr;
    const double sigma_pos = fwhm_ / kFwhmPerSigma * std::numbers::sqrt2 / std::max(best_snr, 1e-300);
    // Look-elsewhere guard: the offset must also beat the predicted position clearly (the SNR
    // difference of pure noise over ~100 trial offsets stays below ~3, common practice).
    // If the best structure were the star moved by best_o, the SNR at the prediction would be its SNR
    // times the overlap rho of the responses at 0 and at best_o. A clear excess (>= 3) means a structure
    // of its own sits at the prediction: the far one is then left to the spurious search, not taken
    // as an offset.
    const double snr_zero = snr_at(0.0);
    summary_.snr_at_prediction = snr_zero;
    std::vector<double> h0(h.size());
    st.mixture.evaluate(0.0, h0);
    st.mixture.evaluate(best_o, h);
    double s01 = 0, s00 = 0, s11 = 0;
    for (std::size_t k = 0; k < h.size(); ++k) {
      s01 += st.sum_w[k] * h0[k] * h[k];
      s00 += st.sum_w[k] * h0[k] * h0[k];
      s11 += st.sum_w[k] * h[k] * h[k];
    }
    const double rho = s00 > 0 && s11 > 0 ? s01 / std::sqrt(s00 * s11) : 0.0;
    const bool star_at_prediction = snr_zero - rho * best_snr >= 3.0;
    if (best_snr >= opt_.offset_snr && best_snr - snr_zero >= 4.0 && std::fabs(best_o) > 5.0 * sigma_pos &&
        !star_at_prediction) {
      offset_s_ = best_o;
      summary_.offset_applied = true;
    }
  }

  // A second structure at a fixed instrumental delay, away from the star's delays: reported and masked.
  void search_spurious() {
    // Raw (unshifted) stack, star region masked.
    double star_lo = 1e300, star_hi = -1e300;
    std::vector<double> sum_wc(nb_, 0.0), sum_w(nb_, 0.0);
    for (std::size_t f = 0; f < frames_.size(); ++f) {
      const FrameInfo& fi = frames_[f];
      if (!(fi.weight > 0)) continue;
      star_lo = std::min(star_lo, fi.peak_s + offset_s_);
      star_hi = std::max(star_hi, fi.peak_s + offset_s_);
      const float* row = run_.frame(f);
      for (std::size_t k = 0; k < nb_; ++k) {
        sum_wc[k] += fi.weight * fi.gain * double(row[k]);
        sum_w[k] += fi.weight;
      }
    }
    if (star_lo > star_hi) return;
    const double guard = 3.0 * fwhm_, edge = 2.0 * fwhm_;
    std::vector<double> c(nb_), w(nb_), h(nb_);
    for (std::size_t k = 0; k < nb_; ++k) {
      double t = run_.delay.center_s(int(k));
      bool star = t > star_lo - guard && t < star_hi + guard;
      c[k] = sum_w[k] > 0 ? sum_wc[k] / sum_w[k] : 0.0;
      w[k] = star ? 0.0 : sum_w[k];
    }
    const double lo = run_.delay.center_s(0) + edge, hi = run_.delay.center_s(run_.delay.bins - 1) - edge;
    // Noise scale from every bin outside the star region (a spurious peak there only inflates it).
    double ss = 0;
    int n = 0;
    for (std::size_t k = 0; k < nb_; ++k)
      if (w[k] > 0) ss += w[k] * c[k] * c[k], ++n;
    if (n < 3) return;
    const double scale = std::sqrt(ss / n);
    double best_snr = -1e300, best_q = NAN;
    for (double q = lo; q <= hi; q += run_.delay.step_s / 2.0) {
      if (q > star_lo - guard && q < star_hi + guard) continue;
      binned_response(run_.delay, q, fwhm_, h);
      double snr = matched_snr(c, w, h, scale);
      if (snr > best_snr) {
        best_snr = snr;
        best_q = q;
      }
    }
    if (best_snr >= opt_.spurious_snr) {
      summary_.spurious_delay_s = best_q;
      summary_.spurious_snr = best_snr;
      for (std::size_t k = 0; k < nb_; ++k)
        if (std::fabs(run_.delay.center_s(int(k)) - best_q) < edge) raw_ok_[k] = 0.0;
    }
  }

  double automatic_chunk_s() const {
    const auto& m = run_.meta;
    const std::size_t stride = std::size_t(std::max(1L, std::lround(60.0 / run_.frame_s)));
    double worst_rate = 0;   // per second
    std::optional<Model> ud;
    if (std::isfinite(m.expected_diameter_rad) && m.expected_diameter_rad > 0)
      ud.emplace(ModelKind::UniformDisk, std::vector<double>{m.expected_diameter_rad});
    for (std::size_t f = stride; f < frames_.size(); f += stride) {
      const Uvw &a = frames_[f - stride].uvw, &b = frames_[f].uvw;
      double dt = (frames_[f].mid_mjd - frames_[f - stride].mid_mjd) * kSecondsPerDay;
      double change;
      if (ud) change = std::fabs(ud->vis2(b.u_m / m.lambda_m, b.v_m / m.lambda_m) - ud->vis2(a.u_m / m.lambda_m, a.v_m / m.lambda_m)) / opt_.vis2_step;
      else change = std::fabs(b.projected_m() - a.projected_m()) / std::max(a.projected_m(), 1e-3) / 0.01;
      worst_rate = std::max(worst_rate, change / dt);
    }
    double chunk = worst_rate > 0 ? 1.0 / worst_rate : opt_.max_chunk_s;
    return std::clamp(chunk, run_.frame_s, opt_.max_chunk_s);
  }

  void reduce_chunks(std::size_t run_index, std::vector<Vis2Point>& out) {
    const double chunk_s = std::isnan(opt_.chunk_s) ? automatic_chunk_s() : std::max(opt_.chunk_s, run_.frame_s);
    summary_.chunk_s = chunk_s;
    const double t0 = run_.frame_start_mjd.front();
    std::size_t f0 = 0;
    std::vector<double> h(std::size_t(aligned_.bins));
    while (f0 < frames_.size()) {
      long index = long(std::floor((run_.frame_start_mjd[f0] - t0) * kSecondsPerDay / chunk_s + 1e-6));
      std::size_t f1 = f0;
      while (f1 < frames_.size() &&
             long(std::floor((run_.frame_start_mjd[f1] - t0) * kSecondsPerDay / chunk_s + 1e-6)) == index)
        ++f1;
      ++summary_.chunks;
      Stack st(aligned_, fwhm_);
      accumulate(f0, f1, st);
      if (st.frames == 0) {
        ++summary_.chunks_empty;
        f0 = f1;
        continue;
      }
      Vis2Point p;
      p.run = run_index;
      p.frames_total = int(f1 - f0);
      p.frames_used = st.frames;
      p.int_time_s = st.frames * run_.frame_s;
      p.u_m = st.wu / st.w;
      p.v_m = st.wv / st.w;
      p.mjd = t0 + st.wt / st.w;
      st.mixture.evaluate(offset_s_, h);
      AmplitudeFit fit = fit_amplitude(st.mean(), st.sum_w, h);
      p.area_s = fit.area_s;
      p.area_err_s = fit.area_err_s;
      if (!std::isfinite(fit.area_s) || !(fit.area_err_s > 0)) add_flag(p.flag, "peak fit failed");
      if (p.frames_used < opt_.min_good_fraction * p.frames_total)
        add_flag(p.flag, "rate drop (" + std::to_string(p.frames_total - p.frames_used) + " of " +
                             std::to_string(p.frames_total) + " frames rejected)");
      // Peak residuals against the off-peak scatter: chi2/dof follows F(dof, n_off) without extra
      // structure; flag beyond ~8 standard deviations of that ratio (false alarms < 1e-5 per chunk).
      const double dof = fit.peak_bins - 1;
      if (dof > 0 && fit.peak_chi2 > dof * (1.0 + 8.0 * std::sqrt(2.0 / dof + 2.0 / std::max(fit.offpeak_bins, 1))))
        add_flag(p.flag, "structure in the peak region (chi2 " + std::to_string(int(fit.peak_chi2)) + " for " +
                             std::to_string(int(dof)) + " bins)");
      if (!p.flag.empty()) ++summary_.chunks_flagged;
      out.push_back(p);
      f0 = f1;
    }
  }

  RunSummary& summary() { return summary_; }
  const std::string& telescope_1() const { return run_.meta.telescope_1.name; }
  const std::string& telescope_2() const { return run_.meta.telescope_2.name; }
  double fwhm_s() const { return fwhm_; }
  double applied_offset_s() const { return offset_s_; }
  // Replaces the run's offset by the one implied by the night's per-telescope offsets.
  void set_offset_from_night(double offset_s) {
    offset_s_ = offset_s;
    summary_.offset_from_night = true;
    summary_.offset_applied = true;
    summary_.offset_s = offset_s;
  }

 private:
  const CorrelationRun& run_;
  const ReduceOptions& opt_;
  double fwhm_;
  std::size_t nb_;
  std::vector<double> raw_ok_;
  std::vector<FrameInfo> frames_;
  DelayAxis aligned_;
  long base_ = 0;
  double base_rest_s_ = 0;
  double offset_s_ = 0;
  RunSummary summary_;
};

// Timing offsets belong to telescopes, not pairs: a run's offset is delta_1 - delta_2. Every run where
// the star was found (at an applied offset, or at the prediction with SNR >= offset_snr) gives one
// equation, weighted by its SNR^2; the per-telescope offsets are solved by least squares (a 1e-9 ridge
// fixes the free common offset) and every run whose two telescopes are connected by such equations
// takes delta_1 - delta_2 when that differs from its own value by more than a quarter FWHM. Runs too
// faint to find a shifted star on their own are thereby realigned too.
void apply_telescope_offsets(std::vector<std::unique_ptr<RunReducer>>& reducers) {
  std::vector<std::string> names;
  auto index = [&](const std::string& n) {
    for (std::size_t i = 0; i < names.size(); ++i)
      if (names[i] == n) return int(i);
    names.push_back(n);
    return int(names.size()) - 1;
  };
  struct Equation { int i, j; double offset, weight; };
  std::vector<Equation> eq;
  for (auto& r : reducers) {
    const RunSummary& s = r->summary();
    if (s.offset_applied) eq.push_back({index(r->telescope_1()), index(r->telescope_2()), s.offset_s, s.offset_snr * s.offset_snr});
    else if (s.snr_at_prediction >= 5.0) eq.push_back({index(r->telescope_1()), index(r->telescope_2()), 0.0, s.snr_at_prediction * s.snr_at_prediction});
  }
  bool any_offset = false;
  for (const auto& e : eq) any_offset = any_offset || e.offset != 0.0;
  if (!any_offset) return;
  const int n = int(names.size());
  Eigen::MatrixXd a = Eigen::MatrixXd::Identity(n, n) * 1e-9;
  Eigen::VectorXd b = Eigen::VectorXd::Zero(n);
  std::vector<int> component(static_cast<std::size_t>(n));
  for (int k = 0; k < n; ++k) component[std::size_t(k)] = k;
  auto root = [&](int k) {
    while (component[std::size_t(k)] != k) k = component[std::size_t(k)];
    return k;
  };
  for (const auto& e : eq) {
    a(e.i, e.i) += e.weight;
    a(e.j, e.j) += e.weight;
    a(e.i, e.j) -= e.weight;
    a(e.j, e.i) -= e.weight;
    b(e.i) += e.weight * e.offset;
    b(e.j) -= e.weight * e.offset;
    component[std::size_t(root(e.i))] = root(e.j);
  }
  const Eigen::VectorXd delta = a.ldlt().solve(b);
  for (auto& r : reducers) {
    int i = -1, j = -1;
    for (int k = 0; k < n; ++k) {
      if (names[std::size_t(k)] == r->telescope_1()) i = k;
      if (names[std::size_t(k)] == r->telescope_2()) j = k;
    }
    if (i < 0 || j < 0 || root(i) != root(j)) continue;
    const double predicted = delta(i) - delta(j);
    if (std::fabs(predicted - r->applied_offset_s()) > 0.25 * r->fwhm_s()) r->set_offset_from_night(predicted);
  }
}

}  // namespace

Reduction reduce_correlations(const CorrelationSet& data, const ReduceOptions& options, const ZeroBaselineSpec& zero,
                              bool* dubious) {
  Reduction red;
  std::vector<std::unique_ptr<RunReducer>> reducers;
  std::vector<std::size_t> run_index;
  for (std::size_t r = 0; r < data.runs.size(); ++r) {
    const CorrelationRun& run = data.runs[r];
    if (run.frames() == 0) continue;
    reducers.push_back(std::make_unique<RunReducer>(data.site, run, options, dubious));
    reducers.back()->search_offset();
    run_index.push_back(r);
  }
  apply_telescope_offsets(reducers);
  for (std::size_t i = 0; i < reducers.size(); ++i) {
    reducers[i]->search_spurious();
    reducers[i]->reduce_chunks(run_index[i], red.points);
    red.runs.push_back(reducers[i]->summary());
  }
  // Zero-baseline correlation per run.
  std::vector<double> a0(data.runs.size(), NAN), a0_err(data.runs.size(), NAN);
  switch (zero.source) {
    case ZeroBaselineSpec::Source::File:
      red.zero_baseline_source = "file";
      for (std::size_t r = 0; r < data.runs.size(); ++r) {
        const auto& m = data.runs[r].meta;
        if (!(m.zero_baseline_s > 0))
          throw InputError("run " + m.telescope_1.name + "-" + m.telescope_2.name + " " + m.target_name,
                           "the file records no zero-baseline correlation",
                           "supply one with --zero-baseline-ps, measure it with --calibrator, or use "
                           "--zero-baseline-nominal and fit the normalisation");
        a0[r] = m.zero_baseline_s;
        a0_err[r] = std::isfinite(m.zero_baseline_err_s) ? m.zero_baseline_err_s : 0.0;
      }
      break;
    case ZeroBaselineSpec::Source::Supplied:
      red.zero_baseline_source = "supplied";
      std::fill(a0.begin(), a0.end(), zero.value_s);
      std::fill(a0_err.begin(), a0_err.end(), std::isfinite(zero.err_s) ? zero.err_s : 0.0);
      break;
    case ZeroBaselineSpec::Source::Nominal:
      red.zero_baseline_source = "nominal tau_c/2 of each filter (uncalibrated: fit the normalisation c0)";
      for (std::size_t r = 0; r < data.runs.size(); ++r) {
        const auto& m = data.runs[r].meta;
        Instrument filter;
        filter.lambda_m = m.lambda_m;
        filter.bandwidth_m = m.bandwidth_m;
        filter.profile = m.profile;
        a0[r] = bunching_area_s(1.0, coherence_time_s(filter), 1.0);
        a0_err[r] = 0.0;
        if (!(a0[r] > 0) || !std::isfinite(a0[r]))
          throw InputError("run " + m.telescope_1.name + "-" + m.telescope_2.name + " " + m.target_name,
                           "the recorded filter (bandwidth_m) gives no coherence time", "check the file's bandwidth_m");
      }
      break;
    case ZeroBaselineSpec::Source::Calibrator: {
      red.zero_baseline_source = "calibrator " + zero.calibrator;
      double sw = 0, swy = 0;
      bool present = false;
      for (const auto& p : red.points) {
        const auto& m = data.runs[p.run].meta;
        if (m.target_name != zero.calibrator) continue;
        present = true;
        if (!p.flag.empty()) continue;
        double v2 = zero.calibrator_model.vis2(p.u_m / m.lambda_m, p.v_m / m.lambda_m);
        if (!(v2 > 0.05)) continue;   // a resolved calibrator point carries little on A0
        double y = p.area_s / v2, s = p.area_err_s / v2;
        sw += 1.0 / (s * s);
        swy += y / (s * s);
      }
      if (!present)
        throw InputError("--calibrator", "no run observes '" + zero.calibrator + "'", "name a target present in the file");
      if (!(sw > 0))
        throw InputError("--calibrator", "no usable chunk of '" + zero.calibrator + "'", "check its flags in the summary");
      std::fill(a0.begin(), a0.end(), swy / sw);
      std::fill(a0_err.begin(), a0_err.end(), 1.0 / std::sqrt(sw));
      break;
    }
  }
  for (auto& p : red.points) {
    p.vis2 = p.area_s / a0[p.run];
    p.vis2_err = p.area_err_s / a0[p.run];
    p.vis2_cal_err = std::fabs(p.vis2) * a0_err[p.run] / a0[p.run];
  }
  std::size_t k = 0;
  for (std::size_t r = 0; r < data.runs.size(); ++r) {
    if (data.runs[r].frames() == 0) continue;
    red.runs[k].zero_baseline_s = a0[r];
    red.runs[k].zero_baseline_err_s = a0_err[r];
    ++k;
  }
  return red;
}

}  // namespace siiplan::astro
