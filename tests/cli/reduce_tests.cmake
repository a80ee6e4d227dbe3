# siiplan simulate and siiplan reduce. The HDF5 fixtures in tests/data/ are written with h5py by
# scripts/make_correlation_fixtures.py (a program other than siiplan, following the documented layout).

# The chain on the demo scenario: simulate (explicit options, faults injected) -> reduce.
siiplan_cli_test(NAME simulate_explicit EXIT 0
  ARGS simulate --site ${DEMO}/site.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini
       --ra 10:00:00 --dec -30 --mag 1.0 --diameter-mas 0.3 --start 2026-03-15T03:00 --end 2026-03-15T04:00
       --frame-s 5 --seed 3 --timing-offset Birch:8 --spurious Alder-Cedar:-15:0.04 --cloud 40:45:0.1
       -o ${OUT}/reduce_chain.h5
  STDOUT "wrote .*reduce_chain.h5: [0-9]+ runs.*no zero-baseline correlation recorded \\(instrument: zero_baseline = free\\)")
set_tests_properties("cli: simulate_explicit" PROPERTIES FIXTURES_SETUP reduce_chain)
siiplan_cli_test(NAME reduce_chain EXIT 0
  ARGS reduce ${OUT}/reduce_chain.h5 --zero-baseline-nominal -o ${OUT}/reduce_chain.oifits --csv ${OUT}/reduce_chain.csv
  STDOUT "Alder-Birch [^\n]*rejected for rate drops 60;[^\n]*offset -7\\.9[0-9]+ ns \\(SNR [0-9.]+, applied\\).*Alder-Cedar [^\n]*spurious structure at -1[45]\\.[0-9]+ ns")
set_tests_properties("cli: reduce_chain" PROPERTIES FIXTURES_REQUIRED reduce_chain)
# instrument-large.ini has zero_baseline = free: simulate records no zero-baseline correlation, so reduce
# needs a source and says which.
siiplan_cli_test(NAME reduce_uncalibrated_needs_source EXIT 2
  ARGS reduce ${OUT}/reduce_chain.h5 -o ${OUT}/reduce_uncalibrated.oifits
  STDERR "the file records no zero-baseline correlation \\(.*--zero-baseline-nominal and fit the normalisation\\)"
  ABSENT ${OUT}/reduce_uncalibrated.oifits)
set_tests_properties("cli: reduce_uncalibrated_needs_source" PROPERTIES FIXTURES_REQUIRED reduce_chain)
siiplan_cli_test(NAME reduce_two_zero_baseline_sources EXIT 2
  ARGS reduce ${OUT}/reduce_chain.h5 --zero-baseline-nominal --zero-baseline-ps 0.03 -o ${OUT}/reduce_two.oifits
  STDERR "give only one of --zero-baseline-ps, --calibrator and --zero-baseline-nominal" ABSENT ${OUT}/reduce_two.oifits)

# A valid file written by another program (h5py) following the documented layout.
siiplan_cli_test(NAME reduce_h5py_file EXIT 0
  ARGS reduce ${DATA}/corr_h5py.h5 --chunk-s 100 --csv ${OUT}/reduce_h5py.csv
  STDOUT "4 good \\|V\\|\\^2 points, 0 flagged")

# Bad inputs: exit 2, a message naming the problem, no output left behind.
siiplan_cli_test(NAME reduce_not_hdf5 EXIT 2 ARGS reduce ${DATA}/not_hdf5.h5 -o ${OUT}/reduce_bad.oifits
  STDERR "not_hdf5.h5: not an HDF5 file" ABSENT ${OUT}/reduce_bad.oifits)
siiplan_cli_test(NAME reduce_truncated EXIT 2 ARGS reduce ${DATA}/corr_truncated.h5 -o ${OUT}/reduce_bad.oifits
  STDERR "corr_truncated.h5: HDF5 cannot open the file: it is truncated or corrupted" ABSENT ${OUT}/reduce_bad.oifits)
siiplan_cli_test(NAME reduce_foreign EXIT 2 ARGS reduce ${DATA}/foreign.h5 -o ${OUT}/reduce_bad.oifits
  STDERR "foreign.h5: an HDF5 file, but not a siiplan correlation file" ABSENT ${OUT}/reduce_bad.oifits)
siiplan_cli_test(NAME reduce_missing_metadata EXIT 2 ARGS reduce ${DATA}/corr_missing_target.h5 --csv ${OUT}/reduce_bad.csv
  STDERR "/runs/run_0000: missing attribute 'target'" ABSENT ${OUT}/reduce_bad.csv)
siiplan_cli_test(NAME reduce_missing_file EXIT 2 ARGS reduce ${OUT}/no_such.h5 -o ${OUT}/reduce_bad.oifits
  STDERR "no_such.h5: file not found" ABSENT ${OUT}/reduce_bad.oifits)
siiplan_cli_test(NAME reduce_no_output EXIT 2 ARGS reduce ${DATA}/corr_h5py.h5
  STDERR "no output requested")
siiplan_cli_test(NAME reduce_unknown_calibrator EXIT 2
  ARGS reduce ${DATA}/corr_h5py.h5 --calibrator Nobody -o ${OUT}/reduce_bad.oifits
  STDERR "--calibrator: no run observes 'Nobody'" ABSENT ${OUT}/reduce_bad.oifits)
siiplan_cli_test(NAME simulate_bad_fault EXIT 2
  ARGS simulate --site ${DEMO}/site.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini
       --ra 10:00:00 --dec -30 --mag 1.0 --diameter-mas 0.8 --start 2026-03-15T03:00 --end 2026-03-15T03:10
       --cloud 40:45 -o ${OUT}/simulate_bad.h5
  STDERR "--cloud: '40:45' is not START_MIN:END_MIN:TRANSMISSION" ABSENT ${OUT}/simulate_bad.h5)
siiplan_cli_test(NAME simulate_unknown_telescope EXIT 2
  ARGS simulate --site ${DEMO}/site.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini
       --ra 10:00:00 --dec -30 --mag 1.0 --diameter-mas 0.8 --start 2026-03-15T03:00 --end 2026-03-15T03:10
       --drop-telescope Nessie:1:2 -o ${OUT}/simulate_bad.h5
  STDERR "--drop-telescope: no telescope 'Nessie'" ABSENT ${OUT}/simulate_bad.h5)
siiplan_cli_test(NAME simulate_no_plan_file EXIT 2 ARGS simulate ${OUT}/no_such_plan.h5 -o ${OUT}/simulate_bad.h5
  STDERR "no_such_plan.h5" ABSENT ${OUT}/simulate_bad.h5)

# The chain from a night plan: night -> simulate (one target's model overridden) -> reduce.
siiplan_cli_test(NAME simulate_plan_setup EXIT 0
  ARGS night --site ${DEMO}/site.ini --array ${DEMO}/array-small.csv --instrument ${DEMO}/instrument-small.ini
       --catalog ${DEMO}/targets.csv --date 2026-03-14 --out ${OUT}/simulate_plan
  STDOUT "plan.h5")
set_tests_properties("cli: simulate_plan_setup" PROPERTIES FIXTURES_SETUP simulate_plan)
siiplan_cli_test(NAME simulate_plan EXIT 0
  ARGS simulate ${OUT}/simulate_plan/plan.h5 --seed 2 --frame-s 5 --target Ismer --diameter-mas 1.5
       -o ${OUT}/simulate_plan.h5
  STDOUT "wrote .*simulate_plan.h5: 9 runs")
set_tests_properties("cli: simulate_plan" PROPERTIES FIXTURES_REQUIRED simulate_plan FIXTURES_SETUP simulate_plan_corr)
siiplan_cli_test(NAME reduce_plan EXIT 0
  ARGS reduce ${OUT}/simulate_plan.h5 --csv ${OUT}/reduce_plan.csv
  STDOUT "Quoll-Robin Yselde .* good \\|V\\|\\^2 points")
set_tests_properties("cli: reduce_plan" PROPERTIES FIXTURES_REQUIRED simulate_plan_corr)
siiplan_cli_test(NAME simulate_plan_model_without_target EXIT 2
  ARGS simulate ${OUT}/simulate_plan/plan.h5 --diameter-mas 2 -o ${OUT}/simulate_bad.h5
  STDERR "--model: with a plan, model options change one target only" ABSENT ${OUT}/simulate_bad.h5)
set_tests_properties("cli: simulate_plan_model_without_target" PROPERTIES FIXTURES_REQUIRED simulate_plan)
siiplan_cli_test(NAME simulate_plan_unknown_target EXIT 2
  ARGS simulate ${OUT}/simulate_plan/plan.h5 --target Nobody --diameter-mas 2 -o ${OUT}/simulate_bad.h5
  STDERR "--target: no block of the plan observes 'Nobody'" ABSENT ${OUT}/simulate_bad.h5)
set_tests_properties("cli: simulate_plan_unknown_target" PROPERTIES FIXTURES_REQUIRED simulate_plan)
