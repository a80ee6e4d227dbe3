#!/usr/bin/env bash
# Installs every build and test dependency of siiplan from Debian's packages. Idempotent: when all
# packages are present it prints nothing and changes nothing. Needs root (or sudo) to install.
set -euo pipefail

packages=(
  cmake g++ make pkg-config
  libboost-program-options-dev libeigen3-dev libcfitsio-dev libhdf5-dev liberfa-dev doctest-dev
  libbenchmark-dev
  # outside references and output checks used by tests and scripts/
  python3 python3-numpy python3-scipy python3-astropy python3-h5py python3-mpmath hdf5-tools fitsverify
  # fuzzing and static analysis (scripts/fuzz.sh, scripts/lint.sh)
  clang cppcheck
)

missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
[ ${#missing[@]} -eq 0 ] && exit 0

echo "install-deps: installing ${missing[*]}" >&2
sudo_cmd=()
[ "$(id -u)" -ne 0 ] && sudo_cmd=(sudo)
export DEBIAN_FRONTEND=noninteractive
"${sudo_cmd[@]}" apt-get update -qq
"${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
