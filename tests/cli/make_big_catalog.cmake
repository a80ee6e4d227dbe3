# Writes a target catalog of ROWS_K thousand rows (unique names, positions spread over the sky) to
# OUTPUT, for the large-catalog test in tests/cli/badinput_tests.cmake. Generated at test time so that
# no large file is committed:  cmake -DOUTPUT=<file> -DROWS_K=1000 -P make_big_catalog.cmake
set(block "")
foreach(i RANGE 999)
  math(EXPR ra_deg "(${i} * 37) % 360")
  math(EXPR dec_deg "(${i} % 179) - 89")
  math(EXPR mag_tenths "${i} % 60")
  string(APPEND block "S@K@_${i},${ra_deg}.25,${dec_deg}.5,${mag_tenths}e-1,1.5\n")
endforeach()
file(WRITE "${OUTPUT}.part" "name,ra,dec,mag_v,diameter_mas\n")
math(EXPR last "${ROWS_K} - 1")
foreach(k RANGE ${last})
  string(REPLACE "@K@" "${k}" rows "${block}")
  file(APPEND "${OUTPUT}.part" "${rows}")
endforeach()
file(RENAME "${OUTPUT}.part" "${OUTPUT}")
