# CTest smoke test: generate tiny benchmark circuits and report each as JSON.
# Inputs: GENERATOR, REVBOUND (executables), WORK_DIR (scratch folder).
foreach(Var GENERATOR REVBOUND WORK_DIR)
  if(NOT DEFINED ${Var})
    message(FATAL_ERROR "smoke_test.cmake needs -D${Var}=...")
  endif()
endforeach()

file(REMOVE_RECURSE "${WORK_DIR}")
file(MAKE_DIRECTORY "${WORK_DIR}")

# 200 flat ops on 8 qubits, 2^10 nested leaves, 50 parameterised calls.
execute_process(
  COMMAND "${GENERATOR}" --ops 200 --qubits 8 --levels 10 --params
          --param-gates 8 --param-calls 50 "${WORK_DIR}"
  RESULT_VARIABLE Status OUTPUT_VARIABLE Out ERROR_VARIABLE Err)
if(NOT Status EQUAL 0)
  message(FATAL_ERROR "generator exited with ${Status}:\n${Out}${Err}")
endif()

# Each file: (name, text the JSON must contain).
set(Checks
  "flat.qasm|\"measure\": 8"
  "nested.qasm|\"gates\": 1024"
  "params.qasm|\"as_written\"")
foreach(Check IN LISTS Checks)
  string(REPLACE "|" ";" Parts "${Check}")
  list(GET Parts 0 File)
  list(GET Parts 1 Expected)
  execute_process(
    COMMAND "${REVBOUND}" report --format json "${WORK_DIR}/${File}"
    RESULT_VARIABLE Status OUTPUT_VARIABLE Json ERROR_VARIABLE Err)
  if(NOT Status EQUAL 0)
    message(FATAL_ERROR "revbound report on ${File} exited with ${Status}:\n${Err}")
  endif()
  foreach(Needle "\"schema\": \"revbound/report-1\"" "${Expected}")
    string(FIND "${Json}" "${Needle}" At)
    if(At EQUAL -1)
      message(FATAL_ERROR "report of ${File} lacks '${Needle}':\n${Json}")
    endif()
  endforeach()
endforeach()
message(STATUS "perf smoke test: generator and report OK")
