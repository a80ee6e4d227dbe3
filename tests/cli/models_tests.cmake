# siiplan curve and siiplan coherence through the real binary.
# Check values: models.md §3 (mpmath): UD theta = 1 mas at 420 nm, first null 105.661488999 m, |V|^2 = 0.5 at
# 44.5715007872 m (our CSV prints 15 digits: 44.571500787173, 105.661488999151); the Sun (common practice): about 900 um^2 under lambda^2/(pi theta^2).

siiplan_cli_test(NAME curve_ud_csv EXIT 0
  ARGS curve --model ud --diameter-mas 1 --wavelength-nm 420 --baselines-m 0:120:20 --format csv -o ${OUT}/curve_ud.csv)
siiplan_cli_test(NAME curve_ud_marks EXIT 0
  ARGS curve --model ud --diameter-mas 1 --wavelength-nm 420 --baselines-m 0:120:20 --format csv
  STDOUT "^baseline_m,vis2,note\n0,1,\n.*\n44\\.57150078717[0-9]*,0\\.5[0-9]*,half power\n.*\n105\\.66148899915[0-9]*,[-0-9.e]+,first null\n")
siiplan_cli_test(NAME curve_table_header EXIT 0
  ARGS curve --model ld-linear --diameter-mas 1 --limb-u 0.6 --wavelength-nm 420
  STDOUT "First null: 114\\.355428[0-9]* m")
siiplan_cli_test(NAME curve_band_plot EXIT 0
  ARGS curve --model ld-power --diameter-mas 0.8 --limb-alpha 0.3 --wavelength-nm 420 --bandwidth-nm 10 --filter-profile gaussian --plot ${OUT}/curve_band.svg --format csv
  STDOUT "^baseline_m,vis2,vis2_monochromatic,note\n")
siiplan_cli_test(NAME curve_ellipse_pa EXIT 0
  ARGS curve --model ellipse --diameter-mas 1 --axis-ratio 0.5 --major-pa-deg 0 --baseline-pa-deg 90 --wavelength-nm 420 --baselines-m 100 --format csv
  STDOUT "\n100,0\\.41169337864[0-9]*,\n")   # = a 0.5 mas UD: the baseline runs along the minor axis
siiplan_cli_test(NAME curve_binary EXIT 0
  ARGS curve --model binary --diameter-mas 1 --companion-diameter-mas 0.5 --flux-ratio 0.3 --separation-mas 5.8309518948453 --companion-pa-deg 120.963756532 --baseline-pa-deg 68.1985905136 --wavelength-nm 420 --baselines-m 53.8516480713 --format csv
  STDOUT "\n53\\.8516480713,0\\.31519246[0-9]*,\n")
# Aperture averaging, models.md §1.9: two 12 m mirrors, UD 0.5 mas at 420 nm: <|V|^2>(0) = 0.99704
# (Monte Carlo 0.99705); UD 5 mas: 0.757 (Monte Carlo), the quadrature gives 0.756960.
siiplan_cli_test(NAME curve_mirrors EXIT 0
  ARGS curve --model ud --diameter-mas 0.5 --wavelength-nm 420 --baselines-m 0,50 --mirror-diameter-m 12 --format csv
  STDOUT "^baseline_m,vis2,vis2_mirrors,note
0,1,0\\.99704[0-9]*,
50,")
siiplan_cli_test(NAME curve_mirrors_matter EXIT 0
  ARGS curve --model ud --diameter-mas 5 --wavelength-nm 420 --baselines-m 0 --mirror-diameter-m 12
  STDOUT "Mirrors of 12 m: zero-baseline .V.\\^2 0\\.75696[0-9]*; single mirrors partly resolve the star")
siiplan_cli_test(NAME curve_mirrors_zero EXIT 2
  ARGS curve --diameter-mas 1 --wavelength-nm 420 --mirror-diameter-m 0 -o ${OUT}/bad.csv
  STDERR "--mirror-diameter-m" ABSENT ${OUT}/bad.csv)

# Bad input: exit 2, a message naming the option, no output file.
siiplan_cli_test(NAME curve_zero_diameter EXIT 2
  ARGS curve --diameter-mas 0 --wavelength-nm 420 -o ${OUT}/bad.csv
  STDERR "^siiplan: --diameter-mas: value 0 is out of range \\(it must be greater than 0\\)" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_negative_diameter EXIT 2
  ARGS curve --diameter-mas -1 --wavelength-nm 420 -o ${OUT}/bad.csv STDERR "--diameter-mas: value -1 is out of range" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_zero_wavelength EXIT 2
  ARGS curve --diameter-mas 1 --wavelength-nm 0 -o ${OUT}/bad.csv STDERR "--wavelength-nm: must be greater than zero" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_axis_ratio_high EXIT 2
  ARGS curve --model ellipse --diameter-mas 1 --axis-ratio 1.2 --major-pa-deg 0 --wavelength-nm 420 -o ${OUT}/bad.csv
  STDERR "--axis-ratio: value 1.2 is out of range \\(it must be \\(0, 1.\\)" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_axis_ratio_zero EXIT 2
  ARGS curve --model ellipse --diameter-mas 1 --axis-ratio 0 --major-pa-deg 0 --wavelength-nm 420 -o ${OUT}/bad.csv
  STDERR "--axis-ratio: value 0 is out of range" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_unknown_model EXIT 2
  ARGS curve --model disk --diameter-mas 1 --wavelength-nm 420 -o ${OUT}/bad.csv
  STDERR "--model: unknown model 'disk' \\(choose ud, ld-linear" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_bad_range EXIT 2
  ARGS curve --diameter-mas 1 --wavelength-nm 420 --baselines-m 0:100 -o ${OUT}/bad.csv
  STDERR "--baselines-m: range '0:100' needs three parts" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_reversed_range EXIT 2
  ARGS curve --diameter-mas 1 --wavelength-nm 420 --baselines-m 100:0:5 -o ${OUT}/bad.csv
  STDERR "--baselines-m: range '100:0:5' ends before it starts" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME curve_missing_limb EXIT 2
  ARGS curve --model ld-linear --diameter-mas 1 --wavelength-nm 420 --plot ${OUT}/bad.svg
  STDERR "--limb-u: this option is required \\(model 'ld-linear' needs --diameter-mas, --limb-u\\)" ABSENT ${OUT}/bad.svg)
siiplan_cli_test(NAME curve_foreign_param EXIT 2
  ARGS curve --diameter-mas 1 --limb-u 0.3 --wavelength-nm 420 STDERR "--limb-u: does not apply to model 'ud'")

siiplan_cli_test(NAME coherence_sun EXIT 0
  ARGS coherence --diameter-deg 0.53 --wavelength-nm 500 --format csv
  STDOUT "coherence_area_circle_m2.*\n[^\n]*,9\\.300[0-9]*e-10,")
siiplan_cli_test(NAME coherence_linear_size EXIT 0
  ARGS coherence --linear-diameter-km 1392700 --distance-au 1 --wavelength-nm 500 --mirror-diameter-m 12
  STDOUT "resolves the star almost completely")
siiplan_cli_test(NAME coherence_mirror EXIT 0
  ARGS coherence --diameter-mas 0.5 --wavelength-nm 420 --mirror-diameter-m 12
  STDOUT "first_null_baseline_m +211\\.32298.*does not resolve the star")
siiplan_cli_test(NAME coherence_no_size EXIT 2
  ARGS coherence --wavelength-nm 500 -o ${OUT}/bad.csv STDERR "^siiplan: source size: no diameter given" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME coherence_zero_diameter EXIT 2
  ARGS coherence --diameter-arcsec 0 --wavelength-nm 500 -o ${OUT}/bad.csv STDERR "--diameter-arcsec: must be greater than zero" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME coherence_zero_wavelength EXIT 2
  ARGS coherence --diameter-mas 1 --wavelength-nm 0 -o ${OUT}/bad.csv STDERR "--wavelength-nm: must be greater than zero" ABSENT ${OUT}/bad.csv)
siiplan_cli_test(NAME coherence_two_sizes EXIT 2
  ARGS coherence --diameter-mas 1 --diameter-deg 1 --wavelength-nm 500 STDERR "more than one diameter given")
