# Install rules, the man page and the Debian package. Included at the end of
# CMakeLists.txt. Layout under the prefix:
#   bin/hushgain
#   share/hushgain/devices/      (found by the binary relative to itself)
#   share/hushgain/schema/       JSON Schemas of stage and device files
#   share/man/man1/hushgain.1    (help2man, when installed)
#   share/doc/hushgain/          README, LICENSE, CHANGELOG, examples/
include(GNUInstallDirs)

# The binary finds its devices by this path relative to its own folder
# (src/cli/device_folder.h), so the installed tree can move.
file(RELATIVE_PATH hushgain_devices_from_program
  "/${CMAKE_INSTALL_BINDIR}" "/${CMAKE_INSTALL_DATADIR}/hushgain/devices")
target_compile_definitions(hushgain_cli PRIVATE
  HUSHGAIN_DEVICES_FROM_PROGRAM="${hushgain_devices_from_program}")

install(TARGETS hushgain RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})

# The library for other programs: hushgain::core and its headers, exported
# as the CMake package "hushgain" (lib/cmake/hushgain/). The core's headers
# are every header of src/ but the edges (io, report, cli), which the core
# never includes.
install(TARGETS hushgain_core EXPORT hushgainTargets
  ARCHIVE DESTINATION ${CMAKE_INSTALL_LIBDIR})
install(DIRECTORY src/ DESTINATION ${CMAKE_INSTALL_INCLUDEDIR}/hushgain
  FILES_MATCHING PATTERN "*.h"
  PATTERN "io" EXCLUDE PATTERN "report" EXCLUDE PATTERN "cli" EXCLUDE)
set(hushgain_cmake_dir ${CMAKE_INSTALL_LIBDIR}/cmake/hushgain)
install(EXPORT hushgainTargets NAMESPACE hushgain::
  DESTINATION ${hushgain_cmake_dir})
include(CMakePackageConfigHelpers)
configure_package_config_file(cmake/hushgainConfig.cmake.in
  ${CMAKE_CURRENT_BINARY_DIR}/hushgainConfig.cmake
  INSTALL_DESTINATION ${hushgain_cmake_dir})
write_basic_package_version_file(
  ${CMAKE_CURRENT_BINARY_DIR}/hushgainConfigVersion.cmake
  COMPATIBILITY SameMinorVersion)
install(FILES ${CMAKE_CURRENT_BINARY_DIR}/hushgainConfig.cmake
  ${CMAKE_CURRENT_BINARY_DIR}/hushgainConfigVersion.cmake
  DESTINATION ${hushgain_cmake_dir})
install(DIRECTORY devices/
  DESTINATION ${CMAKE_INSTALL_DATADIR}/hushgain/devices)
install(DIRECTORY schema/ DESTINATION ${CMAKE_INSTALL_DATADIR}/hushgain/schema)
install(FILES README.md LICENSE CHANGELOG.md
  DESTINATION ${CMAKE_INSTALL_DOCDIR})
install(DIRECTORY examples/ DESTINATION ${CMAKE_INSTALL_DOCDIR}/examples)

# The man page: help2man (Debian package help2man) reads `hushgain --help`
# and `--version`; cmake/manpage.cmake adds every subcommand's --help and the
# hand-written sections of doc/hushgain.h2m. Without help2man the page is
# skipped with a message (scripts/setup installs it).
find_program(HUSHGAIN_HELP2MAN help2man)
if(HUSHGAIN_HELP2MAN)
  set(hushgain_man ${CMAKE_CURRENT_BINARY_DIR}/hushgain.1)
  add_custom_command(OUTPUT ${hushgain_man}
    COMMAND ${CMAKE_COMMAND} -DHELP2MAN=${HUSHGAIN_HELP2MAN}
            -DPROGRAM=$<TARGET_FILE:hushgain>
            -DSECTIONS=${CMAKE_CURRENT_SOURCE_DIR}/doc/hushgain.h2m
            -DOUT=${hushgain_man}
            -P ${CMAKE_CURRENT_SOURCE_DIR}/cmake/manpage.cmake
    DEPENDS hushgain ${CMAKE_CURRENT_SOURCE_DIR}/doc/hushgain.h2m
            ${CMAKE_CURRENT_SOURCE_DIR}/cmake/manpage.cmake
    COMMENT "Generating the man page hushgain.1" VERBATIM)
  add_custom_target(hushgain_man ALL DEPENDS ${hushgain_man})
  # OPTIONAL: a build of chosen targets only (scripts/test-sanitize builds
  # hushgain and its tests) has no page, and installs without it.
  install(FILES ${hushgain_man} DESTINATION ${CMAKE_INSTALL_MANDIR}/man1
    OPTIONAL)
else()
  message(STATUS "help2man not found: no man page (scripts/setup installs it)")
endif()

if(HUSHGAIN_BUILD_TESTS)
# CTest: install into a scratch prefix, move it, run a budget from elsewhere.
add_test(NAME install_relocated
  COMMAND ${CMAKE_COMMAND} -DBUILD_DIR=${CMAKE_CURRENT_BINARY_DIR}
          -DSOURCE_DIR=${CMAKE_CURRENT_SOURCE_DIR}
          -DHELP2MAN=${HUSHGAIN_HELP2MAN}
          -P ${CMAKE_CURRENT_SOURCE_DIR}/tests/install/install_test.cmake)
# CTest: examples/embedding built against the installed package, and a
# parent project that takes hushgain in with add_subdirectory.
add_test(NAME embedding_consumer
  COMMAND ${CMAKE_COMMAND} -DBUILD_DIR=${CMAKE_CURRENT_BINARY_DIR}
          -DSOURCE_DIR=${CMAKE_CURRENT_SOURCE_DIR}
          -P ${CMAKE_CURRENT_SOURCE_DIR}/tests/install/embedding_test.cmake)
endif()

# The Debian package: `cpack -G DEB` in the build folder (or `cmake --build
# build --target package`). One package holds everything installed above;
# gnuplot-nox is recommended (pictures), the shared-library dependencies
# come from dpkg-shlibdeps.
# cpack installs without building first (preinstall builds nothing): a
# CTest runs it while other tests run the built programs.
set(CMAKE_SKIP_INSTALL_ALL_DEPENDENCY ON)
if(hushgain_top_level)
set(CPACK_GENERATOR DEB)
set(CPACK_PACKAGE_NAME hushgain)
set(CPACK_PACKAGE_VENDOR "The hushgain authors")
set(CPACK_PACKAGE_CONTACT "The hushgain authors <hushgain@localhost>")
set(CPACK_PACKAGE_DESCRIPTION_SUMMARY
  "noise and offset budgets of high-gain inverting op-amp front ends")
set(CPACK_PACKAGE_DESCRIPTION
  "hushgain computes the noise and offset budget of a high-gain inverting
op-amp stage (plain or T-network feedback, or a photodiode transimpedance
stage) from a JSON stage file: every contributor's share of the output
noise, offsets and drift, bandwidth, loop gain and warnings. It searches
standard-value T networks, suggests transimpedance feedback parts, draws
spectra with gnuplot and runs a Monte Carlo over tolerances.")
set(CPACK_RESOURCE_FILE_LICENSE ${CMAKE_CURRENT_SOURCE_DIR}/LICENSE)
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_SECTION science)
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
set(CPACK_DEBIAN_PACKAGE_RECOMMENDS gnuplot-nox)
set(CPACK_PACKAGING_INSTALL_PREFIX /usr)
include(CPack)
endif()

# CTest: build the .deb, check its control fields, install it with dpkg into
# a scratch root (its own dpkg database: the machine is not touched, and two
# builds may run it at once) and run a budget with the installed program.
# Skipped where dpkg is missing (not Debian).
if(HUSHGAIN_BUILD_TESTS AND hushgain_top_level)
add_test(NAME deb_package
  COMMAND ${CMAKE_COMMAND} -DBUILD_DIR=${CMAKE_CURRENT_BINARY_DIR}
          -DSTATIC_PROGRAM=${hushgain_static_program}
          -P ${CMAKE_CURRENT_SOURCE_DIR}/tests/install/deb_test.cmake)
set_tests_properties(deb_package PROPERTIES SKIP_RETURN_CODE 77
  SKIP_REGULAR_EXPRESSION "skipped: ")
endif()
