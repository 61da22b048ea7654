# Warnings for our own targets only: a non-exported INTERFACE target, no global flags.
add_library(bandstack_warnings INTERFACE)
target_compile_options(bandstack_warnings INTERFACE
  $<$<CXX_COMPILER_ID:GNU,Clang>:-Wall -Wextra -Wpedantic -Wshadow -Wconversion -Wno-sign-conversion>)
