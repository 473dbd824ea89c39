#!/usr/bin/env bash
# Installs the Debian packages cuspmap builds and tests with (run as root, or with sudo).
# clang and libclang-rt-14-dev (libFuzzer and the sanitizer runtimes) serve tools/ci_checks.sh.
set -euo pipefail
packages=(cmake g++ make libeigen3-dev libcli11-dev libstb-dev catch2 libtomlplusplus-dev
          nlohmann-json3-dev libpolyclipping-dev libfftw3-dev libzip-dev zlib1g-dev libpugixml-dev
          libbenchmark-dev python3 python3-numpy python3-scipy
          clang libclang-rt-14-dev)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ "${#missing[@]}" -gt 0 ]; then
  sudo_cmd=""
  [ "$(id -u)" -eq 0 ] || sudo_cmd="sudo"
  $sudo_cmd apt-get update
  DEBIAN_FRONTEND=noninteractive $sudo_cmd apt-get install -y "${missing[@]}"
fi
