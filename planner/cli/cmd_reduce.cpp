// siiplan reduce: correlation data (CORR.h5) -> calibrated |V|^2 (OIFITS v2 and/or CSV), with a summary.
#include <cstdio>
#include <iostream>

#include "astro/errors.hpp"
#include "astro/reduction.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/correlation_h5.hpp"
#include "io/oifits.hpp"
#include "io/vis2_csv.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/observing_options.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

// The reduction as the shared squared-visibility structure: one target per name, one station per
// telescope, one single-channel instrument per filter, one record per chunk (FLAG set when flagged).
io::Vis2Data to_vis2_data(const CorrelationSet& set, const Reduction& red) {
  io::Vis2Data d;
  d.header.object = "";
  auto target_id = [&](const RunMetadata& m) {
    for (const auto& t : d.targets)
      if (t.name == m.target_name) return t.id;
    d.targets.push_back(io::OiTarget{int(d.targets.size()) + 1, m.target_name, m.target_position, ""});
    return d.targets.back().id;
  };
  auto station = [&](const Telescope& t) {
    for (const auto& s : d.array.stations)
      if (s.tel_name == t.name) return s.index;
    io::OiStation s;
    s.index = int(d.array.stations.size()) + 1;
    s.tel_name = s.sta_name = t.name;
    s.diameter_m = t.diameter_m;
    const Geocentric g = geocentric_offset_from_enu(set.site, Enu{t.east_m, t.north_m, t.up_m});
    s.xyz_m = {g.x_m, g.y_m, g.z_m};
    d.array.stations.push_back(s);
    return s.index;
  };
  auto instrument = [&](const RunMetadata& m) {
    for (std::size_t i = 0; i < d.instruments.size(); ++i)
      if (d.instruments[i].channels[0].eff_wave_m == m.lambda_m && d.instruments[i].channels[0].eff_band_m == m.bandwidth_m)
        return int(i);
    char name[64];
    std::snprintf(name, sizeof name, "SII_%.1fNM", m.lambda_m * 1e9);
    d.instruments.push_back(io::OiInstrument{name, {io::OiChannel{m.lambda_m, m.bandwidth_m}}});
    return int(d.instruments.size()) - 1;
  };
  // OI_ARRAY in the standard's GEOCENTRIC frame: the site's ECEF position, stations as ECEF offsets.
  const Geocentric centre = site_geocentric(set.site);
  d.array.frame = "GEOCENTRIC";
  d.array.center_xyz_m = {centre.x_m, centre.y_m, centre.z_m};
  for (const auto& p : red.points) {
    const RunMetadata& m = set.runs[p.run].meta;
    io::Vis2Record r;
    r.target_id = target_id(m);
    r.instrument = instrument(m);
    r.mjd = p.mjd;
    r.int_time_s = p.int_time_s;
    r.u_m = p.u_m;
    r.v_m = p.v_m;
    r.stations = std::array<int, 2>{station(m.telescope_1), station(m.telescope_2)};
    bool bad = !p.flag.empty() || !std::isfinite(p.vis2) || !(p.vis2_err > 0);
    r.vis2 = {std::isfinite(p.vis2) ? p.vis2 : 0.0};
    r.vis2_err = {p.vis2_err > 0 ? p.vis2_err : 1.0};
    r.flag = {bad};
    d.records.push_back(r);
  }
  return d;
}

void print_summary(std::ostream& out, const std::string& file, const CorrelationSet& set, const Reduction& red) {
  out << "reduced " << file << " (" << set.creator << "): " << red.runs.size() << " runs, zero-baseline correlation from "
      << red.zero_baseline_source << "\n";
  char buf[512];
  for (const auto& r : red.runs) {
    std::snprintf(buf, sizeof buf,
                  "  %-8s %-12s chunks %3d of %5.0f s, flagged %d, empty %d; frames %ld, rejected for rate drops %ld; "
                  "SNR %.1f at the predicted delay, best offset %+.3f ns (SNR %.1f, %s)",
                  r.pair.c_str(), r.target.c_str(), r.chunks, r.chunk_s, r.chunks_flagged, r.chunks_empty, r.frames,
                  r.frames_rate_drop, r.snr_at_prediction, r.offset_s * 1e9, r.offset_snr,
                  r.offset_from_night ? "applied from the night's telescope offsets" : r.offset_applied ? "applied" : "not applied");
    out << buf;
    if (std::isfinite(r.spurious_delay_s)) {
      std::snprintf(buf, sizeof buf, "; spurious structure at %+.3f ns (SNR %.1f) masked", r.spurious_delay_s * 1e9, r.spurious_snr);
      out << buf;
    }
    std::snprintf(buf, sizeof buf, "; A0 = %.4g +- %.2g ps\n", r.zero_baseline_s * 1e12, r.zero_baseline_err_s * 1e12);
    out << buf;
  }
  std::size_t flagged = 0;
  for (const auto& p : red.points)
    if (!p.flag.empty()) {
      if (flagged++ < 20) {
        const auto& m = set.runs[p.run].meta;
        std::snprintf(buf, sizeof buf, "  flagged: %s-%s %s MJD %.5f: %s\n", m.telescope_1.name.c_str(),
                      m.telescope_2.name.c_str(), m.target_name.c_str(), p.mjd, p.flag.c_str());
        out << buf;
      }
    }
  if (flagged > 20) out << "  ... and " << flagged - 20 << " more flagged chunks\n";
  out << "  " << red.points.size() - flagged << " good |V|^2 points, " << flagged << " flagged\n";
}

int run_reduce(const po::variables_map& vm) {
  const std::string input = text_option(vm, "correlations", "give the correlation file, e.g. siiplan reduce corr.h5 -o vis2.oifits");
  const bool want_oifits = given(vm, "output"), want_csv = given(vm, "csv");
  if (!want_oifits && !want_csv) throw InputError("-o", "no output requested", "give -o VIS2.oifits and/or --csv FILE");
  ReduceOptions ro;
  if (given(vm, "chunk-s")) ro.chunk_s = positive_option(vm, "chunk-s", "");
  ro.max_chunk_s = positive_or(vm, "max-chunk-s", ro.max_chunk_s);
  ro.vis2_step = positive_or(vm, "vis2-step", ro.vis2_step);
  ro.rate_drop_fraction = number_or(vm, "rate-drop", ro.rate_drop_fraction);
  if (!(ro.rate_drop_fraction >= 0 && ro.rate_drop_fraction < 1))
    throw InputError("--rate-drop", "must be in [0, 1)", "e.g. --rate-drop 0.5");
  if (given(vm, "offset-search-ns")) ro.offset_search_s = positive_option(vm, "offset-search-ns", "") * 1e-9;
  ZeroBaselineSpec zero;
  if (int(given(vm, "zero-baseline-ps")) + int(given(vm, "calibrator")) + int(vm.count("zero-baseline-nominal") > 0) > 1)
    throw InputError("--calibrator", "give only one of --zero-baseline-ps, --calibrator and --zero-baseline-nominal",
                     "one source of the zero-baseline correlation");
  if (vm.count("zero-baseline-nominal")) {
    zero.source = ZeroBaselineSpec::Source::Nominal;
  } else if (given(vm, "zero-baseline-ps")) {
    zero.source = ZeroBaselineSpec::Source::Supplied;
    zero.value_s = positive_option(vm, "zero-baseline-ps", "") * 1e-12;
    zero.err_s = number_or(vm, "zero-baseline-err-ps", 0.0) * 1e-12;
    if (!(zero.err_s >= 0)) throw InputError("--zero-baseline-err-ps", "must be >= 0", "");
  } else if (given(vm, "calibrator")) {
    zero.source = ZeroBaselineSpec::Source::Calibrator;
    zero.calibrator = text_option(vm, "calibrator", "");
    double d = positive_or(vm, "calibrator-diameter-mas", 1e-6);
    zero.calibrator_model = Model(ModelKind::UniformDisk, {d * kMasToRad});
  }
  // Validate output names before the work.
  if (want_csv) io::is_csv_path(text_option(vm, "csv", ""), "csv");

  const CorrelationSet set = io::read_correlation_h5(input);
  bool dubious = false;
  const Reduction red = reduce_correlations(set, ro, zero, &dubious);
  warn_dubious_year(dubious);
  if (red.points.empty()) throw InputError(input, "no chunk could be reduced", "check the summary: every frame was rejected");
  const io::Vis2Data data = to_vis2_data(set, red);
  if (want_oifits) io::write_oifits(text_option(vm, "output", ""), data);
  if (want_csv) io::write_text_output(text_option(vm, "csv", ""), [&](std::ostream& out) { io::write_vis2_csv(out, data); });
  print_summary(std::cout, input, set, red);
  return 0;
}

void describe_reduce(po::options_description& desc) {
  desc.add_options()
      ("correlations", po::value<std::string>(), "correlation file (CORR.h5)")
      ("output,o", po::value<std::string>(), "OIFITS v2 file to write")
      ("csv", po::value<std::string>(), "measurement CSV to write (time-weighted u_m, v_m, vis2, vis2_err, flag, ...)")
      ("chunk-s", po::value<std::string>(), "chunk length in s (default: |V|^2 of the expected diameter moves by --vis2-step)")
      ("max-chunk-s", po::value<std::string>(), "longest automatic chunk in s (default 1800)")
      ("vis2-step", po::value<std::string>(), "automatic chunks: largest |V|^2 change within one (default 0.01)")
      ("rate-drop", po::value<std::string>(), "reject frames whose rate falls below this fraction of the median (default 0.5)")
      ("offset-search-ns", po::value<std::string>(), "search a residual delay offset within +- this (default 10 timing FWHM)")
      ("zero-baseline-ps", po::value<std::string>(), "zero-baseline correlation (peak area at |V|^2 = 1) in ps, instead of the file's")
      ("zero-baseline-err-ps", po::value<std::string>(), "its 1-sigma error in ps (a correlated error)")
      ("calibrator", po::value<std::string>(), "measure the zero-baseline correlation on this target of the file")
      ("zero-baseline-nominal", "no calibration: divide by the filter's tau_c/2, so |V|^2 carry the unknown factor c0 "
                                "(then 'siiplan fit --free-norm')")
      ("calibrator-diameter-mas", po::value<std::string>(), "the calibrator's uniform-disk diameter (default: unresolved)");
}

const Register reg{Command{
    "reduce",
    "reduce correlation data (HDF5) to calibrated |V|^2 (OIFITS v2, CSV) with flags and a summary",
    "siiplan reduce CORR.h5 -o VIS2.oifits [--csv VIS2.csv] [options]",
    "Steps per telescope pair and target: reject frames with rate drops; correct each frame for the\n"
    "dilution by the recorded background; align frames on the predicted geometric delay (unless tracked\n"
    "online) and search a residual fixed delay offset; find and mask a spurious structure at a fixed\n"
    "delay; average frames into chunks short enough that |V|^2 moves little; fit the peak area with the\n"
    "known Gaussian response (one-parameter least squares, error from the off-peak scatter); divide by\n"
    "the zero-baseline correlation (from the file, --zero-baseline-ps, or --calibrator). Its error is\n"
    "common to all points: it is reported in the summary, not added to VIS2ERR (fit with a c0 prior).\n"
    "Without any calibration (instrument zero_baseline = free) --zero-baseline-nominal divides by the\n"
    "filter's tau_c/2 and the fit takes the normalisation c0 as a free parameter (--free-norm).\n"
    "Flagged chunks are written with FLAG = T and listed with the reason.\n\n"
    "Example:\n"
    "  siiplan reduce corr.h5 -o vis2.oifits --csv vis2.csv",
    {"correlations"},
    describe_reduce,
    run_reduce}};

}  // namespace
}  // namespace siiplan::cli
