# CTest: the exported package. Installs the build into a scratch prefix,
# builds examples/embedding against it with find_package(hushgain) and runs
# it (it checks R_f's output noise against the Johnson-Nyquist closed form
# and fails otherwise); then configures a parent project that takes hushgain
# in with add_subdirectory and checks that hushgain left the parent's build
# type alone and registered no tests there.
# Arguments: -DBUILD_DIR= -DSOURCE_DIR=
function(check condition what)
  separate_arguments(words UNIX_COMMAND "${condition}")
  if(NOT (${words}))
    message(FATAL_ERROR "embedding test: ${what}")
  endif()
endfunction()

string(MD5 tag "${BUILD_DIR}")
set(WORK_DIR "/tmp")
if(DEFINED ENV{TMPDIR})
  set(WORK_DIR "$ENV{TMPDIR}")
endif()
set(WORK_DIR "${WORK_DIR}/hushgain-embedding-test-${tag}")
file(REMOVE_RECURSE "${WORK_DIR}")

execute_process(
  COMMAND ${CMAKE_COMMAND} --install "${BUILD_DIR}" --prefix "${WORK_DIR}/prefix"
  OUTPUT_QUIET RESULT_VARIABLE status)
check("status EQUAL 0" "cmake --install failed")
check("EXISTS ${WORK_DIR}/prefix/include/hushgain/budget/compute_budget.h"
      "the core's headers are not installed")
check("NOT EXISTS ${WORK_DIR}/prefix/include/hushgain/io"
      "the edges' headers (io) were installed")

execute_process(
  COMMAND ${CMAKE_COMMAND} -S "${SOURCE_DIR}/examples/embedding"
          -B "${WORK_DIR}/consumer" -DCMAKE_BUILD_TYPE=Release
          "-DCMAKE_PREFIX_PATH=${WORK_DIR}/prefix"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "configuring the consumer failed: ${out}${err}")
execute_process(
  COMMAND ${CMAKE_COMMAND} --build "${WORK_DIR}/consumer"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "building the consumer failed: ${out}${err}")
execute_process(COMMAND "${WORK_DIR}/consumer/budget_by_hand"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "the consumer failed (${status}): ${out}${err}")
check("out MATCHES closed.form" "the consumer printed no check: ${out}")

# A parent project: its build type stays, hushgain's tests stay out.
file(WRITE "${WORK_DIR}/parent/CMakeLists.txt" "
cmake_minimum_required(VERSION 3.18)
project(parent LANGUAGES CXX)
enable_testing()
add_subdirectory(\"${SOURCE_DIR}\" hushgain)
add_executable(budget_by_hand \"${SOURCE_DIR}/examples/embedding/budget_by_hand.cpp\")
target_link_libraries(budget_by_hand PRIVATE hushgain::core)
")
execute_process(
  COMMAND ${CMAKE_COMMAND} -S "${WORK_DIR}/parent" -B "${WORK_DIR}/parent-build"
          -DCMAKE_BUILD_TYPE=Debug
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "configuring the parent failed: ${out}${err}")
file(STRINGS "${WORK_DIR}/parent-build/CMakeCache.txt" build_type
  REGEX "^CMAKE_BUILD_TYPE:")
check("build_type STREQUAL CMAKE_BUILD_TYPE:STRING=Debug"
      "the parent's build type became ${build_type}")
execute_process(COMMAND ${CMAKE_CTEST_COMMAND} -N
  WORKING_DIRECTORY "${WORK_DIR}/parent-build" OUTPUT_VARIABLE listed)
check("listed MATCHES \"Total Tests: 0\"" "hushgain registered tests in the parent: ${listed}")
file(REMOVE_RECURSE "${WORK_DIR}")
