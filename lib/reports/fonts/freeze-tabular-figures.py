"""Makes the digits of a font tabular by default: maps the cmap entries of 0-9 (and the
other characters the font's `tnum` feature substitutes) to their tabular glyphs, so the
PDF sheets get tabular figures without asking pdfkit for an OpenType feature (a feature
request turns off pdfkit's layout cache and makes a 96-vial sheet several times slower).

Run with Debian's python3-fonttools (4.38):
    /usr/bin/python3 freeze-tabular-figures.py <in.ttf> <out.ttf>
The outlines are unchanged; only the character-to-glyph map is. SIL OFL 1.1 allows
modified versions; Geist declares no Reserved Font Name.
"""
import sys
from fontTools.ttLib import TTFont

src, dst = sys.argv[1], sys.argv[2]
font = TTFont(src)
gsub = font["GSUB"].table
mapping = {}
for rec in gsub.FeatureList.FeatureRecord:
    if rec.FeatureTag != "tnum":
        continue
    for li in rec.Feature.LookupListIndex:
        lookup = gsub.LookupList.Lookup[li]
        for sub in lookup.SubTable:
            if lookup.LookupType == 7:
                sub = sub.ExtSubTable
            if hasattr(sub, "mapping"):
                mapping.update(sub.mapping)
if not mapping:
    sys.exit(f"{src}: no tnum substitutions found")
changed = 0
for table in font["cmap"].tables:
    for cp, glyph in list(table.cmap.items()):
        if glyph in mapping:
            table.cmap[cp] = mapping[glyph]
            changed += 1
font.save(dst)
print(f"{dst}: {changed} cmap entries now point at tabular glyphs ({len(mapping)} substitutions)")
