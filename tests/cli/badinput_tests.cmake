# Bad input to every reader, through the real binary: each case exits with code 2, names the file and
# line (or HDU, dataset, option) and says what to do, and leaves no output file (ABSENT) or leaves an
# existing one unchanged (UNCHANGED). Cases named ok_* are inputs that look odd but are valid (CRLF line
# endings, a byte-order mark, long lines, unknown columns or keys) and must work (exit 0).
# Files: tests/data/bad/, written by scripts/make_bad_inputs.py (astropy/h5py for the binary ones).
# Regexes avoid square brackets (CMake list parsing); '.' stands for them.
set(BAD ${DATA}/bad)
set(BO ${OUT}/badinput)
file(MAKE_DIRECTORY ${BO})
set(BAD_STAR --ra 05:55:10.3 --dec +07:24:25)
set(BAD_NIGHT --night 2026-01-15)
set(BAD_TRACKS tracks --site ${DEMO}/site.ini --array ${DEMO}/array-small.csv)
set(BAD_RESOLVE --magnitude 2 --diameter-mas 1 --baselines-m 10,20 --mirror-diameter-m 1)

# Site INI (read by sky; the same reader serves tracks, resolve, night, simulate)
function(bad_site name file regex)
  siiplan_cli_test(NAME bad_site_${name} EXIT 2 ARGS sky --site ${file} ${BAD_NIGHT} -o ${BO}/site_${name}.txt
                   STDERR "${regex}" ABSENT ${BO}/site_${name}.txt)
endfunction()
bad_site(missing ${BAD}/no-such-site.ini "^siiplan: .*no-such-site.ini: no such file \\(check the path\\)")
bad_site(empty ${BAD}/site-empty.ini "site-empty.ini: the file is empty \\(see the README")
bad_site(no_latitude ${BAD}/site-no-latitude.ini "site-no-latitude.ini: missing key 'latitude_deg' in .site. \\(geodetic latitude")
bad_site(no_section ${BAD}/site-no-section.ini "site-no-section.ini: no .site. section \\(start the file with")
bad_site(nonnumeric ${BAD}/site-nonnumeric-height.ini "site-nonnumeric-height.ini:5: 'site.height_m = high' is not a finite number \\(height")
bad_site(nan ${BAD}/site-nan-latitude.ini "site-nan-latitude.ini:3: 'site.latitude_deg = nan' is not a finite number")
bad_site(inf ${BAD}/site-inf-longitude.ini "site-inf-longitude.ini:4: 'site.longitude_deg = inf' is not a finite number")
bad_site(latitude_range ${BAD}/site-latitude-91.ini "site-latitude-91.ini:3: latitude_deg = -91 must lie within -90 .. 90")
bad_site(non_utf8 ${BAD}/site-non-utf8.ini "site-non-utf8.ini:2: byte 18 of the line is not valid UTF-8 text \\(save the file as UTF-8")
bad_site(long_value ${BAD}/site-long-value.ini "site-long-value.ini:5: 'site.height_m = 9999.*' is not a finite number")
siiplan_cli_test(NAME bad_site_ok_unknown_key EXIT 0 ARGS sky --site ${BAD}/site-ok-unknown-key.ini ${BAD_NIGHT} --format csv
                 STDERR "^siiplan: warning: .*site-ok-unknown-key.ini:6: unknown key 'dome_colour' in .site. is ignored\n$")
siiplan_cli_test(NAME bad_site_ok_crlf EXIT 0 ARGS sky --site ${BAD}/site-ok-crlf.ini ${BAD_NIGHT} --format csv
                 STDOUT "^time_utc,mjd_utc,local,sky" STDERR "^$")
siiplan_cli_test(NAME bad_site_ok_long_comment EXIT 0 ARGS sky --site ${BAD}/site-ok-long-comment.ini ${BAD_NIGHT} --format csv
                 STDOUT "^time_utc,mjd_utc,local,sky" STDERR "^$")

# Telescope array CSV (read by tracks)
function(bad_array name file regex)
  siiplan_cli_test(NAME bad_array_${name} EXIT 2 ARGS tracks --site ${DEMO}/site.ini --array ${file} ${BAD_STAR} ${BAD_NIGHT}
                   -o ${BO}/array_${name}.csv STDERR "${regex}" ABSENT ${BO}/array_${name}.csv)
endfunction()
bad_array(missing ${BAD}/no-such-array.csv "no-such-array.csv: no such file")
bad_array(empty ${BAD}/array-empty.csv "array-empty.csv: the file is empty \\(no header row\\) \\(the first line must name the columns")
bad_array(no_rows ${BAD}/array-header-only.csv "array-header-only.csv: the array has no telescopes \\(add one row per telescope")
bad_array(no_diameter ${BAD}/array-no-diameter.csv "array-no-diameter.csv:1: missing column 'diameter_m' \\(add the mirror diameter")
bad_array(nan ${BAD}/array-nan-east.csv "array-nan-east.csv:3: column 'east_m': 'nan' is not a finite number")
bad_array(inf ${BAD}/array-inf-north.csv "array-inf-north.csv:4: column 'north_m': 'inf' is not a finite number")
bad_array(zero_diameter ${BAD}/array-zero-diameter.csv "array-zero-diameter.csv:3: diameter_m = 0 must lie within 0 .. 100 \\(exclusive of 0\\)")
bad_array(negative_diameter ${BAD}/array-negative-diameter.csv "array-negative-diameter.csv:4: diameter_m = -0.8 must lie within")
bad_array(duplicate ${BAD}/array-duplicate-name.csv "array-duplicate-name.csv:4: telescope name 'A' is used twice \\(also at .*array-duplicate-name.csv:2\\)")
bad_array(coincident ${BAD}/array-coincident.csv "array-coincident.csv:4: telescope 'C' is less than 1 cm from 'B'.*check the coordinates")
bad_array(too_many_fields ${BAD}/array-too-many-fields.csv "array-too-many-fields.csv:3: the record has 6 fields but the header has 5")
bad_array(non_utf8 ${BAD}/array-non-utf8.csv "array-non-utf8.csv:3: byte 2 of the line is not valid UTF-8 text")
bad_array(one_telescope ${BAD}/array-one-telescope.csv "--array: the array has only one telescope \\(an intensity interferometer needs at least two")
function(ok_array name file)
  siiplan_cli_test(NAME bad_array_ok_${name} EXIT 0 ARGS tracks --site ${DEMO}/site.ini --array ${file} ${BAD_STAR} ${BAD_NIGHT}
                   --format csv STDOUT "\n2026-01-16T[0-9:]+Z,[0-9.]+,A-B,.*\n2026-01-16T[0-9:]+Z,[0-9.]+,B-C," STDERR "^$")
endfunction()
ok_array(crlf ${BAD}/array-ok-crlf.csv)
ok_array(extra_column ${BAD}/array-ok-extra-column.csv)
ok_array(long_line ${BAD}/array-ok-long-line.csv)

# Instrument INI (read by resolve; also night and simulate)
function(bad_instrument name file regex)
  siiplan_cli_test(NAME bad_instrument_${name} EXIT 2 ARGS resolve --instrument ${file} ${BAD_RESOLVE} -o ${BO}/instr_${name}.txt
                   STDERR "${regex}" ABSENT ${BO}/instr_${name}.txt)
endfunction()
bad_instrument(missing ${BAD}/no-such-instrument.ini "no-such-instrument.ini: no such file")
bad_instrument(empty ${BAD}/instrument-empty.ini "instrument-empty.ini: the file is empty")
bad_instrument(no_mode ${BAD}/instrument-no-mode.ini "instrument-no-mode.ini: missing key 'mode' in .instrument. \\(mode = analog")
bad_instrument(bad_mode ${BAD}/instrument-bad-mode.ini "instrument-bad-mode.ini:2: mode = 'quantum' is not allowed")
bad_instrument(efficiency_zero ${BAD}/instrument-efficiency-0.ini "instrument-efficiency-0.ini:5: efficiency = 0 must lie within \\(0, 1.")
bad_instrument(efficiency_above_one ${BAD}/instrument-efficiency-1.5.ini "instrument-efficiency-1.5.ini:5: efficiency = 1.5 must lie within \\(0, 1. \\(a fraction")
bad_instrument(efficiency_negative ${BAD}/instrument-efficiency-negative.ini "instrument-efficiency-negative.ini:5: efficiency = -0.2 must lie within")
bad_instrument(efficiency_nan ${BAD}/instrument-efficiency-nan.ini "instrument-efficiency-nan.ini:5: 'instrument.efficiency = nan' is not a finite number")
bad_instrument(zero_bandwidth ${BAD}/instrument-zero-bandwidth.ini "instrument-zero-bandwidth.ini:4: bandwidth_nm = 0 must lie within \\(0, 225.")
bad_instrument(negative_fov ${BAD}/instrument-negative-fov.ini "instrument-negative-fov.ini:7: fov_arcsec = -5 must lie within")
siiplan_cli_test(NAME bad_instrument_ok_crlf EXIT 0 ARGS resolve --instrument ${BAD}/instrument-ok-crlf.ini ${BAD_RESOLVE}
                 STDOUT "baseline_m" STDERR "^$")
siiplan_cli_test(NAME bad_instrument_ok_unknown_key EXIT 0 ARGS resolve --instrument ${BAD}/instrument-ok-unknown-key.ini ${BAD_RESOLVE}
                 STDOUT "baseline_m" STDERR "^siiplan: warning: .*instrument-ok-unknown-key.ini:11: unknown key 'cryostat'")

# Target catalogs, CSV and FITS (read by tracks --catalog; the night planner uses the same reader)
function(bad_catalog name file regex)
  siiplan_cli_test(NAME bad_catalog_${name} EXIT 2 ARGS ${BAD_TRACKS} --catalog ${file} --target Alpha ${BAD_NIGHT}
                   -o ${BO}/catalog_${name}.csv STDERR "${regex}" ABSENT ${BO}/catalog_${name}.csv)
endfunction()
bad_catalog(missing ${BAD}/no-such-catalog.csv "no-such-catalog.csv: no such file")
bad_catalog(empty ${BAD}/catalog-empty.csv "catalog-empty.csv: the file is empty")
bad_catalog(no_dec ${BAD}/catalog-no-dec.csv "catalog-no-dec.csv:1: missing column 'dec' \\(the catalog needs name, ra and dec")
bad_catalog(ra_range ${BAD}/catalog-ra-361.csv "catalog-ra-361.csv:2: column 'ra': RA 361.0 deg is outside 0 .. 360 \\(write RA as")
bad_catalog(dec_range ${BAD}/catalog-dec-minus-91.csv "catalog-dec-minus-91.csv:3: column 'dec': Dec '-91:00:00' is beyond")
bad_catalog(duplicate ${BAD}/catalog-duplicate-name.csv "catalog-duplicate-name.csv:3: target name 'Alpha' is used twice")
bad_catalog(nonnumeric ${BAD}/catalog-nonnumeric-mag.csv "catalog-nonnumeric-mag.csv:3: column 'mag_v': 'bright' is not a finite number")
bad_catalog(nan ${BAD}/catalog-nan-diameter.csv "catalog-nan-diameter.csv:3: column 'diameter_mas': 'NaN' is not a finite number")
bad_catalog(inf ${BAD}/catalog-inf-mag.csv "catalog-inf-mag.csv:2: column 'mag_v': 'inf' is not a finite number")
bad_catalog(zero_diameter ${BAD}/catalog-zero-diameter.csv "catalog-zero-diameter.csv:2: .*out of range \\(it must be greater than 0\\)")
bad_catalog(negative_priority ${BAD}/catalog-negative-priority.csv "catalog-negative-priority.csv:3: priority must be greater than 0")
bad_catalog(unknown_model ${BAD}/catalog-unknown-model.csv "catalog-unknown-model.csv:3: unknown model 'donut' \\(use one of ud,")
bad_catalog(ra_huge_hours ${BAD}/catalog-ra-huge-hours.csv "catalog-ra-huge-hours.csv:3: column 'ra': RA '1111.*' is not an angle")
bad_catalog(ra_huge_minutes ${BAD}/catalog-ra-huge-minutes.csv "catalog-ra-huge-minutes.csv:3: column 'ra': RA '06:2344.*' is out of range \\(hours 0-23, minutes and seconds 0-59\\)")
bad_catalog(non_utf8 ${BAD}/catalog-non-utf8.csv "catalog-non-utf8.csv:3: byte 2 of the line is not valid UTF-8")
bad_catalog(fits_not_fits ${BAD}/not-fits.fits "not-fits.fits: cannot read as FITS")
bad_catalog(fits_truncated ${BAD}/catalog-truncated.fits "catalog-truncated.fits.TARGETS. row 1: .*FITS")
bad_catalog(fits_no_table ${BAD}/catalog-no-table.fits "catalog-no-table.fits: no binary table in this FITS file \\(write the catalog as a BINTABLE")
bad_catalog(fits_no_ra ${BAD}/catalog-no-ra.fits "catalog-no-ra.fits.TARGETS. columns: missing column 'ra'")
bad_catalog(fits_numeric_name ${BAD}/catalog-numeric-name.fits "catalog-numeric-name.fits.TARGETS. column 'name': is numeric, but it must hold text \\(store it as a character column")
bad_catalog(fits_dec_range ${BAD}/catalog-dec-out.fits "catalog-dec-out.fits.TARGETS. row 2: column 'dec': Dec '95' is beyond")
bad_catalog(fits_unquoted_ttype ${BAD}/catalog-unquoted-ttype.fits
            "catalog-unquoted-ttype.fits: HDU 2, header card 15: the value of TTYPE4 is not a quoted character string")
bad_catalog(fits_nan_ra ${BAD}/catalog-nan-ra.fits "catalog-nan-ra.fits.TARGETS. row 1: column 'ra'")
function(ok_catalog name file)
  siiplan_cli_test(NAME bad_catalog_ok_${name} EXIT 0 ARGS ${BAD_TRACKS} --catalog ${file} --target Alpha ${BAD_NIGHT} --format csv
                   STDOUT "^time_utc,.*\n2026-01-16T" STDERR "^$")
endfunction()
ok_catalog(crlf ${BAD}/catalog-ok-crlf.csv)
ok_catalog(bom ${BAD}/catalog-ok-bom.csv)
ok_catalog(extra_column ${BAD}/catalog-ok-extra-column.csv)
ok_catalog(long_line ${BAD}/catalog-ok-long-line.csv)
ok_catalog(fits ${BAD}/catalog-ok.fits)

# A catalog of one million targets, generated at test time into the build tree (30 MB, not committed).
# tracks reads and checks the whole catalog, then follows one of the last targets: the reader's path without a
# full night plan (which would schedule a million targets).
add_test(NAME "cli: bad_catalog_million_rows_generate"
         COMMAND ${CMAKE_COMMAND} -DOUTPUT=${BO}/catalog-1m.csv -DROWS_K=1000 -P ${PROJECT_SOURCE_DIR}/tests/cli/make_big_catalog.cmake)
set_tests_properties("cli: bad_catalog_million_rows_generate" PROPERTIES FIXTURES_SETUP catalog_1m)
siiplan_cli_test(NAME bad_catalog_million_rows EXIT 0 ARGS ${BAD_TRACKS} --catalog ${BO}/catalog-1m.csv --target S999_606 ${BAD_NIGHT}
                 --format csv STDOUT "^time_utc,.*\n2026-01-1.T")
set_tests_properties("cli: bad_catalog_million_rows" PROPERTIES FIXTURES_REQUIRED catalog_1m TIMEOUT 300)

# Measurement CSV and OIFITS (read by fit; convert and reduce share the readers)
function(bad_vis2 name file regex)
  siiplan_cli_test(NAME bad_vis2_${name} EXIT 2 ARGS convert ${file} -o ${BO}/vis2_${name}.oifits
                   STDERR "${regex}" ABSENT ${BO}/vis2_${name}.oifits)
endfunction()
bad_vis2(missing ${BAD}/no-such-data.csv "no-such-data.csv: no such file")
bad_vis2(no_err ${BAD}/vis2-no-err.csv "vis2-no-err.csv:1: missing column 'vis2_err'")
bad_vis2(negative_err ${BAD}/vis2-negative-err.csv "vis2-negative-err.csv:3: vis2_err must be positive, got -0.03 \\(give the 1-sigma error")
bad_vis2(zero_err ${BAD}/vis2-zero-err.csv "vis2-zero-err.csv:4: vis2_err must be positive, got 0")
bad_vis2(nonnumeric ${BAD}/vis2-nonnumeric.csv "vis2-nonnumeric.csv:3: column 'vis2': 'high' is not a finite number")
bad_vis2(inf ${BAD}/vis2-inf.csv "vis2-inf.csv:4: column 'vis2': 'inf' is not a finite number")
bad_vis2(no_rows ${BAD}/vis2-header-only.csv "vis2-header-only.csv: no measurements \\(the file needs at least one row")
siiplan_cli_test(NAME bad_vis2_ok_crlf EXIT 0 ARGS fit ${BAD}/vis2-ok-crlf.csv --model ud STDOUT "diameter")
bad_vis2(oifits_not_fits ${BAD}/not-fits.fits "not-fits.fits: not a FITS file")
bad_vis2(oifits_not_oifits ${BAD}/oifits-not-oifits.fits "oifits-not-oifits.fits: no OI_VIS2 table \\(the file holds no squared visibilities")
bad_vis2(oifits_no_vis2 ${DATA}/astropy_no_vis2.oifits "astropy_no_vis2.oifits: no OI_VIS2 table")
bad_vis2(oifits_nwave ${DATA}/astropy_bad_nwave.oifits "astropy_bad_nwave.oifits: HDU 5 \\(OI_VIS2\\): column VIS2DATA holds 3 values per row where 2 are expected")
bad_vis2(oifits_wrong_type ${DATA}/astropy_bad_type.oifits "astropy_bad_type.oifits: HDU 5 \\(OI_VIS2\\): column VIS2DATA has the wrong type")
bad_vis2(oifits_unquoted_ttype ${BAD}/catalog-unquoted-ttype.fits "catalog-unquoted-ttype.fits: HDU 2, header card 15: the value of TTYPE4")
bad_vis2(oifits_truncated ${BAD}/oifits-truncated.oifits "oifits-truncated.oifits: .*truncated")

# Correlation files (read by reduce) and night plans (read by simulate)
function(bad_corr name file regex)
  siiplan_cli_test(NAME bad_corr_${name} EXIT 2 ARGS reduce ${file} -o ${BO}/corr_${name}.oifits
                   STDERR "${regex}" ABSENT ${BO}/corr_${name}.oifits)
endfunction()
bad_corr(missing ${BAD}/no-such-corr.h5 "no-such-corr.h5")
bad_corr(not_hdf5 ${BAD}/not-hdf5.h5 "not-hdf5.h5: not an HDF5 file \\(or its header is damaged\\)")
bad_corr(truncated ${BAD}/corr-truncated.h5 "corr-truncated.h5: HDF5 cannot open the file: it is truncated or corrupted")
bad_corr(other_program ${BAD}/corr-other-program.h5 "corr-other-program.h5: an HDF5 file, but not a siiplan correlation file")
bad_corr(missing_attribute ${BAD}/corr-missing-target.h5 "corr-missing-target.h5: /runs/run_0000: missing attribute 'target'")
bad_corr(version ${BAD}/corr-version-99.h5 "corr-version-99.h5: /: format_version 99 \\(this siiplan reads 1\\)")
bad_corr(plan_given ${BAD}/plan-no-array.h5 "plan-no-array.h5: an HDF5 file, but not a siiplan correlation file")
function(bad_plan name file regex)
  siiplan_cli_test(NAME bad_plan_${name} EXIT 2 ARGS simulate --plan ${file} -o ${BO}/plan_${name}.h5
                   STDERR "${regex}" ABSENT ${BO}/plan_${name}.h5)
endfunction()
bad_plan(missing ${BAD}/no-such-plan.h5 "no-such-plan.h5")
bad_plan(not_hdf5 ${BAD}/not-hdf5.h5 "not-hdf5.h5: not a readable siiplan plan file: not an HDF5 file")
bad_plan(truncated ${BAD}/plan-truncated.h5 "plan-truncated.h5: not a readable siiplan plan file: .*\\(write it with 'siiplan night'\\)")
bad_plan(no_array ${BAD}/plan-no-array.h5 "plan-no-array.h5: not a readable siiplan plan file: missing group 'array'")
bad_plan(corr_given ${BAD}/corr-version-99.h5 "corr-version-99.h5: not a readable siiplan plan file: attribute 'format' is not 'siiplan-plan'")

# Command-line values
function(bad_option name regex)
  siiplan_cli_test(NAME bad_option_${name} EXIT 2 ARGS ${ARGN} -o ${BO}/option_${name}.txt
                   STDERR "${regex}" ABSENT ${BO}/option_${name}.txt)
endfunction()
bad_option(date_before_utc "--night: '1900-01-01' lies before 1960, where UTC and ERFA's leap-second table begin \\(give a date from 1960 on\\)"
           ${BAD_TRACKS} ${BAD_STAR} --night 1900-01-01)
bad_option(start_before_utc "--start: .1959-12-31. lies before 1960"
           ${BAD_TRACKS} ${BAD_STAR} --start 1959-12-31T22:00 --end 1959-12-31T23:00)
bad_option(date_year_5_digits "--night: '10000-01-01' is not a date" ${BAD_TRACKS} ${BAD_STAR} --night 10000-01-01)
bad_option(dec_range "--dec: Dec '91' is beyond" ${BAD_TRACKS} --ra 05:55:10.3 --dec 91 ${BAD_NIGHT})
bad_option(ra_nan "--ra: RA 'nan' is not an angle" ${BAD_TRACKS} --ra nan --dec 10 ${BAD_NIGHT})
bad_option(dec_huge_degrees "--dec: Dec '-99999999999:00:00' is not an angle" ${BAD_TRACKS} --ra 10 --dec -99999999999:00:00 ${BAD_NIGHT})
bad_option(diameter_nan "--diameter-mas: 'nan' is not a finite number"
           curve --model ud --diameter-mas nan --wavelength-nm 450 --baselines-m 0:10:1)
bad_option(wavelength_inf "--wavelength-nm: 'inf' is not a finite number"
           curve --model ud --diameter-mas 1 --wavelength-nm inf --baselines-m 0:10:1)
bad_option(diameter_negative "--diameter-mas: value -1 is out of range \\(it must be greater than 0\\)"
           curve --model ud --diameter-mas -1 --wavelength-nm 450 --baselines-m 0:10:1)
bad_option(too_many_baselines "--baselines-m: range '0:1e12:1e-3' has more than 1000000 values"
           curve --model ud --diameter-mas 1 --wavelength-nm 450 --baselines-m 0:1e12:1e-3)
bad_option(step_zero "--step-min: must be greater than zero, got 0" ${BAD_TRACKS} ${BAD_STAR} ${BAD_NIGHT} --step-min 0)
# Boost.Program_options 1.74 looped forever on its own placeholder syntax in an option name.
bad_option(unknown_option_placeholder "unrecognised option '--.+canonical_option.+=1' \\(see 'siiplan help curve'\\)"
           curve --%canonical_option%=1 --diameter-mas 1 --wavelength-nm 450 --baselines-m 0:10:1)
bad_option(magnitude_nan "--magnitude: 'nan' is not a finite number"
           resolve --instrument ${DEMO}/instrument-small.ini --magnitude nan --diameter-mas 1 --baselines-m 10,20 --mirror-diameter-m 1)

# An existing output file keeps its content when the input is bad (table, SVG and night outputs).
siiplan_cli_test(NAME bad_keeps_existing_table EXIT 2 ARGS ${BAD_TRACKS} --catalog ${BAD}/catalog-ra-361.csv --target Alpha
                 ${BAD_NIGHT} -o ${BO}/existing.csv STDERR "catalog-ra-361.csv:2" UNCHANGED ${BO}/existing.csv)
siiplan_cli_test(NAME bad_keeps_existing_plot EXIT 2 ARGS tracks --site ${DEMO}/site.ini --array ${BAD}/array-coincident.csv
                 ${BAD_STAR} ${BAD_NIGHT} --plot ${BO}/existing.svg STDERR "array-coincident.csv:4" UNCHANGED ${BO}/existing.svg)
siiplan_cli_test(NAME bad_keeps_existing_night EXIT 2 ARGS night --site ${DEMO}/site.ini --array ${DEMO}/array-small.csv
                 --instrument ${DEMO}/instrument-small.ini --date 2026-03-14 --catalog ${BAD}/catalog-duplicate-name.csv
                 --out ${BO}/night-existing STDERR "catalog-duplicate-name.csv:3" UNCHANGED ${BO}/night-existing/schedule.csv)
siiplan_cli_test(NAME bad_keeps_existing_oifits EXIT 2 ARGS convert ${BAD}/vis2-negative-err.csv -o ${BO}/existing.oifits
                 STDERR "vis2-negative-err.csv:3" UNCHANGED ${BO}/existing.oifits)
