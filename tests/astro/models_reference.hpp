// Reading tests/data/models_reference.csv (written by scripts/make_ref_models.py: mpmath 40 digits,
// scipy 1.10), shared by the model, Bessel, coherence and limb-conversion tests.
#pragma once

#include <sstream>
#include <string>
#include <vector>

#include "astro/models.hpp"
#include "io/csv.hpp"

namespace siiplan::test {

struct RefRow {
  int line;
  std::string quantity, model;
  std::vector<double> params;   // user units
  double x, u_m, v_m, lambda_m, value;
};

inline std::vector<RefRow> models_reference(const std::string& quantity) {
  static const io::CsvTable table = io::read_csv(std::string(SIIPLAN_TEST_DATA_DIR) + "/models_reference.csv");
  const auto c = [&](const char* n) { return table.require(n, "regenerate with scripts/make_ref_models.py"); };
  const std::size_t q = c("quantity"), m = c("model"), p = c("params"), x = c("x"), u = c("u_m"), v = c("v_m"),
                    l = c("lambda_m"), val = c("value");
  std::vector<RefRow> out;
  for (const auto& row : table.rows()) {
    if (table.text(row, q) != quantity) continue;
    RefRow r{row.line, table.text(row, q), table.text(row, m), {}, table.number_or(row, x, 0), table.number_or(row, u, 0),
             table.number_or(row, v, 0), table.number_or(row, l, 0), table.number(row, val)};
    std::stringstream ss(table.text(row, p));
    std::string item;
    while (std::getline(ss, item, ';')) r.params.push_back(std::stod(item));
    out.push_back(r);
  }
  return out;
}

// The model of a reference row: kind from its name, parameters converted from user units.
inline astro::Model reference_model(const RefRow& r) {
  const auto kind = *astro::model_from_name(r.model);
  const auto specs = astro::model_params(kind);
  std::vector<double> p;
  for (std::size_t i = 0; i < specs.size(); ++i) p.push_back(r.params.at(i) / specs[i].user_per_internal);
  return astro::Model(kind, p);
}

}  // namespace siiplan::test
