#pragma once
// Private to report: the per-column results the summaries and sweep plots show, with their titles.
#include <string>
#include <vector>

#include "bandstack/report/result_data.hpp"
#include "bandstack/report/svg.hpp"

namespace bandstack::report {

struct ShownScalar {
  const ScalarField* field = nullptr;
  std::string title;        // "OLR", "adjusted forcing, doubled_co2"
  AxisSpec axis;            // quantity and units
  std::string id;           // for data-plot ids
};

// The per-column results present in the file, main ones first; per-experiment results for at most
// `max_experiments` experiments.
[[nodiscard]] std::vector<ShownScalar> shown_scalars(const ResultData& data, std::size_t max_experiments = 2);

} // namespace bandstack::report
