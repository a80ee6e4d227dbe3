# siiplan tracks and siiplan sky: the demo files work; bad site/array/catalog files give exit 2 with
# file:line and leave no output file; polar cases and a never-rising star are reported, not errors.
set(GEO_SITE ${DEMO}/site.ini)
set(GEO_ARRAY ${DEMO}/array-large.csv)
set(GEO_STAR --ra 05:55:10.3 --dec +07:24:25)

siiplan_cli_test(NAME tracks_demo EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} ${GEO_STAR} --night 2026-01-15
                 STDOUT "Alder-Birch.*Safety")
siiplan_cli_test(NAME tracks_demo_csv EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${DEMO}/array-small.csv ${GEO_STAR}
                 --night 2026-01-15 --format csv
                 STDOUT "^time_utc,mjd_utc,pair,alt_deg,az_deg,ha_h,airmass,u_m,v_m,w_m,baseline_m,pa_deg,delay_ns,delay_rate_ns_per_s\n2026-01-16T01:10:00Z,")
siiplan_cli_test(NAME tracks_catalog_target EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY}
                 --catalog ${DATA}/geometry/catalog-good.csv --target Southern --start 2026-01-16T02:00 --end 2026-01-16T03:00
                 --format csv STDOUT "Alder-Fir")
siiplan_cli_test(NAME tracks_plot EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} ${GEO_STAR} --night 2026-01-15
                 --plot ${OUT}/geo_tracks.svg -o ${OUT}/geo_tracks.txt)
siiplan_cli_test(NAME tracks_never_rises EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} --ra 12:00:00 --dec +80
                 --night 2026-01-15 STDOUT "never rises above")
siiplan_cli_test(NAME tracks_midnight_sun EXIT 0 ARGS tracks --site ${DATA}/geometry/site-arctic.ini --array ${GEO_ARRAY}
                 ${GEO_STAR} --night 2026-06-21 STDOUT "No dark time.*midnight sun")
siiplan_cli_test(NAME tracks_dubious_year EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} ${GEO_STAR}
                 --night 2028-01-15 --format csv STDERR "^siiplan: warning: the date lies beyond the leap-second table[^\n]*\n$")
siiplan_cli_test(NAME sky_demo EXIT 0 ARGS sky --site ${GEO_SITE} --night 2026-01-15 ${GEO_STAR}
                 STDOUT "sunset.*dark time begins.*moonrise.*Moon illuminated.*target_alt_deg.*Safety")
siiplan_cli_test(NAME sky_midnight_sun EXIT 0 ARGS sky --site ${DATA}/geometry/site-arctic.ini --night 2026-06-21
                 STDOUT "The Sun does not set \\(midnight sun")
siiplan_cli_test(NAME sky_polar_night EXIT 0 ARGS sky --site ${DATA}/geometry/site-arctic.ini --night 2026-12-21
                 STDOUT "The Sun does not rise \\(polar night")
siiplan_cli_test(NAME sky_plot EXIT 0 ARGS sky --site ${GEO_SITE} --night 2026-01-15 --plot ${OUT}/geo_sky.svg --format csv
                 STDOUT "^time_utc,mjd_utc,local,sky,sun_alt_deg")

# Bad input: exit 2, file:line (or the option), no output file.
siiplan_cli_test(NAME tracks_bad_site EXIT 2 ARGS tracks --site ${DATA}/geometry/site-bad-latitude.ini --array ${GEO_ARRAY}
                 ${GEO_STAR} --night 2026-01-15 -o ${OUT}/geo_bad1.csv
                 STDERR "site-bad-latitude.ini:4: latitude_deg = 95 must lie within -90 .. 90" ABSENT ${OUT}/geo_bad1.csv)
siiplan_cli_test(NAME tracks_duplicate_telescope EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${DATA}/geometry/array-duplicate.csv
                 ${GEO_STAR} --night 2026-01-15 -o ${OUT}/geo_bad2.csv
                 STDERR "array-duplicate.csv:4: telescope name 'A' is used twice" ABSENT ${OUT}/geo_bad2.csv)
siiplan_cli_test(NAME tracks_coincident_telescopes EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${DATA}/geometry/array-coincident.csv
                 ${GEO_STAR} --night 2026-01-15 -o ${OUT}/geo_bad3.csv
                 STDERR "array-coincident.csv:3: telescope 'B' is less than 1 cm from 'A'" ABSENT ${OUT}/geo_bad3.csv)
siiplan_cli_test(NAME tracks_nonnumeric_array EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${DATA}/geometry/array-nonnumeric.csv
                 ${GEO_STAR} --night 2026-01-15 --plot ${OUT}/geo_bad4.svg
                 STDERR "array-nonnumeric.csv:3: column 'east_m'" ABSENT ${OUT}/geo_bad4.svg)
siiplan_cli_test(NAME tracks_bad_catalog EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY}
                 --catalog ${DATA}/geometry/catalog-bad-dec.csv --target Good --night 2026-01-15 -o ${OUT}/geo_bad5.csv
                 STDERR "catalog-bad-dec.csv:3: column 'dec': Dec '\\+95:00:00' is beyond" ABSENT ${OUT}/geo_bad5.csv)
siiplan_cli_test(NAME tracks_unknown_target EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY}
                 --catalog ${DATA}/geometry/catalog-good.csv --target Nope --night 2026-01-15 STDERR "--target: 'Nope' is not in")
siiplan_cli_test(NAME tracks_bad_ra EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} --ra 25:00:00 --dec 10
                 --night 2026-01-15 STDERR "--ra: RA '25:00:00' is out of range")
siiplan_cli_test(NAME tracks_bad_night EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} ${GEO_STAR}
                 --night 2026-02-30 STDERR "--night: '2026-02-30' is not a valid calendar date")
siiplan_cli_test(NAME tracks_end_before_start EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} ${GEO_STAR}
                 --start 2026-01-16T03:00 --end 2026-01-16T02:00 STDERR "--end: must be later than --start")
siiplan_cli_test(NAME tracks_no_target EXIT 2 ARGS tracks --site ${GEO_SITE} --array ${GEO_ARRAY} --night 2026-01-15
                 STDERR "--ra: no target given")
siiplan_cli_test(NAME sky_missing_site EXIT 2 ARGS sky --site ${DATA}/geometry/no-such-site.ini --night 2026-01-15
                 -o ${OUT}/geo_bad6.txt STDERR "no-such-site.ini" ABSENT ${OUT}/geo_bad6.txt)
# --start is the first sample, whatever the step (it used to snap to a grid counted from 0h UTC: 00:45 for 00:10
# with 45-minute steps); --night keeps steps on round clock times.
siiplan_cli_test(NAME tracks_start_is_first_sample EXIT 0 ARGS tracks --site ${GEO_SITE} --array ${DEMO}/array-small.csv
                 ${GEO_STAR} --start 2026-01-16T00:10 --end 2026-01-16T02:00 --step-min 45 --format csv
                 STDOUT "^time_utc,[^\n]*\n2026-01-16T00:10:00Z,[^\n]*\n2026-01-16T00:10:00Z,[^\n]*\n2026-01-16T00:10:00Z,[^\n]*\n2026-01-16T00:55:00Z,")
