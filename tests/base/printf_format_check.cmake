# CTest printf_format_checked: compiles tests/base/printf_format_cases.cpp
# once per case with the compiler and the warning flags of every hushgain
# target. Case 0 (correct calls) must compile; cases 1..5 (a mismatched or
# unchecked format) must each be refused with a format diagnostic, so a
# Printf whose arguments do not match its format cannot be built.
#   cmake -DCXX=... -DFLAGS="-Wall;..." -DSOURCE_DIR=... -DWORK_DIR=... -P
foreach(var CXX FLAGS SOURCE_DIR WORK_DIR)
  if(NOT DEFINED ${var})
    message(FATAL_ERROR "printf_format_check: ${var} not given")
  endif()
endforeach()
file(MAKE_DIRECTORY "${WORK_DIR}")
set(source "${SOURCE_DIR}/tests/base/printf_format_cases.cpp")

function(compile case out_rc out_log)
  execute_process(
    COMMAND "${CXX}" -std=c++20 ${FLAGS} "-DFORMAT_CASE=${case}"
            "-I${SOURCE_DIR}/src" -c "${source}"
            -o "${WORK_DIR}/printf_format_case_${case}.o"
    RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE err)
  set(${out_rc} "${rc}" PARENT_SCOPE)
  set(${out_log} "${out}${err}" PARENT_SCOPE)
endfunction()

compile(0 rc log)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "the correct calls (case 0) did not compile:\n${log}")
endif()
message(STATUS "case 0: correct calls compile")

# What each mistake must be refused with (GCC and clang spell them alike
# enough for these words).
set(expect_1 "format")
set(expect_2 "format")
set(expect_3 "format")
set(expect_4 "format")
set(expect_5 "not a string literal")
foreach(case 1 2 3 4 5)
  compile(${case} rc log)
  if(rc EQUAL 0)
    message(FATAL_ERROR "case ${case} compiled, but its format does not match "
                        "its arguments:\n${log}")
  endif()
  if(NOT log MATCHES "error:.*${expect_${case}}")
    message(FATAL_ERROR "case ${case} failed without a format error:\n${log}")
  endif()
  message(STATUS "case ${case}: refused")
endforeach()
