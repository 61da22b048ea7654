# Third-party libraries, all from Debian packages (scripts/setup installs them).
find_package(Eigen3 3.4 REQUIRED NO_MODULE)
find_package(Boost 1.74 REQUIRED)
find_package(TBB REQUIRED)
find_package(tomlplusplus REQUIRED)
find_package(CLI11 REQUIRED)
find_package(fmt REQUIRED)
find_package(PkgConfig REQUIRED)
pkg_check_modules(NETCDF_CXX4 REQUIRED IMPORTED_TARGET netcdf-cxx4)

# Optional: MPI (Open MPI, Debian libopenmpi-dev) for runs across the ranks of an MPI job; on by
# default when found.
find_package(MPI COMPONENTS CXX QUIET)
option(BANDSTACK_MPI "Run studies across MPI ranks (needs MPI, e.g. Debian libopenmpi-dev)" ${MPI_CXX_FOUND})
if(BANDSTACK_MPI AND NOT MPI_CXX_FOUND)
  message(FATAL_ERROR "BANDSTACK_MPI is on but no MPI was found: install libopenmpi-dev or turn it off")
endif()
