#!/usr/bin/env bash
# The PDF fonts in public/fonts: DejaVu Sans (regular, bold, oblique, bold oblique) and Sans Mono from the dejavu-fonts-ttf npm package,
# cut down to the characters a report can print (Latin, Latin-1 and Latin Extended-A, Greek, punctuation,
# super- and subscripts, letterlike symbols, arrows, mathematical operators, technical and geometric signs)
# without OpenType layout features or hinting. A report is laid out about 2.5 times faster with them than with
# the full 750 kB files (react-pdf lays text out with fontkit). tests/report/pdf-glyphs.test.ts checks that
# every character of the registry's formulas, units and texts is still there.
# Needs fontTools (Debian: apt-get install python3-fonttools).
set -euo pipefail
cd "$(dirname "$0")/.."
UNICODES="U+0020-007E,U+00A0-017F,U+0300-036F,U+0370-03FF,U+2010-2027,U+2030-205E,U+1D00-1DBF,U+2070-209F,U+20AC,U+2100-214F,U+2190-21FF,U+2200-22FF,U+2300-23FF,U+25A0-25FF,U+2713-2717,U+FFFD"
for font in DejaVuSans DejaVuSans-Bold DejaVuSans-Oblique DejaVuSans-BoldOblique DejaVuSansMono; do
  /usr/bin/python3 -m fontTools.subset "node_modules/dejavu-fonts-ttf/ttf/$font.ttf" --unicodes="$UNICODES" \
    --layout-features='' --no-hinting --desubroutinize --output-file="public/fonts/$font.ttf"
done
cp node_modules/dejavu-fonts-ttf/LICENSE public/fonts/DejaVu-LICENSE.txt
