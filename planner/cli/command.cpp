#include "planner/cli/command.hpp"

#include <iostream>

#include "astro/errors.hpp"
#include "io/csv.hpp"

namespace siiplan::cli {

std::vector<Command>& registry() {
  static std::vector<Command> commands;
  return commands;
}

void add_output_options(po::options_description& desc, bool with_plot) {
  desc.add_options()
      ("format", po::value<std::string>()->default_value("table"), "output form: 'table' (aligned, for people) or 'csv' (full precision, for scripts)")
      ("output,o", po::value<std::string>(), "write the table to FILE instead of standard output (written whole or not at all)");
  if (with_plot) desc.add_options()("plot", po::value<std::string>(), "also draw the result as an SVG chart into FILE.svg");
}

io::Format output_format(const po::variables_map& vm) { return io::parse_format(vm["format"].as<std::string>()); }

std::string output_path(const po::variables_map& vm) {
  return vm.count("output") ? vm["output"].as<std::string>() : std::string();
}

std::optional<std::string> plot_path(const po::variables_map& vm) {
  if (!vm.count("plot")) return std::nullopt;
  return vm["plot"].as<std::string>();
}

bool given(const po::variables_map& vm, const std::string& name) { return vm.count(name) && !vm[name].defaulted(); }

std::string text_option(const po::variables_map& vm, const std::string& name, const std::string& hint) {
  if (!vm.count(name)) throw InputError("--" + name, "this option is required", hint);
  return vm[name].as<std::string>();
}

std::optional<double> optional_number(const po::variables_map& vm, const std::string& name) {
  if (!vm.count(name)) return std::nullopt;
  const auto& text = vm[name].as<std::string>();
  if (auto v = io::parse_number(text)) return v;
  throw InputError("--" + name, "'" + text + "' is not a finite number", "write a plain decimal number such as 1.5");
}

double number_option(const po::variables_map& vm, const std::string& name, const std::string& hint) {
  if (auto v = optional_number(vm, name)) return *v;
  throw InputError("--" + name, "this option is required", hint);
}

double number_or(const po::variables_map& vm, const std::string& name, double fallback) {
  auto v = optional_number(vm, name);
  return v ? *v : fallback;
}

double positive_option(const po::variables_map& vm, const std::string& name, const std::string& hint) {
  double v = number_option(vm, name, hint);
  if (!(v > 0)) throw InputError("--" + name, "must be greater than zero, got " + vm[name].as<std::string>(), hint);
  return v;
}

double positive_or(const po::variables_map& vm, const std::string& name, double fallback) {
  return vm.count(name) ? positive_option(vm, name, "give a value greater than zero") : fallback;
}

void warn(const std::string& text) { std::cerr << "siiplan: warning: " << text << '\n'; }

const char* const kSafetyNotice =
    "Safety: never point a telescope or detector at or near the Sun; keep photomultipliers and SPADs shut "
    "or their high voltage off in twilight, moonlight beyond their rating and any bright light; treat the "
    "detector high voltage as dangerous; make sure nobody is near a telescope before it moves. The "
    "observatory's own safety rules and its licensed staff have the last word over anything siiplan suggests.";

}  // namespace siiplan::cli
