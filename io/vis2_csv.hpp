// The measurement CSV: squared visibilities written by people and scripts, one row per measurement.
//
// Columns (case-insensitive, any order; '#' comment lines allowed, io/csv.hpp):
//   u_m, v_m            projected baseline in metres, u East, v North            } one of the two
//   baseline_m [pa_deg] projected length, and its position angle N through E     } forms is required
//   wavelength_nm       effective wavelength (required)
//   vis2, vis2_err      calibrated |V|^2 and its 1-sigma error (required; error > 0). Negative values are
//                       kept: clipping them biases the diameter (models.md §5.1).
//   with --raw:         correlation, correlation_err (or vis2, vis2_err) hold the raw normalised
//                       correlation c(B) = c(0)|V|^2 instead (fit it with a free or prior c(0)).
//   optional:           mjd (UTC), pair ("T1-T2": baseline from T1 to T2), target, bandwidth_nm,
//                       int_time_s, flag (0/1 or true/false; 1 = bad, skipped by the fit)
// An empty optional cell means "not known". The writer emits every column above (u_m, v_m and the
// derived baseline_m, pa_deg), one row per unflagged or flagged value, at full precision, so that
// CSV -> OIFITS -> CSV reproduces the file written from the original data.
#pragma once

#include <filesystem>
#include <iosfwd>

#include "io/oifits.hpp"

namespace siiplan::io {

// Reads the CSV into the shared data structure: one target per distinct `target` (the file's stem
// when the column is absent), one station per name in `pair`, one single-channel instrument per
// distinct (wavelength, bandwidth), one record per row. InputError with file:line for a missing
// column, a malformed number or pair, a non-positive error, or no unflagged measurement at all.
Vis2Data read_vis2_csv(const std::filesystem::path& path, bool raw_correlation = false);

// Writes the data as a measurement CSV (the header line, then one row per record and channel).
void write_vis2_csv(std::ostream& out, const Vis2Data& data);

// True for names ending in .csv (case-insensitive); false for .oifits/.fits/.fit; InputError naming
// `option` for anything else.
bool is_csv_path(const std::filesystem::path& path, const std::string& option);

// Reads either form by extension (CSV or OIFITS), optionally keeping only one target.
Vis2Data read_vis2_file(const std::filesystem::path& path, const std::optional<std::string>& target,
                        bool raw_correlation = false);

}  // namespace siiplan::io
