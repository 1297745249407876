# Runs one app command and checks both its exit code and its output (CTest's PASS_REGULAR_EXPRESSION
# alone ignores the exit code). Arguments (-D…):
#   COMMAND  the command, its words joined by "@@"
#   CODE     the expected exit code
#   REGEX    a regular expression the combined stdout + stderr must match (optional)
#   FORBID   a regular expression it must not match (optional)
#   WORKDIR  the working directory (optional)
#   FRESH    a folder emptied before the run (optional), e.g. the run's output directory
#   ABSENT   glob patterns (joined by "@@") of files that must not exist after the run (optional): results
#            of a failed run, temporary files of an interrupted write
#   PRESENT  files (joined by "@@") that must exist after the run (optional): results a rejected case keeps
string(REPLACE "@@" ";" command "${COMMAND}")
if(NOT WORKDIR)
  set(WORKDIR ".")
endif()
if(FRESH)
  file(REMOVE_RECURSE ${FRESH})
  file(MAKE_DIRECTORY ${FRESH})
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
if(ABSENT)
  string(REPLACE "@@" ";" patterns "${ABSENT}")
  foreach(pattern ${patterns})
    file(GLOB found ${pattern})
    if(found)
      message(FATAL_ERROR "files left that must not exist: ${found}\noutput:\n${text}")
    endif()
  endforeach()
endif()
if(PRESENT)
  string(REPLACE "@@" ";" files "${PRESENT}")
  foreach(file ${files})
    if(NOT EXISTS ${file})
      message(FATAL_ERROR "file missing that must exist: ${file}\noutput:\n${text}")
    endif()
  endforeach()
endif()
message(STATUS "exit code ${rc} as expected; output:\n${text}")
