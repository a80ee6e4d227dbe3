// Planning one observing night: from site, array, instrument and catalog to a schedule (pure
// computation; the CLI reads the files and writes the products).
//
// Steps:
//  1. The dark window: the longest stretch of the night of `date` (astro/night.hpp) with the Sun's
//     geometric altitude below constraints.sun_max_altitude_rad. It is cut into whole slots of slot_s.
//  2. Per target (targets are independent: processed in parallel, one at a time per thread, so memory
//     stays O(targets x slots), never targets x pairs x slots):
//     - the diameter: the catalog's, or an estimate from V and Teff (astro::diameter_from_teff_rad);
//     - visibility per slot, checked at both slot edges and the middle: altitude >= min_altitude_rad;
//       if the Moon is up (centre above -0 deg 50'): separation >= moon_min_separation_rad, and the slot
//       is refused altogether when moonlit time is not allowed. A telescope pair is usable in a slot when
//       the altitude also clears both telescopes' own limits;
//     - per usable pair at the slot middle: (u,v) (astro::UvwProjection built once per target and slot,
//       then astro::project_uv over all pairs), |V|^2 and d|V|^2/dtheta (DiameterFisher::add_batch: the
//       vectorised kernel of astro/disk_kernel.hpp for uniform and linear limb-darkened disks) from
//       the target's model, sigma(|V|^2) for one slot of integration from the star's flux in the
//       instrument's band after extinction at the slot's airmass and the Krisciunas & Schaefer sky
//       (astro/sensitivity.hpp), accumulated into the Fisher information on (theta, c0)
//       (astro::DiameterFisher).
//  3. The scheduler (planner/scheduler.hpp) picks the blocks.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "astro/night.hpp"
#include "astro/sensitivity.hpp"
#include "astro/site.hpp"
#include "astro/time.hpp"
#include "astro/units.hpp"
#include "planner/scheduler.hpp"

namespace siiplan::planner {

struct NightConstraints {
  double min_altitude_rad = 20 * astro::kDegToRad;       // target altitude limit (telescopes may add their own)
  double sun_max_altitude_rad = -18 * astro::kDegToRad;  // darkness: Sun below this (astronomical twilight)
  double moon_min_separation_rad = 10 * astro::kDegToRad;   // applies while the Moon is up
  bool allow_moonlit = true;       // intensity interferometry usually runs in moonlight
  double slot_s = 300;             // time resolution of the plan
  double min_block_s = 1200;       // shortest block on one target
  double slew_deg_per_s = 1.0;     // slew rate (great-circle angle between targets)
  double fixed_slew_s = -1;        // >= 0: every slew takes this long instead
  double setup_s = 300;            // per target change: calibration, zero-baseline or dark run
};

// Messages "name = value; must be ..." for each invalid field (empty = valid).
std::vector<std::string> validate(const NightConstraints& constraints);

struct NightInputs {
  astro::Site site;
  std::vector<astro::Telescope> telescopes;
  astro::Instrument instrument;
  std::vector<astro::Target> targets;
  astro::CalendarDate date;
  NightConstraints constraints;
  int threads = 1;
};

// The time grid and what the Sun and Moon do on it.
struct NightGrid {
  astro::NightSummary summary;     // twilights, Moon crossings, illumination
  bool has_dark_time = false;
  astro::JulianDate dark_start_utc, dark_end_utc;
  int n_slots = 0;
  double slot_s = 0;
  std::vector<astro::JulianDate> edges_utc;   // [n_slots + 1]
  std::vector<astro::JulianDate> mids_utc;    // [n_slots]
  std::vector<double> moon_alt_edge_rad;      // [n_slots + 1]
  std::vector<double> moon_az_edge_rad;
  double moon_phase_angle_rad = astro::kPi;   // at the middle of the night
  double moon_illuminated_fraction = 0;
  bool dubious_year = false;
  astro::JulianDate slot_start(int k) const { return edges_utc[std::size_t(k)]; }
};

// Why a target got no time, or what limited it.
struct TargetStatus {
  std::string reason;               // empty: observable in at least one slot
  int observable_slots = 0;
  double max_alt_rad = -astro::kPi / 2;   // highest altitude during the dark window (slot edges)
  std::vector<double> alt_edge_rad;       // [n_slots + 1] altitude at the slot edges
  std::string flux_note;            // which magnitude fed the flux
};

struct NightPlan {
  NightGrid grid;
  std::vector<astro::Target> targets;   // as given, with estimated diameters filled in
  std::vector<TargetStatus> status;
  std::vector<TargetSlots> slots;
  SchedulerOptions scheduler;
  PlanResult result;
  std::vector<astro::TelescopePair> pairs;
};

// progress(done, total) is called from one thread now and then while targets are processed.
NightPlan plan_night(const NightInputs& inputs, const std::function<void(std::size_t, std::size_t)>& progress = {});

// What one block measures: per slot of the block (sample at the slot middle) and per pair.
struct BlockSamples {
  std::vector<astro::JulianDate> mid_utc;   // [n]
  std::vector<double> exposure_s;           // [n] slot time minus the overhead share
  // [n_pairs * n], index p * n + k
  std::vector<double> u_m, v_m, w_m, vis2, sigma_vis2;
  std::vector<std::uint8_t> usable;
  std::vector<double> alt_rad, airmass, moon_sep_rad;   // [n] target altitude etc. at the slot middle
};
BlockSamples block_samples(const NightInputs& inputs, const NightPlan& plan, const Block& block);

}  // namespace siiplan::planner
