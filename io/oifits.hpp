// Squared-visibility data sets, and OIFITS files that hold them.
//
// Vis2Data is the in-memory form shared by the OIFITS reader/writer (this file), the measurement CSV
// (io/vis2_csv.hpp), the reduction and the fitter: targets, one array of telescopes, one or more
// "instruments" (sets of wavelength channels, one OI_WAVELENGTH table each) and records (one row of an
// OI_VIS2 table: one telescope pair at one time, with one value per channel of its instrument).
//
// Units follow the rest of siiplan: SI and radians inside. Unknown numbers are NaN (an empty CSV cell;
// a NaN in the FITS column), unknown stations are std::nullopt (STA_INDEX null value in the file).
//
// File format: OIFITS version 2, Duvert, Young & Hummel 2017, A&A 597, A8 (Tables 3-6 for OI_TARGET,
// OI_ARRAY, OI_WAVELENGTH, OI_VIS2; models.md §6). Version 1 files (Pauls et al. 2005, PASP 117, 1255)
// are read as well: their OI_VIS2 differs only in ways that do not matter here (TIME in seconds rather
// than zero, no mandatory ARRNAME, OI_ARRAY optional).
//
// Single-precision columns (EFF_WAVE, EFF_BAND, DIAMETER, EQUINOX) are read through the shortest
// decimal that represents the stored float, so 443 nm written as float reads back as 443e-9 exactly
// and a write/read round trip is the identity.
#pragma once

#include <array>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "astro/site.hpp"

namespace siiplan::io {

struct OiTarget {
  int id = 1;                       // TARGET_ID, >= 1
  std::string name;                 // TARGET
  astro::SkyPosition position{NAN, NAN, 0, 0};  // ICRS, epoch J2000.0 (RAEP0/DECEP0, EQUINOX 2000); NaN = unknown
  std::string category;             // "SCI", "CAL" or "" (v2 CATEGORY column, written only when one is set)
};

struct OiStation {
  int index = 1;                    // STA_INDEX, >= 1
  std::string tel_name;             // TEL_NAME
  std::string sta_name;             // STA_NAME
  double diameter_m = NAN;          // DIAMETER (mirror diameter)
  std::array<double, 3> xyz_m{0, 0, 0};  // STAXYZ, relative to the array centre, in the array's frame
};

struct OiArray {
  std::string name = "SIIPLAN";     // ARRNAME
  std::string frame = "GEOCENTRIC"; // FRAME
  std::array<double, 3> center_xyz_m{0, 0, 0};  // ARRAYX/Y/Z (m)
  std::vector<OiStation> stations;
  const OiStation* find(int sta_index) const;
};

struct OiChannel {
  double eff_wave_m = 0;            // EFF_WAVE
  double eff_band_m = NAN;          // EFF_BAND (NaN = unknown)
};

struct OiInstrument {               // one OI_WAVELENGTH table
  std::string name;                 // INSNAME
  std::vector<OiChannel> channels;  // NWAVE rows
};

struct Vis2Record {                 // one OI_VIS2 row
  int target_id = 1;                // TARGET_ID
  int instrument = 0;               // index into Vis2Data::instruments (INSNAME)
  double mjd = NAN;                 // MJD (UTC) of the measurement's mid-point
  double int_time_s = NAN;          // INT_TIME
  double u_m = 0, v_m = 0;          // UCOORD, VCOORD: projected baseline, u East, v North (models.md §6.4)
  std::optional<std::array<int, 2>> stations;  // STA_INDEX (baseline from the first to the second)
  std::vector<double> vis2;         // VIS2DATA, one per channel of the instrument (negative values kept)
  std::vector<double> vis2_err;     // VIS2ERR
  std::vector<bool> flag;           // FLAG (true = bad datum, skipped by the fit)
};

// Primary-header keywords of OIFITS v2 (Duvert et al. 2017 §4, models.md §6.1).
struct OiHeader {
  std::string origin = "siiplan";   // ORIGIN: institution responsible for the file
  std::string telescop = "SIIPLAN"; // TELESCOP (array or facility)
  std::string instrume = "SII";     // INSTRUME
  std::string observer = "UNKNOWN"; // OBSERVER
  std::string insmode = "SII";      // INSMODE
  std::string object;               // OBJECT (written as 'MULTI' for several targets when left empty)
  std::string obstech = "INTENSITY INTERFEROMETRY";  // OBSTECH (optional keyword)
};

struct Vis2Data {
  OiHeader header;
  std::vector<OiTarget> targets;
  OiArray array;
  std::vector<OiInstrument> instruments;
  std::vector<Vis2Record> records;
  // The values are raw normalised correlations c(B) = c(0)|V|^2 rather than calibrated |V|^2 (CSV read
  // with --raw). OIFITS has no slot for them (models.md §6.5): write_oifits refuses such data.
  bool raw_correlation = false;
  // False when the source gave baseline lengths without position angles (CSV baseline_m without pa_deg):
  // then u_m = 0 and v_m = the length, fine for circular models only.
  bool position_angles_known = true;

  const OiTarget* find_target(int id) const;
  // Number of (record, channel) values not flagged.
  std::size_t count_unflagged() const;
  // Keep only the records of the target named `name` (exact match, then case-insensitive); InputError
  // naming `source` and listing the targets present when there is none.
  void select_target(const std::string& name, const std::string& source);
  // Checks the cross-references (target ids, instrument indices, station indices, channel counts,
  // finite positive errors); InputError naming `source` and the record otherwise.
  void validate(const std::string& source) const;
};

// Reads every OI_VIS2 table of an OIFITS (v1 or v2) file with its OI_WAVELENGTH (by INSNAME), the
// OI_TARGET table and the OI_ARRAY table (by ARRNAME; only one array is supported). When `target` is
// given, only that target's records are kept. Throws InputError naming the file, HDU and column for: a
// file that is not FITS, no OI_VIS2 / OI_TARGET / matching OI_WAVELENGTH, a VIS2DATA width that is
// not NWAVE, columns of the wrong type, and data that are empty once flags are honoured.
Vis2Data read_oifits(const std::filesystem::path& path, const std::optional<std::string>& target = std::nullopt);

// Writes an OIFITS v2 file (primary header with CONTENT='OIFITS2', OI_TARGET, OI_ARRAY, one
// OI_WAVELENGTH per instrument, OI_VIS2 tables in record order) atomically: the file appears whole or
// not at all. Runs validate() first; RuntimeFailure with cfitsio's message if writing fails.
void write_oifits(const std::filesystem::path& path, const Vis2Data& data);

}  // namespace siiplan::io
