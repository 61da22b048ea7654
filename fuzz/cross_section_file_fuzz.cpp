// libFuzzer target: one input = the bytes of a cross-section file written to a scratch file.
// Expected rejections (InputError, FileError) are fine; anything else is a bug (see fuzz_entry.hpp).
#include "fuzz_entry.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  (void)bandstack::fuzz::feed(bandstack::fuzz::Target::cross_section_file, data, size);
  return 0;
}
