// Correlation data file writer and reader (layout in io/correlation_h5.hpp), HDF5 C API.
#include "io/correlation_h5.hpp"

#include <hdf5.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstring>

#include "astro/errors.hpp"
#include "io/hdf5_output.hpp"
#include "io/hdf5_util.hpp"

namespace siiplan::io {
namespace {

using astro::CorrelationRun;
using astro::CorrelationSet;

using hdf5::Id;
using hdf5::Quiet;
using hdf5::text_type;
using hdf5::Writer;

// Reading: every failure is an InputError naming the file and the object path.
struct Reader {
  std::string file;
  [[noreturn]] void fail(const std::string& where, const std::string& what) const {
    throw InputError(file, where + ": " + what,
                     "the file is not a complete siiplan correlation file; write it again with 'siiplan simulate' "
                     "or fix the named object");
  }
  bool has_attr(hid_t obj, const char* name) const { return H5Aexists(obj, name) > 0; }
  std::vector<double> attr_doubles(hid_t obj, const std::string& where, const char* name, hssize_t expected) const {
    if (!has_attr(obj, name)) fail(where, std::string("missing attribute '") + name + "'");
    Id a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    Id space(H5Aget_space(a), H5Sclose);
    hssize_t n = H5Sget_simple_extent_npoints(space);
    if (n != expected) fail(where, std::string("attribute '") + name + "' has " + std::to_string(n) + " values, expected " + std::to_string(expected));
    std::vector<double> v(static_cast<std::size_t>(n));
    if (H5Aread(a, H5T_NATIVE_DOUBLE, v.data()) < 0) fail(where, std::string("attribute '") + name + "' is not a number");
    return v;
  }
  double attr(hid_t obj, const std::string& where, const char* name) const { return attr_doubles(obj, where, name, 1)[0]; }
  double finite_attr(hid_t obj, const std::string& where, const char* name) const {
    double v = attr(obj, where, name);
    if (!std::isfinite(v)) fail(where, std::string("attribute '") + name + "' is not finite");
    return v;
  }
  double optional_attr(hid_t obj, const std::string& where, const char* name) const {
    return has_attr(obj, name) ? attr(obj, where, name) : NAN;
  }
  int attr_int(hid_t obj, const std::string& where, const char* name) const {
    if (!has_attr(obj, name)) fail(where, std::string("missing attribute '") + name + "'");
    Id a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    int v = 0;
    if (H5Aread(a, H5T_NATIVE_INT, &v) < 0) fail(where, std::string("attribute '") + name + "' is not an integer");
    return v;
  }
  std::string attr_text(hid_t obj, const std::string& where, const char* name) const {
    if (!has_attr(obj, name)) fail(where, std::string("missing attribute '") + name + "'");
    Id a(H5Aopen(obj, name, H5P_DEFAULT), H5Aclose);
    Id ftype(H5Aget_type(a), H5Tclose);
    if (H5Tget_class(ftype) != H5T_STRING) fail(where, std::string("attribute '") + name + "' is not text");
    if (H5Tis_variable_str(ftype) > 0) {
      Id type(text_type(), H5Tclose);
      char* p = nullptr;
      if (H5Aread(a, type, &p) < 0 || !p) fail(where, std::string("attribute '") + name + "' cannot be read");
      std::string s(p);
      H5free_memory(p);
      return s;
    }
    std::size_t n = H5Tget_size(ftype);
    if (!hdf5::fits_in_file(a, n, 1)) fail(where, std::string("attribute '") + name + "' claims more text than the file holds");
    std::string s(n, '\0');
    Id type(H5Tcopy(H5T_C_S1), H5Tclose);
    H5Tset_size(type, n);
    if (H5Aread(a, type, s.data()) < 0) fail(where, std::string("attribute '") + name + "' cannot be read");
    s.resize(std::strlen(s.c_str()));
    return s;
  }
  hid_t group(hid_t parent, const std::string& where, const std::string& name) const {
    if (H5Lexists(parent, name.c_str(), H5P_DEFAULT) <= 0) fail(where, "missing group '" + name + "'");
    hid_t g = H5Gopen2(parent, name.c_str(), H5P_DEFAULT);
    if (g < 0) fail(where, "'" + name + "' is not a group");
    return g;
  }
  // Reads a dataset of the given shape.
  template <class T>
  std::vector<T> data(hid_t parent, const std::string& where, const char* name, hid_t mem_type,
                      std::vector<hsize_t> shape_or_empty, std::vector<hsize_t>* shape_out = nullptr) const {
    if (H5Lexists(parent, name, H5P_DEFAULT) <= 0) fail(where, std::string("missing dataset '") + name + "'");
    Id d(H5Dopen2(parent, name, H5P_DEFAULT), H5Dclose);
    if (!d.ok()) fail(where, std::string("'") + name + "' is not a dataset");
    Id space(H5Dget_space(d), H5Sclose);
    int rank = H5Sget_simple_extent_ndims(space);
    std::vector<hsize_t> dims(std::size_t(std::max(rank, 0)));
    if (rank > 0) H5Sget_simple_extent_dims(space, dims.data(), nullptr);
    if (!shape_or_empty.empty() && dims != shape_or_empty) {
      std::string want, got;
      for (auto x : shape_or_empty) want += (want.empty() ? "" : " x ") + std::to_string(x);
      for (auto x : dims) got += (got.empty() ? "" : " x ") + std::to_string(x);
      fail(where, std::string("dataset '") + name + "' has shape " + (got.empty() ? "scalar" : got) + ", expected " + want);
    }
    if (shape_out) *shape_out = dims;
    hssize_t points = H5Sget_simple_extent_npoints(space);
    const hsize_t n = hsize_t(std::max<hssize_t>(points, 0));
    if (points < 0 || !hdf5::fits_in_file(d, n, sizeof(T)))
      fail(where, std::string("dataset '") + name + "' claims more values than the file holds");
    std::vector<T> v(n);
    if (n > 0 && H5Dread(d, mem_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data()) < 0)
      fail(where, std::string("dataset '") + name + "' cannot be read (truncated or corrupted file?)");
    return v;
  }
};

const char* mode_name(astro::DetectionMode m) { return m == astro::DetectionMode::Analog ? "analog" : "photon-counting"; }
const char* profile_name(astro::FilterProfile p) { return p == astro::FilterProfile::TopHat ? "top-hat" : "gaussian"; }

std::string run_name(std::size_t i) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "run_%04zu", i);
  return buf;
}

}  // namespace

void write_correlation_h5(const std::filesystem::path& path, const CorrelationSet& set) {
  Quiet quiet;
  Hdf5MemoryFile out(path);
  Writer w{path.string(), out.group_properties(), out.dataset_properties()};
  {
    const hid_t file = out.id();
    w.attr_text(file, "format", "siiplan-correlation");
    w.attr_int(file, "format_version", kCorrelationFormatVersion);
    w.attr_text(file, "creator", set.creator);
    {
      Id g(H5Gcreate2(file, "site", H5P_DEFAULT, out.group_properties(), H5P_DEFAULT), H5Gclose);
      w.check(g.ok(), "/site");
      w.attr_text(g, "name", set.site.name);
      w.attr(g, "lat_rad", set.site.lat_rad);
      w.attr(g, "lon_east_rad", set.site.lon_east_rad);
      w.attr(g, "height_m", set.site.height_m);
      w.attr(g, "dut1_s", set.site.dut1_s);
    }
    Id runs(H5Gcreate2(file, "runs", H5P_DEFAULT, out.group_properties(), H5P_DEFAULT), H5Gclose);
    w.check(runs.ok(), "/runs");
    w.attr_int(runs, "count", int(set.runs.size()));
    for (std::size_t i = 0; i < set.runs.size(); ++i) {
      const CorrelationRun& r = set.runs[i];
      const auto& m = r.meta;
      Id g(H5Gcreate2(runs, run_name(i).c_str(), H5P_DEFAULT, out.group_properties(), H5P_DEFAULT), H5Gclose);
      w.check(g.ok(), "/runs/" + run_name(i));
      w.attr_text(g, "telescope_1", m.telescope_1.name);
      w.attr_text(g, "telescope_2", m.telescope_2.name);
      double e1[3] = {m.telescope_1.east_m, m.telescope_1.north_m, m.telescope_1.up_m};
      double e2[3] = {m.telescope_2.east_m, m.telescope_2.north_m, m.telescope_2.up_m};
      w.attr(g, "telescope_1_enu_m", e1, 3);
      w.attr(g, "telescope_2_enu_m", e2, 3);
      w.attr(g, "telescope_1_diameter_m", m.telescope_1.diameter_m);
      w.attr(g, "telescope_2_diameter_m", m.telescope_2.diameter_m);
      w.attr_text(g, "target", m.target_name);
      w.attr(g, "target_ra_rad", m.target_position.ra_rad);
      w.attr(g, "target_dec_rad", m.target_position.dec_rad);
      w.attr(g, "lambda_m", m.lambda_m);
      w.attr(g, "bandwidth_m", m.bandwidth_m);
      w.attr_text(g, "filter_profile", profile_name(m.profile));
      w.attr(g, "timing_fwhm_s", m.timing_fwhm_s);
      w.attr_text(g, "detection_mode", mode_name(m.mode));
      w.attr_int(g, "delay_tracked_online", m.delay_tracked_online ? 1 : 0);
      w.attr(g, "frame_s", r.frame_s);
      w.attr(g, "background_1_hz", m.background_1_hz);
      w.attr(g, "background_2_hz", m.background_2_hz);
      if (std::isfinite(m.zero_baseline_s)) {
        w.attr(g, "zero_baseline_s", m.zero_baseline_s);
        w.attr(g, "zero_baseline_err_s", std::isfinite(m.zero_baseline_err_s) ? m.zero_baseline_err_s : 0.0);
      }
      if (std::isfinite(m.expected_diameter_rad)) w.attr(g, "expected_diameter_rad", m.expected_diameter_rad);
      const hsize_t nf = r.frames(), nb = hsize_t(r.delay.bins);
      w.data(g, "frame_start_mjd", H5T_IEEE_F64LE, H5T_NATIVE_DOUBLE, r.frame_start_mjd.data(), {nf});
      std::vector<double> delay(nb);
      for (hsize_t k = 0; k < nb; ++k) delay[k] = r.delay.center_s(int(k));
      w.data(g, "delay_s", H5T_IEEE_F64LE, H5T_NATIVE_DOUBLE, delay.data(), {nb});
      w.data(g, "correlation", H5T_IEEE_F32LE, H5T_NATIVE_FLOAT, r.correlation.data(), {nf, nb});
      std::vector<double> rates(2 * nf);
      for (hsize_t f = 0; f < nf; ++f) {
        rates[2 * f] = r.rate_1_hz[f];
        rates[2 * f + 1] = r.rate_2_hz[f];
      }
      w.data(g, "rate_hz", H5T_IEEE_F64LE, H5T_NATIVE_DOUBLE, rates.data(), {nf, 2});
    }
  }
  out.commit();
}

CorrelationSet read_correlation_h5(const std::filesystem::path& path) {
  Quiet quiet;
  const std::string name = path.string();
  if (!std::filesystem::is_regular_file(path)) throw InputError(name, "file not found", "check the path");
  if (H5Fis_hdf5(path.c_str()) <= 0)
    throw InputError(name, "not an HDF5 file (or its header is damaged)", "give a correlation file written by 'siiplan simulate'");
  Id file(H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose);
  if (!file.ok())
    throw InputError(name, "HDF5 cannot open the file: it is truncated or corrupted", "copy or write it again");
  Reader r{name};
  if (!r.has_attr(file, "format") || r.attr_text(file, "/", "format") != "siiplan-correlation")
    throw InputError(name, "an HDF5 file, but not a siiplan correlation file (no format = 'siiplan-correlation' attribute on /)",
                     "give a file written by 'siiplan simulate' or in the layout of the README");
  int version = r.attr_int(file, "/", "format_version");
  if (version != kCorrelationFormatVersion)
    r.fail("/", "format_version " + std::to_string(version) + " (this siiplan reads " + std::to_string(kCorrelationFormatVersion) + ")");
  CorrelationSet set;
  set.creator = r.attr_text(file, "/", "creator");
  {
    Id g(r.group(file, "/", "site"), H5Gclose);
    set.site.name = r.attr_text(g, "/site", "name");
    set.site.lat_rad = r.finite_attr(g, "/site", "lat_rad");
    set.site.lon_east_rad = r.finite_attr(g, "/site", "lon_east_rad");
    set.site.height_m = r.finite_attr(g, "/site", "height_m");
    set.site.dut1_s = r.finite_attr(g, "/site", "dut1_s");
  }
  Id runs(r.group(file, "/", "runs"), H5Gclose);
  int count = r.attr_int(runs, "/runs", "count");
  if (count < 0) r.fail("/runs", "negative count");
  for (int i = 0; i < count; ++i) {
    const std::string where = "/runs/" + run_name(std::size_t(i));
    Id g(r.group(runs, "/runs", run_name(std::size_t(i))), H5Gclose);
    CorrelationRun run;
    auto& m = run.meta;
    m.telescope_1.name = r.attr_text(g, where, "telescope_1");
    m.telescope_2.name = r.attr_text(g, where, "telescope_2");
    auto e1 = r.attr_doubles(g, where, "telescope_1_enu_m", 3), e2 = r.attr_doubles(g, where, "telescope_2_enu_m", 3);
    m.telescope_1.east_m = e1[0], m.telescope_1.north_m = e1[1], m.telescope_1.up_m = e1[2];
    m.telescope_2.east_m = e2[0], m.telescope_2.north_m = e2[1], m.telescope_2.up_m = e2[2];
    m.telescope_1.diameter_m = r.finite_attr(g, where, "telescope_1_diameter_m");
    m.telescope_2.diameter_m = r.finite_attr(g, where, "telescope_2_diameter_m");
    m.target_name = r.attr_text(g, where, "target");
    m.target_position.ra_rad = r.finite_attr(g, where, "target_ra_rad");
    m.target_position.dec_rad = r.finite_attr(g, where, "target_dec_rad");
    m.lambda_m = r.finite_attr(g, where, "lambda_m");
    m.bandwidth_m = r.finite_attr(g, where, "bandwidth_m");
    std::string profile = r.attr_text(g, where, "filter_profile");
    if (profile != "top-hat" && profile != "gaussian") r.fail(where, "filter_profile '" + profile + "' is not top-hat or gaussian");
    m.profile = profile == "top-hat" ? astro::FilterProfile::TopHat : astro::FilterProfile::Gaussian;
    m.timing_fwhm_s = r.finite_attr(g, where, "timing_fwhm_s");
    std::string mode = r.attr_text(g, where, "detection_mode");
    if (mode != "analog" && mode != "photon-counting") r.fail(where, "detection_mode '" + mode + "' is not analog or photon-counting");
    m.mode = mode == "analog" ? astro::DetectionMode::Analog : astro::DetectionMode::PhotonCounting;
    m.delay_tracked_online = r.attr_int(g, where, "delay_tracked_online") != 0;
    run.frame_s = r.finite_attr(g, where, "frame_s");
    m.background_1_hz = r.finite_attr(g, where, "background_1_hz");
    m.background_2_hz = r.finite_attr(g, where, "background_2_hz");
    m.zero_baseline_s = r.optional_attr(g, where, "zero_baseline_s");
    m.zero_baseline_err_s = r.optional_attr(g, where, "zero_baseline_err_s");
    m.expected_diameter_rad = r.optional_attr(g, where, "expected_diameter_rad");
    if (!(m.lambda_m > 0) || !(m.timing_fwhm_s > 0) || !(run.frame_s > 0))
      r.fail(where, "lambda_m, timing_fwhm_s and frame_s must be > 0");

    std::vector<hsize_t> shape;
    run.frame_start_mjd = r.data<double>(g, where, "frame_start_mjd", H5T_NATIVE_DOUBLE, {}, &shape);
    if (shape.size() != 1) r.fail(where, "dataset 'frame_start_mjd' must be one-dimensional");
    const hsize_t nf = shape[0];
    auto delay = r.data<double>(g, where, "delay_s", H5T_NATIVE_DOUBLE, {}, &shape);
    if (shape.size() != 1 || delay.size() < 2) r.fail(where, "dataset 'delay_s' must be one-dimensional with >= 2 bins");
    const hsize_t nb = shape[0];
    const double step = (delay.back() - delay.front()) / double(nb - 1);
    for (hsize_t k = 0; k < nb; ++k)
      if (!(step > 0) || std::fabs(delay[k] - (delay.front() + double(k) * step)) > 1e-6 * step)
        r.fail(where, "dataset 'delay_s' is not uniformly spaced and increasing");
    run.delay = astro::DelayAxis{delay.front(), step, int(nb)};
    run.correlation = r.data<float>(g, where, "correlation", H5T_NATIVE_FLOAT, {nf, nb});
    auto rates = r.data<double>(g, where, "rate_hz", H5T_NATIVE_DOUBLE, {nf, 2});
    run.rate_1_hz.resize(nf);
    run.rate_2_hz.resize(nf);
    for (hsize_t f = 0; f < nf; ++f) {
      run.rate_1_hz[f] = rates[2 * f];
      run.rate_2_hz[f] = rates[2 * f + 1];
      if (f > 0 && !(run.frame_start_mjd[f] > run.frame_start_mjd[f - 1]))
        r.fail(where, "dataset 'frame_start_mjd' is not increasing at frame " + std::to_string(f));
    }
    set.runs.push_back(std::move(run));
  }
  return set;
}

}  // namespace siiplan::io
