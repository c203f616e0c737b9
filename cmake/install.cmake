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
target_compile_definitions(hushgain PRIVATE
  HUSHGAIN_DEVICES_FROM_PROGRAM="${hushgain_devices_from_program}")

install(TARGETS hushgain RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})
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
  install(FILES ${hushgain_man} DESTINATION ${CMAKE_INSTALL_MANDIR}/man1)
else()
  message(STATUS "help2man not found: no man page (scripts/setup installs it)")
endif()

# CTest: install into a scratch prefix, move it, run a budget from elsewhere.
add_test(NAME install_relocated
  COMMAND ${CMAKE_COMMAND} -DBUILD_DIR=${CMAKE_CURRENT_BINARY_DIR}
          -DSOURCE_DIR=${CMAKE_CURRENT_SOURCE_DIR}
          -DHELP2MAN=${HUSHGAIN_HELP2MAN}
          -P ${CMAKE_CURRENT_SOURCE_DIR}/tests/install/install_test.cmake)
