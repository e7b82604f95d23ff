# stage_warnings(target): the project's warning flags on one target.
function(stage_warnings target)
  target_compile_options(${target} PRIVATE -Wall -Wextra -Wpedantic
    # Element and model structs are aggregates with defaults; leaving the
    # trailing fields out is the intended way to write them.
    -Wno-missing-field-initializers)
  if(CMAKE_CXX_COMPILER_ID STREQUAL "GNU" AND CMAKE_CXX_COMPILER_VERSION VERSION_LESS 13)
    # GCC 12 reports a false -Wrestrict inside std::string's operator+ at -O3
    # (GCC bug 105329, fixed in GCC 13); it is not in our code.
    target_compile_options(${target} PRIVATE -Wno-restrict)
  endif()
  if(STAGE_WARNINGS_AS_ERRORS)
    target_compile_options(${target} PRIVATE -Werror)
  endif()
endfunction()
