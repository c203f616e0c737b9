# CTest: cpack -G DEB, then dpkg-deb --field checks, a dpkg install into a
# scratch root with its own database, and a budget run by the installed
# program on the installed example. -DBUILD_DIR= the build folder,
# -DSTATIC_PROGRAM=ON when the program is linked statically.
function(check condition what)
  separate_arguments(words UNIX_COMMAND "${condition}")
  if(NOT (${words}))
    message(FATAL_ERROR "deb test: ${what}")
  endif()
endfunction()

find_program(DPKG dpkg)
find_program(DPKG_DEB dpkg-deb)
find_program(DPKG_SHLIBDEPS dpkg-shlibdeps)
if(NOT DPKG OR NOT DPKG_DEB OR NOT DPKG_SHLIBDEPS)
  message("skipped: dpkg, dpkg-deb or dpkg-shlibdeps missing (not Debian, or no dpkg-dev)")
  return()
endif()

string(MD5 tag "${BUILD_DIR}")
set(WORK_DIR "/tmp")
if(DEFINED ENV{TMPDIR})
  set(WORK_DIR "$ENV{TMPDIR}")
endif()
set(WORK_DIR "${WORK_DIR}/hushgain-deb-test-${tag}")
file(REMOVE_RECURSE "${WORK_DIR}")
file(MAKE_DIRECTORY "${WORK_DIR}")

execute_process(
  COMMAND cpack -G DEB -B "${WORK_DIR}/out" --config "${BUILD_DIR}/CPackConfig.cmake"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "cpack failed: ${out}${err}")
file(GLOB debs "${WORK_DIR}/out/*.deb")
list(LENGTH debs count)
check("count EQUAL 1" "expected one .deb, got: ${debs}")

function(field name out_var)
  execute_process(COMMAND "${DPKG_DEB}" --field "${debs}" ${name}
    OUTPUT_VARIABLE value OUTPUT_STRIP_TRAILING_WHITESPACE)
  set(${out_var} "${value}" PARENT_SCOPE)
endfunction()
field(Package package)
field(Recommends recommends)
field(Depends depends)
check("package STREQUAL hushgain" "Package is '${package}'")
check("recommends STREQUAL gnuplot-nox" "Recommends is '${recommends}'")
# A statically linked program (HUSHGAIN_STATIC_RUNTIME, the default) needs
# no library; a dynamically linked one needs libc6, found by dpkg-shlibdeps.
if(STATIC_PROGRAM)
  if(NOT depends STREQUAL "")
    message(FATAL_ERROR "deb test: Depends of a static program is '${depends}'")
  endif()
else()
  check("depends MATCHES libc6" "Depends lacks libc6: '${depends}'")
endif()

# dpkg into a scratch root: its own admin folder, dependencies not checked
# (they live in the real system's database), no root needed.
set(root "${WORK_DIR}/root")
file(MAKE_DIRECTORY "${root}/var/lib/dpkg/info" "${root}/var/lib/dpkg/updates")
file(TOUCH "${root}/var/lib/dpkg/status")
execute_process(
  COMMAND "${DPKG}" --instdir=${root} --admindir=${root}/var/lib/dpkg
          --force-not-root --force-depends --force-script-chrootless
          --no-triggers --log=/dev/null -i "${debs}"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "dpkg -i failed: ${out}${err}")
execute_process(
  COMMAND "${DPKG}" --admindir=${root}/var/lib/dpkg -L hushgain
  OUTPUT_VARIABLE listed)
check("listed MATCHES /usr/bin/hushgain" "dpkg -L lacks /usr/bin/hushgain")
check("listed MATCHES /usr/share/hushgain/devices/opamps/jfet-input.json"
      "dpkg -L lacks the devices")

execute_process(
  COMMAND ${CMAKE_COMMAND} -E env --unset=HUSHGAIN_DEVICES
          "${root}/usr/bin/hushgain" budget
          "${root}/usr/share/doc/hushgain/examples/hydrophone-preamp.json"
  WORKING_DIRECTORY "${WORK_DIR}"
  OUTPUT_VARIABLE out ERROR_VARIABLE err RESULT_VARIABLE status)
check("status EQUAL 0" "the installed program failed: ${err}")
check("out MATCHES \"hydrophone preamp\"" "no budget printed: ${out}")
file(REMOVE_RECURSE "${WORK_DIR}")
