// siiplan convert: squared-visibility data between the measurement CSV and OIFITS v2.
#include <iostream>
#include <ostream>

#include "astro/errors.hpp"
#include "io/atomic_file.hpp"
#include "io/oifits.hpp"
#include "io/vis2_csv.hpp"
#include "planner/cli/command.hpp"

namespace siiplan::cli {
namespace {

int run_convert(const po::variables_map& vm) {
  const std::string in = text_option(vm, "input", "give the file to convert: siiplan convert IN -o OUT");
  const std::string out = text_option(vm, "output", "give the output file with -o OUT.oifits or -o OUT.csv");
  const bool out_csv = io::is_csv_path(out, "--output");
  std::optional<std::string> target;
  if (vm.count("target")) target = vm["target"].as<std::string>();
  const io::Vis2Data data = io::read_vis2_file(in, target, vm.count("raw") > 0);
  if (out_csv) {
    io::write_text_atomically(out, [&](std::ostream& os) { io::write_vis2_csv(os, data); });
  } else {
    if (!data.position_angles_known)
      warn("the input gives baseline lengths without position angles: written as UCOORD = 0, VCOORD = length "
           "(a COMMENT in each OI_VIS2 table says so)");
    if (data.array.stations.empty())
      warn("the input names no telescopes (no 'pair' column): STA_INDEX is written as unknown");
    io::write_oifits(out, data);
  }
  std::size_t values = 0;
  for (const auto& r : data.records) values += r.vis2.size();
  std::cerr << "siiplan: wrote " << out << " (" << data.records.size() << " records, " << values << " values, "
            << data.targets.size() << " target" << (data.targets.size() == 1 ? "" : "s") << ")\n";
  return 0;
}

const Register reg{Command{
    "convert",
    "convert squared-visibility data between the measurement CSV and OIFITS v2 (by file extension)",
    "siiplan convert IN.csv|IN.oifits -o OUT.oifits|OUT.csv [--target NAME]",
    "Reads a measurement CSV (.csv) or an OIFITS v1/v2 file (.oifits, .fits) and writes the other form (or\n"
    "the same form, normalised). OIFITS output is version 2 (Duvert, Young & Hummel 2017): a primary header\n"
    "with CONTENT='OIFITS2', OI_TARGET, OI_ARRAY, one OI_WAVELENGTH per distinct wavelength and bandwidth\n"
    "of the CSV, and OI_VIS2 tables (UCOORD/VCOORD in metres, STA_INDEX from the 'pair' column, MJD,\n"
    "INT_TIME, FLAG) in the order of the input. Values that the CSV does not give (target position, MJD,\n"
    "integration time, bandwidth, mirror diameters) are written as NaN, i.e. unknown. CSV output has one row\n"
    "per value (flagged ones with flag = 1). Raw correlations (--raw) cannot be stored as OIFITS VIS2DATA.\n"
    "The output appears whole or not at all.\n\n"
    "Example:\n"
    "  siiplan convert catalogs-demo/measurements-demo.csv -o demo.oifits\n"
    "  siiplan convert demo.oifits -o back.csv",
    {"input"},
    [](po::options_description& desc) {
      desc.add_options()
          ("input", po::value<std::string>(), "file to convert: .csv or .oifits/.fits (positional)")
          ("output,o", po::value<std::string>(), "output file: .oifits/.fits or .csv (required)")
          ("target", po::value<std::string>(), "keep only this target")
          ("raw", "the CSV holds raw normalised correlations (CSV output only)");
    },
    run_convert}};

}  // namespace
}  // namespace siiplan::cli
