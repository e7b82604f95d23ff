# Installs stage into a scratch prefix, then configures, builds and runs the
# consumer project against it with find_package(stage CONFIG REQUIRED).
set(prefix "${BINARY_DIR}/consumer-prefix")
set(work "${BINARY_DIR}/consumer-build")
file(REMOVE_RECURSE "${prefix}" "${work}")
foreach(step
    "${CMAKE_COMMAND};--install;${BINARY_DIR};--prefix;${prefix}"
    "${CMAKE_COMMAND};-S;${SOURCE_DIR}/tests/consumer;-B;${work};-DCMAKE_PREFIX_PATH=${prefix};-DCMAKE_BUILD_TYPE=Release"
    "${CMAKE_COMMAND};--build;${work}"
    "${work}/consumer")
  execute_process(COMMAND ${step} RESULT_VARIABLE status)
  if(NOT status EQUAL 0)
    message(FATAL_ERROR "consumer step failed (${status}): ${step}")
  endif()
endforeach()
