# siiplan fit and siiplan convert: demo data, OIFITS from astropy (scripts/make_ref_oifits.py), bad input.
set(MEAS ${DEMO}/measurements-demo.csv)

# Demo data (invented star Mirelle, theta_LD = 0.444 mas, u = 0.38; scripts/make_demo_measurements.py):
# an LD fit with u fixed recovers the diameter used to simulate the data within its error.
siiplan_cli_test(NAME fit_demo_ld EXIT 0 ARGS fit ${MEAS} --model ld-linear --fix limb_u=0.38 --format csv
                 STDOUT "diameter_mas,0\\.44[3-6][0-9]*,0\\.0013")
siiplan_cli_test(NAME fit_demo_table EXIT 0 ARGS fit ${MEAS} --free-norm --convert-limb-u 0.38
                 STDOUT "Status: converged.*reduced chi2 = .*LD diameter \\(linear u=0.38, short_baseline\\)")
siiplan_cli_test(NAME fit_demo_csv_rows EXIT 0 ARGS fit ${MEAS} --format csv
                 STDOUT "^parameter,value,error,error_scaled\n.*norm,1,fixed,fixed\n.*chi2_reduced,1\\.2")
siiplan_cli_test(NAME fit_demo_plot EXIT 0 ARGS fit ${MEAS} --model ellipse --plot ${OUT}/fit_ellipse.svg
                 STDOUT "axis_ratio")
siiplan_cli_test(NAME fit_demo_compare EXIT 0 ARGS fit ${MEAS} --compare ud,ld-linear,gaussian --fix limb_u=0.38
                 STDOUT "gaussian .*AIC = chi2 \\+ 2")
siiplan_cli_test(NAME fit_demo_bootstrap EXIT 0 ARGS fit ${MEAS} --bootstrap 50 --bootstrap-nights --seed 4
                 STDOUT "error_bootstrap.*3 groups")
siiplan_cli_test(NAME fit_norm_prior EXIT 0 ARGS fit ${MEAS} --norm-prior 1+-0.02 STDOUT "Gaussian prior 1 \\+- 0.02")
# OIFITS written by astropy.io.fits, one target of two selected: 3 rows x 2 channels, 1 value flagged.
siiplan_cli_test(NAME fit_oifits_astropy EXIT 0 ARGS fit ${DATA}/astropy_v2.oifits --target ALPHA_TEST --free-norm
                 STDOUT "5 measurements, target ALPHA_TEST")
# A fit that does not converge: exit 0, said plainly on stdout and stderr.
siiplan_cli_test(NAME fit_not_converged EXIT 0 ARGS fit ${MEAS} --diameter-mas 3 --max-iterations 1
                 STDOUT "Status: NOT converged" STDERR "warning: the fit did not converge")

# convert: CSV -> OIFITS (checked by fitsverify when installed) -> CSV.
siiplan_cli_test(NAME convert_to_oifits EXIT 0 ARGS convert ${MEAS} -o ${OUT}/demo_meas.oifits STDERR "180 records")
siiplan_cli_test(NAME convert_back EXIT 0 ARGS convert ${OUT}/demo_meas.oifits -o ${OUT}/demo_meas_back.csv)
siiplan_cli_test(NAME convert_direct EXIT 0 ARGS convert ${MEAS} -o ${OUT}/demo_meas_direct.csv)
set_tests_properties("cli: convert_back" PROPERTIES DEPENDS "cli: convert_to_oifits")
add_test(NAME "cli: convert_round_trip_identical"
         COMMAND ${CMAKE_COMMAND} -E compare_files ${OUT}/demo_meas_back.csv ${OUT}/demo_meas_direct.csv)
set_tests_properties("cli: convert_round_trip_identical" PROPERTIES DEPENDS "cli: convert_back;cli: convert_direct")
find_program(FITSVERIFY fitsverify)
if(FITSVERIFY)
  add_test(NAME "cli: convert_fitsverify" COMMAND ${FITSVERIFY} -q -e ${OUT}/demo_meas.oifits)
  set_tests_properties("cli: convert_fitsverify" PROPERTIES DEPENDS "cli: convert_to_oifits"
                       PASS_REGULAR_EXPRESSION "verification OK" FAIL_REGULAR_EXPRESSION "error")
endif()

# Bad input: exit 2, a clear message, no output left behind.
siiplan_cli_test(NAME fit_missing_column EXIT 2 ARGS fit ${DATA}/curvefit_ref.csv
                 STDERR "missing column 'vis2'")
siiplan_cli_test(NAME fit_not_fits EXIT 2 ARGS fit ${DATA}/not_fits.fits STDERR "not a FITS file")
siiplan_cli_test(NAME fit_no_vis2 EXIT 2 ARGS fit ${DATA}/astropy_no_vis2.oifits STDERR "no OI_VIS2 table")
siiplan_cli_test(NAME fit_all_flagged EXIT 2 ARGS fit ${DATA}/astropy_all_flagged.oifits
                 STDERR "no unflagged squared visibilities")
siiplan_cli_test(NAME fit_bad_nwave EXIT 2 ARGS fit ${DATA}/astropy_bad_nwave.oifits
                 STDERR "HDU 5 \\(OI_VIS2\\): column VIS2DATA holds 3 values per row where 2 are expected")
siiplan_cli_test(NAME fit_unknown_fix EXIT 2 ARGS fit ${MEAS} --fix limb_q=1 STDERR "has no parameter 'limb_q'")
siiplan_cli_test(NAME fit_bad_prior EXIT 2 ARGS fit ${MEAS} --norm-prior 1+-0 STDERR "--norm-prior")
siiplan_cli_test(NAME fit_bad_input_no_plot EXIT 2 ARGS fit ${DATA}/not_fits.fits --plot ${OUT}/fit_bad.svg
                 ABSENT ${OUT}/fit_bad.svg)
file(WRITE ${OUT}/fit_zero_err.csv "baseline_m,wavelength_nm,vis2,vis2_err\n10,443,0.5,0.1\n20,443,0.4,-0.1\n")
siiplan_cli_test(NAME fit_nonpositive_error EXIT 2 ARGS fit ${OUT}/fit_zero_err.csv
                 STDERR "fit_zero_err.csv:3: vis2_err must be positive")
siiplan_cli_test(NAME convert_not_fits EXIT 2 ARGS convert ${DATA}/not_fits.fits -o ${OUT}/convert_bad.csv
                 STDERR "not a FITS file" ABSENT ${OUT}/convert_bad.csv)
siiplan_cli_test(NAME convert_bad_extension EXIT 2 ARGS convert ${MEAS} -o ${OUT}/convert_bad.txt
                 STDERR "cannot tell the format" ABSENT ${OUT}/convert_bad.txt)
siiplan_cli_test(NAME convert_no_vis2 EXIT 2 ARGS convert ${DATA}/astropy_no_vis2.oifits -o ${OUT}/convert_nv.csv
                 STDERR "no OI_VIS2" ABSENT ${OUT}/convert_nv.csv)
