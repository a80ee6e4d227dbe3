// Tests of io/oifits and io/vis2_csv: files written by an independent writer (astropy.io.fits, by
// scripts/make_ref_oifits.py) read correctly, bad files rejected with the HDU/column named, and
// write/read round trips (OIFITS and CSV -> OIFITS -> CSV) that are the identity.
#include "io/oifits.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <functional>
#include <random>
#include <sstream>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/vis2_csv.hpp"
#include "support/close.hpp"

using namespace siiplan;
using siiplan::test::check_close;
namespace fs = std::filesystem;

namespace {

fs::path data_file(const char* name) { return fs::path(SIIPLAN_TEST_DATA_DIR) / name; }

// A fresh scratch directory per test case.
fs::path scratch(const std::string& tag) {
  fs::path p = fs::temp_directory_path() / ("siiplan_oifits_test_" + tag + "_" + std::to_string(std::random_device{}()));
  fs::create_directories(p);
  return p;
}

std::string message_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no InputError)";
}

std::string csv_text(const io::Vis2Data& d) {
  std::ostringstream s;
  io::write_vis2_csv(s, d);
  return s.str();
}

void check_same(const io::Vis2Data& a, const io::Vis2Data& b) {
  REQUIRE(a.records.size() == b.records.size());
  REQUIRE(a.targets.size() == b.targets.size());
  REQUIRE(a.instruments.size() == b.instruments.size());
  REQUIRE(a.array.stations.size() == b.array.stations.size());
  for (std::size_t i = 0; i < a.targets.size(); ++i) {
    CHECK(a.targets[i].name == b.targets[i].name);
    CHECK(a.targets[i].id == b.targets[i].id);
    CHECK(a.targets[i].category == b.targets[i].category);
    if (std::isfinite(a.targets[i].position.ra_rad)) {
      check_close(b.targets[i].position.ra_rad, a.targets[i].position.ra_rad, 1e-15, 0, "RA");
      check_close(b.targets[i].position.dec_rad, a.targets[i].position.dec_rad, 1e-15, 0, "Dec");
    } else {
      CHECK(std::isnan(b.targets[i].position.ra_rad));
    }
  }
  for (std::size_t i = 0; i < a.array.stations.size(); ++i) {
    const auto &x = a.array.stations[i], &y = b.array.stations[i];
    CHECK(x.index == y.index);
    CHECK(x.tel_name == y.tel_name);
    CHECK(x.sta_name == y.sta_name);
    CHECK((x.diameter_m == y.diameter_m || (std::isnan(x.diameter_m) && std::isnan(y.diameter_m))));
    CHECK(x.xyz_m == y.xyz_m);
  }
  for (std::size_t i = 0; i < a.instruments.size(); ++i) {
    CHECK(a.instruments[i].name == b.instruments[i].name);
    REQUIRE(a.instruments[i].channels.size() == b.instruments[i].channels.size());
    for (std::size_t k = 0; k < a.instruments[i].channels.size(); ++k) {
      CHECK(a.instruments[i].channels[k].eff_wave_m == b.instruments[i].channels[k].eff_wave_m);
      const double ba = a.instruments[i].channels[k].eff_band_m, bb = b.instruments[i].channels[k].eff_band_m;
      CHECK((ba == bb || (std::isnan(ba) && std::isnan(bb))));
    }
  }
  for (std::size_t i = 0; i < a.records.size(); ++i) {
    const auto &x = a.records[i], &y = b.records[i];
    CAPTURE(i);
    CHECK(x.target_id == y.target_id);
    CHECK(x.instrument == y.instrument);
    CHECK((x.mjd == y.mjd || (std::isnan(x.mjd) && std::isnan(y.mjd))));
    CHECK((x.int_time_s == y.int_time_s || (std::isnan(x.int_time_s) && std::isnan(y.int_time_s))));
    CHECK(x.u_m == y.u_m);
    CHECK(x.v_m == y.v_m);
    CHECK(x.stations == y.stations);
    CHECK(x.vis2 == y.vis2);
    CHECK(x.vis2_err == y.vis2_err);
    CHECK(x.flag == y.flag);
  }
}

}  // namespace

TEST_SUITE("io/oifits") {

TEST_CASE("an OIFITS v2 file written by astropy.io.fits is read correctly") {
  // Values as written by scripts/make_ref_oifits.py (ROWS and the table builders there).
  auto d = io::read_oifits(data_file("astropy_v2.oifits"));
  REQUIRE(d.targets.size() == 2);
  CHECK(d.targets[0].name == "ALPHA_TEST");
  CHECK(d.targets[1].category == "CAL");
  check_close(d.targets[0].position.ra_rad, 83.5 * astro::kDegToRad, 1e-15, 0, "RAEP0");
  check_close(d.targets[0].position.dec_rad, -5.5 * astro::kDegToRad, 1e-15, 0, "DECEP0");
  check_close(d.targets[0].position.pmdec_rad_per_yr, -2e-6 * astro::kDegToRad, 1e-15, 0, "PMDEC");
  CHECK(d.header.telescop == "TESTARRAY");
  CHECK(d.array.name == "TESTARRAY");
  REQUIRE(d.array.stations.size() == 3);
  CHECK(d.array.stations[2].tel_name == "TC");
  CHECK(d.array.stations[2].sta_name == "PADC");
  CHECK(d.array.stations[2].diameter_m == 6.5);  // float32 in the file, read through its shortest decimal
  CHECK(d.array.stations[1].xyz_m == std::array<double, 3>{30.0, -12.0, 1.5});
  CHECK(d.array.center_xyz_m == std::array<double, 3>{1000.0, 2000.0, 3000.0});
  REQUIRE(d.instruments.size() == 1);
  CHECK(d.instruments[0].name == "TESTSII_2CH");
  REQUIRE(d.instruments[0].channels.size() == 2);
  CHECK(d.instruments[0].channels[0].eff_wave_m == 440e-9);  // float32 440e-9 -> exactly the double 440e-9
  CHECK(d.instruments[0].channels[1].eff_band_m == 12e-9);
  REQUIRE(d.records.size() == 4);
  const auto& r1 = d.records[1];
  CHECK(r1.target_id == 1);
  CHECK(r1.mjd == 60310.30);
  CHECK(r1.int_time_s == 600.0);
  CHECK(r1.u_m == -45.0);
  CHECK(r1.v_m == 60.0);
  CHECK(r1.stations == std::array<int, 2>{1, 3});
  CHECK(r1.vis2 == std::vector<double>{0.35, -0.015});  // negative value kept
  CHECK(r1.vis2_err == std::vector<double>{0.03, 0.03});
  CHECK(d.records[2].flag == std::vector<bool>{false, true});
  CHECK(d.count_unflagged() == 7);

  auto beta = io::read_oifits(data_file("astropy_v2.oifits"), std::string("beta_test"));
  REQUIRE(beta.records.size() == 1);
  CHECK(beta.targets.size() == 1);
  CHECK(beta.records[0].vis2[0] == 0.95);
  CHECK(message_of([] { io::read_oifits(data_file("astropy_v2.oifits"), std::string("GAMMA")); })
            .find("ALPHA_TEST, BETA_TEST") != std::string::npos);
}

TEST_CASE("an OIFITS v1 file (no OI_ARRAY, TIME in seconds) is read") {
  auto d = io::read_oifits(data_file("astropy_v1.oifits"));
  REQUIRE(d.records.size() == 3);
  CHECK(d.records[0].vis2 == std::vector<double>{0.81, 0.77});
  CHECK(d.records[0].mjd == 60310.25);
  REQUIRE(d.array.stations.size() == 3);  // stations known only by index
  CHECK(d.array.find(3)->tel_name == "S3");
  CHECK(std::isnan(d.array.find(3)->diameter_m));
}

TEST_CASE("bad OIFITS files: the message names the problem, the HDU and the column") {
  CHECK(message_of([] { io::read_oifits(data_file("not_fits.fits")); }).find("not a FITS file") != std::string::npos);
  CHECK(message_of([] { io::read_oifits(data_file("astropy_no_vis2.oifits")); }).find("no OI_VIS2 table") !=
        std::string::npos);
  auto nwave = message_of([] { io::read_oifits(data_file("astropy_bad_nwave.oifits")); });
  CHECK(nwave.find("HDU 5 (OI_VIS2)") != std::string::npos);
  CHECK(nwave.find("column VIS2DATA holds 3 values per row where 2 are expected") != std::string::npos);
  auto type = message_of([] { io::read_oifits(data_file("astropy_bad_type.oifits")); });
  CHECK(type.find("column VIS2DATA has the wrong type") != std::string::npos);
  CHECK(message_of([] { io::read_oifits(data_file("astropy_all_flagged.oifits")); })
            .find("no unflagged squared visibilities") != std::string::npos);
  CHECK(message_of([] { io::read_oifits(data_file("missing.oifits")); }).find("no such file") != std::string::npos);
}

TEST_CASE("write_oifits then read_oifits is the identity") {
  auto original = io::read_oifits(data_file("astropy_v2.oifits"));
  // Unknown values survive too: a record without stations, an unknown MJD and bandwidth.
  original.records[3].stations.reset();
  original.records[3].mjd = NAN;
  original.instruments[0].channels[1].eff_band_m = NAN;
  auto dir = scratch("roundtrip");
  auto path = dir / "out.oifits";
  io::write_oifits(path, original);
  auto back = io::read_oifits(path);
  check_same(original, back);
  CHECK(back.header.telescop == original.header.telescop);
  // Nothing else is left in the directory (the temporary file was renamed).
  CHECK(std::distance(fs::directory_iterator(dir), fs::directory_iterator()) == 1);
  fs::remove_all(dir);
}

TEST_CASE("measurement CSV -> OIFITS -> CSV reproduces the CSV written from the original data") {
  auto dir = scratch("csv");
  auto csv = dir / "night.csv";
  std::ofstream(csv) << "# two filters, interleaved, one flagged row, one negative value\n"
                        "target,mjd,pair,u_m,v_m,wavelength_nm,bandwidth_nm,int_time_s,vis2,vis2_err,flag\n"
                        "Star A,60400.1,T1-T2,12.5,-3.25,443,10,600,0.91,0.02,0\n"
                        "Star A,60400.1,T1-T2,12.5,-3.25,520,12,600,0.935,0.02,0\n"
                        "Star A,60400.2,T2-T3,80,40.125,443,10,600,-0.012,0.03,0\n"
                        "Star B,60400.3,T1-T3,-7,9.5,443,10,,0.5,0.05,1\n"
                        "Star B,,T1-T3,60,0,443,10,,0.45,0.05,0\n";
  auto from_csv = io::read_vis2_csv(csv);
  CHECK(from_csv.records.size() == 5);
  CHECK(from_csv.instruments.size() == 2);
  CHECK(from_csv.array.stations.size() == 3);
  CHECK(from_csv.records[2].vis2[0] == -0.012);
  auto oifits = dir / "night.oifits";
  io::write_oifits(oifits, from_csv);
  auto back = io::read_oifits(oifits);
  CHECK(csv_text(back) == csv_text(from_csv));
  // And the CSV writer's output reads back to the same text.
  auto csv2 = dir / "again.csv";
  std::ofstream(csv2) << csv_text(from_csv);
  CHECK(csv_text(io::read_vis2_csv(csv2)) == csv_text(from_csv));
  fs::remove_all(dir);
}

TEST_CASE("baseline_m without pa_deg: lengths only, kept through CSV") {
  auto dir = scratch("len");
  auto csv = dir / "lengths.csv";
  std::ofstream(csv) << "baseline_m,wavelength_nm,vis2,vis2_err\n20,420,0.9,0.02\n40,420,0.6,0.02\n";
  auto d = io::read_vis2_csv(csv);
  CHECK(!d.position_angles_known);
  CHECK(d.records[1].v_m == 40);
  CHECK(d.targets[0].name == "lengths");  // the file's stem when there is no target column
  auto text = csv_text(d);
  CHECK(text.find(",,,40,,420,") != std::string::npos);  // u_m, v_m and pa_deg left empty
  fs::remove_all(dir);
}

TEST_CASE("bad measurement CSVs name file:line") {
  auto dir = scratch("bad");
  auto write = [&](const char* name, const char* text) {
    std::ofstream(dir / name) << text;
    return dir / name;
  };
  auto missing = write("missing.csv", "u_m,v_m,wavelength_nm,vis2\n1,2,443,0.5\n");
  CHECK(message_of([&] { io::read_vis2_csv(missing); }).find("missing column 'vis2_err'") != std::string::npos);
  auto no_baseline = write("nob.csv", "wavelength_nm,vis2,vis2_err\n443,0.5,0.1\n");
  CHECK(message_of([&] { io::read_vis2_csv(no_baseline); }).find("u_m") != std::string::npos);
  auto zero_err = write("zero.csv", "baseline_m,wavelength_nm,vis2,vis2_err\n10,443,0.5,0.1\n20,443,0.4,0\n");
  auto msg = message_of([&] { io::read_vis2_csv(zero_err); });
  CHECK(msg.find("zero.csv:3") != std::string::npos);
  CHECK(msg.find("vis2_err must be positive") != std::string::npos);
  auto flagged = write("flagged.csv", "baseline_m,wavelength_nm,vis2,vis2_err,flag\n10,443,0.5,0.1,1\n");
  CHECK(message_of([&] { io::read_vis2_csv(flagged); }).find("every measurement is flagged") != std::string::npos);
  auto bad_pair = write("pair.csv", "baseline_m,wavelength_nm,vis2,vis2_err,pair\n10,443,0.5,0.1,T1T2\n");
  CHECK(message_of([&] { io::read_vis2_csv(bad_pair); }).find("pair.csv:2") != std::string::npos);
  // Raw correlations cannot go into OIFITS VIS2DATA (models.md §6.5).
  auto raw = write("raw.csv", "baseline_m,wavelength_nm,correlation,correlation_err\n10,443,0.0005,0.0001\n");
  auto d = io::read_vis2_csv(raw, true);
  CHECK(d.raw_correlation);
  CHECK(message_of([&] { io::write_oifits(dir / "raw.oifits", d); }).find("raw correlations") != std::string::npos);
  CHECK(!fs::exists(dir / "raw.oifits"));
  fs::remove_all(dir);
}

}  // TEST_SUITE
