# Third-party libraries, all from Debian packages (scripts/setup installs them).
find_package(Eigen3 3.4 REQUIRED NO_MODULE)
find_package(Boost 1.74 REQUIRED)
find_package(TBB REQUIRED)
find_package(tomlplusplus REQUIRED)
find_package(CLI11 REQUIRED)
find_package(fmt REQUIRED)
find_package(PkgConfig REQUIRED)
pkg_check_modules(NETCDF_CXX4 REQUIRED IMPORTED_TARGET netcdf-cxx4)
