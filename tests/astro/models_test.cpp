// Tests of astro/models: every model against outside references, against the numerical Hankel transform
// of its own intensity profile, analytic gradients against central differences, and the Fourier
// invariants V(0) = 1 and V(-u,-v) = conj V(u,v).
#include "astro/models.hpp"

#include <cmath>
#include <functional>
#include <vector>

#include "astro/bessel.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"
#include "tests/astro/models_reference.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {

constexpr double kRefTol = 1e-12;      // closed forms vs mpmath, relative (absolute 1e-14 near nulls)
constexpr double kHankelTol = 1e-9;    // closed forms vs our own numerical Hankel transform (issue 2)
constexpr double kGradTol = 2e-7;      // analytic vs central difference, in units of |V|^2 per parameter scale
const double kLambda = 420e-9;

// Tanh-sinh (double-exponential) quadrature on [0, 1]: copes with the (1 - r^2)^(alpha/2) endpoint
// behaviour of limb-darkened profiles. Takahasi & Mori 1974, Publ. RIMS 9, 721.
double tanh_sinh_01(const std::function<double(double)>& f) {
  const double h = 1.0 / 256;   // 2201 nodes on t in [-4.3, 4.3]; the weights beyond are < 1e-40
  double sum = 0;
  for (int k = -1100; k <= 1100; ++k) {
    const double t = k * h;
    const double s = 0.5 * kPi * std::sinh(t);
    const double w = 0.5 * kPi * std::cosh(t) / (std::cosh(s) * std::cosh(s));   // d tanh(s)/dt
    const double r = 0.5 * (1 + std::tanh(s));                                  // maps (-1, 1) to (0, 1)
    if (r > 0 && r < 1) sum += 0.5 * w * f(r);
  }
  return sum * h;
}

// The intensity profile I(r) (r in units of the radius) of each limb-darkening law.
std::function<double(double)> profile(const Model& m) {
  const auto& p = m.params();
  auto mu = [](double r) { return std::sqrt(std::max(0.0, 1 - r * r)); };
  switch (m.kind()) {
    case ModelKind::LinearLD: return [=](double r) { return 1 - p[1] * (1 - mu(r)); };
    case ModelKind::QuadraticLD:
      return [=](double r) { return 1 - p[1] * (1 - mu(r)) - p[2] * (1 - mu(r)) * (1 - mu(r)); };
    case ModelKind::PowerLD: return [=](double r) { return std::pow(mu(r), p[1]); };
    default: return [](double) { return 1.0; };
  }
}

double hankel_v(const Model& m, double x) {
  auto I = profile(m);
  const double num = tanh_sinh_01([&](double r) { return I(r) * bessel_j0(x * r) * r; });
  const double den = tanh_sinh_01([&](double r) { return I(r) * r; });
  return num / den;
}

Model make(ModelKind k, std::vector<double> p) { return Model(k, std::move(p)); }
const double mas = kMasToRad;

}  // namespace

TEST_SUITE("astro/models") {
  TEST_CASE("|V|^2 of every model against mpmath (scripts/make_ref_models.py)") {
    auto rows = siiplan::test::models_reference("vis2");
    REQUIRE(rows.size() > 80);
    int kinds_seen[8] = {};
    for (const auto& r : rows) {
      CAPTURE(r.line);
      const Model m = siiplan::test::reference_model(r);
      kinds_seen[int(m.kind())]++;
      check_close(m.vis2(r.u_m / r.lambda_m, r.v_m / r.lambda_m), r.value, kRefTol, 1e-14, r.model);
    }
    for (int k = 0; k < 8; ++k) CHECK(kinds_seen[k] > 0);
  }

  TEST_CASE("models.md §3 check values (mpmath, 12 digits)") {
    auto at = [](const Model& m, double x) { return m.vis2(x / (kPi * m.diameter_rad()), 0); };
    const Model ud = make(ModelKind::UniformDisk, {mas});
    const Model lin = make(ModelKind::LinearLD, {mas, 0.6});
    check_close(at(ud, 2), 0.332611503882, 2e-12, 0, "UD x=2");
    check_close(at(ud, 10), 7.55951863785e-5, 2e-11, 0, "UD x=10");
    check_close(at(lin, 3), 0.0817150264074, 2e-12, 0, "linear u=0.6 x=3");
    check_close(lin.visibility(5 / (kPi * mas), 0).real(), -0.0940426499420, 2e-11, 0, "signed V, u=0.6, x=5");
    check_close(at(make(ModelKind::QuadraticLD, {mas, 0.4, 0.25}), 5), 0.00986852490323, 2e-11, 0, "quadratic x=5");
    check_close(at(make(ModelKind::PowerLD, {mas, 0.3}), 3), 0.0710550806971, 2e-11, 0, "power 0.3 x=3");
    // §1.5: Gaussian |V|^2 = 1/2 at x = sqrt(2) ln 2.
    check_close(at(make(ModelKind::Gaussian, {mas}), 0.980258143468), 0.5, 1e-12, 0, "Gaussian half power");
  }

  TEST_CASE("models.md §1.7 ellipse and §1.8 binary check values") {
    const Model e = make(ModelKind::Ellipse, {mas, 0.8, 30 * kDegToRad});
    check_close(e.vis2(60 / kLambda, 80 / kLambda), 0.00238595959623, 1e-11, 0, "ellipse");
    // (dalpha, ddelta) = (+5, -3) mas -> separation sqrt(34) mas at PA atan2(5, -3)
    const Model b = make(ModelKind::Binary, {mas, 0.5 * mas, 0.3, std::sqrt(34.0) * mas, std::atan2(5.0, -3.0)});
    check_close(b.vis2(50 / kLambda, 20 / kLambda), 0.315192464225, 1e-11, 0, "binary");
    // The binary's |V|^2 cannot tell the companion's PA from PA + 180 deg (models.md §1.8).
    const Model flipped = b.with_params({mas, 0.5 * mas, 0.3, std::sqrt(34.0) * mas, std::atan2(5.0, -3.0) + kPi});
    check_close(flipped.vis2(50 / kLambda, 20 / kLambda), 0.315192464225, 1e-11, 0, "binary 180 deg ambiguity");
    // The ellipse's PA is that of the major axis: a baseline along it sees the full diameter.
    const Model along = make(ModelKind::Ellipse, {mas, 0.5, 40 * kDegToRad});
    const Model ud = make(ModelKind::UniformDisk, {mas});
    const double s = std::sin(40 * kDegToRad), c = std::cos(40 * kDegToRad);
    check_close(along.vis2(70 * s / kLambda, 70 * c / kLambda), ud.vis2(70 / kLambda, 0), 1e-14, 0, "major axis");
  }

  TEST_CASE("radially symmetric models equal the numerical Hankel transform of their own profile to 1e-9") {
    const std::vector<Model> models{make(ModelKind::UniformDisk, {mas}), make(ModelKind::LinearLD, {mas, 0.3}),
                                    make(ModelKind::LinearLD, {mas, 1.0}), make(ModelKind::QuadraticLD, {mas, 0.4, 0.25}),
                                    make(ModelKind::QuadraticLD, {mas, 0.8, -0.3}), make(ModelKind::PowerLD, {mas, 0.3}),
                                    make(ModelKind::PowerLD, {mas, 2.7}), make(ModelKind::PowerLD, {mas, 7.5})};
    for (const auto& m : models)
      for (double x : {1e-3, 0.4, 1.0, 2.5, 3.9, 7.0, 12.0, 17.0, 25.0}) {
        CAPTURE(x);
        check_close(m.visibility(x / (kPi * mas), 0).real(), hankel_v(m, x), 0, kHankelTol, std::string(model_name(m.kind())));
      }
  }

  TEST_CASE("V(0) = 1 and V(-u,-v) = conj V(u,v) for every model") {
    const std::vector<Model> models{
        make(ModelKind::UniformDisk, {mas}),         make(ModelKind::LinearLD, {mas, 0.6}),
        make(ModelKind::QuadraticLD, {mas, 0.4, 0.25}), make(ModelKind::PowerLD, {mas, 0.3}),
        make(ModelKind::Gaussian, {mas}),            make(ModelKind::Ring, {mas}),
        make(ModelKind::Ellipse, {mas, 0.7, 0.3}),   make(ModelKind::Binary, {mas, 0.4 * mas, 0.5, 4 * mas, 1.0})};
    for (const auto& m : models) {
      CAPTURE(model_name(m.kind()));
      const auto v0 = m.visibility(0, 0);
      check_close(v0.real(), 1.0, 0, 1e-15, "Re V(0)");
      check_close(v0.imag(), 0.0, 0, 1e-15, "Im V(0)");
      for (auto [u, v] : {std::pair{30.0, 50.0}, {-80.0, 12.0}, {0.0, 140.0}}) {
        const auto a = m.visibility(u / kLambda, v / kLambda), b = m.visibility(-u / kLambda, -v / kLambda);
        check_close(b.real(), a.real(), 0, 1e-15, "Re V(-b)");
        check_close(b.imag(), -a.imag(), 0, 1e-15, "Im V(-b)");
        check_close(m.vis2(u / kLambda, v / kLambda), std::norm(a), 0, 1e-15, "vis2 = |V|^2");
      }
    }
    // The binary's complex V follows exp(-2 pi i (u dalpha + v ddelta)) (models.hpp): a point companion
    // of flux ratio 1 due East at 1/(4u) gives V = (1 + exp(-i pi/2))/2 = (1 - i)/2.
    const double u = 50 / kLambda;
    const Model east = make(ModelKind::Binary, {1e-6 * mas, 0.0, 1.0, 1 / (4 * u), kPi / 2});
    check_close(east.visibility(u, 0).imag(), -0.5, 0, 1e-9, "binary phase sign");
  }

  TEST_CASE("analytic gradients against central differences, on both sides of every series switch") {
    struct Probe {
      Model model;
      std::vector<double> scale;   // typical size of each parameter (step = 1e-6 * scale)
    };
    const std::vector<Probe> probes{
        {make(ModelKind::UniformDisk, {mas}), {mas}},
        {make(ModelKind::LinearLD, {mas, 0.6}), {mas, 1}},
        {make(ModelKind::QuadraticLD, {mas, 0.4, 0.25}), {mas, 1, 1}},
        {make(ModelKind::PowerLD, {mas, 0.3}), {mas, 1}},
        {make(ModelKind::PowerLD, {mas, 3.0}), {mas, 1}},
        {make(ModelKind::Gaussian, {mas}), {mas}},
        {make(ModelKind::Ring, {mas}), {mas}},
        {make(ModelKind::Ellipse, {mas, 0.6, 0.5}), {mas, 1, 1}},
        {make(ModelKind::Binary, {mas, 0.5 * mas, 0.3, 3 * mas, 0.7}), {mas, mas, 1, mas, 1}},
    };
    // x = pi theta B / lambda at these points: 1e-4, 0.3, 1.9, 2.1, 5, 15.9, 16.1, 30
    for (const auto& pr : probes)
      for (double x : {1e-4, 0.3, 1.9, 2.1, 5.0, 15.9, 16.1, 30.0}) {
        CAPTURE(model_name(pr.model.kind()));
        CAPTURE(x);
        const double b = x / (kPi * mas);
        const double u = 0.6 * b, v = 0.8 * b;
        std::vector<double> g(pr.model.params().size());
        pr.model.vis2_and_gradient(u, v, g);
        for (std::size_t k = 0; k < g.size(); ++k) {
          CAPTURE(k);
          const double h = 1e-6 * pr.scale[k];
          auto p_plus = pr.model.params(), p_minus = pr.model.params();
          p_plus[k] += h;
          p_minus[k] -= h;
          const double fd = (pr.model.with_params(p_plus).vis2(u, v) - pr.model.with_params(p_minus).vis2(u, v)) / (2 * h);
          check_close(g[k] * pr.scale[k], fd * pr.scale[k], 1e-6, kGradTol, "d|V|^2/dp * scale");
        }
      }
  }

  TEST_CASE("parameter ranges: bad values are InputError naming the parameter") {
    CHECK_THROWS_AS(make(ModelKind::UniformDisk, {0.0}), siiplan::InputError);
    CHECK_THROWS_AS(make(ModelKind::UniformDisk, {-mas}), siiplan::InputError);
    CHECK_THROWS_AS(make(ModelKind::Ellipse, {mas, 0.0, 0.0}), siiplan::InputError);
    CHECK_THROWS_AS(make(ModelKind::Ellipse, {mas, 1.01, 0.0}), siiplan::InputError);
    CHECK_NOTHROW(make(ModelKind::Ellipse, {mas, 1.0, 0.0}));
    CHECK_THROWS_AS(make(ModelKind::LinearLD, {mas, 1.2}), siiplan::InputError);
    CHECK_THROWS_AS(make(ModelKind::QuadraticLD, {mas, 0.9, 0.3}), siiplan::InputError);   // I(0) < 0
    CHECK_THROWS_AS(make(ModelKind::UniformDisk, {NAN}), siiplan::InputError);
    try {
      make(ModelKind::Ellipse, {mas, 1.5, 0.0});
    } catch (const siiplan::InputError& e) {
      CHECK(e.where() == "axis_ratio");
      CHECK(e.hint() == "it must be (0, 1]");
    }
    CHECK(model_from_name("ld-power") == ModelKind::PowerLD);
    CHECK(!model_from_name("disk"));
    for (auto k : all_model_kinds()) CHECK(model_from_name(model_name(k)) == k);
  }
}
