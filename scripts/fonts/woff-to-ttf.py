#!/usr/bin/env python3
# WOFF (1.0) to plain TrueType for the PDF fonts (fontkit inflates WOFF tables on every read).
# Standard library only. Run once; the results are committed under fonts/.
# Usage: scripts/fonts/woff-to-ttf.py <in.woff> <out.ttf>
import struct
import sys
import zlib

src, dst = sys.argv[1], sys.argv[2]
data = open(src, "rb").read()
sig, flavor, _length, num_tables = struct.unpack(">4sIIH", data[:14])
assert sig == b"wOFF", "not a WOFF 1.0 file"
entries = []
for i in range(num_tables):
    tag, offset, comp_len, orig_len, checksum = struct.unpack(">4sIIII", data[44 + i * 20 : 64 + i * 20])
    raw = data[offset : offset + comp_len]
    table = zlib.decompress(raw) if comp_len < orig_len else raw
    assert len(table) == orig_len
    entries.append((tag, checksum, table))
entries.sort(key=lambda e: e[0])
power = 1
while power * 2 <= num_tables:
    power *= 2
search_range = power * 16
entry_selector = power.bit_length() - 1
out = bytearray(struct.pack(">IHHHH", flavor, num_tables, search_range, entry_selector, num_tables * 16 - search_range))
offset = 12 + 16 * num_tables
body = bytearray()
for tag, checksum, table in entries:
    out += struct.pack(">4sIII", tag, checksum, offset + len(body), len(table))
    body += table + b"\0" * ((4 - len(table) % 4) % 4)
open(dst, "wb").write(bytes(out + body))
