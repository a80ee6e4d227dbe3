# siiplan night: the demo night, outputs read back by independent parsers, constraints from the site file,
# bad catalogs, and a night without dark time.
set(NIGHT_COMMON --site ${DEMO}/site.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini --date 2026-03-14)
siiplan_cli_test(NAME night_demo EXIT 0 ARGS night ${NIGHT_COMMON} --catalog ${DEMO}/targets.csv --out ${OUT}/night-demo
                 STDOUT "Goals met: plan [0-9]+ .*simple schedule")
set_tests_properties("cli: night_demo" PROPERTIES FIXTURES_SETUP night_demo_outputs)
add_test(NAME "cli: night_outputs_parse" COMMAND /usr/bin/python3 ${CMAKE_CURRENT_SOURCE_DIR}/cli/check_night_outputs.py ${OUT}/night-demo)
set_tests_properties("cli: night_outputs_parse" PROPERTIES FIXTURES_REQUIRED night_demo_outputs PASS_REGULAR_EXPRESSION "^ok:")
add_test(NAME "cli: night_h5dump" COMMAND h5dump -H ${OUT}/night-demo/plan.h5)
set_tests_properties("cli: night_h5dump" PROPERTIES FIXTURES_REQUIRED night_demo_outputs PASS_REGULAR_EXPRESSION "block_0000")

siiplan_cli_test(NAME night_small_array EXIT 0
                 ARGS night --site ${DEMO}/site.ini --array ${DEMO}/array-small.csv --instrument ${DEMO}/instrument-small.ini
                      --date 2026-03-14 --catalog ${DEMO}/targets.csv --out ${OUT}/night-small STDOUT "blocks planned")
siiplan_cli_test(NAME night_constraints_from_site EXIT 0
                 ARGS night --site ${DATA}/site-constraints.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini
                      --date 2026-03-14 --catalog ${DEMO}/targets.csv --out ${OUT}/night-constr --threads 1
                 STDOUT "slots of 10 min.*never above 35 deg")

siiplan_cli_test(NAME night_no_dark_time EXIT 0
                 ARGS night --site ${DATA}/site-arctic.ini --array ${DEMO}/array-large.csv --instrument ${DEMO}/instrument-large.ini
                      --date 2026-06-21 --catalog ${DEMO}/targets.csv --out ${OUT}/night-arctic
                 STDOUT "No dark time at Invented Arctic Station")
siiplan_cli_test(NAME night_bad_ra EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-catalog-bad-ra.csv --out ${OUT}/night-bad1
                 STDERR "night-catalog-bad-ra.csv:3: column 'ra'.*outside 0 .. 360" ABSENT ${OUT}/night-bad1/report.html)
siiplan_cli_test(NAME night_missing_column EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-catalog-no-ra.csv --out ${OUT}/night-bad2
                 STDERR "night-catalog-no-ra.csv:1: missing column 'ra'" ABSENT ${OUT}/night-bad2/schedule.csv)
siiplan_cli_test(NAME night_duplicate_name EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-catalog-duplicate.csv --out ${OUT}/night-bad3
                 STDERR "night-catalog-duplicate.csv:4: target name 'Alpha' is used twice" ABSENT ${OUT}/night-bad3/plan.h5)
siiplan_cli_test(NAME night_empty_catalog EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-catalog-empty.csv --out ${OUT}/night-bad4
                 STDERR "night-catalog-empty.csv" ABSENT ${OUT}/night-bad4/report.html)
siiplan_cli_test(NAME night_bad_moonlit EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DEMO}/targets.csv --moonlit maybe --out ${OUT}/night-bad5
                 STDERR "--moonlit: 'maybe' is not yes or no" ABSENT ${OUT}/night-bad5/report.html)
siiplan_cli_test(NAME night_bad_slot EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DEMO}/targets.csv --slot-min 0 --out ${OUT}/night-bad6
                 STDERR "slot = 0 min; must lie within" ABSENT ${OUT}/night-bad6/report.html)

# FITS binary-table catalogs (written by astropy: scripts/make_night_fits_catalogs.py)
siiplan_cli_test(NAME night_fits_catalog EXIT 0 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-targets.fits --out ${OUT}/night-fits
                 STDOUT "24 of 40 targets observable")
siiplan_cli_test(NAME night_fits_bad_ra EXIT 2 ARGS night ${NIGHT_COMMON} --catalog ${DATA}/night-bad-ra.fits --out ${OUT}/night-bad7
                 STDERR "night-bad-ra.fits\\[TARGETS\\] row 2: column 'ra'.*outside 0 .. 360" ABSENT ${OUT}/night-bad7/report.html)
