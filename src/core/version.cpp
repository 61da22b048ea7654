#include "bandstack/core/version.hpp"

namespace bandstack {

std::string_view version() noexcept { return BANDSTACK_VERSION; }

std::string_view caution_text() noexcept {
  return "bandstack is a research tool with idealised default spectroscopy. Its results are for exploring "
         "mechanisms and for batch studies, not for operational or regulatory figures without validation "
         "against line-by-line references and observations.";
}

} // namespace bandstack
