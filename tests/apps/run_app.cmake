# Runs one app command and checks both its exit code and its output (CTest's PASS_REGULAR_EXPRESSION
# alone ignores the exit code). Arguments (-D…):
#   COMMAND  the command, its words joined by "@@"
#   CODE     the expected exit code
#   REGEX    a regular expression the combined stdout + stderr must match (optional)
#   FORBID   a regular expression it must not match (optional)
#   WORKDIR  the working directory (optional)
string(REPLACE "@@" ";" command "${COMMAND}")
if(NOT WORKDIR)
  set(WORKDIR ".")
endif()
execute_process(COMMAND ${command} WORKING_DIRECTORY ${WORKDIR} RESULT_VARIABLE rc OUTPUT_VARIABLE out
                ERROR_VARIABLE err)
set(text "${out}${err}")
if(NOT "${rc}" STREQUAL "${CODE}")
  message(FATAL_ERROR "exit code ${rc}, expected ${CODE}; output:\n${text}")
endif()
if(DEFINED REGEX AND NOT text MATCHES "${REGEX}")
  message(FATAL_ERROR "output does not match '${REGEX}':\n${text}")
endif()
if(DEFINED FORBID AND text MATCHES "${FORBID}")
  message(FATAL_ERROR "output matches the forbidden '${FORBID}':\n${text}")
endif()
message(STATUS "exit code ${rc} as expected; output:\n${text}")
