#!/usr/bin/env bash
# Everything the tests need on a fresh Debian machine: Debian's Chromium (Playwright drives it;
# no browser download), Debian's Firefox ESR (driven over WebDriver BiDi by e2e/helpers/firefox.ts), SciPy/NumPy/NetworkX (and Debian's statsmodels and scikit-learn) as reference libraries, a font with wide coverage,
# and the npm packages at their locked versions.
set -eu
cd "$(dirname "$0")/.."
has_py() { python3 -c "import $1" 2>/dev/null || /usr/bin/python3 -c "import $1" 2>/dev/null; }
need_apt=""
[ -x /usr/bin/chromium ] || need_apt="$need_apt chromium"
[ -x /usr/bin/firefox-esr ] || need_apt="$need_apt firefox-esr"
has_py 'scipy, numpy' || need_apt="$need_apt python3-scipy python3-numpy"
has_py networkx || need_apt="$need_apt python3-networkx"
# statsmodels and scikit-learn: oracles for fits and factor analysis; Debian installs them for /usr/bin/python3 only
/usr/bin/python3 -c "import statsmodels" 2>/dev/null || need_apt="$need_apt python3-statsmodels"
/usr/bin/python3 -c "import sklearn" 2>/dev/null || need_apt="$need_apt python3-sklearn"
# pdftoppm: the print tests turn the figures' PDF files into pixels to compare them with Chromium's rendering
command -v pdftoppm >/dev/null || need_apt="$need_apt poppler-utils"
fc-list 2>/dev/null | grep -qi dejavu || need_apt="$need_apt fonts-dejavu-core"
if [ -n "$need_apt" ]; then
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq $need_apt
fi
npm ci --no-audit --no-fund
