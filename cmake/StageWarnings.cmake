# stage_warnings(target): the project's warning flags on one target.
function(stage_warnings target)
  target_compile_options(${target} PRIVATE -Wall -Wextra -Wpedantic
    # Element and model structs are aggregates with defaults; leaving the
    # trailing fields out is the intended way to write them.
    -Wno-missing-field-initializers)
  if(STAGE_WARNINGS_AS_ERRORS)
    target_compile_options(${target} PRIVATE -Werror)
  endif()
endfunction()
