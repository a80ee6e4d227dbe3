// The products of a planned night: the schedule and baseline tables, the plan file contents, the
// stdout summary and the HTML report. Pure formatting (no file access: the CLI writes them).
#pragma once

#include <string>
#include <vector>

#include "io/plan_h5.hpp"
#include "io/table.hpp"
#include "planner/night_plan.hpp"

namespace siiplan::planner {

struct ScheduledBlock {
  Block block;
  BlockSamples samples;
};

// One row of baselines.csv: a scheduled target and one pair over all its blocks.
struct PairSummary {
  int target = 0;
  std::size_t pair = 0;
  int samples = 0;
  double baseline_min_m = 0, baseline_max_m = 0, pa_min_deg = 0, pa_max_deg = 0;
  double vis2_min = 0, vis2_max = 0, snr = 0;
  std::string verdict;
  bool resolves = false;
};

struct NightProducts {
  std::vector<ScheduledBlock> blocks;
  std::vector<PairSummary> pairs;
  io::Table schedule;    // schedule.csv
  io::Table baselines;   // baselines.csv
  io::Table summary;     // the stdout table
  io::PlanFile plan_file;
};

NightProducts make_products(const NightInputs& inputs, const NightPlan& plan, const std::string& date_text,
                            const std::string& version);

// Lines printed above the summary table (dark window, objective of the plan and of the simple schedule).
std::string summary_header(const NightInputs& inputs, const NightPlan& plan);

// The self-contained HTML page (inline SVG, no scripts, no external links).
std::string night_report_html(const NightInputs& inputs, const NightPlan& plan, const NightProducts& products,
                              const std::string& date_text, const std::string& safety_notice);

// Pair label "A-B" from telescope names.
std::string pair_label(const std::vector<astro::Telescope>& telescopes, const astro::TelescopePair& pair);

}  // namespace siiplan::planner
