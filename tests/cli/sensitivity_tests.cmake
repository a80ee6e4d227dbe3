# siiplan resolve and the instrument file (io/instrument_io): demo runs and bad input.
set(RES resolve --magnitude 2.3 --diameter-mas 0.8 --baselines-m 20:200:30 --mirror-diameter-m 12)

siiplan_cli_test(NAME resolve_demo_large EXIT 0
  ARGS ${RES} --instrument ${DEMO}/instrument-large.ini --hours 2
  STDOUT "baseline_m.*verdict.*resolves.*Diameter precision.*free: +sigma_theta = [0-9.]+ mas.*this instrument.*Safety:")
siiplan_cli_test(NAME resolve_demo_small_array EXIT 0
  ARGS resolve --instrument ${DEMO}/instrument-small.ini --magnitude 1.5 --teff-k 9700 --vmag 1.6
       --array ${DEMO}/array-small.csv --site ${DEMO}/site.ini --ra 06:45:08.9 --dec -16:42:58 --time 2026-03-14T00:30:00 --hours 4
  STDOUT "estimated from V = 1.6.*projected baselines.*Pika-Quoll.*calibrated: sigma_theta")
siiplan_cli_test(NAME resolve_array_unprojected EXIT 0
  ARGS resolve --instrument ${DEMO}/instrument-large.ini --magnitude 3 --diameter-mas 0.6 --array ${DEMO}/array-large.csv --site ${DEMO}/site.ini
  STDOUT "unprojected pair lengths.*Alder-Birch")
siiplan_cli_test(NAME resolve_csv EXIT 0
  ARGS ${RES} --instrument ${DEMO}/instrument-large.ini --format csv
  STDOUT "^pair,baseline_m,vis2,sigma_vis2,snr,hours_to_3sigma,beyond_first_null,sigma_theta_mas,verdict\n-,20,")
siiplan_cli_test(NAME resolve_saturation_reported EXIT 0
  ARGS resolve --magnitude 0 --diameter-mas 0.8 --baselines-m 50 --mirror-diameter-m 12 --instrument ${DEMO}/instrument-large.ini
  STDOUT "SATURATED: needs a neutral-density filter of [0-9.]+ mag" STDERR "neutral-density filter")

# Bad input: exit 2, a message naming the file:line or option, no output file.
siiplan_cli_test(NAME resolve_bad_efficiency EXIT 2
  ARGS ${RES} --instrument ${DATA}/instrument-bad-efficiency.ini -o ${OUT}/resolve_bad_eff.csv
  STDERR "instrument-bad-efficiency.ini:[0-9]+: efficiency = 25 must lie within" ABSENT ${OUT}/resolve_bad_eff.csv)
siiplan_cli_test(NAME resolve_bad_efficiency_part EXIT 2
  ARGS ${RES} --instrument ${DATA}/instrument-bad-efficiency-zero.ini -o ${OUT}/resolve_bad_part.csv
  STDERR "instrument-bad-efficiency-zero.ini:[0-9]+: coupling = 0 must lie within" ABSENT ${OUT}/resolve_bad_part.csv)
siiplan_cli_test(NAME resolve_negative_bandwidth EXIT 2
  ARGS ${RES} --instrument ${DATA}/instrument-negative-bandwidth.ini -o ${OUT}/resolve_neg_bw.csv
  STDERR "instrument-negative-bandwidth.ini:[0-9]+: bandwidth_nm = -10 must lie within" ABSENT ${OUT}/resolve_neg_bw.csv)
siiplan_cli_test(NAME resolve_missing_mode EXIT 2
  ARGS ${RES} --instrument ${DATA}/instrument-missing-mode.ini -o ${OUT}/resolve_no_mode.csv
  STDERR "instrument-missing-mode.ini: missing key 'mode' in \\[instrument\\]" ABSENT ${OUT}/resolve_no_mode.csv)
siiplan_cli_test(NAME resolve_missing_timing EXIT 2
  ARGS ${RES} --instrument ${DATA}/instrument-missing-timing.ini -o ${OUT}/resolve_no_timing.csv
  STDERR "missing key 'timing_fwhm_ps' in \\[instrument\\]" ABSENT ${OUT}/resolve_no_timing.csv)
siiplan_cli_test(NAME resolve_magnitude_not_number EXIT 2
  ARGS resolve --magnitude bright --diameter-mas 0.8 --baselines-m 50 --mirror-diameter-m 12 --instrument ${DEMO}/instrument-large.ini -o ${OUT}/resolve_mag.csv
  STDERR "^siiplan: --magnitude: 'bright' is not a finite number" ABSENT ${OUT}/resolve_mag.csv)
siiplan_cli_test(NAME resolve_no_baselines EXIT 2
  ARGS resolve --magnitude 2 --diameter-mas 0.8 --instrument ${DEMO}/instrument-large.ini
  STDERR "--array: no baselines given")
siiplan_cli_test(NAME resolve_no_diameter EXIT 2
  ARGS resolve --magnitude 2 --baselines-m 50 --mirror-diameter-m 12 --instrument ${DEMO}/instrument-large.ini
  STDERR "--diameter-mas: no diameter given")
siiplan_cli_test(NAME resolve_teff_needs_v EXIT 2
  ARGS resolve --magnitude 2 --band B --teff-k 9000 --baselines-m 50 --mirror-diameter-m 12 --instrument ${DEMO}/instrument-large.ini
  STDERR "--vmag: the diameter estimate needs the V magnitude")
