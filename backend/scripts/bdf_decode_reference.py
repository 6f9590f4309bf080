#!/usr/bin/env python3
"""Decodes a BDF/BDF+ file's ordinary signals with numpy, as the reference for Gyre's reader.

Usage: python3 bdf_decode_reference.py FILE.bdf  (JSON on stdout: one entry per ordinary
signal with its label and physical values in float64, and the decoded digital integers).

Written from the format's public description, not from Gyre's code:
- header layout: Kemp et al. 1992 (EDF), which BDF keeps (BioSemi, "BDF file format",
  biosemi.com/faq/file_format.htm): 256 fixed bytes, then 256 bytes per signal in
  column blocks (label 16, transducer 80, dimension 8, physical min 8, physical max 8,
  digital min 8, digital max 8, prefiltering 80, samples per record 8, reserved 32);
- samples: 3 bytes each, least significant first, two's complement (BioSemi);
- annotation signals ('BDF Annotations', BDF+) take 3 bytes per "sample" too and are skipped;
- number of data records -1: the count is the bytes after the header over the record size;
- physical = (digital - dmin) * (pmax - pmin) / (dmax - dmin) + pmin (Kemp et al. 1992).
"""
import json
import sys

import numpy as np


def text(header: bytes, start: int, width: int) -> str:
    return header[start : start + width].decode("ascii").strip()


def main(path: str) -> None:
    with open(path, "rb") as f:
        data = f.read()
    if data[0] != 0xFF or data[1:8] != b"BIOSEMI":
        raise SystemExit("not a BDF file (version field is not 0xFF BIOSEMI)")
    ns = int(text(data, 252, 4))
    header_bytes = 256 * (1 + ns)
    columns = {}
    offset = 256
    for name, width in [
        ("label", 16),
        ("transducer", 80),
        ("dimension", 8),
        ("pmin", 8),
        ("pmax", 8),
        ("dmin", 8),
        ("dmax", 8),
        ("prefiltering", 80),
        ("spr", 8),
        ("reserved", 32),
    ]:
        columns[name] = [text(data, offset + i * width, width) for i in range(ns)]
        offset += width * ns
    spr = [int(v) for v in columns["spr"]]
    record_bytes = 3 * sum(spr)
    records = int(text(data, 236, 8))
    if records == -1:
        records = (len(data) - header_bytes) // record_bytes
    body = np.frombuffer(data, dtype=np.uint8, count=records * record_bytes, offset=header_bytes)
    body = body.reshape(records, record_bytes)
    out = []
    start = 0
    for i in range(ns):
        width = 3 * spr[i]
        label = columns["label"][i]
        if label != "BDF Annotations":
            b = body[:, start : start + width].reshape(-1, 3).astype(np.int32)
            digital = b[:, 0] | (b[:, 1] << 8) | (b[:, 2] << 16)
            digital = np.where(digital >= 1 << 23, digital - (1 << 24), digital)
            pmin, pmax = float(columns["pmin"][i]), float(columns["pmax"][i])
            dmin, dmax = float(columns["dmin"][i]), float(columns["dmax"][i])
            gain = (pmax - pmin) / (dmax - dmin)
            physical = (digital.astype(np.float64) - dmin) * gain + pmin
            out.append(
                {
                    "label": label,
                    "digital": digital.tolist(),
                    "physical": [float(v) for v in physical],
                }
            )
        start += width
    json.dump({"numpy": np.__version__, "signals": out}, sys.stdout)


if __name__ == "__main__":
    main(sys.argv[1])
