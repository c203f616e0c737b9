# CTest: install into a temporary prefix, move the prefix elsewhere, and run
# a budget from a third folder with nothing pointing at the source tree: the
# binary must find its devices relative to itself. Then take the devices
# away and check that the error names the place it looked.
# Arguments: -DBUILD_DIR= -DSOURCE_DIR= [-DHELP2MAN=]. The scratch folder is
# under the system's temporary folder, away from both trees, one per build.
# `condition` is an if() condition as one string (paths without spaces).
function(check condition what)
  separate_arguments(words UNIX_COMMAND "${condition}")
  if(NOT (${words}))
    message(FATAL_ERROR "install test: ${what}")
  endif()
endfunction()

string(MD5 tag "${BUILD_DIR}")
set(WORK_DIR "/tmp")
if(DEFINED ENV{TMPDIR})
  set(WORK_DIR "$ENV{TMPDIR}")
endif()
set(WORK_DIR "${WORK_DIR}/hushgain-install-test-${tag}")
file(REMOVE_RECURSE "${WORK_DIR}")
file(MAKE_DIRECTORY "${WORK_DIR}/elsewhere")
execute_process(
  COMMAND ${CMAKE_COMMAND} --install "${BUILD_DIR}" --prefix "${WORK_DIR}/prefix"
  OUTPUT_QUIET RESULT_VARIABLE status)
check("status EQUAL 0" "cmake --install failed (${status})")
foreach(file
    bin/hushgain
    share/hushgain/devices/opamps/jfet-input.json
    share/hushgain/devices/resistors/thin-film.json
    share/hushgain/schema/stage.schema.json
    share/hushgain/schema/device.schema.json
    share/doc/hushgain/README.md
    share/doc/hushgain/LICENSE
    share/doc/hushgain/CHANGELOG.md
    share/doc/hushgain/examples/geophone-preamp.json)
  check("EXISTS ${WORK_DIR}/prefix/${file}" "${file} not installed")
endforeach()
if(HELP2MAN AND EXISTS "${BUILD_DIR}/hushgain.1")
  check("EXISTS ${WORK_DIR}/prefix/share/man/man1/hushgain.1"
        "share/man/man1/hushgain.1 not installed")
endif()
check("NOT EXISTS ${WORK_DIR}/prefix/bin/hushgain-source-devices"
      "the build's source-tree pointer was installed")

# Relocate: the prefix moves, the binary follows its own location.
file(RENAME "${WORK_DIR}/prefix" "${WORK_DIR}/moved")
file(COPY "${SOURCE_DIR}/examples/geophone-preamp.json"
     DESTINATION "${WORK_DIR}/elsewhere")
set(program "${WORK_DIR}/moved/bin/hushgain")
execute_process(
  COMMAND ${CMAKE_COMMAND} -E env --unset=HUSHGAIN_DEVICES
          "${program}" budget geophone-preamp.json --format json
  WORKING_DIRECTORY "${WORK_DIR}/elsewhere"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "relocated budget failed (${status}): ${err}")
# The same budget as the build tree's binary with the source tree's devices.
execute_process(
  COMMAND "${BUILD_DIR}/hushgain" --devices "${SOURCE_DIR}/devices" budget
          "${SOURCE_DIR}/examples/geophone-preamp.json" --format json
  OUTPUT_VARIABLE reference RESULT_VARIABLE status)
check("status EQUAL 0" "the build tree's budget failed")
check("out STREQUAL reference" "relocated budget differs:\n${out}")

# --help names no folder of the build machine.
execute_process(COMMAND "${program}" --help OUTPUT_VARIABLE help)
string(FIND "${help}" "${SOURCE_DIR}" at_source)
string(FIND "${help}" "${BUILD_DIR}" at_build)
check("at_source EQUAL -1 AND at_build EQUAL -1"
      "--help shows a build-machine path: ${help}")

# Without its devices the relocated binary says where it looked, and the
# source tree is not among the places (nothing points back to it).
file(REMOVE_RECURSE "${WORK_DIR}/moved/share/hushgain/devices")
execute_process(
  COMMAND ${CMAKE_COMMAND} -E env --unset=HUSHGAIN_DEVICES
          "${program}" budget geophone-preamp.json
  WORKING_DIRECTORY "${WORK_DIR}/elsewhere"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
set(expected "error: command line: device folder not found; looked in \
${WORK_DIR}/moved/share/hushgain/devices (beside the program); give \
--devices DIR or set HUSHGAIN_DEVICES\n")
check("status EQUAL 2" "missing devices: exit ${status}, expected 2")
check("err STREQUAL expected" "missing devices: got\n${err}expected\n${expected}")
file(REMOVE_RECURSE "${WORK_DIR}")
