# cmake -P script behind the Install.EmbedConsumer test: install, configure
# and build consumer/ against the installed tree, run it, compare its output.
foreach(Var BUILD_DIR WORK_DIR CONSUMER_DIR CIRCUIT GENERATOR CXX_COMPILER)
  if(NOT DEFINED ${Var} OR "${${Var}}" STREQUAL "")
    message(FATAL_ERROR "RunConsumer.cmake: -D${Var}=... is required")
  endif()
endforeach()

# run(STEP COMMAND...): runs one step, fails the test with its output.
function(run Step)
  execute_process(COMMAND ${ARGN} RESULT_VARIABLE Rc
                  OUTPUT_VARIABLE Out ERROR_VARIABLE Err)
  if(NOT Rc EQUAL 0)
    message(FATAL_ERROR "${Step} failed (${Rc}):\n${Out}\n${Err}")
  endif()
  set(RunOutput "${Out}" PARENT_SCOPE)
endfunction()

set(Prefix ${WORK_DIR}/prefix)
set(ConsumerBuild ${WORK_DIR}/consumer-build)
file(REMOVE_RECURSE ${WORK_DIR})

set(Install ${CMAKE_COMMAND} --install ${BUILD_DIR} --prefix ${Prefix})
if(BUILD_TYPE)
  list(APPEND Install --config ${BUILD_TYPE})
endif()
run("install" ${Install})
foreach(Installed
    include/revbound/report/Report.h
    include/revbound/qasm/Frontend.h
    bin/revbound)
  if(NOT EXISTS ${Prefix}/${Installed})
    message(FATAL_ERROR "install: ${Prefix}/${Installed} is missing")
  endif()
endforeach()

set(Configure ${CMAKE_COMMAND} -S ${CONSUMER_DIR} -B ${ConsumerBuild}
  -G ${GENERATOR} -DCMAKE_PREFIX_PATH=${Prefix}
  -DCMAKE_CXX_COMPILER=${CXX_COMPILER})
if(C_COMPILER)
  list(APPEND Configure -DCMAKE_C_COMPILER=${C_COMPILER})
endif()
if(BUILD_TYPE)
  list(APPEND Configure -DCMAKE_BUILD_TYPE=${BUILD_TYPE})
endif()
if(LAUNCHER)
  list(APPEND Configure -DCMAKE_CXX_COMPILER_LAUNCHER=${LAUNCHER})
endif()
run("consumer configure" ${Configure})
run("consumer build" ${CMAKE_COMMAND} --build ${ConsumerBuild})
run("consumer run" ${ConsumerBuild}/revbound_embed ${CIRCUIT})

# The circuit is qelib1.inc's ccx body (OpenQASM 2.0, Cross et al.,
# arXiv:1707.03429) on inputs a, b and target c, then `reset c`.
# - T-count 7: four t and three tdg in that body, the 7-T Toffoli also of
#   Amy, Maslov, Mosca & Roetteler, IEEE TCAD 32(6), 818, 2013 (from memory).
# - two-qubit gates 6: the six cx of the body.
# - depth 11, derived by ASAP layering (common practice; one layer per gate
#   and per reset, docs/metrics.md), ready times (a,b,c) after each step:
#   h c (0,0,1); cx b,c (0,2,2); tdg c (0,2,3); cx a,c (4,2,4); t c (4,2,5);
#   cx b,c (4,6,6); tdg c (4,6,7); cx a,c (8,6,8); t b (8,7,8); t c (8,7,9);
#   h c (8,7,10); cx a,b (9,9,10); t a, tdg b (10,10,10); cx a,b (11,11,10);
#   reset c (11,11,11).
# - T-depth 4, the same layering counting only t and tdg:
#   tdg c (0,0,1); cx a,c (1,0,1); t c (1,0,2); cx b,c (1,2,2); tdg c
#   (1,2,3); cx a,c (3,2,3); t b, t c (3,3,4); cx a,b (3,3,4); t a, tdg b
#   (4,4,4).
# - one erasure, the reset. With a, b uniform random bits, c = a AND b is 1
#   with probability 1/4, so the reset removes the binary entropy
#   h(1/4) = 2 - (3/4) log2 3 = 0.811278 bits (Shannon; derivation), exactly.
# - least heat k_B T ln 2 x 0.811278 bits at 300 K, k_B = 1.380649e-23 J/K
#   (SI Brochure, 9th edition, 2019; Landauer, IBM J. Res. Dev. 5, 183,
#   1961): 2.329e-21 J.
set(Expected "toffoli_reset.qasm: 3 qubits
T-count 7
two-qubit gates 6
depth 11
T-depth 4
erasure events 1
erased entropy 0.811278 to 0.811278 bits
least heat at 300 K 2.329e-21 J
")
if(NOT RunOutput STREQUAL Expected)
  message(FATAL_ERROR "consumer output differs.\nexpected:\n${Expected}\ngot:\n${RunOutput}")
endif()
message(STATUS "consumer output as expected:\n${RunOutput}")
file(REMOVE_RECURSE ${WORK_DIR})
