// libFuzzer target: one input = the text of a study file (io::parse_study).
// Expected rejections (InputError, FileError) are fine; anything else is a bug (see fuzz_entry.hpp).
#include "fuzz_entry.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  (void)bandstack::fuzz::feed(bandstack::fuzz::Target::study, data, size);
  return 0;
}
