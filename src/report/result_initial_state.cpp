// The state a column started from before it was driven to equilibrium. The result file stores only
// the equilibrium; the study text it carries rebuilds the first guess exactly as the run built it
// (io::column_spec, atmosphere::make_column).
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/io/sweep.hpp"
#include "report/reader_parts.hpp"

namespace bandstack::report {

void add_initial_states(ResultData& data) {
  const auto text = data.attributes.find("study_text");
  if (text == data.attributes.end() || data.profiles.empty()) return;
  try {
    const io::Study study = io::parse_study(text->second, "study_text of " + data.path.string());
    if (!study.equilibrium) return;
    for (const io::ColumnSpec& spec : study.columns)
      if (!spec.profile_file.empty()) return; // rebuilding would read the profile file again
    if (io::column_count(study) != data.column_count) return;
    for (ColumnProfile& profile : data.profiles) {
      const io::ColumnSpec spec = io::column_spec(study, profile.flat_index);
      const atmosphere::Column column = atmosphere::make_column(spec.settings, study.grid, spec.name);
      profile.initial_pressure_layer_pa = column.pressure_layer_pa;
      profile.initial_temperature_layer_k = column.temperature_layer_k;
    }
  } catch (const Error&) {
    // A study written by another version may not parse: the report then shows the equilibrium alone.
    for (ColumnProfile& profile : data.profiles) {
      profile.initial_pressure_layer_pa.clear();
      profile.initial_temperature_layer_k.clear();
    }
  }
}

} // namespace bandstack::report
