#!/usr/bin/env bash
# Installs what terayee needs to build (Debian packages, only those missing), then
# configures and builds it in build/ (Release). Run it from anywhere; it is idempotent.
#   tools/setup.sh            build
#   BUILD_TYPE=Debug tools/setup.sh, SANITIZE=ON tools/setup.sh (into build-sanitize/)
#   MPI=ON tools/setup.sh     also Open MPI and the MPI build of HDF5; the MPI binary into build-mpi/
#                             (docs/parallel.md; the default build stays one process, serial HDF5)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
packages=(cmake g++ make libhdf5-dev libyaml-cpp-dev libfmt-dev nlohmann-json3-dev libeigen3-dev doctest-dev libcli11-dev libexpat1-dev
  pkg-config libcairo2-dev fonts-dejavu-core libplplot-dev plplot-driver-cairo ffmpeg universal-ctags)
mpi="${MPI:-OFF}"
[ "$mpi" = "ON" ] && packages+=(openmpi-bin libopenmpi-dev libhdf5-openmpi-dev jq hdf5-tools time)  # jq, h5diff, time: mpi-check.sh
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "terayee setup: installing ${missing[*]}" >&2
  sudo=""
  [ "$(id -u)" -eq 0 ] || sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq "${missing[@]}" >/dev/null
fi
build="$root/build"
sanitize="${SANITIZE:-OFF}"
[ "$sanitize" = "ON" ] && build="$root/build-sanitize"
[ "$mpi" = "ON" ] && build="$root/build-mpi"
cmake -S "$root" -B "$build" -DCMAKE_BUILD_TYPE="${BUILD_TYPE:-Release}" -DTERAYEE_SANITIZE="$sanitize" \
  -DTERAYEE_MPI="$mpi" >/dev/null
cmake --build "$build" -j "$(nproc)"
