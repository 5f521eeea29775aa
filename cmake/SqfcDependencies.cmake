# SPDX-License-Identifier: MIT
# Finds the Debian packages sqfc builds against (see docs/dependencies.md).
find_package(Threads REQUIRED)
find_package(PkgConfig REQUIRED)
find_package(Boost 1.74 REQUIRED)
find_package(CLI11 2.1 CONFIG REQUIRED)
# Symmetric eigenvalues for the spectrum check (Debian: liblapack-dev, libblas-dev).
find_package(LAPACK REQUIRED)
# Run stores of `sqfc table --store` (Debian: libsqlite3-dev).
find_package(SQLite3 REQUIRED)

# FLINT 2.9 ships neither a CMake config nor a .pc file.
pkg_check_modules(GMP REQUIRED IMPORTED_TARGET gmp)
pkg_check_modules(MPFR REQUIRED IMPORTED_TARGET mpfr)
find_path(FLINT_INCLUDE_DIR flint/flint.h REQUIRED)
find_library(FLINT_LIBRARY flint REQUIRED)
if(NOT TARGET sqfc_flint)
  add_library(sqfc_flint UNKNOWN IMPORTED)
  set_target_properties(sqfc_flint PROPERTIES
    IMPORTED_LOCATION "${FLINT_LIBRARY}"
    INTERFACE_INCLUDE_DIRECTORIES "${FLINT_INCLUDE_DIR}"
    INTERFACE_LINK_LIBRARIES "PkgConfig::MPFR;PkgConfig::GMP")
endif()

# Distributed table runs (mpirun -np K sqfc table ...; Debian: libopenmpi-dev, openmpi-bin).
# Optional: ON when MPI is found, and the build works without it.
find_package(MPI COMPONENTS CXX QUIET)
option(SQFC_ENABLE_MPI "Build distributed table runs over MPI (needs an MPI library)" ${MPI_CXX_FOUND})
if(SQFC_ENABLE_MPI AND NOT MPI_CXX_FOUND)
  message(FATAL_ERROR "SQFC_ENABLE_MPI is ON but no MPI library was found (Debian: libopenmpi-dev)")
endif()
