#!/usr/bin/python3
# Noto Nastaliq Urdu for the PDFs (run once; the results are committed under fonts/). Needs
# fontTools and brotli (Debian: python3-fonttools python3-brotli).
# The font leaves some mark-to-base and mark-to-ligature anchors empty (a NULL offset: "this mark
# class does not attach to this base"), which the OpenType spec allows and HarfBuzz reads as "this
# subtable does not apply". fontkit 2 reads the empty anchor and stops with "Cannot read properties
# of null (reading 'xCoordinate')", so every Urdu booklet failed. Here each such subtable is split
# into one subtable per mark class whose base (or ligature) coverage holds only the glyphs that
# have an anchor for that class: a mark meets exactly one of them (its own class), and a base
# without an anchor is simply not covered, so the next subtable is tried, as HarfBuzz does.
# Second, the line ascent (hhea) is lowered from 1.904 em to 1.6 em: react-pdf puts the baseline a
# full ascent below the top of each line, so with the design ascent every Urdu line carried 0.3 em
# of empty room above it and the booklet's cover no longer held its QR code. Words still climb as
# high as they are drawn; only the tallest cascades reach a little into the line above's spacing.
# Nothing else changes. Usage: scripts/fonts/nastaliq-for-pdf.py <in.woff2> <out.ttf>
import copy
import sys

from fontTools.ttLib import TTFont
from fontTools.ttLib.tables import otTables as ot


def anchors_of(st, record):
    if st.LookupType == 4:
        return record.BaseAnchor
    # Mark-to-ligature: one anchor list per component; a class counts as present only when every
    # component has it (in this font a class is present on all components or on none).
    return record


def split(st):
    """One subtable per mark class, or None when no anchor is empty."""
    if st.LookupType == 4:
        bases = list(zip(st.BaseCoverage.glyphs, st.BaseArray.BaseRecord))
        empty = any(a is None for _, r in bases for a in r.BaseAnchor)
    else:
        bases = list(zip(st.LigatureCoverage.glyphs, st.LigatureArray.LigatureAttach))
        empty = any(a is None for _, la in bases for c in la.ComponentRecord for a in c.LigatureAnchor)
    if not empty:
        return None
    out = []
    for cls in range(st.ClassCount):
        marks = [(g, m) for g, m in zip(st.MarkCoverage.glyphs, st.MarkArray.MarkRecord) if m.Class == cls]
        if not marks:
            continue
        new = copy.deepcopy(st)
        new.ClassCount = 1
        new.MarkCoverage = ot.Coverage()
        new.MarkCoverage.glyphs = [g for g, _ in marks]
        new.MarkArray = ot.MarkArray()
        new.MarkArray.MarkRecord = []
        for _, m in marks:
            rec = copy.deepcopy(m)
            rec.Class = 0
            new.MarkArray.MarkRecord.append(rec)
        new.MarkArray.MarkCount = len(marks)
        kept = []
        if st.LookupType == 4:
            for g, r in bases:
                if r.BaseAnchor[cls] is not None:
                    rec = ot.BaseRecord()
                    rec.BaseAnchor = [copy.deepcopy(r.BaseAnchor[cls])]
                    kept.append((g, rec))
            new.BaseCoverage = ot.Coverage()
            new.BaseCoverage.glyphs = [g for g, _ in kept]
            new.BaseArray = ot.BaseArray()
            new.BaseArray.BaseRecord = [r for _, r in kept]
            new.BaseArray.BaseCount = len(kept)
        else:
            for g, la in bases:
                comps = la.ComponentRecord
                if all(c.LigatureAnchor[cls] is not None for c in comps):
                    nla = ot.LigatureAttach()
                    nla.ComponentRecord = []
                    for c in comps:
                        nc = ot.ComponentRecord()
                        nc.LigatureAnchor = [copy.deepcopy(c.LigatureAnchor[cls])]
                        nla.ComponentRecord.append(nc)
                    nla.ComponentCount = len(comps)
                    kept.append((g, nla))
                else:
                    assert all(c.LigatureAnchor[cls] is None for c in comps), f"{g}: class {cls} on some components only"
            new.LigatureCoverage = ot.Coverage()
            new.LigatureCoverage.glyphs = [g for g, _ in kept]
            new.LigatureArray = ot.LigatureArray()
            new.LigatureArray.LigatureAttach = [la for _, la in kept]
            new.LigatureArray.LigatureCount = len(kept)
        if kept:
            out.append(new)
    return out


def main(src, dst):
    font = TTFont(src)
    font.flavor = None
    changed = 0
    for lookup in font["GPOS"].table.LookupList.Lookup:
        subtables = []
        for st in lookup.SubTable:
            inner = st.ExtSubTable if lookup.LookupType == 9 else st
            parts = split(inner) if inner.LookupType in (4, 5) else None
            if parts is None:
                subtables.append(st)
                continue
            changed += 1
            for p in parts:
                if lookup.LookupType == 9:
                    ext = ot.ExtensionPos()
                    ext.Format = 1
                    ext.ExtensionLookupType = inner.LookupType
                    ext.ExtSubTable = p
                    subtables.append(ext)
                else:
                    subtables.append(p)
        lookup.SubTable = subtables
        lookup.SubTableCount = len(subtables)
    font["hhea"].ascent = round(font["head"].unitsPerEm * 1.6)
    font.save(dst)
    print(f"{dst}: {changed} subtables split")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
