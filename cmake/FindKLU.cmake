# FindKLU: SuiteSparse's KLU sparse LU. Debian 12 ships klu.h under
# suitesparse/ with neither a CMake package config nor a pkg-config file.
#
# Defines the imported target KLU::KLU and KLU_FOUND.
find_path(KLU_INCLUDE_DIR klu.h PATH_SUFFIXES suitesparse)
find_library(KLU_LIBRARY NAMES klu)
find_library(KLU_AMD_LIBRARY NAMES amd)
find_library(KLU_COLAMD_LIBRARY NAMES colamd)
find_library(KLU_BTF_LIBRARY NAMES btf)
find_library(KLU_CONFIG_LIBRARY NAMES suitesparseconfig)

include(FindPackageHandleStandardArgs)
find_package_handle_standard_args(KLU REQUIRED_VARS
  KLU_LIBRARY KLU_INCLUDE_DIR KLU_AMD_LIBRARY KLU_COLAMD_LIBRARY KLU_BTF_LIBRARY
  KLU_CONFIG_LIBRARY)

if(KLU_FOUND AND NOT TARGET KLU::KLU)
  add_library(KLU::KLU UNKNOWN IMPORTED)
  set_target_properties(KLU::KLU PROPERTIES
    IMPORTED_LOCATION "${KLU_LIBRARY}"
    INTERFACE_INCLUDE_DIRECTORIES "${KLU_INCLUDE_DIR}"
    INTERFACE_LINK_LIBRARIES
      "${KLU_AMD_LIBRARY};${KLU_COLAMD_LIBRARY};${KLU_BTF_LIBRARY};${KLU_CONFIG_LIBRARY}")
endif()
mark_as_advanced(KLU_INCLUDE_DIR KLU_LIBRARY KLU_AMD_LIBRARY KLU_COLAMD_LIBRARY
                 KLU_BTF_LIBRARY KLU_CONFIG_LIBRARY)
