// Option groups shared by every command that observes something from somewhere at some time:
// tracks, sky, and the later resolve/night/simulate commands. One place declares the flags, one place
// turns them into astro:: values, so every command spells and checks them the same way.
//
//   --site FILE                 site INI ([site] section; io/site_io.hpp)
//   --array FILE                telescope CSV (io/site_io.hpp)
//   --ra/--dec (+ --pmra-mas-per-yr, --pmdec-mas-per-yr)     one target given on the command line, or
//   --target NAME --catalog FILE                              a target picked from a catalog (io/catalog.hpp)
//   --night YYYY-MM-DD  or  --start/--end ISO-8601 UTC        the time span; --step-min the sampling step
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "astro/night.hpp"
#include "astro/site.hpp"
#include "astro/time.hpp"
#include "planner/cli/command.hpp"

namespace siiplan::cli {

// --- site and array ----------------------------------------------------------------------------------
void add_site_option(po::options_description& desc);
astro::Site load_site(const po::variables_map& vm);                     // --site is required

void add_array_option(po::options_description& desc);
std::vector<astro::Telescope> load_array(const po::variables_map& vm, const astro::Site& site);  // required

// --- target ------------------------------------------------------------------------------------------
// --ra/--dec accept degrees ("83.63") or sexagesimal ("05:35:17.3" hours for RA, "-05:23:28" degrees for
// Dec); ICRS, epoch J2000.0.
// Also declares --catalog unless desc already has it (call add_catalog_option first, or not at all).
void add_target_options(po::options_description& desc);
// The one target named by --ra/--dec or --target/--catalog; InputError when neither or both are given.
astro::Target load_target(const po::variables_map& vm);

// --catalog FILE alone (for commands that work through a whole catalog).
void add_catalog_option(po::options_description& desc);
std::vector<astro::Target> load_catalog(const po::variables_map& vm);   // --catalog is required

// --- time span ---------------------------------------------------------------------------------------
struct TimeSpan {
  astro::JulianDate start_utc, end_utc;   // start < end
  double step_s = 300;                    // sampling step
  std::optional<astro::CalendarDate> night;  // set when given by --night
  std::string label;                      // "night of 2026-03-14" or "2026-03-14T20:00:00 to ..."
};

// --night, --start, --end, --step-min (default_step_min shown in the help).
void add_time_options(po::options_description& desc, double default_step_min);
// With --night the span is the site's local noon-to-noon window of that date (astro/night.hpp), which
// the command then narrows (e.g. to sunset..sunrise); with --start/--end it is exactly that span.
// InputError naming the option for a malformed date, end <= start, a span over 31 days, or a step <= 0.
TimeSpan load_time_span(const po::variables_map& vm, const astro::Site& site);
// How sample_times places its instants.
enum class SampleGrid {
  FromStart,   // start, start + step, ... (a span the user gave with --start)
  RoundTimes,  // a grid of `step` counted from 0h UTC, so steps fall on round clock times (--night)
};
// The instants of the grid that lie in [start, end]; start itself when no grid instant does.
std::vector<astro::JulianDate> sample_times(astro::JulianDate start_utc, astro::JulianDate end_utc, double step_s,
                                            SampleGrid grid);
// The grid a time span asks for: FromStart for --start/--end, RoundTimes for --night.
SampleGrid sample_grid(const TimeSpan& span);

// Why a night has no dark time, for messages: "the Sun stays above -18 deg (lowest -12.4 deg; midnight
// sun)" and the like.
std::string describe_no_dark(const astro::NightSummary& night);

// ERFA's "dubious year" status (dates beyond its leap-second table): prints the warning the first time
// it is called with true, and never again in this process.
void warn_dubious_year(bool dubious);

}  // namespace siiplan::cli
