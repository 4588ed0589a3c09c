# Shared by scripts/run and scripts/test: install the Debian packages the project needs, then
# configure and build Release into build/. Sourced, not run.
set -euo pipefail

TAILWISE_PACKAGES=(
  build-essential cmake ninja-build pkg-config
  qt6-base-dev qt6-base-dev-tools qt6-svg-dev libgl-dev libxkbcommon-dev
  libqcustomplot-dev libboost-math-dev libeigen3-dev
  fonts-dejavu-core xvfb xauth
  clang libclang-rt-14-dev
  poppler-utils python3-numpy python3-scipy
  python3-pandas libopenblas-dev libfast-float-dev
  libcli11-dev libsqlite3-dev libxlsxwriter-dev python3-openpyxl dpkg-dev
)

tailwise_install_packages() {
  local missing=()
  for p in "${TAILWISE_PACKAGES[@]}"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
  done
  [[ ${#missing[@]} -eq 0 ]] && return 0
  if [[ $(id -u) -ne 0 ]]; then
    echo "Tailwise needs these Debian packages: ${missing[*]}" >&2
    echo "Install them with:  sudo apt-get install -y ${missing[*]}" >&2
    exit 1
  fi
  echo "Installing Debian packages: ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

# The build is for this machine: -march=native (TAILWISE_NATIVE), since scripts/run and CI run what
# they build where they build it, and the vector units make the covariance and the simulation
# several times faster. The sanitiser and fuzz builds (scripts/test-hardening) stay generic.
tailwise_build() {
  local top=$1; shift
  cmake -S "$top" -B "$top/build" -G Ninja -DCMAKE_BUILD_TYPE=Release -DTAILWISE_NATIVE=ON "$@" >/dev/null
  cmake --build "$top/build" -j "$(nproc)"
}
