#include "astro/fit.hpp"

#include <algorithm>
#include <cstdio>
#include <limits>
#include <numeric>
#include <random>

#include "astro/coherence.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// --- bounds by reparameterisation (see the header) ---------------------------------------------------

enum class Transform { Exp, SqrtLower, Sine, Identity };

struct Var {
  int param = 0;  // index into the full vector (model parameters, then c0)
  Transform transform = Transform::Identity;
  double lo = -kInf, hi = kInf;
  bool lower_open = false;
};

Var make_var(int param, double lo, double hi, bool lower_open) {
  Var v{param, Transform::Identity, lo, hi, lower_open};
  if (std::isfinite(lo) && std::isfinite(hi)) v.transform = Transform::Sine;
  else if (std::isfinite(lo) && lower_open && lo == 0) v.transform = Transform::Exp;
  else if (std::isfinite(lo)) v.transform = Transform::SqrtLower;
  return v;
}

double to_physical(const Var& v, double q) {
  switch (v.transform) {
    case Transform::Exp: return std::exp(q);
    case Transform::SqrtLower: return v.lo - 1 + std::sqrt(q * q + 1);
    case Transform::Sine: {
      double p = v.lo + (v.hi - v.lo) * (std::sin(q) + 1) / 2;
      // An open lower bound (axis ratio > 0) is approached but never reached.
      if (v.lower_open && p <= v.lo) p = v.lo + 1e-9 * (v.hi - v.lo);
      return std::min(p, v.hi);
    }
    case Transform::Identity: return q;
  }
  return q;
}

double dphysical_dq(const Var& v, double q) {
  switch (v.transform) {
    case Transform::Exp: return std::exp(q);
    case Transform::SqrtLower: return q / std::sqrt(q * q + 1);
    case Transform::Sine: return (v.hi - v.lo) * std::cos(q) / 2;
    case Transform::Identity: return 1;
  }
  return 1;
}

double to_internal(const Var& v, double p) {
  switch (v.transform) {
    case Transform::Exp: return std::log(p);
    case Transform::SqrtLower: {
      double s = p - v.lo + 1;
      return std::sqrt(std::max(s * s - 1, 0.0));
    }
    case Transform::Sine: return std::asin(std::clamp(2 * (p - v.lo) / (v.hi - v.lo) - 1, -1.0, 1.0));
    case Transform::Identity: return p;
  }
  return p;
}

// --- the least-squares problem ------------------------------------------------------------------------

class Problem {
 public:
  Problem(std::span<const Vis2Measurement> data, ModelKind kind, NormSpec norm)
      : data_(data), kind_(kind), norm_(norm), n_model_(int(model_params(kind).size())) {}

  int n_model() const { return n_model_; }
  int n_residuals() const { return int(data_.size()) + (norm_.mode == NormMode::Prior ? 1 : 0); }
  const NormSpec& norm() const { return norm_; }

  // Residuals r_i = (c0 |V_i|^2 - y_i)/sigma_i (and (c0 - prior)/error) at the full parameter vector,
  // and optionally the Jacobian dr/dp in the physical parameters listed in `vars`. False when the
  // parameters are outside the model's domain (the Model constructor refuses them).
  bool evaluate(const std::vector<double>& full, const std::vector<Var>& vars, Eigen::VectorXd& r,
                Eigen::MatrixXd* jac) const {
    std::optional<Model> model;
    try {
      model.emplace(kind_, std::vector<double>(full.begin(), full.begin() + n_model_));
    } catch (const InputError&) {
      return false;
    }
    ++evaluations_;
    const double c0 = full[n_model_];
    r.resize(n_residuals());
    if (jac) jac->resize(n_residuals(), long(vars.size()));
    std::vector<double> grad(n_model_);
    for (std::size_t i = 0; i < data_.size(); ++i) {
      const auto& d = data_[i];
      double ul = d.u_m / d.lambda_m, vl = d.v_m / d.lambda_m;
      double v2 = jac ? model->vis2_and_gradient(ul, vl, grad) : model->vis2(ul, vl);
      r[long(i)] = (c0 * v2 - d.vis2) / d.vis2_err;
      if (jac)
        for (std::size_t k = 0; k < vars.size(); ++k)
          (*jac)(long(i), long(k)) = (vars[k].param == n_model_ ? v2 : c0 * grad[vars[k].param]) / d.vis2_err;
    }
    if (norm_.mode == NormMode::Prior) {
      long i = long(data_.size());
      r[i] = (c0 - norm_.value) / norm_.error;
      if (jac)
        for (std::size_t k = 0; k < vars.size(); ++k) (*jac)(i, long(k)) = vars[k].param == n_model_ ? 1 / norm_.error : 0;
    }
    return r.allFinite() && (!jac || jac->allFinite());
  }

  // chi^2 at model parameters `full` with c0 at its best value given the mode (closed form: the model
  // is linear in c0). Writes that c0 into full. +inf outside the model's domain.
  double chi2_best_norm(std::vector<double>& full) const {
    std::optional<Model> model;
    try {
      model.emplace(kind_, std::vector<double>(full.begin(), full.begin() + n_model_));
    } catch (const InputError&) {
      return kInf;
    }
    ++evaluations_;
    std::vector<double> m(data_.size());
    double smm = 0, smy = 0;
    for (std::size_t i = 0; i < data_.size(); ++i) {
      const auto& d = data_[i];
      m[i] = model->vis2(d.u_m / d.lambda_m, d.v_m / d.lambda_m);
      double w = 1 / (d.vis2_err * d.vis2_err);
      smm += m[i] * m[i] * w;
      smy += m[i] * d.vis2 * w;
    }
    double c0 = norm_.value;
    if (norm_.mode == NormMode::Free && smm > 0) c0 = smy / smm;
    if (norm_.mode == NormMode::Prior) {
      double wp = 1 / (norm_.error * norm_.error);
      c0 = (smy + norm_.value * wp) / (smm + wp);
    }
    full[n_model_] = c0;
    double chi2 = 0;
    for (std::size_t i = 0; i < data_.size(); ++i) {
      double r = (c0 * m[i] - data_[i].vis2) / data_[i].vis2_err;
      chi2 += r * r;
    }
    if (norm_.mode == NormMode::Prior) chi2 += std::pow((c0 - norm_.value) / norm_.error, 2);
    return std::isfinite(chi2) ? chi2 : kInf;
  }

  int evaluations() const { return evaluations_; }

 private:
  std::span<const Vis2Measurement> data_;
  ModelKind kind_;
  NormSpec norm_;
  int n_model_;
  mutable int evaluations_ = 0;
};

// --- Levenberg-Marquardt on the transformed variables ----------------------------------------------

struct LmOutcome {
  std::vector<double> full;
  double chi2 = kInf;
  FitStatus status = FitStatus::Stalled;
  std::string why;
  int iterations = 0;
};

std::string short_number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

// The Gauss-Newton decrement g^T A^-1 g: the chi^2 reduction a full Gauss-Newton step predicts.
double gn_decrement(const Eigen::MatrixXd& a, const Eigen::VectorXd& g) {
  Eigen::MatrixXd m = a;
  for (long k = 0; k < m.rows(); ++k) m(k, k) += 1e-12 * (a(k, k) > 0 ? a(k, k) : 1.0);
  Eigen::VectorXd x = m.ldlt().solve(g);
  return std::abs(g.dot(x));
}

LmOutcome levenberg_marquardt(const Problem& prob, std::vector<double> full, const std::vector<Var>& vars,
                              const FitOptions& opt) {
  LmOutcome out;
  const long n = long(vars.size());
  Eigen::VectorXd q(n);
  for (long k = 0; k < n; ++k) q[k] = to_internal(vars[k], full[vars[k].param]);
  auto apply = [&](const Eigen::VectorXd& qq, std::vector<double>& f) {
    for (long k = 0; k < n; ++k) f[vars[k].param] = to_physical(vars[k], qq[k]);
  };
  apply(q, full);
  Eigen::VectorXd r;
  Eigen::MatrixXd jp;
  if (!prob.evaluate(full, vars, r, &jp)) {
    out.full = full;
    out.why = "the start values are outside the model's domain";
    return out;
  }
  auto jq = [&](const Eigen::MatrixXd& j, const Eigen::VectorXd& qq) {
    Eigen::MatrixXd m = j;
    for (long k = 0; k < n; ++k) m.col(k) *= dphysical_dq(vars[k], qq[k]);
    return m;
  };
  Eigen::MatrixXd j = jq(jp, q);
  double chi2 = r.squaredNorm();
  double lambda = 1e-3;
  auto tol_chi2 = [&](double c) { return std::max(c, 1.0); };
  for (int it = 0;; ++it) {
    Eigen::MatrixXd a = j.transpose() * j;
    Eigen::VectorXd g = j.transpose() * r;
    if (gn_decrement(a, g) <= opt.chi2_rel_tol * tol_chi2(chi2)) {
      out.status = FitStatus::Converged;
      out.why = "the predicted chi-squared reduction fell below " + short_number(opt.chi2_rel_tol) + " relative";
      out.iterations = it;
      break;
    }
    if (it >= opt.max_iterations) {
      out.status = FitStatus::IterationLimit;
      out.why = "reached the limit of " + std::to_string(opt.max_iterations) + " iterations before chi-squared settled";
      out.iterations = it;
      break;
    }
    bool accepted = false, stop = false;
    while (!accepted) {
      Eigen::MatrixXd m = a;
      for (long k = 0; k < n; ++k) m(k, k) += lambda * (a(k, k) > 0 ? a(k, k) : 1.0);
      Eigen::VectorXd step = m.ldlt().solve(-g);
      Eigen::VectorXd q_new = q + step;
      std::vector<double> f_new = full;
      apply(q_new, f_new);
      Eigen::VectorXd r_new;
      Eigen::MatrixXd jp_new;
      bool ok = step.allFinite() && prob.evaluate(f_new, vars, r_new, &jp_new);
      double chi2_new = ok ? r_new.squaredNorm() : kInf;
      if (chi2_new < chi2) {
        accepted = true;
        bool small_step = true;
        for (long k = 0; k < n; ++k)
          small_step = small_step && std::abs(step[k]) <= opt.step_rel_tol * (std::abs(q[k]) + opt.step_rel_tol);
        q = q_new;
        full = f_new;
        r = r_new;
        j = jq(jp_new, q);
        chi2 = chi2_new;
        lambda = std::max(lambda / 10, 1e-12);
        if (small_step && lambda <= 1e-2) {
          out.status = FitStatus::Converged;
          out.why = "the parameter steps fell below " + short_number(opt.step_rel_tol) + " relative";
          out.iterations = it + 1;
          stop = true;
        }
      } else {
        lambda *= 10;
        if (lambda > 1e16) {
          // No step lowers chi^2: a minimum at the limit of double precision, or a stall.
          double dec = gn_decrement(a, g);
          out.iterations = it + 1;
          if (dec <= 1e-8 * tol_chi2(chi2)) {
            out.status = FitStatus::Converged;
            out.why = "no further reduction of chi-squared is possible in double precision";
          } else {
            out.status = FitStatus::Stalled;
            out.why = "no step reduces chi-squared although the gradient is not small";
          }
          stop = true;
          break;
        }
      }
    }
    if (stop) break;
  }
  out.full = full;
  out.chi2 = chi2;
  return out;
}

// --- start values -----------------------------------------------------------------------------------

// A typical start value for a parameter the user did not give (internal units), or NaN when the
// parameter is scanned on a grid instead.
double typical_start(std::string_view name) {
  if (name == "limb_u") return 0.5;
  if (name == "limb_a") return 0.4;
  if (name == "limb_b") return 0.2;
  if (name == "limb_alpha") return 0.3;
  if (name == "flux_ratio") return 0.3;
  return NAN;
}

struct GridAxis {
  int param;
  std::vector<double> values;
};

std::vector<double> log_grid(double lo, double hi, int n) {
  std::vector<double> v;
  for (int i = 0; i < n; ++i) v.push_back(lo * std::pow(hi / lo, double(i) / (n - 1)));
  return v;
}
std::vector<double> lin_grid(double lo, double step, int n) {
  std::vector<double> v;
  for (int i = 0; i < n; ++i) v.push_back(lo + step * i);
  return v;
}

// Start diameter from the data's half-power point: the smallest spatial frequency |b|/lambda where
// |V|^2 (divided by c0 for fixed/prior c0, by the mean of the shortest-baseline quarter when c0 is free)
// drops below 1/2 in a running median of three, scaled through the uniform disk's half-power baseline
// (astro/coherence.hpp, which scales as 1/theta). NaN when the data never drop below 1/2.
double half_power_diameter_rad(std::span<const Vis2Measurement> data, const NormSpec& norm) {
  std::vector<std::pair<double, double>> pts;  // (spatial frequency, value)
  for (const auto& d : data) pts.emplace_back(std::hypot(d.u_m, d.v_m) / d.lambda_m, d.vis2);
  std::sort(pts.begin(), pts.end());
  if (pts.size() < 3) return NAN;
  double c0 = norm.value;
  if (norm.mode == NormMode::Free) {
    std::size_t q = std::max<std::size_t>(1, pts.size() / 4);
    c0 = 0;
    for (std::size_t i = 0; i < q; ++i) c0 += pts[i].second / double(q);
  }
  if (!(c0 > 0)) return NAN;
  for (std::size_t i = 1; i + 1 < pts.size(); ++i) {
    double a = pts[i - 1].second, b = pts[i].second, c = pts[i + 1].second;
    double median = std::max(std::min(a, b), std::min(std::max(a, b), c));
    if (median / c0 < 0.5 && pts[i].first > 0) {
      const double ref_rad = kMasToRad;  // reference UD of 1 mas at lambda = 1 m: baseline in wavelengths
      double ref_half = half_power_baseline_m(Model(ModelKind::UniformDisk, {ref_rad}), 1.0);
      return ref_rad * ref_half / pts[i].first;
    }
  }
  return NAN;
}

double wrap(double angle, double period) {
  double a = std::fmod(angle, period);
  return a < 0 ? a + period : a;
}

}  // namespace

// --- FitResult --------------------------------------------------------------------------------------

Model FitResult::model() const {
  std::vector<double> p;
  for (std::size_t k = 0; k + 1 < params.size(); ++k) p.push_back(params[k].value);
  return Model(kind, std::move(p));
}

const FitParameter* FitResult::find(std::string_view name) const {
  for (const auto& p : params)
    if (p.name == name) return &p;
  return nullptr;
}

// --- fit_vis2 ----------------------------------------------------------------------------------------

FitResult fit_vis2(std::span<const Vis2Measurement> data, const FitOptions& opt) {
  auto specs = model_params(opt.kind);
  const int n_model = int(specs.size());
  const std::string model_label(model_name(opt.kind));
  if (data.empty()) throw InputError("fit", "no measurements to fit", "give at least one unflagged measurement");
  for (std::size_t i = 0; i < data.size(); ++i)
    if (!(data[i].vis2_err > 0) || !(data[i].lambda_m > 0) || !std::isfinite(data[i].vis2))
      throw InputError("fit", "measurement " + std::to_string(i + 1) + " has a non-positive error or wavelength",
                       "every measurement needs a positive error and wavelength");
  if (!opt.start.empty() && int(opt.start.size()) != n_model)
    throw InputError("fit", "wrong number of start values", "internal use");
  if (!opt.fixed.empty() && int(opt.fixed.size()) != n_model)
    throw InputError("fit", "wrong number of fixed flags", "internal use");
  if (opt.norm.mode == NormMode::Prior && !(opt.norm.error > 0))
    throw InputError("norm prior", "the prior error must be positive", "write VALUE+-ERROR with ERROR > 0");
  if (!std::isfinite(opt.norm.value))
    throw InputError("norm", "the zero-baseline value is not finite", "give a finite value");

  auto start_of = [&](int k) { return opt.start.empty() ? std::optional<double>() : opt.start[k]; };
  auto fixed_of = [&](int k) { return !opt.fixed.empty() && opt.fixed[k]; };

  Problem prob(data, opt.kind, opt.norm);
  std::vector<double> full(n_model + 1, NAN);
  full[n_model] = opt.norm.value;
  std::vector<Var> vars;
  for (int k = 0; k < n_model; ++k) {
    const auto& s = specs[k];
    auto st = start_of(k);
    if (fixed_of(k) && !st)
      throw InputError(std::string(s.name), "is fixed but has no value", "give it as --fix " + std::string(s.name) + "=VALUE");
    if (st) {
      double v = *st;
      bool ok = std::isfinite(v) && v <= s.upper && (s.lower_open ? v > s.lower : v >= s.lower);
      if (!ok)
        throw InputError(std::string(s.name), "start value " + std::to_string(v * s.user_per_internal) + " is out of range",
                         "it must be " + param_range_text(s));
      full[k] = v;
    } else {
      full[k] = typical_start(s.name);
    }
    if (!fixed_of(k)) vars.push_back(make_var(k, s.lower, s.upper, s.lower_open));
  }
  if (opt.norm.mode != NormMode::Fixed) vars.push_back(make_var(n_model, -kInf, kInf, false));
  const int n_res = prob.n_residuals();
  if (int(vars.size()) > n_res)
    throw InputError("fit", std::to_string(vars.size()) + " free parameters but only " + std::to_string(n_res) + " data",
                     "fix some parameters (--fix NAME=VALUE) or add measurements");

  // Scales of the data for the grids: resolution lambda/B.
  double b_max = 0, b_min = kInf, l_min = kInf, l_max = 0;
  for (const auto& d : data) {
    double b = std::hypot(d.u_m, d.v_m);
    b_max = std::max(b_max, b);
    if (b > 0) b_min = std::min(b_min, b);
    l_min = std::min(l_min, d.lambda_m);
    l_max = std::max(l_max, d.lambda_m);
  }
  if (!(b_max > 0))
    throw InputError("fit", "every measurement is at zero baseline", "a diameter needs measurements at non-zero baselines");
  const double res_fine = l_min / b_max, res_coarse = l_max / b_min;

  // Grid axes for the parameters without start values (models.md §5.2: grids for multimodal models).
  std::vector<GridAxis> axes;
  for (int k = 0; k < n_model; ++k) {
    if (!std::isnan(full[k])) continue;
    std::string_view name = specs[k].name;
    bool binary = opt.kind == ModelKind::Binary;
    if (name == "diameter_mas") {
      double theta0 = half_power_diameter_rad(data, opt.norm);
      if (std::isfinite(theta0)) axes.push_back({k, log_grid(theta0 / 3, theta0 * 3, binary ? 9 : 25)});
      else axes.push_back({k, log_grid(0.01 * res_fine, 5 * res_coarse, binary ? 15 : 61)});
    }
    else if (name == "axis_ratio") axes.push_back({k, {0.6, 0.9}});
    else if (name == "major_pa_deg") axes.push_back({k, lin_grid(0, 15 * kDegToRad, 12)});
    else if (name == "separation_mas") axes.push_back({k, log_grid(0.25 * res_fine, 2 * res_coarse, 30)});
    else if (name == "companion_pa_deg") axes.push_back({k, lin_grid(0, 10 * kDegToRad, 18)});
    else if (name == "companion_diameter_mas") full[k] = -1;  // set to half the primary at each node
    else axes.push_back({k, {0.5 * (specs[k].lower + specs[k].upper)}});
  }
  auto fill_dependent = [&](std::vector<double>& f) {
    for (int k = 0; k < n_model; ++k)
      if (specs[k].name == "companion_diameter_mas" && !start_of(k)) f[k] = 0.5 * f[0];
  };

  // Evaluate the grid (Cartesian product) and keep the best few nodes as LM starts.
  constexpr std::size_t kStarts = 4;
  std::vector<std::pair<double, std::vector<double>>> best;
  std::vector<std::size_t> idx(axes.size(), 0);
  for (;;) {
    std::vector<double> f = full;
    for (std::size_t a = 0; a < axes.size(); ++a) f[axes[a].param] = axes[a].values[idx[a]];
    fill_dependent(f);
    if (opt.norm.mode == NormMode::Fixed) f[n_model] = opt.norm.value;
    double c = opt.norm.mode == NormMode::Fixed ? [&] {
      Eigen::VectorXd r;
      return prob.evaluate(f, {}, r, nullptr) ? r.squaredNorm() : kInf;
    }() : prob.chi2_best_norm(f);
    if (std::isfinite(c)) {
      best.emplace_back(c, f);
      std::sort(best.begin(), best.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
      if (best.size() > kStarts) best.pop_back();
    }
    std::size_t a = 0;
    for (; a < axes.size(); ++a) {
      if (++idx[a] < axes[a].values.size()) break;
      idx[a] = 0;
    }
    if (a == axes.size()) break;
  }
  if (best.empty())
    throw InputError("fit", "no start value of model '" + model_label + "' gives a finite chi-squared",
                     "give start values (e.g. --diameter-mas) inside the model's ranges");
  if (axes.empty()) best.resize(1);

  LmOutcome lm;
  for (const auto& [c, f] : best) {
    LmOutcome o = levenberg_marquardt(prob, f, vars, opt);
    bool o_ok = o.status == FitStatus::Converged, lm_ok = lm.status == FitStatus::Converged;
    if (lm.full.empty() || (o_ok && !lm_ok) || (o_ok == lm_ok && o.chi2 < lm.chi2)) lm = std::move(o);
  }

  // Result: values, wrapped angles, covariance from the physical Jacobian at the solution.
  FitResult res;
  res.kind = opt.kind;
  std::vector<double> sol = lm.full;
  for (int k = 0; k < n_model; ++k) {
    if (opt.kind == ModelKind::Ellipse && specs[k].name == "major_pa_deg") sol[k] = wrap(sol[k], kPi);
    if (opt.kind == ModelKind::Binary && specs[k].name == "companion_pa_deg") sol[k] = wrap(sol[k], kTwoPi);
  }
  for (int k = 0; k <= n_model; ++k) {
    FitParameter p;
    p.name = k < n_model ? std::string(specs[k].name) : "norm";
    p.user_per_internal = k < n_model ? specs[k].user_per_internal : 1.0;
    p.value = sol[k];
    res.params.push_back(p);
  }
  for (const auto& v : vars) {
    res.free_params.push_back(v.param);
    auto& p = res.params[v.param];
    p.free = true;
    p.at_bound = (std::isfinite(v.lo) && !v.lower_open && p.value <= v.lo) || (std::isfinite(v.hi) && p.value >= v.hi);
  }
  res.chi2 = lm.chi2;
  res.n_data = n_res;
  res.n_free = int(vars.size());
  res.dof = res.n_data - res.n_free;
  res.chi2_reduced = res.dof > 0 ? res.chi2 / res.dof : NAN;
  res.aic = res.chi2 + 2.0 * res.n_free;
  res.iterations = lm.iterations;
  res.status = lm.status;

  std::string unconstrained;
  if (!vars.empty() && std::isfinite(lm.chi2)) {
    Eigen::VectorXd r;
    Eigen::MatrixXd j;
    prob.evaluate(sol, vars, r, &j);
    Eigen::MatrixXd a = j.transpose() * j;
    const long n = a.rows();
    // Invert through the correlation-normalised matrix so that parameter units do not matter.
    Eigen::VectorXd s(n);
    for (long k = 0; k < n; ++k) s[k] = a(k, k) > 0 ? 1 / std::sqrt(a(k, k)) : 0;
    Eigen::MatrixXd an = s.asDiagonal() * a * s.asDiagonal();
    Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(an);
    double emax = eig.eigenvalues().maxCoeff();
    bool singular = false;
    for (long k = 0; k < n; ++k)
      if (s[k] == 0) {
        singular = true;
        unconstrained += (unconstrained.empty() ? "" : ", ") + res.params[vars[k].param].name;
      }
    if (!singular && eig.eigenvalues().minCoeff() < 1e-12 * emax) {
      singular = true;
      Eigen::VectorXd null = eig.eigenvectors().col(0);
      for (long k = 0; k < n; ++k)
        if (std::abs(null[k]) > 0.3) unconstrained += (unconstrained.empty() ? "" : ", ") + res.params[vars[k].param].name;
    }
    if (!singular) {
      Eigen::MatrixXd inv_n = eig.eigenvectors() * eig.eigenvalues().cwiseInverse().asDiagonal() * eig.eigenvectors().transpose();
      res.covariance = s.asDiagonal() * inv_n * s.asDiagonal();
      res.correlation = res.covariance;
      for (long x = 0; x < n; ++x)
        for (long y = 0; y < n; ++y)
          res.correlation(x, y) = res.covariance(x, y) / std::sqrt(res.covariance(x, x) * res.covariance(y, y));
      double scale = std::isfinite(res.chi2_reduced) ? std::sqrt(res.chi2_reduced) : NAN;
      for (long k = 0; k < n; ++k) {
        auto& p = res.params[vars[k].param];
        p.error = std::sqrt(res.covariance(k, k));
        p.error_scaled = p.error * scale;
      }
    } else if (res.status == FitStatus::Converged) {
      res.status = FitStatus::ConvergedDegenerate;
    }
  }
  res.evaluations = prob.evaluations();
  std::string it = std::to_string(res.iterations) + " iteration" + (res.iterations == 1 ? "" : "s");
  switch (res.status) {
    case FitStatus::Converged:
      res.status_text = "converged after " + it + " (" + lm.why + ")";
      break;
    case FitStatus::ConvergedDegenerate:
      res.status_text = "converged after " + it + ", but the data do not constrain " +
                        (unconstrained.empty() ? std::string("some parameter") : unconstrained) +
                        ": no uncertainties (fix it with --fix or add measurements)";
      break;
    case FitStatus::IterationLimit:
      res.status_text = "NOT converged: " + lm.why + "; the values shown are where the search stopped, not a result";
      break;
    case FitStatus::Stalled:
      res.status_text = "NOT converged after " + it + ": " + lm.why + "; the values shown are not a result";
      break;
  }
  return res;
}

std::vector<double> normalised_residuals(std::span<const Vis2Measurement> data, const FitResult& result) {
  Model m = result.model();
  double c0 = result.norm();
  std::vector<double> out;
  for (const auto& d : data) out.push_back((d.vis2 - c0 * m.vis2(d.u_m / d.lambda_m, d.v_m / d.lambda_m)) / d.vis2_err);
  return out;
}

// --- bootstrap ---------------------------------------------------------------------------------------

BootstrapSummary bootstrap_fit(std::span<const Vis2Measurement> data, const FitOptions& options, FitResult& result,
                               const BootstrapOptions& bs) {
  // Groups: single points, or nights (points separated by less than 0.3 d in MJD: one night at one site).
  std::vector<std::vector<std::size_t>> groups;
  if (bs.by_night) {
    std::vector<std::size_t> order(data.size());
    std::iota(order.begin(), order.end(), 0);
    for (std::size_t i = 0; i < data.size(); ++i)
      if (!std::isfinite(data[i].mjd))
        throw InputError("--bootstrap-nights", "measurement " + std::to_string(i + 1) + " has no MJD",
                         "nights are found from the mjd column; give it or resample points instead");
    std::sort(order.begin(), order.end(), [&](auto a, auto b) { return data[a].mjd < data[b].mjd; });
    for (std::size_t k = 0; k < order.size(); ++k) {
      if (k == 0 || data[order[k]].mjd - data[order[k - 1]].mjd > 0.3) groups.emplace_back();
      groups.back().push_back(order[k]);
    }
  } else {
    for (std::size_t i = 0; i < data.size(); ++i) groups.push_back({i});
  }
  if (groups.size() < 2)
    throw InputError("--bootstrap", std::string("only one ") + (bs.by_night ? "night" : "point") + " to resample",
                     "the bootstrap needs at least two independent groups of data");
  if (bs.samples < 2) throw InputError("--bootstrap", "needs at least 2 resamples", "use e.g. --bootstrap 500");

  // Refit from the best solution: every parameter starts at its best value, fixed ones stay fixed.
  FitOptions o = options;
  o.start.assign(result.params.size() - 1, std::nullopt);
  for (std::size_t k = 0; k + 1 < result.params.size(); ++k) o.start[k] = result.params[k].value;
  if (o.norm.mode == NormMode::Free) o.norm.value = result.norm();

  std::mt19937_64 rng(bs.seed);
  std::uniform_int_distribution<std::size_t> pick(0, groups.size() - 1);
  std::vector<std::vector<double>> draws(result.params.size());
  BootstrapSummary sum;
  sum.groups = int(groups.size());
  std::vector<Vis2Measurement> sample;
  for (int s = 0; s < bs.samples; ++s) {
    sample.clear();
    for (std::size_t g = 0; g < groups.size(); ++g)
      for (std::size_t i : groups[pick(rng)]) sample.push_back(data[i]);
    FitResult f;
    try {
      f = fit_vis2(sample, o);
    } catch (const InputError&) {
      ++sum.failed;  // e.g. a resample with fewer distinct points than free parameters
      continue;
    }
    if (!f.usable()) {
      ++sum.failed;
      continue;
    }
    ++sum.samples;
    for (std::size_t k = 0; k < f.params.size(); ++k) {
      double v = f.params[k].value;
      // Angles: measure the spread around the best value, across the wrap.
      if (f.params[k].name == "major_pa_deg") v = result.params[k].value + std::remainder(v - result.params[k].value, kPi);
      if (f.params[k].name == "companion_pa_deg")
        v = result.params[k].value + std::remainder(v - result.params[k].value, kTwoPi);
      draws[k].push_back(v);
    }
  }
  for (std::size_t k = 0; k < result.params.size(); ++k) {
    auto& p = result.params[k];
    if (!p.free || draws[k].size() < 2) continue;
    double mean = std::accumulate(draws[k].begin(), draws[k].end(), 0.0) / double(draws[k].size());
    double ss = 0;
    for (double v : draws[k]) ss += (v - mean) * (v - mean);
    p.bootstrap_error = std::sqrt(ss / double(draws[k].size() - 1));
  }
  return sum;
}

}  // namespace siiplan::astro
