// The subcommand framework of the siiplan program.
//
// Each subcommand lives in planner/cli/cmd_<name>.cpp and registers itself with a file-scope
//   static const siiplan::cli::Register reg{Command{...}};
// giving its name, a one-line summary, a worked example, its options (describe) and its action (run).
// main.cpp only finds the command, parses, and maps exceptions to exit codes (0 ok, 1 runtime, 2 usage
// or input). Options are read as text and converted by the helpers below, so every bad value gets the
// same message: "siiplan: --name: 'text' is not ... (hint)".
#pragma once

#include <boost/program_options.hpp>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "io/table.hpp"

namespace siiplan::cli {

namespace po = boost::program_options;

struct Command {
  std::string name;
  std::string summary;                  // one line, for 'siiplan --help'
  std::string usage;                    // e.g. "siiplan curve [options]"
  std::string details;                  // paragraphs shown by 'siiplan help NAME': what, units, examples
  std::vector<std::string> positional;  // names of positional arguments, in order (one value each)
  std::function<void(po::options_description&)> describe;
  std::function<int(const po::variables_map&)> run;
};

std::vector<Command>& registry();
struct Register {
  explicit Register(Command command) { registry().push_back(std::move(command)); }
};

// --- shared options -------------------------------------------------------------------------------
// --format table|csv, -o/--output FILE, and optionally --plot FILE.svg.
void add_output_options(po::options_description& desc, bool with_plot);
io::Format output_format(const po::variables_map& vm);
std::string output_path(const po::variables_map& vm);          // "" = standard output
std::optional<std::string> plot_path(const po::variables_map& vm);

// --- option values (declare them as po::value<std::string>()) --------------------------------------
bool given(const po::variables_map& vm, const std::string& name);
std::string text_option(const po::variables_map& vm, const std::string& name, const std::string& hint);
// A finite number; InputError "--name: ..." if absent (with hint) or malformed.
double number_option(const po::variables_map& vm, const std::string& name, const std::string& hint);
std::optional<double> optional_number(const po::variables_map& vm, const std::string& name);
double number_or(const po::variables_map& vm, const std::string& name, double fallback);
// Same, and > 0.
double positive_option(const po::variables_map& vm, const std::string& name, const std::string& hint);
double positive_or(const po::variables_map& vm, const std::string& name, double fallback);

// A warning on standard error: "siiplan: warning: <text>".
void warn(const std::string& text);

// The usual cautions of the trade, printed once with any observing recommendation.
extern const char* const kSafetyNotice;

}  // namespace siiplan::cli
