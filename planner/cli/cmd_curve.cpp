// siiplan curve: squared visibility |V|^2 against projected baseline for one star model.
#include <algorithm>
#include <cmath>
#include <ostream>

#include "astro/aperture_average.hpp"
#include "astro/band_average.hpp"
#include "astro/coherence.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/svg_plot.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/model_options.hpp"
#include "planner/cli/values.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

constexpr const char* kWavelengthHint = "give the filter's central wavelength, e.g. --wavelength-nm 420";

FilterProfile filter_profile(const po::variables_map& vm) {
  const std::string text = vm["filter-profile"].as<std::string>();
  if (text == "tophat") return FilterProfile::TopHat;
  if (text == "gaussian") return FilterProfile::Gaussian;
  throw InputError("--filter-profile", "unknown profile '" + text + "'", "choose tophat or gaussian");
}

struct Row {
  double baseline_m;
  std::string note;
};

int run_curve(const po::variables_map& vm) {
  const Model model = model_from_options(vm);
  Filter filter;
  filter.lambda_m = positive_option(vm, "wavelength-nm", kWavelengthHint) * kNmToM;
  filter.bandwidth_m = number_or(vm, "bandwidth-nm", 0.0) * kNmToM;
  if (filter.bandwidth_m < 0)
    throw InputError("--bandwidth-nm", "must not be negative, got " + vm["bandwidth-nm"].as<std::string>(),
                     "give the filter's full width in nm, or 0 for a monochromatic curve");
  if (filter.bandwidth_m >= filter.lambda_m)
    throw InputError("--bandwidth-nm", "is not smaller than the wavelength", "give a filter width well below --wavelength-nm");
  filter.profile = filter_profile(vm);
  const double pa_rad = number_or(vm, "baseline-pa-deg", 0.0) * kDegToRad;
  const double mirror_m = given(vm, "mirror-diameter-m") ? positive_option(vm, "mirror-diameter-m", "") : 0.0;
  const io::Format format = output_format(vm);

  // Characteristic baselines of the monochromatic model at the central wavelength.
  const double null_m = first_null_baseline_m(model, filter.lambda_m, pa_rad);
  const double half_m = half_power_baseline_m(model, filter.lambda_m, pa_rad);

  std::vector<double> baselines;
  if (vm.count("baselines-m")) {
    baselines = parse_number_list(vm["baselines-m"].as<std::string>(), "baselines-m", 1'000'000);
    for (double b : baselines)
      if (b < 0)
        throw InputError("--baselines-m", "baseline " + io::format_number(b, 6) + " m is negative",
                         "give baseline lengths >= 0; the direction is set by --baseline-pa-deg");
  } else {
    // Default: 0 to twice the first null (or to |V|^2 = 0.01 when there is none), 200 steps.
    double stop = std::isfinite(null_m) ? 2 * null_m : baseline_at_vis2_m(model, filter.lambda_m, 0.01, pa_rad);
    if (!std::isfinite(stop)) stop = 4 * half_m;
    for (int i = 0; i <= 200; ++i) baselines.push_back(stop * i / 200.0);
  }
  if (mirror_m > 0 && baselines.size() > 20'000)
    throw InputError("--baselines-m", "more than 20000 baselines with --mirror-diameter-m",
                     "aperture averaging is a quadrature per baseline: give a coarser step");
  std::vector<Row> rows;
  for (double b : baselines) rows.push_back({b, ""});
  const double lo = *std::min_element(baselines.begin(), baselines.end());
  const double hi = *std::max_element(baselines.begin(), baselines.end());
  // The table marks the first null and the half-power point with rows of their own.
  if (std::isfinite(half_m) && half_m >= lo && half_m <= hi) rows.push_back({half_m, "half power"});
  if (std::isfinite(null_m) && null_m >= lo && null_m <= hi) rows.push_back({null_m, "first null"});
  std::stable_sort(rows.begin(), rows.end(), [](const Row& a, const Row& b) { return a.baseline_m < b.baseline_m; });

  const bool band = filter.bandwidth_m > 0;
  const double su = std::sin(pa_rad), sv = std::cos(pa_rad);
  io::Table table;
  table.add_column("baseline_m", 8);
  table.add_column("vis2", 8);
  if (band) table.add_column("vis2_monochromatic", 8);
  if (mirror_m > 0) table.add_column("vis2_mirrors", 8);
  table.add_column("note");
  io::PlotSeries curve{band ? "band-averaged" : "", {}, {}, {}, io::PlotSeries::Style::Line, "#1f5fa8", false};
  io::PlotSeries mono{"monochromatic", {}, {}, {}, io::PlotSeries::Style::Line, "#777777", true};
  io::PlotSeries mirrors{"two " + io::format_number(mirror_m, 4) + " m mirrors (monochromatic)", {}, {}, {},
                         io::PlotSeries::Style::Line, "#c2410c", false};
  for (const auto& r : rows) {
    const double u_m = r.baseline_m * su, v_m = r.baseline_m * sv;
    const double v2 = band_averaged_vis2(model, u_m, v_m, filter);
    std::vector<io::Table::Cell> cells{r.baseline_m, v2};
    if (band) {
      const double m = model.vis2(u_m / filter.lambda_m, v_m / filter.lambda_m);
      cells.push_back(m);
      mono.x.push_back(r.baseline_m);
      mono.y.push_back(m);
    }
    if (mirror_m > 0) {
      const double a = aperture_averaged_vis2(model, u_m, v_m, filter.lambda_m, mirror_m, mirror_m);
      cells.push_back(a);
      mirrors.x.push_back(r.baseline_m);
      mirrors.y.push_back(a);
    }
    cells.push_back(r.note);
    table.add_row(std::move(cells));
    curve.x.push_back(r.baseline_m);
    curve.y.push_back(v2);
  }

  const std::string title = describe_model(model) + " at " + io::format_number(filter.lambda_m / kNmToM, 8) + " nm" +
                            (band ? " (" + io::format_number(filter.bandwidth_m / kNmToM, 6) + " nm band)" : "") +
                            (model.is_radially_symmetric() ? "" : ", baseline PA " + io::format_number(pa_rad * kRadToDeg, 6) + " deg");
  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (format == io::Format::Csv) {
      table.write(out, io::Format::Csv);
      return;
    }
    out << "Model: " << title << "\n";
    out << "First null: " << (std::isfinite(null_m) ? io::format_number(null_m, 10) + " m" : std::string("none"))
        << ";  |V|^2 = 0.5 at: " << (std::isfinite(half_m) ? io::format_number(half_m, 10) + " m" : std::string("not reached"))
        << "  (monochromatic, at the central wavelength)\n";
    if (mirror_m > 0) {
      const ApertureEffect e = aperture_effect(model, filter.lambda_m, mirror_m, mirror_m);
      out << "Mirrors of " << io::format_number(mirror_m, 6) << " m: zero-baseline |V|^2 " << io::format_number(e.vis2_zero_baseline, 6)
          << (e.matters ? "; single mirrors partly resolve the star (use vis2_mirrors)\n"
                        : "; aperture averaging stays below 1 %\n");
    }
    out << "\n";
    table.write(out, io::Format::Table);
  });

  if (auto plot = plot_path(vm)) {
    io::Plot p;
    p.title = title;
    p.x_label = "projected baseline (m)";
    p.y_label = "|V|^2";
    p.y_min = 0;
    p.y_max = 1;
    p.series.push_back(std::move(curve));
    if (band) p.series.push_back(std::move(mono));
    if (mirror_m > 0) p.series.push_back(std::move(mirrors));
    if (std::isfinite(half_m) && half_m >= lo && half_m <= hi)
      p.markers.push_back({half_m, "half power " + io::format_number(half_m, 4) + " m", true, "#2b8a3e"});
    if (std::isfinite(null_m) && null_m >= lo && null_m <= hi)
      p.markers.push_back({null_m, "first null " + io::format_number(null_m, 4) + " m", true, "#b03030"});
    p.markers.push_back({0.5, "0.5", false});
    const std::string svg = p.render();
    io::write_text_atomically(*plot, [&](std::ostream& out) { out << svg; });
  }
  return 0;
}

const Register reg{Command{
    "curve",
    "squared visibility |V|^2 of a star model against projected baseline, with its first null and half-power point",
    "siiplan curve --model MODEL --diameter-mas D [model parameters] --wavelength-nm L [--baselines-m A:B:STEP] [options]",
    "Computes |V|^2, the squared visibility that an intensity interferometer measures as c(B)/c(0), for one star\n"
    "model at each projected baseline. Models: ud (uniform disk), ld-linear (--limb-u), ld-quadratic\n"
    "(--limb-a, --limb-b), ld-power (--limb-alpha), gaussian (--diameter-mas = FWHM), ring (thin ring),\n"
    "ellipse (--diameter-mas = major axis, --axis-ratio, --major-pa-deg: PA of the MAJOR axis, North through\n"
    "East; for an oblate star that is the rotation-axis PA + 90 deg) and binary (primary UD --diameter-mas,\n"
    "--companion-diameter-mas, --flux-ratio F2/F1, --separation-mas, --companion-pa-deg: PA of the companion\n"
    "from the primary, North through East). For ellipse and binary the baseline direction matters: give\n"
    "--baseline-pa-deg (North through East, default 0 = North).\n"
    "With --bandwidth-nm, |V|^2 is averaged over the filter (top-hat or Gaussian transmission T, FWHM =\n"
    "bandwidth) with weight T^2, as the correlation is a second-order quantity; the monochromatic value at\n"
    "the central wavelength is shown beside it. The first null and the |V|^2 = 0.5 baseline (of the\n"
    "monochromatic model, along --baseline-pa-deg) get rows of their own, marked in the 'note' column, and\n"
    "vertical markers in the --plot chart. Default baselines: 0 to twice the first null in 200 steps.\n"
    "With --mirror-diameter-m D, the column vis2_mirrors gives the monochromatic |V|^2 averaged over two\n"
    "filled circular mirrors of diameter D (every pair of points, one on each mirror; models.md §1.9), and\n"
    "the header says whether single mirrors partly resolve the star (zero-baseline loss above 1 %).\n\n"
    "Example (a 1 mas uniform disk at 420 nm; mpmath gives the first null at 105.661488999 m and half power\n"
    "at 44.5715007872 m):\n"
    "  siiplan curve --model ud --diameter-mas 1 --wavelength-nm 420 --baselines-m 0:120:20\n"
    "  First null: 105.661489 m;  |V|^2 = 0.5 at: 44.57150079 m  (monochromatic, at the central wavelength)\n"
    "  baseline_m           vis2  note\n"
    "          40      0.5761707\n"
    "   44.571501            0.5  half power\n"
    "         100   0.0021684476\n"
    "   105.66149  1.5691938e-32  first null\n"
    "         120   0.0074786431\n"
    "CSV columns: baseline_m, vis2, [vis2_monochromatic,] [vis2_mirrors,] note.",
    {},
    [](po::options_description& desc) {
      add_model_options(desc);
      desc.add_options()
          ("wavelength-nm", po::value<std::string>(), "central wavelength of the filter in nm (required)")
          ("bandwidth-nm", po::value<std::string>(), "filter full width in nm (FWHM for gaussian); default 0 = monochromatic")
          ("filter-profile", po::value<std::string>()->default_value("tophat"), "filter transmission: tophat or gaussian")
          ("baselines-m", po::value<std::string>(), "projected baselines in m: START:STOP:STEP or a comma list")
          ("baseline-pa-deg", po::value<std::string>(), "baseline position angle in degrees, North through East (ellipse, binary); default 0")
          ("mirror-diameter-m", po::value<std::string>(), "also |V|^2 averaged over two mirrors of this diameter (aperture averaging)");
      add_output_options(desc, true);
    },
    run_curve}};

}  // namespace
}  // namespace siiplan::cli
