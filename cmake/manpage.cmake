# Builds the man page OUT with HELP2MAN from PROGRAM's --help and --version,
# the hand-written SECTIONS file and, under "COMMANDS", the --help of every
# subcommand (so the page lists every option and cannot fall behind).
get_filename_component(out_dir "${OUT}" DIRECTORY)
set(include_file "${out_dir}/hushgain-commands.h2m")
file(READ "${SECTIONS}" text)
string(APPEND text "\n[COMMANDS]\n")
foreach(command "budget" "tee sweep" "tee search" "tia suggest" "tia snr" "plot" "spread")
  separate_arguments(words UNIX_COMMAND "${command}")
  execute_process(COMMAND "${PROGRAM}" ${words} --help
    OUTPUT_VARIABLE help RESULT_VARIABLE status)
  if(NOT status EQUAL 0)
    message(FATAL_ERROR "${PROGRAM} ${command} --help failed")
  endif()
  # roff: a leading dot or quote starts a request, a backslash an escape.
  string(REPLACE "\\" "\\e" help "${help}")
  string(REGEX REPLACE "(^|\n)([.'])" "\\1\\\\&\\2" help "${help}")
  string(APPEND text ".SS \"hushgain ${command}\"\n.nf\n${help}.fi\n")
endforeach()
file(WRITE "${include_file}" "${text}")
execute_process(
  COMMAND "${HELP2MAN}" --no-info --section=1
          "--name=noise and offset budgets of high-gain inverting op-amp front ends"
          "--include=${include_file}" "--output=${OUT}" "${PROGRAM}"
  RESULT_VARIABLE status)
if(NOT status EQUAL 0)
  message(FATAL_ERROR "help2man failed on ${PROGRAM}")
endif()
