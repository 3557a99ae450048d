#!/bin/sh
# How the PDF fonts in fonts/ were made (run once; the results are committed, nothing runs this
# at install or start). Needs fontTools (Debian: python3-fonttools). Inputs are the subset
# .woff files that used to sit in fonts/ (git history; OFL-1.1, see each folder's LICENSE).
# - Latin and Latin Extended merged into one font: as two fonts, every run of text that fell back
#   to the second (a Polish or Romanian letter) embedded a subset of its own.
# - Saved as plain TrueType: fontkit inflates a WOFF table again on every read, which was most of
#   a booklet's render time.
# Arabic (Noto Naskh Arabic) comes from the @fontsource package's
# WOFF files, made TrueType with scripts/fonts/woff-to-ttf.py (standard library only).
# Usage: scripts/fonts/make-pdf-fonts.sh <latin-400> <latin-ext-400> <latin-700> <latin-ext-700>
set -eu
out="$(cd "$(dirname "$0")/../../fonts" && pwd)"
py=/usr/bin/python3
merge() {
  $py -m fontTools.merge --output-file="$out/atkinson-hyperlegible/atkinson-hyperlegible-latin-all-$3-normal.ttf" "$1" "$2"
}
merge "$1" "$2" 400
merge "$3" "$4" 700
