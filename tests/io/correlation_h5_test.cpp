// The correlation data file: round trip, a file written by another program (h5py), and bad files.
#include "io/correlation_h5.hpp"

#include <doctest/doctest.h>
#include <hdf5.h>

#include <filesystem>

#include "astro/errors.hpp"
#include "astro/reduction.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"

using namespace siiplan;
using siiplan::test::check_close;
namespace fs = std::filesystem;

namespace {

std::string message_of(const fs::path& path) {
  try {
    io::read_correlation_h5(path);
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

astro::CorrelationSet small_set() {
  astro::CorrelationSet set;
  set.creator = "test";
  set.site.name = "s";
  set.site.lat_rad = 0.6;
  set.site.lon_east_rad = -1.9;
  set.site.height_m = 2000;
  astro::CorrelationRun r;
  r.meta.telescope_1 = astro::Telescope{"A", 1, 2, 3, 4, 0, NAN};
  r.meta.telescope_2 = astro::Telescope{"B", 5, 6, 7, 8, 0, NAN};
  r.meta.target_name = "star";
  r.meta.target_position = {1.0, -0.5, 0, 0};
  r.meta.lambda_m = 420e-9;
  r.meta.bandwidth_m = 1e-9;
  r.meta.timing_fwhm_s = 5e-10;
  r.meta.delay_tracked_online = false;
  r.meta.background_1_hz = 12;
  r.meta.background_2_hz = 34;
  r.meta.zero_baseline_s = 2.9e-13;
  r.meta.zero_baseline_err_s = 1e-15;
  r.frame_s = 2;
  r.frame_start_mjd = {61000.1, 61000.1 + 2 / 86400.0, 61000.1 + 4 / 86400.0};
  r.delay = astro::DelayAxis{-2e-9, 1.25e-10, 32};
  for (int i = 0; i < 3 * 32; ++i) r.correlation.push_back(float(i) * 1e-5f);
  r.rate_1_hz = {1e6, 2e6, 3e6};
  r.rate_2_hz = {4e6, 5e6, 6e6};
  set.runs.push_back(r);
  return set;
}

// A valid correlation file in the temporary directory, then the HDF5 C API replaces run 0's dataset
// `name` with a one-dimensional double dataset of n values (written from `values` unless null).
fs::path with_dataset_replaced(const char* file, const char* name, hsize_t n, hid_t dcpl, const double* values) {
  const fs::path path = fs::temp_directory_path() / file;
  io::write_correlation_h5(path, small_set());
  const std::string object = std::string("/runs/run_0000/") + name;
  hid_t f = H5Fopen(path.c_str(), H5F_ACC_RDWR, H5P_DEFAULT);
  REQUIRE(f >= 0);
  H5Ldelete(f, object.c_str(), H5P_DEFAULT);
  hid_t space = H5Screate_simple(1, &n, nullptr);
  hid_t d = H5Dcreate2(f, object.c_str(), H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, dcpl, H5P_DEFAULT);
  REQUIRE(d >= 0);
  if (values) H5Dwrite(d, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values);
  H5Dclose(d);
  H5Sclose(space);
  H5Fclose(f);
  return path;
}

}  // namespace

TEST_SUITE("io/correlation_h5") {

TEST_CASE("write then read gives back every field") {
  const fs::path path = fs::temp_directory_path() / "siiplan_corr_roundtrip.h5";
  const auto set = small_set();
  io::write_correlation_h5(path, set);
  const auto back = io::read_correlation_h5(path);
  REQUIRE(back.runs.size() == 1);
  const auto &a = set.runs[0], &b = back.runs[0];
  CHECK(back.site.name == "s");
  CHECK(back.site.lat_rad == set.site.lat_rad);
  CHECK(b.meta.telescope_2.name == "B");
  CHECK(b.meta.telescope_2.up_m == 7);
  CHECK(b.meta.telescope_1.diameter_m == 4);
  CHECK(b.meta.target_position.dec_rad == -0.5);
  CHECK_FALSE(b.meta.delay_tracked_online);
  CHECK(b.meta.background_2_hz == 34);
  CHECK(b.meta.zero_baseline_err_s == 1e-15);
  CHECK(std::isnan(b.meta.expected_diameter_rad));
  CHECK(b.frame_start_mjd == a.frame_start_mjd);
  check_close(b.delay.start_s, a.delay.start_s, 0, 1e-24, "delay start");
  check_close(b.delay.step_s, a.delay.step_s, 1e-12, 0, "delay step");
  CHECK(b.delay.bins == 32);
  CHECK(b.correlation == a.correlation);
  CHECK(b.rate_2_hz == a.rate_2_hz);
  // Nothing but the file itself is left in the directory (atomic write).
  for (const auto& e : fs::directory_iterator(fs::temp_directory_path()))
    CHECK(e.path().filename().string().find("siiplan_corr_roundtrip.h5.") == std::string::npos);
  fs::remove(path);
}

TEST_CASE("a file written with h5py in the documented layout is read and reduces to |V|^2 = 1") {
  // tests/data/corr_h5py.h5: written by scripts/make_correlation_fixtures.py (h5py), a noiseless peak
  // of the zero-baseline area: |V|^2 = 1 up to float32 rounding.
  const auto set = io::read_correlation_h5(fs::path(SIIPLAN_TEST_DATA_DIR) / "corr_h5py.h5");
  REQUIRE(set.runs.size() == 1);
  CHECK(set.runs[0].meta.target_name == "fixture star");
  astro::ReduceOptions ro;
  ro.chunk_s = 100;
  const auto red = astro::reduce_correlations(set, ro, astro::ZeroBaselineSpec{});
  REQUIRE(red.points.size() == 4);
  for (const auto& p : red.points) check_close(p.vis2, 1.0, 1e-5, 0, "noiseless |V|^2");
}

TEST_CASE("bad files are InputErrors that name the problem") {
  const fs::path data = SIIPLAN_TEST_DATA_DIR;
  CHECK(message_of(data / "not_hdf5.h5").find("not an HDF5 file") != std::string::npos);
  CHECK(message_of(data / "corr_truncated.h5").find("truncated or corrupted") != std::string::npos);
  CHECK(message_of(data / "foreign.h5").find("not a siiplan correlation file") != std::string::npos);
  CHECK(message_of(data / "corr_missing_target.h5").find("/runs/run_0000: missing attribute 'target'") != std::string::npos);
  CHECK(message_of(data / "no_such_file.h5").find("file not found") != std::string::npos);
}

TEST_CASE("a dataset with the wrong shape is named") {
  // The valid layout, then 'rate_hz' rewritten with one column.
  const double v[3] = {1, 2, 3};
  const fs::path path = with_dataset_replaced("siiplan_corr_badshape.h5", "rate_hz", 3, H5P_DEFAULT, v);
  CHECK(message_of(path).find("/runs/run_0000: dataset 'rate_hz' has shape 3, expected 3 x 2") != std::string::npos);
  fs::remove(path);
}

TEST_CASE("a dataset that claims more values than the file holds is refused before any allocation") {
  // Fuzz regression: a damaged header made the reader allocate gigabytes. Here 'delay_s' is rewritten as
  // a chunked dataset of 4e9 values with no chunk written (HDF5 would return its fill value): 32 GB for a
  // file of a few kB.
  hid_t dcpl = H5Pcreate(H5P_DATASET_CREATE);
  const hsize_t chunk[1] = {1024};
  H5Pset_chunk(dcpl, 1, chunk);
  const fs::path path = with_dataset_replaced("siiplan_corr_huge.h5", "delay_s", 4000000000ULL, dcpl, nullptr);
  H5Pclose(dcpl);
  REQUIRE(fs::file_size(path) < 100000);
  CHECK(message_of(path).find("/runs/run_0000: dataset 'delay_s' claims more values than the file holds") != std::string::npos);
  fs::remove(path);
}

}  // TEST_SUITE
