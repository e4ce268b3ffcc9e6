#!/bin/sh
# Installs what Descent Sizer needs to build and test, from Debian 12 packages (the last line:
# the Python module descent_sizer and its tests).
# Runs apt-get as root, or through sudo for another user. Installing twice is harmless.
set -eu

packages="cmake ninja-build g++ pkg-config
libeigen3-dev libfmt-dev nlohmann-json3-dev libboost-dev libcli11-dev doctest-dev libnlopt-dev libnlopt-cxx-dev
qt6-base-dev libqt6opengl6-dev qt6-charts-dev qt6-qpa-plugins fonts-dejavu-core
python3-dev pybind11-dev python3-numpy python3-pytest"

missing=""
for p in $packages; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing="$missing $p"
done
[ -z "$missing" ] && exit 0

if [ "$(id -u)" -eq 0 ]; then as_root=""; else as_root="sudo"; fi
echo "Installing:$missing"
$as_root apt-get update -qq
DEBIAN_FRONTEND=noninteractive $as_root apt-get install -y -qq --no-install-recommends $missing
