// siiplan fit: a star model fitted to measured squared visibilities (CSV or OIFITS), with honest errors.
#include <algorithm>
#include <cmath>
#include <map>
#include <ostream>
#include <sstream>

#include "astro/errors.hpp"
#include "astro/fit.hpp"
#include "astro/limb_conversion.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/csv.hpp"
#include "io/svg_plot.hpp"
#include "io/table.hpp"
#include "io/vis2_csv.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/model_options.hpp"
#include "planner/cli/values.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

// The unflagged values of a data set as fitter input (one per record and channel).
std::vector<Vis2Measurement> measurements(const io::Vis2Data& data) {
  std::vector<Vis2Measurement> out;
  for (const auto& r : data.records) {
    const auto& ch = data.instruments[r.instrument].channels;
    for (std::size_t k = 0; k < ch.size(); ++k)
      if (!r.flag[k]) out.push_back({r.u_m, r.v_m, ch[k].eff_wave_m, r.vis2[k], r.vis2_err[k], r.mjd});
  }
  return out;
}

// "1±0.05", "1+-0.05" or "1+/-0.05".
NormSpec parse_prior(const std::string& text) {
  for (const char* sep : {"±", "+/-", "+-"}) {
    auto at = text.find(sep);
    if (at == std::string::npos) continue;
    auto value = io::parse_number(text.substr(0, at));
    auto error = io::parse_number(text.substr(at + std::string(sep).size()));
    if (value && error && *error > 0) return {NormMode::Prior, *value, *error};
    break;
  }
  throw InputError("--norm-prior", "'" + text + "' is not VALUE±ERROR with ERROR > 0", "write e.g. --norm-prior 1+-0.05");
}

// --fix NAME=VALUE (user units) or a bare NAME (fixed at the value of its model option).
struct FixRequest {
  std::string name;
  std::optional<double> user_value;
};
std::vector<FixRequest> fix_requests(const po::variables_map& vm) {
  std::vector<FixRequest> out;
  if (!vm.count("fix")) return out;
  for (const auto& text : vm["fix"].as<std::vector<std::string>>()) {
    auto eq = text.find('=');
    FixRequest f{text.substr(0, eq), std::nullopt};
    if (eq != std::string::npos) {
      auto v = io::parse_number(text.substr(eq + 1));
      if (!v) throw InputError("--fix", "'" + text + "': the value is not a number", "write NAME=VALUE, e.g. --fix limb_u=0.6");
      f.user_value = v;
    }
    out.push_back(f);
  }
  return out;
}

// Fit options for one model: start values from the model options (only when they belong to `kind`),
// fixed parameters from --fix. Throws for a --fix name that the model does not have when `strict`.
FitOptions fit_options_for(ModelKind kind, const std::vector<std::optional<double>>& given,
                           const std::vector<FixRequest>& fixes, NormSpec norm, int max_iterations) {
  FitOptions o;
  o.kind = kind;
  o.norm = norm;
  o.max_iterations = max_iterations;
  auto specs = model_params(kind);
  o.start = given.empty() ? std::vector<std::optional<double>>(specs.size()) : given;
  o.fixed.assign(specs.size(), false);
  for (const auto& f : fixes)
    for (std::size_t k = 0; k < specs.size(); ++k) {
      if (specs[k].name != f.name) continue;
      if (f.user_value) {
        double v = *f.user_value / specs[k].user_per_internal;
        bool ok = std::isfinite(v) && v <= specs[k].upper && (specs[k].lower_open ? v > specs[k].lower : v >= specs[k].lower);
        if (!ok)
          throw InputError("--fix", f.name + "=" + io::format_number(*f.user_value, 10) + " is out of range",
                           "it must be " + param_range_text(specs[k]));
        o.start[k] = v;
      } else if (!o.start[k]) {
        throw InputError("--fix", f.name + " has no value", "write --fix " + f.name + "=VALUE or give --" + model_option_name(f.name));
      }
      o.fixed[k] = true;
    }
  return o;
}

// Ellipses and binaries depend on the baseline's direction, the other models on its length only.
bool needs_position_angles(ModelKind kind) { return kind == ModelKind::Ellipse || kind == ModelKind::Binary; }

bool model_has(ModelKind kind, const std::string& name) {
  for (const auto& s : model_params(kind))
    if (s.name == name) return true;
  return false;
}

// UD <-> LD conversions of a result (models.md §2): a UD diameter into an LD one for a linear law
// (--convert-limb-u), or an LD diameter into its UD equivalent. Both criteria of astro/limb_conversion.
struct Conversion {
  std::string name;  // e.g. "diameter_ld_mas (short-baseline, HB74)"
  std::string key;   // CSV parameter name
  double value_mas, error_mas;
};
std::vector<Conversion> conversions(const FitResult& r, std::optional<double> limb_u) {
  std::vector<Conversion> out;
  if (!r.usable()) return out;
  const auto& d = r.params[0];
  double err = std::isfinite(d.error) ? d.error : 0;
  const std::pair<LimbCriterion, const char*> criteria[] = {
      {LimbCriterion::ShortBaseline, "short_baseline"}, {LimbCriterion::FirstLobeLeastSquares, "first_lobe"}};
  if (r.kind == ModelKind::UniformDisk && limb_u) {
    Model law(ModelKind::LinearLD, {kMasToRad, *limb_u});
    for (auto [c, tag] : criteria) {
      double ratio = ld_over_ud_ratio(law, c);
      out.push_back({std::string("LD diameter (linear u=") + io::format_number(*limb_u, 4) + ", " + tag + ")",
                     std::string("diameter_ld_") + tag + "_mas", d.value * ratio * kRadToMas, err * ratio * kRadToMas});
    }
  } else if (r.kind == ModelKind::LinearLD || r.kind == ModelKind::QuadraticLD || r.kind == ModelKind::PowerLD) {
    Model m = r.model();
    for (auto [c, tag] : criteria) {
      double ratio = ld_over_ud_ratio(m, c);
      out.push_back({std::string("UD-equivalent diameter (") + tag + ")", std::string("diameter_ud_") + tag + "_mas",
                     d.value / ratio * kRadToMas, err / ratio * kRadToMas});
    }
  }
  return out;
}

// --- plot ----------------------------------------------------------------------------------------------

void write_plot(const std::string& path, const std::vector<Vis2Measurement>& data, const FitResult& r,
                const std::string& title, bool raw) {
  const Model model = r.model();
  const double c0 = r.norm();
  const bool circular = !needs_position_angles(r.kind);
  const auto resid = normalised_residuals(data, r);
  double b_max = 0, lambda_mean = 0;
  for (const auto& d : data) {
    b_max = std::max(b_max, std::hypot(d.u_m, d.v_m));
    lambda_mean += d.lambda_m / double(data.size());
  }
  // Points grouped by baseline position angle (mod 180 deg: |V|^2 is even) for non-circular models.
  const int bins = circular ? 1 : 6;
  auto bin_of = [&](const Vis2Measurement& d) {
    double pa = std::fmod(std::atan2(d.u_m, d.v_m) * kRadToDeg + 360.0, 180.0);
    return circular ? 0 : std::min(bins - 1, int(pa / (180.0 / bins)));
  };
  io::Plot top, bottom;
  top.title = title;
  top.x_label = "projected baseline (m)";
  top.y_label = raw ? "normalised correlation c(B)" : "|V|^2";
  bottom.x_label = "projected baseline (m)";
  bottom.y_label = "residual (sigma)";
  top.x_min = bottom.x_min = 0;
  top.x_max = bottom.x_max = b_max * 1.05;
  for (int b = 0; b < bins; ++b) {
    std::string color = io::palette_color(std::size_t(b));
    std::string label = circular ? "data" : "PA " + std::to_string(b * 180 / bins) + "-" + std::to_string((b + 1) * 180 / bins) + " deg";
    io::PlotSeries pts{label, {}, {}, {}, io::PlotSeries::Style::PointsWithErrors, color, false};
    io::PlotSeries res{"", {}, {}, {}, io::PlotSeries::Style::Points, color, false};
    for (std::size_t i = 0; i < data.size(); ++i) {
      if (bin_of(data[i]) != b) continue;
      double bl = std::hypot(data[i].u_m, data[i].v_m);
      pts.x.push_back(bl);
      pts.y.push_back(data[i].vis2);
      pts.y_err.push_back(data[i].vis2_err);
      res.x.push_back(bl);
      res.y.push_back(resid[i]);
    }
    if (pts.x.empty()) continue;
    // Model curve at the mean wavelength, along the bin's middle position angle.
    double pa = circular ? 0 : (b + 0.5) * kPi / bins;
    io::PlotSeries curve{circular ? "model" : "", {}, {}, {}, io::PlotSeries::Style::Line, color, false};
    for (int i = 0; i <= 300; ++i) {
      double bl = b_max * 1.05 * i / 300;
      curve.x.push_back(bl);
      curve.y.push_back(c0 * model.vis2(bl * std::sin(pa) / lambda_mean, bl * std::cos(pa) / lambda_mean));
    }
    top.series.push_back(std::move(pts));
    top.series.push_back(std::move(curve));
    bottom.series.push_back(std::move(res));
  }
  bottom.markers.push_back({0.0, "", false});
  const std::string svg = io::combine_svgs({top.render(720, 400), bottom.render(720, 400)}, 720, 400, 1);
  io::write_text_atomically(path, [&](std::ostream& out) { out << svg; });
}

// --- the command -----------------------------------------------------------------------------------------

int run_fit(const po::variables_map& vm) {
  const std::string path = text_option(vm, "data", "give the measurement file: siiplan fit DATA.csv|DATA.oifits");
  std::optional<std::string> target;
  if (vm.count("target")) target = vm["target"].as<std::string>();
  const bool raw = vm.count("raw") > 0;
  const io::Vis2Data data = io::read_vis2_file(path, target, raw);
  const auto meas = measurements(data);

  // Zero-baseline normalisation.
  if (vm.count("free-norm") && vm.count("norm-prior"))
    throw InputError("--norm-prior", "cannot be combined with --free-norm", "choose one");
  NormSpec norm;
  if (vm.count("free-norm") || raw) norm.mode = NormMode::Free;
  if (vm.count("norm-prior")) norm = parse_prior(vm["norm-prior"].as<std::string>());
  const int max_iterations = int(positive_or(vm, "max-iterations", 200));
  const auto fixes = fix_requests(vm);
  std::optional<double> convert_u = optional_number(vm, "convert-limb-u");
  if (convert_u && !(*convert_u >= 0 && *convert_u <= 1))
    throw InputError("--convert-limb-u", "must lie in [0, 1]", "give the linear limb-darkening coefficient u");
  const io::Format format = output_format(vm);

  std::string source = path + " (" + std::to_string(meas.size()) + " measurements" +
                       (data.targets.size() == 1 ? ", target " + data.targets[0].name : ", " + std::to_string(data.targets.size()) + " targets") + ")";
  if (data.targets.size() > 1)
    warn("the data hold " + std::to_string(data.targets.size()) + " targets, fitted together; choose one with --target NAME");

  // --- model comparison -----------------------------------------------------------------------------
  if (vm.count("compare")) {
    auto names = parse_word_list(vm["compare"].as<std::string>(), "compare");
    for (const auto& f : fixes) {
      bool used = false;
      for (const auto& n : names)
        if (auto k = model_from_name(n)) used = used || model_has(*k, f.name);
      if (!used) throw InputError("--fix", "no compared model has a parameter '" + f.name + "'", "check the name");
    }
    io::Table t;
    for (const char* c : {"model", "n_free", "chi2", "dof", "chi2_reduced", "aic", "delta_aic", "diameter_mas", "diameter_error_mas"})
      t.add_column(c, 7);
    t.add_column("status");
    std::vector<std::pair<std::string, FitResult>> results;
    for (const auto& n : names) {
      auto kind = model_from_name(n);
      if (!kind) throw InputError("--compare", "unknown model '" + n + "'", "use names as for --model (ud, ld-linear, ...)");
      if (!data.position_angles_known && needs_position_angles(*kind))
        throw InputError("--compare", "model '" + n + "' needs position angles", "the data give baseline lengths only");
      results.emplace_back(n, fit_vis2(meas, fit_options_for(*kind, {}, fixes, norm, max_iterations)));
    }
    double best_aic = INFINITY;
    for (const auto& [n, r] : results)
      if (r.usable()) best_aic = std::min(best_aic, r.aic);
    for (const auto& [n, r] : results)
      t.add_row({n, (long long)r.n_free, r.chi2, (long long)r.dof, r.chi2_reduced, r.aic, r.aic - best_aic,
                 r.params[0].value * kRadToMas, r.params[0].error * kRadToMas, r.usable() ? "converged" : "NOT converged"});
    io::write_text_output(output_path(vm), [&](std::ostream& out) {
      if (format == io::Format::Csv) return t.write(out, io::Format::Csv);
      out << "Model comparison on " << source << "\n"
          << "c0: " << (norm.mode == NormMode::Fixed ? "fixed at " + io::format_number(norm.value, 6)
                        : norm.mode == NormMode::Free ? std::string("free")
                        : "prior " + io::format_number(norm.value, 6) + " +- " + io::format_number(norm.error, 6)) << "\n\n";
      t.write(out, io::Format::Table);
      out << "\nAIC = chi2 + 2 x (free parameters) (Akaike 1974); lower is better, and differences below ~2 do\n"
             "not distinguish the models. diameter_mas is each model's own size parameter (UD, LD, FWHM, ...).\n";
      for (const auto& [n, r] : results) out << n << ": " << r.status_text << "\n";
    });
    for (const auto& [n, r] : results)
      if (!r.usable()) warn("model " + n + ": " + r.status_text);
    return 0;
  }

  // --- one model --------------------------------------------------------------------------------------
  ModelChoice choice = model_choice_from_options(vm);
  for (const auto& f : fixes)
    if (!model_has(choice.kind, f.name) && f.name != "norm")
      throw InputError("--fix", "model '" + std::string(model_name(choice.kind)) + "' has no parameter '" + f.name + "'",
                       "its parameters are: " + [&] {
                         std::string s;
                         for (const auto& p : model_params(choice.kind)) s += (s.empty() ? "" : ", ") + std::string(p.name);
                         return s;
                       }());
  for (const auto& f : fixes)
    if (f.name == "norm") {
      if (!f.user_value) throw InputError("--fix", "norm has no value", "write --fix norm=VALUE");
      if (vm.count("free-norm") || vm.count("norm-prior"))
        throw InputError("--fix", "norm cannot be fixed together with --free-norm or --norm-prior", "choose one");
      norm = {NormMode::Fixed, *f.user_value, 0};
    }
  std::vector<FixRequest> model_fixes;
  std::copy_if(fixes.begin(), fixes.end(), std::back_inserter(model_fixes), [](const auto& f) { return f.name != "norm"; });
  FitOptions options = fit_options_for(choice.kind, choice.params, model_fixes, norm, max_iterations);
  if (!data.position_angles_known && needs_position_angles(choice.kind))
    throw InputError("--model", "model '" + std::string(model_name(choice.kind)) + "' needs baseline position angles",
                       "the data give baseline lengths only (baseline_m without pa_deg); use a circular model");
  FitResult r = fit_vis2(meas, options);
  std::optional<BootstrapSummary> boot;
  if (vm.count("bootstrap")) {
    double n = positive_option(vm, "bootstrap", "give the number of resamples, e.g. --bootstrap 500");
    if (n != std::floor(n) || n > 1e6) throw InputError("--bootstrap", "must be a whole number up to 1000000", "e.g. --bootstrap 500");
    double seed = number_or(vm, "seed", 1);
    if (seed < 0 || seed != std::floor(seed)) throw InputError("--seed", "must be a whole number >= 0", "e.g. --seed 42");
    if (r.usable()) boot = bootstrap_fit(meas, options, r, {int(n), std::uint64_t(seed), vm.count("bootstrap-nights") > 0});
    else warn("bootstrap skipped: the fit itself did not converge");
  }
  const auto conv = conversions(r, convert_u);

  std::string norm_text = norm.mode == NormMode::Fixed ? "fixed at " + io::format_number(norm.value, 6)
                          : norm.mode == NormMode::Free ? std::string("free")
                          : "Gaussian prior " + io::format_number(norm.value, 6) + " +- " + io::format_number(norm.error, 6);
  io::Table t;
  t.add_column("parameter");
  t.add_column("value", 9);
  t.add_column("error", 4);
  t.add_column("error_scaled", 4);
  if (boot) t.add_column("error_bootstrap", 4);
  for (const auto& p : r.params) {
    std::vector<io::Table::Cell> row{p.name, p.value * p.user_per_internal};
    if (p.free) {
      row.push_back(p.error * p.user_per_internal);
      row.push_back(p.error_scaled * p.user_per_internal);
      if (boot) row.push_back(p.bootstrap_error * p.user_per_internal);
    } else {
      row.insert(row.end(), boot ? 3 : 2, std::string("fixed"));
    }
    t.add_row(std::move(row));
  }
  auto stat_row = [&](const std::string& name, io::Table::Cell v) {
    std::vector<io::Table::Cell> row{name, v, std::string(""), std::string("")};
    if (boot) row.push_back(std::string(""));
    t.add_row(std::move(row));
  };
  const bool csv = format == io::Format::Csv;
  if (csv) {
    stat_row("chi2", r.chi2);
    stat_row("dof", (long long)r.dof);
    stat_row("chi2_reduced", r.chi2_reduced);
    stat_row("aic", r.aic);
    stat_row("converged", (long long)(r.usable() ? 1 : 0));
    for (const auto& c : conv) {
      std::vector<io::Table::Cell> row{c.key, c.value_mas, c.error_mas, std::string("")};
      if (boot) row.push_back(std::string(""));
      t.add_row(std::move(row));
    }
  }
  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (csv) return t.write(out, io::Format::Csv);
    out << "Fit of model " << model_name(r.kind) << " to " << source << "\n"
        << "Zero-baseline correlation c0 (norm): " << norm_text << "\n"
        << "Status: " << r.status_text << "\n\n";
    t.write(out, io::Format::Table);
    out << "\nchi2 = " << io::format_number(r.chi2, 7) << ", degrees of freedom = " << r.dof
        << ", reduced chi2 = " << io::format_number(r.chi2_reduced, 5) << ", AIC = " << io::format_number(r.aic, 7)
        << (norm.mode == NormMode::Prior ? "  (the c0 prior counts as one datum)" : "") << "\n"
        << "error: from (J^T J)^-1, right when the quoted vis2_err are right. error_scaled: error x sqrt(reduced chi2),\n"
        << "for errors known only up to a common factor.";
    if (boot)
      out << "\nerror_bootstrap: standard deviation over " << boot->samples << " refits of the data resampled by "
          << (vm.count("bootstrap-nights") ? "night" : "point") << " (" << boot->groups << " groups"
          << (boot->failed ? ", " + std::to_string(boot->failed) + " refits did not converge and were left out" : std::string())
          << ").";
    out << "\n";
    for (const auto& p : r.params)
      if (p.at_bound) out << "Note: " << p.name << " sits on its bound; its linear error means little.\n";
    if (r.correlation.rows() > 1) {
      out << "Correlations:";
      for (long a = 0; a < r.correlation.rows(); ++a)
        for (long b = a + 1; b < r.correlation.cols(); ++b)
          out << "  " << r.params[r.free_params[a]].name << "/" << r.params[r.free_params[b]].name << " = "
              << io::format_number(r.correlation(a, b), 3);
      out << "\n";
    }
    for (const auto& c : conv)
      out << c.name << ": " << io::format_number(c.value_mas, 7) << " +- " << io::format_number(c.error_mas, 3) << " mas\n";
    if (!conv.empty())
      out << "(short_baseline: matching the curvature at zero baseline, Hanbury Brown et al. 1974; first_lobe:\n"
             " least squares over the first lobe, closer to what a UD fit of first-lobe data returns; models.md §2)\n";
  });
  if (!r.usable()) warn("the fit did not converge: " + r.status_text);
  if (auto plot = plot_path(vm))
    write_plot(*plot, meas, r, describe_model(r.model()) + ", c0 = " + io::format_number(r.norm(), 5), data.raw_correlation);
  return 0;
}

const Register reg{Command{
    "fit",
    "fit a star model (diameter, limb darkening, ...) to measured squared visibilities from CSV or OIFITS",
    "siiplan fit DATA.csv|DATA.oifits [--model M] [--fix NAME=VALUE ...] [--free-norm | --norm-prior V+-E] [options]",
    "Fits c0 |V|^2 of a star model to the measurements by weighted least squares (Levenberg-Marquardt with\n"
    "analytic derivatives; models.md §5). DATA is a measurement CSV (.csv: columns u_m,v_m or baseline_m\n"
    "[,pa_deg], wavelength_nm, vis2, vis2_err [, mjd, pair, target, bandwidth_nm, int_time_s, flag]) or an\n"
    "OIFITS v1/v2 file (.oifits/.fits: every OI_VIS2 table, FLAG honoured). Negative values are kept.\n"
    "Parameters: model options (--diameter-mas, --limb-u, ...) are START values; --fix NAME=VALUE holds one\n"
    "(names as in the output: diameter_mas, limb_u, axis_ratio, major_pa_deg, flux_ratio, ..., norm).\n"
    "Without start values the diameter comes from the data's half-power point and a grid; ellipse and\n"
    "binary get grids over position angle and separation (|V|^2 cannot tell a binary's PA from PA+180).\n"
    "c0 (norm) is fixed at 1 for calibrated data; --free-norm fits it; --norm-prior 1+-0.05 constrains it.\n"
    "With --raw the CSV holds raw normalised correlations (columns correlation, correlation_err or vis2,\n"
    "vis2_err) and c0 is free unless a prior is given.\n"
    "Errors: 'error' = sqrt of (J^T J)^-1 (right when vis2_err are right), 'error_scaled' = error x\n"
    "sqrt(reduced chi2), optional 'error_bootstrap' (--bootstrap N, --seed S, by point or --bootstrap-nights).\n"
    "A fit that does not converge is reported as such (exit 0, a warning on standard error), never silently.\n"
    "--convert-limb-u U turns a UD diameter into the LD one of a linear law (both criteria of models.md §2);\n"
    "an LD fit is shown with its UD-equivalent diameter. --compare ud,ld-linear,... fits several models and\n"
    "lists chi2 and AIC = chi2 + 2k (Akaike 1974).\n"
    "--plot FILE.svg: data with error bars, the model against projected baseline (for an ellipse or binary,\n"
    "points and curves coloured by baseline position angle) and the residuals in sigma.\n\n"
    "Example:\n"
    "  siiplan fit catalogs-demo/measurements-demo.csv --free-norm --convert-limb-u 0.55 --plot fit.svg\n"
    "CSV output (--format csv): rows parameter,value,error,error_scaled[,error_bootstrap] for every model\n"
    "parameter and norm (fixed ones say 'fixed'), then chi2, dof, chi2_reduced, aic, converged (1/0) and any\n"
    "diameter conversions (diameter_ld_short_baseline_mas, ...).",
    {"data"},
    [](po::options_description& desc) {
      desc.add_options()
          ("data", po::value<std::string>(), "measurement file: .csv or .oifits/.fits (positional)")
          ("target", po::value<std::string>(), "fit only this target of a multi-target file")
          ("raw", "the CSV values are raw normalised correlations c(B) = c0 |V|^2 (c0 then free by default)");
      add_model_options(desc);
      desc.add_options()
          ("fix", po::value<std::vector<std::string>>()->composing(), "hold a parameter: NAME=VALUE in user units, or NAME to hold its model option's value (repeatable)")
          ("free-norm", "fit the zero-baseline correlation c0 (norm) instead of fixing it at 1")
          ("norm-prior", po::value<std::string>(), "Gaussian prior on c0: VALUE+-ERROR (or VALUE±ERROR)")
          ("bootstrap", po::value<std::string>(), "also estimate errors from N bootstrap refits")
          ("seed", po::value<std::string>(), "random seed of the bootstrap (default 1): same seed, same answer")
          ("bootstrap-nights", "resample whole nights (points within 0.3 d of MJD) instead of single points")
          ("compare", po::value<std::string>(), "fit each listed model (e.g. ud,ld-linear,gaussian) and compare chi2 and AIC")
          ("convert-limb-u", po::value<std::string>(), "linear limb-darkening coefficient u for converting a UD diameter to LD")
          ("max-iterations", po::value<std::string>(), "Levenberg-Marquardt iteration limit (default 200)");
      add_output_options(desc, true);
    },
    run_fit}};

}  // namespace
}  // namespace siiplan::cli
