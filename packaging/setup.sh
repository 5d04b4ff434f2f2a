#!/usr/bin/env bash
# SPDX-License-Identifier: GPL-3.0-or-later
# One-step set-up for a fresh Debian 12 machine: install the build dependencies (only those
# missing), configure and build, then run the workbench on the demo ("run"), every test ("test"),
# or make the Debian package in the build folder ("package").
set -euo pipefail
cd "$(dirname "$0")/.."

mode="${1:-run}"
build_dir="${AMPWRIGHT_BUILD_DIR:-build}"
jobs="${AMPWRIGHT_JOBS:-$(nproc 2>/dev/null || echo 2)}"

packages=(cmake ninja-build g++ ccache pkg-config
          qt6-base-dev qt6-charts-dev libqt6opengl6-dev libgl-dev
          nlohmann-json3-dev libspdlog-dev libeigen3-dev libboost-dev
          xvfb xauth fonts-dejavu-core poppler-utils librsvg2-bin)

install_dependencies() {
    local missing=()
    for p in "${packages[@]}"; do
        dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
    done
    [ ${#missing[@]} -eq 0 ] && return 0
    echo "Installing: ${missing[*]}"
    local sudo=""
    [ "$(id -u)" -ne 0 ] && sudo="sudo"
    $sudo apt-get update -q
    DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q "${missing[@]}"
}

build() {
    cmake -S . -B "$build_dir" -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo "$@"
    cmake --build "$build_dir" -j "$jobs"
}

case "$mode" in
    run)
        install_dependencies
        build
        demo="resources/demos/garden-cart.ampw"
        if [ -z "${DISPLAY:-}" ] && [ -z "${WAYLAND_DISPLAY:-}" ]; then
            # No display: evaluate headless, print the summary, write the results (and the sheet).
            "$build_dir/app/ampwright" "$demo"
        else
            exec "$build_dir/app/ampwright" "$demo"
        fi
        ;;
    test)
        install_dependencies
        build
        ctest --test-dir "$build_dir" --output-on-failure -j "$jobs"
        ;;
    package)
        packages+=(dpkg-dev) # dpkg-shlibdeps computes the package's dependencies
        install_dependencies
        build
        rm -f "$build_dir"/ampwright_*.deb
        (cd "$build_dir" && cpack -G DEB)
        echo "Debian package: $(ls "$build_dir"/ampwright_*.deb)"
        ;;
    *)
        echo "usage: packaging/setup.sh run|test|package" >&2
        exit 2
        ;;
esac
