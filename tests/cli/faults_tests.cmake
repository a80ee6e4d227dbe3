# Faults (tests/cli/faults.sh): SIGKILL mid-write, determinism, unwritable output directory, disk full.
foreach(mode kill determinism unwritable diskfull)
  add_test(NAME "cli: fault_${mode}"
           COMMAND bash ${PROJECT_SOURCE_DIR}/tests/cli/faults.sh ${mode} $<TARGET_FILE:siiplan> ${DEMO} ${OUT}/fault-${mode})
  set_tests_properties("cli: fault_${mode}" PROPERTIES SKIP_RETURN_CODE 77 TIMEOUT 600 PASS_REGULAR_EXPRESSION "ok: ")
endforeach()
# The kill test measures timing: keep it from sharing the CPUs with the other fault tests.
set_tests_properties("cli: fault_kill" PROPERTIES RUN_SERIAL TRUE)
