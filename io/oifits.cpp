#include "io/oifits.hpp"

#include <fitsio.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <memory>

#include "astro/errors.hpp"
#include "io/fits_check.hpp"
#include "astro/time.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"

namespace siiplan::io {

namespace fs = std::filesystem;

// --- Vis2Data ----------------------------------------------------------------------------------------

const OiStation* OiArray::find(int sta_index) const {
  for (const auto& s : stations)
    if (s.index == sta_index) return &s;
  return nullptr;
}

const OiTarget* Vis2Data::find_target(int id) const {
  for (const auto& t : targets)
    if (t.id == id) return &t;
  return nullptr;
}

std::size_t Vis2Data::count_unflagged() const {
  std::size_t n = 0;
  for (const auto& r : records)
    for (bool f : r.flag) n += f ? 0 : 1;
  return n;
}

namespace {

bool iequal(std::string_view a, std::string_view b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return std::tolower(static_cast<unsigned char>(x)) == std::tolower(static_cast<unsigned char>(y));
         });
}

}  // namespace

void Vis2Data::select_target(const std::string& name, const std::string& source) {
  const OiTarget* chosen = nullptr;
  for (const auto& t : targets)
    if (t.name == name) chosen = &t;
  if (!chosen)
    for (const auto& t : targets)
      if (iequal(t.name, name)) chosen = &t;
  if (!chosen) {
    std::string list;
    for (const auto& t : targets) list += (list.empty() ? "" : ", ") + t.name;
    throw InputError(source, "no target named '" + name + "'", "the file holds: " + (list.empty() ? "none" : list));
  }
  OiTarget kept = *chosen;
  std::erase_if(records, [&](const Vis2Record& r) { return r.target_id != kept.id; });
  targets = {kept};
}

void Vis2Data::validate(const std::string& source) const {
  for (std::size_t i = 0; i < records.size(); ++i) {
    const auto& r = records[i];
    std::string where = source + ": record " + std::to_string(i + 1);
    if (!find_target(r.target_id))
      throw InputError(where, "TARGET_ID " + std::to_string(r.target_id) + " is not in the target list", "internal use");
    if (r.instrument < 0 || std::size_t(r.instrument) >= instruments.size())
      throw InputError(where, "refers to a missing wavelength table", "internal use");
    std::size_t n = instruments[r.instrument].channels.size();
    if (r.vis2.size() != n || r.vis2_err.size() != n || r.flag.size() != n)
      throw InputError(where, "has " + std::to_string(r.vis2.size()) + " values for " + std::to_string(n) + " channels",
                       "give one value, error and flag per wavelength channel");
    if (r.stations)
      for (int s : *r.stations)
        if (!array.find(s))
          throw InputError(where, "station index " + std::to_string(s) + " is not in the array", "internal use");
    for (std::size_t k = 0; k < n; ++k)
      if (!r.flag[k] && !(r.vis2_err[k] > 0 && std::isfinite(r.vis2_err[k]) && std::isfinite(r.vis2[k])))
        throw InputError(where, "an unflagged value has a non-finite value or an error that is not positive",
                         "flag the value or give a positive error");
  }
  for (const auto& ins : instruments)
    for (const auto& c : ins.channels)
      if (!(c.eff_wave_m > 0))
        throw InputError(source + ": instrument '" + ins.name + "'", "a wavelength is not positive", "check the wavelengths");
}

// --- cfitsio helpers ---------------------------------------------------------------------------------

namespace {

struct FitsCloser {
  void operator()(fitsfile* f) const {
    int status = 0;
    fits_close_file(f, &status);
  }
};
using FitsPtr = std::unique_ptr<fitsfile, FitsCloser>;

std::string cfitsio_message(int status) {
  char text[FLEN_STATUS] = {};
  fits_get_errstatus(status, text);
  std::string msg = text;
  char line[FLEN_ERRMSG];
  std::string detail;
  while (fits_read_errmsg(line)) detail = line;  // the last queued message is the most specific
  if (!detail.empty() && detail != msg) msg += ": " + detail;
  return msg;
}

// A float read through the shortest decimal that represents it (see the header).
double widen(float f) {
  if (!std::isfinite(f)) return double(f);
  char buf[32];
  auto res = std::to_chars(buf, buf + sizeof buf, f);
  double d = 0;
  std::from_chars(buf, res.ptr, d);
  return d;
}

// ---- reading ----

class Reader {
 public:
  Reader(fitsfile* f, std::string file) : f_(f), file_(std::move(file)) {}

  void move_to(int hdu) {
    int status = 0, type = 0;
    fits_movabs_hdu(f_, hdu, &type, &status);
    check(status, "HDU " + std::to_string(hdu));
    hdu_ = hdu;
    extname_ = key_string("EXTNAME").value_or("");
  }
  const std::string& extname() const { return extname_; }
  std::string where() const { return file_ + ": HDU " + std::to_string(hdu_) + " (" + extname_ + ")"; }

  std::optional<std::string> key_string(const char* key) {
    char value[FLEN_VALUE] = {};
    int status = 0;
    fits_read_key(f_, TSTRING, key, value, nullptr, &status);
    if (status == KEY_NO_EXIST || status == VALUE_UNDEFINED) {
      fits_clear_errmsg();
      return std::nullopt;
    }
    check(status, "keyword " + std::string(key));
    std::string s = value;
    while (!s.empty() && s.back() == ' ') s.pop_back();
    return s;
  }
  std::optional<double> key_double(const char* key) {
    double value = 0;
    int status = 0;
    fits_read_key(f_, TDOUBLE, key, &value, nullptr, &status);
    if (status == KEY_NO_EXIST || status == VALUE_UNDEFINED) {
      fits_clear_errmsg();
      return std::nullopt;
    }
    check(status, "keyword " + std::string(key));
    return value;
  }

  long rows() {
    long n = 0;
    int status = 0;
    fits_get_num_rows(f_, &n, &status);
    check(status, "row count");
    return n;
  }

  // Column number, type code and repeat count; nullopt when absent and not required.
  struct Column {
    int number = 0, type = 0;
    long repeat = 0;
  };
  std::optional<Column> column(const char* name, bool required) {
    Column c;
    int status = 0;
    fits_get_colnum(f_, CASEINSEN, const_cast<char*>(name), &c.number, &status);
    if (status == COL_NOT_FOUND || status == COL_NOT_UNIQUE) {
      fits_clear_errmsg();
      if (!required) return std::nullopt;
      throw InputError(where(), std::string("missing column ") + name,
                       "the OIFITS standard (Duvert et al. 2017) requires it; check the file's writer");
    }
    check(status, std::string("column ") + name);
    long width = 0;
    fits_get_coltype(f_, c.number, &c.type, &c.repeat, &width, &status);
    check(status, std::string("column ") + name);
    return c;
  }

  enum class Kind { Integer, Real, Text, Logical };
  Column typed_column(const char* name, Kind kind, long repeat, bool required = true) {
    auto c = column(name, required);
    if (!c) return Column{};
    bool ok = false;
    std::string expected;
    switch (kind) {
      case Kind::Integer:
        ok = c->type == TSHORT || c->type == TINT || c->type == TLONG || c->type == TBYTE || c->type == TLONGLONG;
        expected = "an integer (I or J)";
        break;
      case Kind::Real:
        ok = c->type == TFLOAT || c->type == TDOUBLE;
        expected = "a floating-point number (E or D)";
        break;
      case Kind::Text:
        ok = c->type == TSTRING;
        expected = "text (A)";
        break;
      case Kind::Logical:
        ok = c->type == TLOGICAL;
        expected = "logical (L)";
        break;
    }
    if (!ok)
      throw InputError(where(), std::string("column ") + name + " has the wrong type",
                       "it must be " + expected + " as in the OIFITS standard");
    if (repeat > 0 && kind != Kind::Text && c->repeat != repeat)
      throw InputError(where(), std::string("column ") + name + " holds " + std::to_string(c->repeat) +
                                    " values per row where " + std::to_string(repeat) + " are expected",
                       "its width must match NWAVE of the OI_WAVELENGTH table named by INSNAME");
    return *c;
  }

  std::vector<double> reals(const Column& c, long nrows) {
    std::vector<double> out(std::size_t(nrows * c.repeat));
    if (out.empty()) return out;
    int status = 0;
    if (c.type == TFLOAT) {
      std::vector<float> tmp(out.size());
      fits_read_col(f_, TFLOAT, c.number, 1, 1, long(tmp.size()), nullptr, tmp.data(), nullptr, &status);
      std::transform(tmp.begin(), tmp.end(), out.begin(), widen);
    } else {
      fits_read_col(f_, TDOUBLE, c.number, 1, 1, long(out.size()), nullptr, out.data(), nullptr, &status);
    }
    check(status, "reading column " + std::to_string(c.number));
    return out;
  }
  std::vector<long> integers(const Column& c, long nrows) {
    std::vector<long> out(std::size_t(nrows * c.repeat));
    if (out.empty()) return out;
    int status = 0;
    fits_read_col(f_, TLONG, c.number, 1, 1, long(out.size()), nullptr, out.data(), nullptr, &status);
    check(status, "reading column " + std::to_string(c.number));
    return out;
  }
  std::vector<bool> logicals(const Column& c, long nrows) {
    std::vector<char> tmp(std::size_t(nrows * c.repeat));
    int status = 0;
    if (!tmp.empty())
      fits_read_col(f_, TLOGICAL, c.number, 1, 1, long(tmp.size()), nullptr, tmp.data(), nullptr, &status);
    check(status, "reading column " + std::to_string(c.number));
    return std::vector<bool>(tmp.begin(), tmp.end());
  }
  std::vector<std::string> texts(const Column& c, long nrows) {
    int status = 0;
    long width = 0;
    fits_get_col_display_width(f_, c.number, reinterpret_cast<int*>(&width), &status);
    width = std::max<long>(width, c.repeat) + 1;
    std::vector<std::string> out;
    std::vector<char> buf(std::size_t(width) + 1);
    for (long row = 1; row <= nrows; ++row) {
      char* p = buf.data();
      fits_read_col(f_, TSTRING, c.number, row, 1, 1, nullptr, &p, nullptr, &status);
      check(status, "reading column " + std::to_string(c.number));
      std::string s = p;
      while (!s.empty() && s.back() == ' ') s.pop_back();
      out.push_back(s);
    }
    return out;
  }

  void check(int status, const std::string& what) const {
    if (status)
      throw InputError(where(), what + ": " + cfitsio_message(status), "the file may be damaged or not OIFITS");
  }

 private:
  fitsfile* f_;
  std::string file_;
  int hdu_ = 1;
  std::string extname_;
};

void read_targets(Reader& r, Vis2Data& data) {
  long n = r.rows();
  auto id = r.integers(r.typed_column("TARGET_ID", Reader::Kind::Integer, 1), n);
  auto name = r.texts(r.typed_column("TARGET", Reader::Kind::Text, 0), n);
  auto ra = r.reals(r.typed_column("RAEP0", Reader::Kind::Real, 1), n);
  auto dec = r.reals(r.typed_column("DECEP0", Reader::Kind::Real, 1), n);
  auto pmra_col = r.column("PMRA", false);
  auto pmdec_col = r.column("PMDEC", false);
  std::vector<double> pmra = pmra_col ? r.reals(r.typed_column("PMRA", Reader::Kind::Real, 1), n) : std::vector<double>(n, 0.0);
  std::vector<double> pmdec = pmdec_col ? r.reals(r.typed_column("PMDEC", Reader::Kind::Real, 1), n) : std::vector<double>(n, 0.0);
  std::vector<std::string> category(n);
  if (r.column("CATEGORY", false)) category = r.texts(r.typed_column("CATEGORY", Reader::Kind::Text, 0), n);
  for (long i = 0; i < n; ++i) {
    OiTarget t;
    t.id = int(id[i]);
    t.name = name[i];
    t.position.ra_rad = ra[i] * astro::kDegToRad;
    t.position.dec_rad = dec[i] * astro::kDegToRad;
    t.position.pmra_cosdec_rad_per_yr = pmra[i] * astro::kDegToRad;
    t.position.pmdec_rad_per_yr = pmdec[i] * astro::kDegToRad;
    t.category = category[i];
    data.targets.push_back(std::move(t));
  }
}

void read_array(Reader& r, OiArray& array) {
  array.name = r.key_string("ARRNAME").value_or("");
  array.frame = r.key_string("FRAME").value_or("GEOCENTRIC");
  array.center_xyz_m = {r.key_double("ARRAYX").value_or(0), r.key_double("ARRAYY").value_or(0),
                        r.key_double("ARRAYZ").value_or(0)};
  long n = r.rows();
  auto tel = r.texts(r.typed_column("TEL_NAME", Reader::Kind::Text, 0), n);
  auto sta = r.texts(r.typed_column("STA_NAME", Reader::Kind::Text, 0), n);
  auto idx = r.integers(r.typed_column("STA_INDEX", Reader::Kind::Integer, 1), n);
  auto diam = r.reals(r.typed_column("DIAMETER", Reader::Kind::Real, 1), n);
  auto xyz = r.reals(r.typed_column("STAXYZ", Reader::Kind::Real, 3), n);
  for (long i = 0; i < n; ++i)
    array.stations.push_back({int(idx[i]), tel[i], sta[i], diam[i], {xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]}});
}

void read_wavelengths(Reader& r, OiInstrument& ins) {
  long n = r.rows();
  auto wave = r.reals(r.typed_column("EFF_WAVE", Reader::Kind::Real, 1), n);
  auto band = r.reals(r.typed_column("EFF_BAND", Reader::Kind::Real, 1), n);
  for (long i = 0; i < n; ++i) ins.channels.push_back({wave[i], band[i]});
  if (ins.channels.empty())
    throw InputError(r.where(), "the wavelength table has no rows", "an OI_WAVELENGTH table needs NWAVE >= 1 rows");
}

void read_vis2(Reader& r, int instrument, std::size_t nwave, std::vector<Vis2Record>& out) {
  long n = r.rows();
  long w = long(nwave);
  auto target = r.integers(r.typed_column("TARGET_ID", Reader::Kind::Integer, 1), n);
  auto mjd = r.reals(r.typed_column("MJD", Reader::Kind::Real, 1), n);
  auto itime = r.reals(r.typed_column("INT_TIME", Reader::Kind::Real, 1), n);
  auto vis2 = r.reals(r.typed_column("VIS2DATA", Reader::Kind::Real, w), n);
  auto err = r.reals(r.typed_column("VIS2ERR", Reader::Kind::Real, w), n);
  auto u = r.reals(r.typed_column("UCOORD", Reader::Kind::Real, 1), n);
  auto v = r.reals(r.typed_column("VCOORD", Reader::Kind::Real, 1), n);
  auto sta = r.integers(r.typed_column("STA_INDEX", Reader::Kind::Integer, 2), n);
  auto flag = r.logicals(r.typed_column("FLAG", Reader::Kind::Logical, w), n);
  for (long i = 0; i < n; ++i) {
    Vis2Record rec;
    rec.target_id = int(target[i]);
    rec.instrument = instrument;
    rec.mjd = mjd[i];
    rec.int_time_s = itime[i];
    rec.u_m = u[i];
    rec.v_m = v[i];
    if (sta[2 * i] >= 1 && sta[2 * i + 1] >= 1) rec.stations = std::array<int, 2>{int(sta[2 * i]), int(sta[2 * i + 1])};
    rec.vis2.assign(vis2.begin() + i * w, vis2.begin() + (i + 1) * w);
    rec.vis2_err.assign(err.begin() + i * w, err.begin() + (i + 1) * w);
    rec.flag.assign(flag.begin() + i * w, flag.begin() + (i + 1) * w);
    out.push_back(std::move(rec));
  }
}

}  // namespace

Vis2Data read_oifits(const fs::path& path, const std::optional<std::string>& target) {
  const std::string file = path.string();
  std::error_code ec;
  if (!fs::is_regular_file(path, ec))
    throw InputError(file, "no such file", "check the path");
  check_fits_headers(path);
  fitsfile* raw = nullptr;
  int status = 0;
  fits_open_file(&raw, file.c_str(), READONLY, &status);
  if (status) {
    std::string msg = cfitsio_message(status);
    throw InputError(file, "not a FITS file (cfitsio: " + msg + ")",
                     "give an OIFITS file (.oifits/.fits) or a measurement CSV (.csv)");
  }
  FitsPtr f(raw);
  Reader r(raw, file);
  int nhdu = 0;
  fits_get_num_hdus(raw, &nhdu, &status);
  r.check(status, "HDU count");
  {
    // cfitsio counts complete HDUs only: a file cut short reads as one with fewer tables. For an
    // uncompressed file ("SIMPLE" at byte 0) the last HDU must end exactly at the end of the file.
    char start[6] = {};
    std::ifstream(path, std::ios::binary).read(start, sizeof start);
    LONGLONG head = 0, data_start = 0, data_end = 0;
    int type = 0;
    fits_movabs_hdu(raw, nhdu, &type, &status);
    fits_get_hduaddrll(raw, &head, &data_start, &data_end, &status);
    r.check(status, "HDU " + std::to_string(nhdu));
    const auto size = LONGLONG(fs::file_size(path, ec));
    if (!ec && std::string(start, sizeof start) == "SIMPLE" && size != data_end)
      throw InputError(file, "the file is truncated or damaged: HDU " + std::to_string(nhdu) + " ends at byte " +
                                 std::to_string(data_end) + " but the file has " + std::to_string(size),
                       "copy or write the file again");
  }

  struct Found {
    int hdu;
    std::string name;  // INSNAME or ARRNAME
  };
  std::vector<int> target_hdus, vis2_hdus;
  std::vector<Found> wave_hdus, array_hdus;
  for (int h = 2; h <= nhdu; ++h) {
    r.move_to(h);
    const auto& e = r.extname();
    if (e == "OI_TARGET") target_hdus.push_back(h);
    else if (e == "OI_VIS2") vis2_hdus.push_back(h);
    else if (e == "OI_WAVELENGTH") wave_hdus.push_back({h, r.key_string("INSNAME").value_or("")});
    else if (e == "OI_ARRAY") array_hdus.push_back({h, r.key_string("ARRNAME").value_or("")});
  }
  if (vis2_hdus.empty())
    throw InputError(file, "no OI_VIS2 table", "the file holds no squared visibilities; siiplan fits OI_VIS2 data only");
  if (target_hdus.empty())
    throw InputError(file, "no OI_TARGET table", "an OIFITS file must have one (Duvert et al. 2017 §4)");

  Vis2Data data;
  r.move_to(1);
  data.header.origin = r.key_string("ORIGIN").value_or("");
  data.header.telescop = r.key_string("TELESCOP").value_or("");
  data.header.instrume = r.key_string("INSTRUME").value_or("");
  data.header.observer = r.key_string("OBSERVER").value_or("");
  data.header.insmode = r.key_string("INSMODE").value_or("");
  data.header.object = r.key_string("OBJECT").value_or("");
  data.header.obstech = r.key_string("OBSTECH").value_or("");

  r.move_to(target_hdus.front());
  read_targets(r, data);

  std::optional<std::string> arrname;
  std::map<std::string, int> instrument_of;
  for (int h : vis2_hdus) {
    r.move_to(h);
    auto ins = r.key_string("INSNAME");
    if (!ins) throw InputError(r.where(), "missing keyword INSNAME", "it names the OI_WAVELENGTH table of the data");
    auto arr = r.key_string("ARRNAME");
    if (arr && arrname && *arr != *arrname)
      throw InputError(r.where(), "data from several arrays ('" + *arrname + "', '" + *arr + "')",
                       "split the file by array; siiplan reads one array at a time");
    if (arr) arrname = arr;
    auto it = instrument_of.find(*ins);
    if (it == instrument_of.end()) {
      auto w = std::find_if(wave_hdus.begin(), wave_hdus.end(), [&](const Found& x) { return x.name == *ins; });
      if (w == wave_hdus.end())
        throw InputError(r.where(), "no OI_WAVELENGTH table with INSNAME '" + *ins + "'",
                         "every data table needs the wavelength table it names");
      OiInstrument instrument;
      instrument.name = *ins;
      r.move_to(w->hdu);
      read_wavelengths(r, instrument);
      data.instruments.push_back(std::move(instrument));
      it = instrument_of.emplace(*ins, int(data.instruments.size()) - 1).first;
      r.move_to(h);
    }
    read_vis2(r, it->second, data.instruments[it->second].channels.size(), data.records);
  }

  if (arrname) {
    auto a = std::find_if(array_hdus.begin(), array_hdus.end(), [&](const Found& x) { return x.name == *arrname; });
    if (a == array_hdus.end())
      throw InputError(file, "no OI_ARRAY table with ARRNAME '" + *arrname + "'", "the OI_VIS2 tables name it");
    r.move_to(a->hdu);
    read_array(r, data.array);
  } else if (!array_hdus.empty()) {
    r.move_to(array_hdus.front().hdu);
    read_array(r, data.array);
  } else {
    data.array.name = "";
  }
  // Station indices without an OI_ARRAY row (allowed in OIFITS v1): keep them, with unknown geometry.
  for (const auto& rec : data.records)
    if (rec.stations)
      for (int s : *rec.stations)
        if (!data.array.find(s)) {
          OiStation st;
          st.index = s;
          st.tel_name = st.sta_name = "S" + std::to_string(s);
          data.array.stations.push_back(st);
        }

  // Values that are not finite are unusable: treat them as flagged.
  for (auto& rec : data.records)
    for (std::size_t k = 0; k < rec.vis2.size(); ++k)
      if (!std::isfinite(rec.vis2[k]) || !std::isfinite(rec.vis2_err[k])) rec.flag[k] = true;

  if (target) data.select_target(*target, file);
  for (std::size_t i = 0; i < data.records.size(); ++i)
    if (!data.find_target(data.records[i].target_id))
      throw InputError(file, "an OI_VIS2 row has TARGET_ID " + std::to_string(data.records[i].target_id) +
                                 " which is not in OI_TARGET", "the file's cross-references are broken");
  if (data.count_unflagged() == 0)
    throw InputError(file, "no unflagged squared visibilities" + (target ? " for target '" + *target + "'" : std::string()),
                     "every VIS2DATA value is flagged (FLAG = T) or not finite");
  data.validate(file);
  return data;
}

// --- writing -----------------------------------------------------------------------------------------

namespace {

class Writer {
 public:
  Writer(fitsfile* f, std::string target) : f_(f), target_(std::move(target)) {}

  void check(int status, const std::string& what) const {
    if (status) throw RuntimeFailure(target_, "writing " + what + " failed: " + cfitsio_message(status), "check the disk");
  }
  void key(const char* name, const std::string& value, const char* comment) {
    int status = 0;
    fits_write_key(f_, TSTRING, name, const_cast<char*>(value.c_str()), comment, &status);
    check(status, name);
  }
  void key(const char* name, double value, const char* comment) {
    int status = 0;
    fits_write_key(f_, TDOUBLE, name, &value, comment, &status);
    check(status, name);
  }
  void key(const char* name, int value, const char* comment) {
    int status = 0;
    fits_write_key(f_, TINT, name, &value, comment, &status);
    check(status, name);
  }
  void comment(const char* text) {
    int status = 0;
    fits_write_comment(f_, text, &status);
    check(status, "COMMENT");
  }
  struct ColumnDef {
    std::string name, form, unit;
  };
  void table(const char* extname, const std::vector<ColumnDef>& cols, long nrows) {
    std::vector<char*> ttype, tform, tunit;
    for (const auto& c : cols) {
      ttype.push_back(const_cast<char*>(c.name.c_str()));
      tform.push_back(const_cast<char*>(c.form.c_str()));
      tunit.push_back(const_cast<char*>(c.unit.c_str()));
    }
    int status = 0;
    fits_create_tbl(f_, BINARY_TBL, nrows, int(cols.size()), ttype.data(), tform.data(), tunit.data(), extname, &status);
    check(status, extname);
    key("OI_REVN", 2, "revision of the table definition (OIFITS 2)");
  }
  void col(int n, std::vector<double> values) {
    int status = 0;
    if (!values.empty()) fits_write_col(f_, TDOUBLE, n, 1, 1, long(values.size()), values.data(), &status);
    check(status, "column " + std::to_string(n));
  }
  void col_float(int n, const std::vector<double>& values) {
    std::vector<float> tmp(values.begin(), values.end());
    int status = 0;
    if (!tmp.empty()) fits_write_col(f_, TFLOAT, n, 1, 1, long(tmp.size()), tmp.data(), &status);
    check(status, "column " + std::to_string(n));
  }
  void col_int(int n, std::vector<int> values) {
    int status = 0;
    if (!values.empty()) fits_write_col(f_, TINT, n, 1, 1, long(values.size()), values.data(), &status);
    check(status, "column " + std::to_string(n));
  }
  void col_logical(int n, const std::vector<bool>& values) {
    std::vector<char> tmp(values.begin(), values.end());
    int status = 0;
    if (!tmp.empty()) fits_write_col(f_, TLOGICAL, n, 1, 1, long(tmp.size()), tmp.data(), &status);
    check(status, "column " + std::to_string(n));
  }
  void col_text(int n, const std::vector<std::string>& values) {
    std::vector<char*> ptrs;
    for (const auto& s : values) ptrs.push_back(const_cast<char*>(s.c_str()));
    int status = 0;
    if (!ptrs.empty()) fits_write_col(f_, TSTRING, n, 1, 1, long(ptrs.size()), ptrs.data(), &status);
    check(status, "column " + std::to_string(n));
  }

 private:
  fitsfile* f_;
  std::string target_;
};

std::string text_form(const std::vector<std::string>& values, std::size_t standard_width) {
  std::size_t w = standard_width;
  for (const auto& s : values) w = std::max(w, s.size());
  return std::to_string(w) + "A";
}

std::string iso_date(double mjd) {
  auto d = astro::utc_date(astro::utc_from_mjd(mjd));
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", d.year, d.month, d.day);
  return buf;
}

void write_targets(Writer& w, const Vis2Data& data) {
  const auto& t = data.targets;
  std::vector<std::string> names;
  bool any_category = false;
  for (const auto& x : t) {
    names.push_back(x.name);
    any_category = any_category || !x.category.empty();
  }
  std::vector<Writer::ColumnDef> cols = {
      {"TARGET_ID", "1I", ""},      {"TARGET", text_form(names, 16), ""}, {"RAEP0", "1D", "deg"},
      {"DECEP0", "1D", "deg"},      {"EQUINOX", "1E", "year"},           {"RA_ERR", "1D", "deg"},
      {"DEC_ERR", "1D", "deg"},     {"SYSVEL", "1D", "m/s"},             {"VELTYP", "8A", ""},
      {"VELDEF", "8A", ""},         {"PMRA", "1D", "deg/year"},          {"PMDEC", "1D", "deg/year"},
      {"PMRA_ERR", "1D", "deg/year"}, {"PMDEC_ERR", "1D", "deg/year"},   {"PARALLAX", "1E", "deg"},
      {"PARA_ERR", "1E", "deg"},    {"SPECTYP", "16A", ""}};
  if (any_category) cols.push_back({"CATEGORY", "3A", ""});
  long n = long(t.size());
  w.table("OI_TARGET", cols, n);
  std::vector<int> id;
  std::vector<double> ra, dec, pmra, pmdec, nan(n, NAN), equinox(n, 2000.0);
  std::vector<std::string> category, veltyp(n, "UNKNOWN"), veldef(n, "OPTICAL"), spectyp(n, "UNKNOWN");
  for (const auto& x : t) {
    id.push_back(x.id);
    ra.push_back(x.position.ra_rad * astro::kRadToDeg);
    dec.push_back(x.position.dec_rad * astro::kRadToDeg);
    pmra.push_back(x.position.pmra_cosdec_rad_per_yr * astro::kRadToDeg);
    pmdec.push_back(x.position.pmdec_rad_per_yr * astro::kRadToDeg);
    category.push_back(x.category);
  }
  w.col_int(1, id);
  w.col_text(2, names);
  w.col(3, ra);
  w.col(4, dec);
  w.col_float(5, equinox);
  w.col(6, nan);
  w.col(7, nan);
  w.col(8, nan);
  w.col_text(9, veltyp);
  w.col_text(10, veldef);
  w.col(11, pmra);
  w.col(12, pmdec);
  w.col(13, nan);
  w.col(14, nan);
  w.col_float(15, nan);
  w.col_float(16, nan);
  w.col_text(17, spectyp);
  if (any_category) w.col_text(18, category);
}

void write_array(Writer& w, const OiArray& a) {
  std::vector<std::string> tel, sta;
  for (const auto& s : a.stations) {
    tel.push_back(s.tel_name);
    sta.push_back(s.sta_name);
  }
  w.table("OI_ARRAY",
          {{"TEL_NAME", text_form(tel, 16), ""},
           {"STA_NAME", text_form(sta, 16), ""},
           {"STA_INDEX", "1I", ""},
           {"DIAMETER", "1E", "m"},
           {"STAXYZ", "3D", "m"},
           {"FOV", "1D", "arcsec"},
           {"FOVTYPE", "6A", ""}},
          long(a.stations.size()));
  w.key("ARRNAME", a.name, "array name, referenced by the data tables");
  w.key("FRAME", a.frame, "coordinate frame of ARRAYX/Y/Z and STAXYZ");
  w.key("ARRAYX", a.center_xyz_m[0], "[m] array centre X");
  w.key("ARRAYY", a.center_xyz_m[1], "[m] array centre Y");
  w.key("ARRAYZ", a.center_xyz_m[2], "[m] array centre Z");
  std::vector<int> idx;
  std::vector<double> diam, xyz;
  for (const auto& s : a.stations) {
    idx.push_back(s.index);
    diam.push_back(s.diameter_m);
    xyz.insert(xyz.end(), s.xyz_m.begin(), s.xyz_m.end());
  }
  long n = long(a.stations.size());
  w.col_text(1, tel);
  w.col_text(2, sta);
  w.col_int(3, idx);
  w.col_float(4, diam);
  w.col(5, xyz);
  w.col(6, std::vector<double>(n, NAN));
  w.col_text(7, std::vector<std::string>(n, "FWHM"));
}

void write_wavelengths(Writer& w, const OiInstrument& ins) {
  w.table("OI_WAVELENGTH", {{"EFF_WAVE", "1E", "m"}, {"EFF_BAND", "1E", "m"}}, long(ins.channels.size()));
  w.key("INSNAME", ins.name, "instrument name, referenced by the data tables");
  std::vector<double> wave, band;
  for (const auto& c : ins.channels) {
    wave.push_back(c.eff_wave_m);
    band.push_back(c.eff_band_m);
  }
  w.col_float(1, wave);
  w.col_float(2, band);
}

// One OI_VIS2 table for records [begin, end) that share an instrument.
void write_vis2(Writer& w, const Vis2Data& data, std::size_t begin, std::size_t end) {
  const auto& ins = data.instruments[data.records[begin].instrument];
  std::string nw = std::to_string(ins.channels.size());
  w.table("OI_VIS2",
          {{"TARGET_ID", "1I", ""},
           {"TIME", "1D", "s"},
           {"MJD", "1D", "day"},
           {"INT_TIME", "1D", "s"},
           {"VIS2DATA", nw + "D", ""},
           {"VIS2ERR", nw + "D", ""},
           {"UCOORD", "1D", "m"},
           {"VCOORD", "1D", "m"},
           {"STA_INDEX", "2I", ""},
           {"FLAG", nw + "L", ""}},
          long(end - begin));
  double mjd_min = INFINITY;
  for (std::size_t i = begin; i < end; ++i)
    if (std::isfinite(data.records[i].mjd)) mjd_min = std::min(mjd_min, data.records[i].mjd);
  if (std::isfinite(mjd_min)) w.key("DATE-OBS", iso_date(mjd_min), "UTC start date of the observations");
  w.key("ARRNAME", data.array.name, "array (OI_ARRAY) of the stations");
  w.key("INSNAME", ins.name, "wavelength table (OI_WAVELENGTH) of the data");
  w.key("TNULL9", -1, "STA_INDEX of a station that is not known");
  if (!data.position_angles_known) {
    w.comment("Position angles unknown: UCOORD = 0 and VCOORD = projected baseline length.");
  }
  std::vector<int> target, sta;
  std::vector<double> time, mjd, itime, vis2, err, u, v;
  std::vector<bool> flag;
  for (std::size_t i = begin; i < end; ++i) {
    const auto& r = data.records[i];
    target.push_back(r.target_id);
    time.push_back(0.0);
    mjd.push_back(r.mjd);
    itime.push_back(r.int_time_s);
    vis2.insert(vis2.end(), r.vis2.begin(), r.vis2.end());
    err.insert(err.end(), r.vis2_err.begin(), r.vis2_err.end());
    u.push_back(r.u_m);
    v.push_back(r.v_m);
    sta.push_back(r.stations ? (*r.stations)[0] : -1);
    sta.push_back(r.stations ? (*r.stations)[1] : -1);
    flag.insert(flag.end(), r.flag.begin(), r.flag.end());
  }
  w.col_int(1, target);
  w.col(2, time);
  w.col(3, mjd);
  w.col(4, itime);
  w.col(5, vis2);
  w.col(6, err);
  w.col(7, u);
  w.col(8, v);
  w.col_int(9, sta);
  w.col_logical(10, flag);
}

}  // namespace

void write_oifits(const fs::path& path, const Vis2Data& data) {
  const std::string target = path.string();
  data.validate(target);
  if (data.raw_correlation)
    throw InputError(target, "the values are raw correlations, not calibrated squared visibilities",
                     "OIFITS VIS2DATA must be c(B)/c(0); fit with --free-norm or calibrate first, or keep the CSV form");
  if (data.targets.empty() || data.instruments.empty())
    throw InputError(target, "nothing to write", "the data set has no targets or no wavelengths");
  AtomicPath out(path);
  {
    fitsfile* raw = nullptr;
    int status = 0;
    std::string name = "!" + out.temp().string();
    fits_create_file(&raw, name.c_str(), &status);
    if (status)
      throw RuntimeFailure(target, "cannot create the file: " + cfitsio_message(status), "check that the directory is writable");
    FitsPtr f(raw);
    Writer w(raw, target);
    fits_create_img(raw, BYTE_IMG, 0, nullptr, &status);
    w.check(status, "the primary header");
    const auto& h = data.header;
    std::string object = h.object;
    if (object.empty()) object = data.targets.size() == 1 ? data.targets.front().name : "MULTI";
    w.key("ORIGIN", h.origin, "institution responsible for the file");
    fits_write_date(raw, &status);
    w.check(status, "DATE");
    w.key("CONTENT", std::string("OIFITS2"), "OIFITS version 2 (Duvert, Young & Hummel 2017)");
    w.key("TELESCOP", h.telescop, "facility");
    w.key("INSTRUME", h.instrume, "instrument");
    w.key("OBSERVER", h.observer, "observer");
    w.key("OBJECT", object, "target(s)");
    w.key("INSMODE", h.insmode, "instrument mode");
    if (!h.obstech.empty()) w.key("OBSTECH", h.obstech, "observing technique");
    double mjd_min = INFINITY, mjd_max = -INFINITY;
    for (const auto& r : data.records)
      if (std::isfinite(r.mjd)) {
        mjd_min = std::min(mjd_min, r.mjd);
        mjd_max = std::max(mjd_max, r.mjd);
      }
    if (std::isfinite(mjd_min)) {
      w.key("DATE-OBS", iso_date(mjd_min), "UTC date of the first measurement");
      w.key("MJD-OBS", mjd_min, "[d] MJD of the first measurement");
      w.key("MJD-END", mjd_max, "[d] MJD of the last measurement");
    }
    write_targets(w, data);
    write_array(w, data.array);
    for (const auto& ins : data.instruments) write_wavelengths(w, ins);
    for (std::size_t b = 0; b < data.records.size();) {
      std::size_t e = b + 1;
      while (e < data.records.size() && data.records[e].instrument == data.records[b].instrument) ++e;
      write_vis2(w, data, b, e);
      b = e;
    }
    raw = f.release();
    fits_close_file(raw, &status);
    w.check(status, "the end of the file");
  }
  out.commit();
}

}  // namespace siiplan::io
