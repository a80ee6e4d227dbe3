// siiplan: entry point. Picks the subcommand, parses its options, runs it, and turns exceptions into
// "siiplan: <where>: <what> (<hint>)" and the documented exit codes (0 ok, 1 runtime failure, 2 bad
// usage or input).
#include <algorithm>
#include <iostream>
#include <new>

#include "astro/errors.hpp"
#include "planner/cli/command.hpp"

namespace {

using siiplan::cli::Command;
using siiplan::cli::registry;
namespace po = boost::program_options;

const Command* find_command(const std::string& name) {
  for (const auto& c : registry())
    if (c.name == name) return &c;
  return nullptr;
}

void print_overview(std::ostream& out) {
  auto commands = registry();
  std::sort(commands.begin(), commands.end(), [](const auto& a, const auto& b) { return a.name < b.name; });
  out << "siiplan " << SIIPLAN_VERSION
      << " - plan, simulate and reduce stellar intensity interferometry observations\n\n"
         "Usage: siiplan COMMAND [options]\n"
         "       siiplan help COMMAND     (or siiplan COMMAND --help) for a command's options and an example\n"
         "       siiplan --version\n\nCommands:\n";
  for (auto& c : commands) {
    std::string pad(c.name.size() < 12 ? 12 - c.name.size() : 1, ' ');
    out << "  " << c.name << pad << c.summary << '\n';
  }
  out << "\nExit codes: 0 success, 1 runtime failure, 2 bad usage or input.\n";
}

// The text of a command-line error. Boost.Program_options 1.74 fills placeholders such as
// %canonical_option% in a loop that never ends when the user's own text holds the same placeholder (an
// option spelled '--%canonical_option%' hung the program), so the text is built from a copy whose
// user-given parts show '%' as the look-alike U+FF05.
std::string usage_error_text(const po::error& e) {
  struct Defused : po::error_with_option_name {
    explicit Defused(const po::error_with_option_name& original) : po::error_with_option_name(original) {
      for (auto& entry : m_substitutions) {
        std::string& text = entry.second;
        for (auto p = text.find('%'); p != std::string::npos; p = text.find('%', p)) text.replace(p, 1, "\uFF05");
      }
    }
  };
  if (const auto* named = dynamic_cast<const po::error_with_option_name*>(&e)) return Defused(*named).what();
  return e.what();
}

po::options_description describe(const Command& c) {
  po::options_description desc("Options of 'siiplan " + c.name + "'");
  desc.add_options()("help,h", "show this help");
  if (c.describe) c.describe(desc);
  return desc;
}

void print_command_help(const Command& c, std::ostream& out) {
  out << "Usage: " << c.usage << "\n\n" << c.summary << "\n\n" << describe(c) << '\n' << c.details << '\n';
}

int run(int argc, char** argv) {
  std::vector<std::string> args(argv + 1, argv + argc);
  if (args.empty() || args[0] == "--help" || args[0] == "-h") {
    print_overview(std::cout);
    return args.empty() ? 2 : 0;
  }
  if (args[0] == "--version") {
    std::cout << "siiplan " << SIIPLAN_VERSION << '\n';
    return 0;
  }
  if (args[0] == "help") {
    if (args.size() < 2) {
      print_overview(std::cout);
      return 0;
    }
    const Command* c = find_command(args[1]);
    if (!c) throw siiplan::InputError("help", "unknown command '" + args[1] + "'", "run 'siiplan --help' for the list");
    print_command_help(*c, std::cout);
    return 0;
  }
  const Command* c = find_command(args[0]);
  if (!c)
    throw siiplan::InputError("", "unknown command '" + args[0] + "'", "run 'siiplan --help' for the list of commands");
  std::vector<std::string> rest(args.begin() + 1, args.end());
  if (std::find(rest.begin(), rest.end(), "--help") != rest.end() ||
      std::find(rest.begin(), rest.end(), "-h") != rest.end()) {
    print_command_help(*c, std::cout);
    return 0;
  }
  po::options_description desc = describe(*c);
  po::positional_options_description positional;
  for (const auto& p : c->positional) positional.add(p.c_str(), 1);
  po::variables_map vm;
  try {
    po::store(po::command_line_parser(rest).options(desc).positional(positional).run(), vm);
    po::notify(vm);
  } catch (const po::error& e) {
    throw siiplan::InputError("", usage_error_text(e), "see 'siiplan help " + c->name + "'");
  }
  return c->run(vm);
}

}  // namespace

int main(int argc, char** argv) {
  try {
    return run(argc, argv);
  } catch (const siiplan::Error& e) {
    std::cerr << "siiplan: " << e.what() << '\n';
    return e.exit_code();
  } catch (const std::bad_alloc&) {
    std::cerr << "siiplan: out of memory (use a smaller input or a machine with more memory)\n";
    return 1;
  } catch (const std::exception& e) {
    std::cerr << "siiplan: internal error: " << e.what() << " (please report it with the command line used)\n";
    return 1;
  }
}
