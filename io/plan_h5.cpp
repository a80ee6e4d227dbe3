// plan.h5 writer and reader (layout in io/plan_h5.hpp), HDF5 C API.
#include "io/plan_h5.hpp"

#include <hdf5.h>

#include <array>
#include <cmath>
#include <cstdio>
#include <functional>

#include "astro/errors.hpp"
#include "astro/models.hpp"
#include "io/hdf5_output.hpp"
#include "io/hdf5_util.hpp"

namespace siiplan::io {
namespace {

using hdf5::Writer;
using Handle = hdf5::Id;

// Reading: every failure is an InputError naming the file and object.
struct Reader {
  std::string file;
  [[noreturn]] void fail(const std::string& what) const {
    throw InputError(file, "not a readable siiplan plan file: " + what, "write it with 'siiplan night'");
  }
  hid_t open_group(hid_t parent, const char* name) const {
    if (H5Lexists(parent, name, H5P_DEFAULT) <= 0) fail(std::string("missing group '") + name + "'");
    hid_t g = H5Gopen2(parent, name, H5P_DEFAULT);
    if (g < 0) fail(name);
    return g;
  }
  std::vector<double> attr_doubles(hid_t obj, const char* name) const {
    if (H5Aexists(obj, name) <= 0) fail(std::string("missing attribute '") + name + "'");
    Handle a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    Handle space(H5Aget_space(a), H5Sclose);
    hssize_t n = H5Sget_simple_extent_npoints(space);
    if (n <= 0 || !hdf5::fits_in_file(a, hsize_t(n), sizeof(double))) fail(name);
    std::vector<double> v(static_cast<std::size_t>(n));
    if (H5Aread(a, H5T_NATIVE_DOUBLE, v.data()) < 0) fail(name);
    return v;
  }
  double attr(hid_t obj, const char* name) const { return attr_doubles(obj, name).at(0); }
  int attr_int(hid_t obj, const char* name) const {
    if (H5Aexists(obj, name) <= 0) fail(std::string("missing attribute '") + name + "'");
    Handle a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    int v = 0;
    if (H5Aread(a, H5T_NATIVE_INT, &v) < 0) fail(name);
    return v;
  }
  std::string attr_text(hid_t obj, const char* name) const {
    if (H5Aexists(obj, name) <= 0) fail(std::string("missing attribute '") + name + "'");
    Handle a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    Handle type(hdf5::text_type(), H5Tclose);
    char* p = nullptr;
    if (H5Aread(a, type, &p) < 0 || !p) fail(name);
    std::string s(p);
    H5free_memory(p);
    return s;
  }
  // Reads a dataset, checking its element count.
  Handle open_data(hid_t parent, const char* name, hsize_t expected) const {
    if (H5Lexists(parent, name, H5P_DEFAULT) <= 0) fail(std::string("missing dataset '") + name + "'");
    Handle d(H5Dopen2(parent, name, H5P_DEFAULT), H5Dclose);
    Handle space(H5Dget_space(d), H5Sclose);
    if (!d.ok() || H5Sget_simple_extent_npoints(space) != hssize_t(expected))
      fail(std::string("dataset '") + name + "' has the wrong size");
    if (!hdf5::fits_in_file(d, expected, sizeof(double)))
      fail(std::string("dataset '") + name + "' claims more values than the file holds");
    return Handle(H5Dopen2(parent, name, H5P_DEFAULT), H5Dclose);
  }
  template <class T>
  std::vector<T> numbers(hid_t parent, const char* name, hsize_t n, hid_t mem_type) const {
    Handle d = open_data(parent, name, n);
    std::vector<T> v(n);
    if (n > 0 && H5Dread(d, mem_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data()) < 0) fail(name);
    return v;
  }
  std::vector<double> doubles(hid_t parent, const char* name, hsize_t n) const {
    return numbers<double>(parent, name, n, H5T_NATIVE_DOUBLE);
  }
  std::vector<int> ints(hid_t parent, const char* name, hsize_t n) const {
    return numbers<int>(parent, name, n, H5T_NATIVE_INT);
  }
  std::vector<std::string> texts(hid_t parent, const char* name, hsize_t n) const {
    Handle d = open_data(parent, name, n);
    Handle type(hdf5::text_type(), H5Tclose);
    std::vector<char*> p(n, nullptr);
    if (n > 0 && H5Dread(d, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, p.data()) < 0) fail(name);
    std::vector<std::string> out;
    for (auto* s : p) {
      out.emplace_back(s ? s : "");
      if (s) H5free_memory(s);
    }
    return out;
  }
  hsize_t length(hid_t parent, const char* name) const {
    if (H5Lexists(parent, name, H5P_DEFAULT) <= 0) fail(std::string("missing dataset '") + name + "'");
    Handle d(H5Dopen2(parent, name, H5P_DEFAULT), H5Dclose);
    Handle space(H5Dget_space(d), H5Sclose);
    hssize_t n = H5Sget_simple_extent_npoints(space);
    if (n < 0) fail(name);
    return hsize_t(n);
  }
};

const char* mode_name(astro::DetectionMode m) { return m == astro::DetectionMode::Analog ? "analog" : "photon-counting"; }
const char* profile_name(astro::FilterProfile p) { return p == astro::FilterProfile::TopHat ? "top-hat" : "gaussian"; }
const char* zero_name(astro::ZeroBaseline z) { return z == astro::ZeroBaseline::Calibrated ? "calibrated" : "free"; }

}  // namespace

void write_plan_h5(const std::filesystem::path& path, const PlanFile& plan) {
  hdf5::Quiet quiet;
  Hdf5MemoryFile out(path);
  Writer w{path.string(), out.group_properties(), out.dataset_properties()};
  {
    const hid_t file = out.id();
    w.attr_text(file, "format", "siiplan-plan");
    w.attr_int(file, "format_version", kPlanFormatVersion);
    w.attr_text(file, "date", plan.date);
    w.attr(file, "night_start_mjd_utc", plan.night_start_mjd_utc);
    w.attr(file, "night_end_mjd_utc", plan.night_end_mjd_utc);
    w.attr(file, "slot_s", plan.slot_s);
    w.attr_text(file, "siiplan_version", plan.siiplan_version);

    {
      Handle g(w.group(file, "site"), H5Gclose);
      const auto& s = plan.site;
      w.attr_text(g, "name", s.name);
      w.attr(g, "lat_rad", s.lat_rad);
      w.attr(g, "lon_east_rad", s.lon_east_rad);
      w.attr(g, "height_m", s.height_m);
      w.attr(g, "pressure_hpa", s.pressure_hpa);
      w.attr(g, "temperature_c", s.temperature_c);
      w.attr(g, "humidity", s.humidity);
      w.attr(g, "dut1_s", s.dut1_s);
      w.attr(g, "utc_offset_h", s.utc_offset_h);
      w.attr(g, "min_altitude_rad", s.min_altitude_rad);
      w.attr(g, "extinction_mag_per_airmass", s.extinction_mag_per_airmass.data(), astro::kBandCount);
    }
    {
      Handle g(w.group(file, "array"), H5Gclose);
      std::vector<std::string> name;
      std::vector<double> e, n, u, d, a, m;
      for (const auto& t : plan.telescopes) {
        name.push_back(t.name);
        e.push_back(t.east_m);
        n.push_back(t.north_m);
        u.push_back(t.up_m);
        d.push_back(t.diameter_m);
        a.push_back(t.area_m2);
        m.push_back(t.min_altitude_rad);
      }
      w.texts(g, "name", name);
      w.doubles(g, "east_m", e);
      w.doubles(g, "north_m", n);
      w.doubles(g, "up_m", u);
      w.doubles(g, "diameter_m", d);
      w.doubles(g, "area_m2", a);
      w.doubles(g, "min_altitude_rad", m);
      std::vector<int> ij;
      for (const auto& p : plan.pairs) {
        ij.push_back(p.i);
        ij.push_back(p.j);
      }
      w.ints(g, "pairs", ij, {plan.pairs.size(), 2});
    }
    {
      Handle g(w.group(file, "instrument"), H5Gclose);
      const auto& in = plan.instrument;
      w.attr_text(g, "mode", mode_name(in.mode));
      w.attr(g, "lambda_m", in.lambda_m);
      w.attr(g, "bandwidth_m", in.bandwidth_m);
      w.attr_text(g, "profile", profile_name(in.profile));
      w.attr(g, "efficiency", in.efficiency);
      w.attr(g, "electronic_bandwidth_hz", in.electronic_bandwidth_hz);
      w.attr(g, "timing_fwhm_s", in.timing_fwhm_s);
      w.attr(g, "excess_noise", in.excess_noise);
      w.attr(g, "correlator_efficiency", in.correlator_efficiency);
      w.attr_int(g, "channels", in.channels);
      w.attr(g, "fov_rad", in.fov_rad);
      w.attr(g, "max_rate_hz", in.max_rate_hz);
      w.attr(g, "dark_rate_hz", in.dark_rate_hz);
      w.attr_text(g, "zero_baseline", zero_name(in.zero_baseline));
      w.attr_text(g, "band", std::string(astro::band_name(in.band)));
    }
    {
      Handle g(w.group(file, "targets"), H5Gclose);
      std::vector<std::string> name, model, note;
      std::vector<double> ra, dec, diam, prio, goal, pred, params;
      std::vector<int> est, sched, npar;
      for (const auto& pt : plan.targets) {
        const auto& t = pt.target;
        name.push_back(t.name);
        ra.push_back(t.position.ra_rad);
        dec.push_back(t.position.dec_rad);
        model.emplace_back(astro::model_name(t.model.kind()));
        diam.push_back(t.model.diameter_rad());
        est.push_back(t.diameter_estimated ? 1 : 0);
        note.push_back(t.diameter_note);
        prio.push_back(t.priority);
        goal.push_back(t.goal_fraction);
        pred.push_back(pt.predicted_sigma_theta_fraction);
        sched.push_back(pt.scheduled ? 1 : 0);
        const auto& p = t.model.params();
        npar.push_back(int(p.size()));
        for (int k = 0; k < kMaxModelParams; ++k) params.push_back(k < int(p.size()) ? p[std::size_t(k)] : NAN);
      }
      w.texts(g, "name", name);
      w.doubles(g, "ra_rad", ra);
      w.doubles(g, "dec_rad", dec);
      w.texts(g, "model", model);
      w.doubles(g, "diameter_rad", diam);
      w.ints(g, "diameter_estimated", est);
      w.texts(g, "diameter_note", note);
      w.doubles(g, "priority", prio);
      w.doubles(g, "goal_fraction", goal);
      w.doubles(g, "predicted_sigma_theta_fraction", pred);
      w.ints(g, "scheduled", sched);
      w.doubles(g, "params", params, {plan.targets.size(), hsize_t(kMaxModelParams)});
      w.ints(g, "n_params", npar);
    }
    {
      Handle g(w.group(file, "blocks"), H5Gclose);
      w.attr_int(g, "count", int(plan.blocks.size()));
      const hsize_t np = plan.pairs.size();
      for (std::size_t b = 0; b < plan.blocks.size(); ++b) {
        const auto& blk = plan.blocks[b];
        char name[32];
        std::snprintf(name, sizeof name, "block_%04zu", b);
        Handle bg(w.group(g, name), H5Gclose);
        w.attr_text(bg, "target", blk.target);
        w.attr_int(bg, "target_index", blk.target_index);
        w.attr(bg, "start_mjd_utc", blk.start_mjd_utc);
        w.attr(bg, "end_mjd_utc", blk.end_mjd_utc);
        w.attr(bg, "overhead_s", blk.overhead_s);
        const hsize_t ns = blk.samples();
        w.doubles(bg, "mjd_utc", blk.mjd_utc);
        w.doubles(bg, "exposure_s", blk.exposure_s);
        w.doubles(bg, "u_m", blk.u_m, {np, ns});
        w.doubles(bg, "v_m", blk.v_m, {np, ns});
        w.doubles(bg, "w_m", blk.w_m, {np, ns});
        w.doubles(bg, "vis2", blk.vis2, {np, ns});
        w.doubles(bg, "sigma_vis2", blk.sigma_vis2, {np, ns});
        w.data(bg, "usable", H5T_NATIVE_UINT8, H5T_NATIVE_UINT8, blk.usable.data(), {np, ns});
      }
    }
  }
  out.commit();
}

PlanFile read_plan_h5(const std::filesystem::path& path) {
  hdf5::Quiet quiet;
  Reader r{path.string()};
  if (!std::filesystem::exists(path)) throw InputError(path.string(), "file not found", "check the path");
  if (H5Fis_hdf5(path.c_str()) <= 0) r.fail("not an HDF5 file");
  Handle file(H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose);
  if (!file.ok()) r.fail("cannot open");
  if (r.attr_text(file, "format") != "siiplan-plan") r.fail("attribute 'format' is not 'siiplan-plan'");
  int version = r.attr_int(file, "format_version");
  if (version != kPlanFormatVersion)
    r.fail("format_version " + std::to_string(version) + " (this siiplan reads " + std::to_string(kPlanFormatVersion) + ")");
  PlanFile plan;
  plan.date = r.attr_text(file, "date");
  plan.night_start_mjd_utc = r.attr(file, "night_start_mjd_utc");
  plan.night_end_mjd_utc = r.attr(file, "night_end_mjd_utc");
  plan.slot_s = r.attr(file, "slot_s");
  plan.siiplan_version = r.attr_text(file, "siiplan_version");
  {
    Handle g(r.open_group(file, "site"), H5Gclose);
    auto& s = plan.site;
    s.name = r.attr_text(g, "name");
    s.lat_rad = r.attr(g, "lat_rad");
    s.lon_east_rad = r.attr(g, "lon_east_rad");
    s.height_m = r.attr(g, "height_m");
    s.pressure_hpa = r.attr(g, "pressure_hpa");
    s.temperature_c = r.attr(g, "temperature_c");
    s.humidity = r.attr(g, "humidity");
    s.dut1_s = r.attr(g, "dut1_s");
    s.utc_offset_h = r.attr(g, "utc_offset_h");
    s.min_altitude_rad = r.attr(g, "min_altitude_rad");
    auto k = r.attr_doubles(g, "extinction_mag_per_airmass");
    if (k.size() != std::size_t(astro::kBandCount)) r.fail("site extinction_mag_per_airmass needs 5 values");
    for (int b = 0; b < astro::kBandCount; ++b) s.extinction_mag_per_airmass[std::size_t(b)] = k[std::size_t(b)];
  }
  {
    Handle g(r.open_group(file, "array"), H5Gclose);
    hsize_t n = r.length(g, "name");
    auto name = r.texts(g, "name", n);
    auto e = r.doubles(g, "east_m", n), no = r.doubles(g, "north_m", n), u = r.doubles(g, "up_m", n);
    auto d = r.doubles(g, "diameter_m", n), a = r.doubles(g, "area_m2", n), m = r.doubles(g, "min_altitude_rad", n);
    for (hsize_t i = 0; i < n; ++i)
      plan.telescopes.push_back(astro::Telescope{name[i], e[i], no[i], u[i], d[i], a[i], m[i]});
    hsize_t np2 = r.length(g, "pairs");
    auto ij = r.ints(g, "pairs", np2);
    for (hsize_t k = 0; k + 1 < np2; k += 2) {
      if (ij[k] < 0 || ij[k + 1] < 0 || hsize_t(ij[k]) >= n || hsize_t(ij[k + 1]) >= n) r.fail("array/pairs index out of range");
      plan.pairs.push_back({ij[k], ij[k + 1]});
    }
  }
  {
    Handle g(r.open_group(file, "instrument"), H5Gclose);
    auto& in = plan.instrument;
    in.mode = r.attr_text(g, "mode") == "analog" ? astro::DetectionMode::Analog : astro::DetectionMode::PhotonCounting;
    in.lambda_m = r.attr(g, "lambda_m");
    in.bandwidth_m = r.attr(g, "bandwidth_m");
    in.profile = r.attr_text(g, "profile") == "top-hat" ? astro::FilterProfile::TopHat : astro::FilterProfile::Gaussian;
    in.efficiency = r.attr(g, "efficiency");
    in.electronic_bandwidth_hz = r.attr(g, "electronic_bandwidth_hz");
    in.timing_fwhm_s = r.attr(g, "timing_fwhm_s");
    in.excess_noise = r.attr(g, "excess_noise");
    in.correlator_efficiency = r.attr(g, "correlator_efficiency");
    in.channels = r.attr_int(g, "channels");
    in.fov_rad = r.attr(g, "fov_rad");
    in.max_rate_hz = r.attr(g, "max_rate_hz");
    in.dark_rate_hz = r.attr(g, "dark_rate_hz");
    in.zero_baseline = r.attr_text(g, "zero_baseline") == "free" ? astro::ZeroBaseline::Free : astro::ZeroBaseline::Calibrated;
    if (!astro::band_from_name(r.attr_text(g, "band"), in.band)) r.fail("instrument band is not U, B, V, R or I");
  }
  {
    Handle g(r.open_group(file, "targets"), H5Gclose);
    hsize_t n = r.length(g, "name");
    auto name = r.texts(g, "name", n);
    auto ra = r.doubles(g, "ra_rad", n), dec = r.doubles(g, "dec_rad", n);
    auto model = r.texts(g, "model", n);
    auto est = r.ints(g, "diameter_estimated", n);
    auto note = r.texts(g, "diameter_note", n);
    auto prio = r.doubles(g, "priority", n), goal = r.doubles(g, "goal_fraction", n);
    auto pred = r.doubles(g, "predicted_sigma_theta_fraction", n);
    auto sched = r.ints(g, "scheduled", n);
    auto params = r.doubles(g, "params", n * kMaxModelParams);
    auto npar = r.ints(g, "n_params", n);
    for (hsize_t i = 0; i < n; ++i) {
      PlanTarget pt;
      auto& t = pt.target;
      t.name = name[i];
      t.position.ra_rad = ra[i];
      t.position.dec_rad = dec[i];
      auto kind = astro::model_from_name(model[i]);
      if (!kind) r.fail("unknown model '" + model[i] + "' for target '" + name[i] + "'");
      if (npar[i] < 1 || npar[i] > kMaxModelParams) r.fail("bad n_params for target '" + name[i] + "'");
      std::vector<double> p(params.begin() + std::ptrdiff_t(i * kMaxModelParams),
                            params.begin() + std::ptrdiff_t(i * kMaxModelParams + hsize_t(npar[i])));
      t.model = astro::Model(*kind, p);
      t.diameter_estimated = est[i] != 0;
      t.diameter_note = note[i];
      t.priority = prio[i];
      t.goal_fraction = goal[i];
      pt.predicted_sigma_theta_fraction = pred[i];
      pt.scheduled = sched[i] != 0;
      plan.targets.push_back(std::move(pt));
    }
  }
  {
    Handle g(r.open_group(file, "blocks"), H5Gclose);
    int count = r.attr_int(g, "count");
    const hsize_t np = plan.pairs.size();
    for (int b = 0; b < count; ++b) {
      char name[32];
      std::snprintf(name, sizeof name, "block_%04d", b);
      Handle bg(r.open_group(g, name), H5Gclose);
      PlanBlock blk;
      blk.target = r.attr_text(bg, "target");
      blk.target_index = r.attr_int(bg, "target_index");
      if (blk.target_index < 0 || std::size_t(blk.target_index) >= plan.targets.size())
        r.fail(std::string(name) + " target_index out of range");
      blk.start_mjd_utc = r.attr(bg, "start_mjd_utc");
      blk.end_mjd_utc = r.attr(bg, "end_mjd_utc");
      blk.overhead_s = r.attr(bg, "overhead_s");
      hsize_t ns = r.length(bg, "mjd_utc");
      blk.mjd_utc = r.doubles(bg, "mjd_utc", ns);
      blk.exposure_s = r.doubles(bg, "exposure_s", ns);
      blk.u_m = r.doubles(bg, "u_m", np * ns);
      blk.v_m = r.doubles(bg, "v_m", np * ns);
      blk.w_m = r.doubles(bg, "w_m", np * ns);
      blk.vis2 = r.doubles(bg, "vis2", np * ns);
      blk.sigma_vis2 = r.doubles(bg, "sigma_vis2", np * ns);
      blk.usable = r.numbers<std::uint8_t>(bg, "usable", np * ns, H5T_NATIVE_UINT8);
      plan.blocks.push_back(std::move(blk));
    }
  }
  return plan;
}

}  // namespace siiplan::io
