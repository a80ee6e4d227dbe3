#include "io/vis2_csv.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <map>
#include <ostream>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/csv.hpp"
#include "io/table.hpp"

namespace siiplan::io {

namespace fs = std::filesystem;

namespace {

std::string lower(std::string s) {
  for (auto& c : s) c = char(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

bool parse_flag(const std::string& text, const std::string& where) {
  std::string t = lower(text);
  if (t.empty() || t == "0" || t == "false" || t == "f" || t == "no") return false;
  if (t == "1" || t == "true" || t == "t" || t == "yes") return true;
  throw InputError(where, "flag '" + text + "' is not 0/1 or true/false", "write 1 for a bad measurement, 0 otherwise");
}

std::string instrument_name(double lambda_nm, double band_nm, std::size_t existing_with_same_wave) {
  std::string name = "SII_" + format_number(lambda_nm, 6) + "NM";
  if (existing_with_same_wave > 0) name += "_" + std::to_string(existing_with_same_wave + 1);
  (void)band_nm;
  return name;
}

}  // namespace

Vis2Data read_vis2_csv(const fs::path& path, bool raw_correlation) {
  CsvTable t = read_csv(path);
  const std::string value_hint = raw_correlation ? "with --raw give 'correlation' (or 'vis2') and its error"
                                                 : "give calibrated squared visibilities in 'vis2'";
  auto pick = [&](const char* raw_name, const char* name) {
    if (raw_correlation && t.find(raw_name)) return t.require(raw_name, value_hint);
    return t.require(name, value_hint);
  };
  std::size_t c_vis2 = pick("correlation", "vis2");
  std::size_t c_err = pick("correlation_err", "vis2_err");
  std::size_t c_wave = t.require("wavelength_nm", "give the effective wavelength of each measurement in nm");
  auto c_u = t.find("u_m"), c_v = t.find("v_m"), c_b = t.find("baseline_m"), c_pa = t.find("pa_deg");
  if (!(c_u && c_v) && !c_b)
    t.require(c_u ? "v_m" : "u_m", "give the projected baseline as u_m,v_m or as baseline_m (optionally with pa_deg)");
  auto c_mjd = t.find("mjd"), c_pair = t.find("pair"), c_target = t.find("target"), c_band = t.find("bandwidth_nm"),
       c_itime = t.find("int_time_s"), c_flag = t.find("flag");

  Vis2Data data;
  data.raw_correlation = raw_correlation;
  data.array.name = "SIIPLAN";
  std::map<std::string, int> target_ids, station_ids;
  std::map<std::pair<double, double>, int> instrument_ids;  // (wavelength, bandwidth) in nm; NaN band keyed as -1
  for (const auto& row : t.rows()) {
    const std::string where = t.where(row);
    Vis2Record rec;
    // target
    std::string target = c_target ? t.text(row, *c_target) : std::string();
    if (target.empty()) target = path.stem().string();
    auto [tit, new_target] = target_ids.emplace(target, int(target_ids.size()) + 1);
    if (new_target) {
      OiTarget tg;
      tg.id = tit->second;
      tg.name = target;
      data.targets.push_back(tg);
    }
    rec.target_id = tit->second;
    // baseline: u_m,v_m when both cells are filled, else baseline_m with pa_deg (when given)
    if (c_u && c_v && !t.text(row, *c_u).empty() && !t.text(row, *c_v).empty()) {
      rec.u_m = t.number(row, *c_u);
      rec.v_m = t.number(row, *c_v);
    } else {
      if (!c_b || t.text(row, *c_b).empty())
        throw InputError(where, "no projected baseline", "fill u_m and v_m, or baseline_m (optionally with pa_deg)");
      double b = t.number(row, *c_b);
      if (b < 0) throw InputError(where, "baseline_m is negative", "give the projected baseline length (>= 0)");
      bool has_pa = c_pa && !t.text(row, *c_pa).empty();
      if (!has_pa) data.position_angles_known = false;
      double pa = has_pa ? t.number(row, *c_pa) * astro::kDegToRad : 0.0;
      rec.u_m = b * std::sin(pa);  // PA from North through East: u (East) = B sin PA, v (North) = B cos PA
      rec.v_m = b * std::cos(pa);
    }
    // wavelength channel
    double lambda_nm = t.number(row, c_wave);
    if (!(lambda_nm > 0)) throw InputError(where, "wavelength_nm must be positive", "give the wavelength in nm");
    double band_nm = t.number_or(row, c_band, NAN);
    std::pair<double, double> key{lambda_nm, std::isnan(band_nm) ? -1.0 : band_nm};
    auto iit = instrument_ids.find(key);
    if (iit == instrument_ids.end()) {
      std::size_t same = std::count_if(instrument_ids.begin(), instrument_ids.end(),
                                       [&](const auto& kv) { return kv.first.first == lambda_nm; });
      OiInstrument ins{instrument_name(lambda_nm, band_nm, same), {{lambda_nm * astro::kNmToM, band_nm * astro::kNmToM}}};
      data.instruments.push_back(ins);
      iit = instrument_ids.emplace(key, int(data.instruments.size()) - 1).first;
    }
    rec.instrument = iit->second;
    // stations
    if (c_pair && !t.text(row, *c_pair).empty()) {
      const std::string& pair = t.text(row, *c_pair);
      auto dash = pair.find('-');
      if (dash == std::string::npos || dash == 0 || dash + 1 == pair.size() || pair.find('-', dash + 1) != std::string::npos)
        throw InputError(where, "pair '" + pair + "' is not of the form NAME-NAME", "write e.g. T1-T2");
      std::array<int, 2> st{};
      std::string names[2] = {pair.substr(0, dash), pair.substr(dash + 1)};
      for (int k = 0; k < 2; ++k) {
        auto [sit, added] = station_ids.emplace(names[k], int(station_ids.size()) + 1);
        if (added) {
          OiStation s;
          s.index = sit->second;
          s.tel_name = s.sta_name = names[k];
          data.array.stations.push_back(s);
        }
        st[k] = sit->second;
      }
      rec.stations = st;
    }
    rec.mjd = t.number_or(row, c_mjd, NAN);
    rec.int_time_s = t.number_or(row, c_itime, NAN);
    double value = t.number(row, c_vis2);
    double err = t.number(row, c_err);
    if (!(err > 0))
      throw InputError(where, std::string(raw_correlation ? "the error" : "vis2_err") + " must be positive, got " +
                                  t.text(row, c_err),
                       "give the 1-sigma error of each measurement; a zero error would give it infinite weight");
    rec.vis2 = {value};
    rec.vis2_err = {err};
    rec.flag = {c_flag ? parse_flag(t.text(row, *c_flag), where) : false};
    data.records.push_back(std::move(rec));
  }
  if (data.count_unflagged() == 0)
    throw InputError(path.string(), data.records.empty() ? "no measurements" : "every measurement is flagged",
                     "the file needs at least one row with flag 0");
  data.validate(path.string());
  return data;
}

void write_vis2_csv(std::ostream& out, const Vis2Data& data) {
  auto num = [](double v) { return std::isfinite(v) ? format_number(v) : std::string(); };
  out << "target,mjd,pair,u_m,v_m,baseline_m,pa_deg,wavelength_nm,bandwidth_nm,int_time_s,"
      << (data.raw_correlation ? "correlation,correlation_err" : "vis2,vis2_err") << ",flag\n";
  for (const auto& r : data.records) {
    const OiTarget* tg = data.find_target(r.target_id);
    std::string pair;
    if (r.stations) {
      const OiStation* a = data.array.find((*r.stations)[0]);
      const OiStation* b = data.array.find((*r.stations)[1]);
      pair = (a ? a->tel_name : "?") + "-" + (b ? b->tel_name : "?");
    }
    double pa_deg = std::atan2(r.u_m, r.v_m) * astro::kRadToDeg;
    if (pa_deg < 0) pa_deg += 360.0;
    const auto& ins = data.instruments[r.instrument];
    // Without position angles only the length is meaningful: u_m, v_m and pa_deg stay empty.
    bool pa = data.position_angles_known;
    for (std::size_t k = 0; k < ins.channels.size(); ++k) {
      out << csv_escape(tg ? tg->name : "") << ',' << num(r.mjd) << ',' << csv_escape(pair) << ','
          << (pa ? num(r.u_m) : "") << ',' << (pa ? num(r.v_m) : "") << ',' << num(std::hypot(r.u_m, r.v_m)) << ','
          << (pa ? num(pa_deg) : "")
          << ',' << num(ins.channels[k].eff_wave_m / astro::kNmToM) << ',' << num(ins.channels[k].eff_band_m / astro::kNmToM)
          << ',' << num(r.int_time_s) << ',' << num(r.vis2[k]) << ',' << num(r.vis2_err[k]) << ','
          << (r.flag[k] ? 1 : 0) << '\n';
    }
  }
}

bool is_csv_path(const fs::path& path, const std::string& option) {
  std::string ext = lower(path.extension().string());
  if (ext == ".csv") return true;
  if (ext == ".oifits" || ext == ".fits" || ext == ".fit") return false;
  throw InputError(option, "cannot tell the format of '" + path.string() + "' from its extension",
                   "name it .csv for the measurement CSV or .oifits/.fits for OIFITS");
}

Vis2Data read_vis2_file(const fs::path& path, const std::optional<std::string>& target, bool raw_correlation) {
  if (is_csv_path(path, path.string())) {
    Vis2Data data = read_vis2_csv(path, raw_correlation);
    if (target) {
      data.select_target(*target, path.string());
      if (data.count_unflagged() == 0)
        throw InputError(path.string(), "no unflagged measurements for target '" + *target + "'", "check the flag column");
    }
    return data;
  }
  if (raw_correlation)
    throw InputError("--raw", "applies to the measurement CSV only", "OIFITS VIS2DATA are calibrated by definition");
  return read_oifits(path, target);
}

}  // namespace siiplan::io
