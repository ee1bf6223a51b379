#!/usr/bin/env python3
"""Converts the Hipparcos star list distributed with d3-celestial into Lightward's compact star asset.

Run once, by hand, when the asset is (re)made:

    mkdir -p /tmp/hip && cd /tmp/hip && npm pack d3-celestial@0.7.35 && tar xzf d3-celestial-0.7.35.tgz
    python3 convert_hipparcos.py /tmp/hip/package/data hipparcos-stars.bin.gz

Input (d3-celestial data/stars.14.json, GeoJSON): each feature has id = HIP number, properties.mag = V,
properties.bv = B−V as a string (empty when unknown), geometry.coordinates = [lon, lat] in degrees where
lon is the right ascension wrapped into −180…180 (RA = lon mod 360) and lat the declination (ICRS, J1991.25).
data/starnames.json gives proper names keyed by HIP number.

Output (gzip, little-endian), read by src/Lightward.Optics/StarCatalog.cs:
    8 bytes  ASCII "LWSTAR01"
    int32    star count N, int32 name count M
    N ×      int32 HIP, float32 x, y, z (unit vector toward the star, ICRS axes), float32 V, float32 B−V (NaN if unknown)
    M ×      int32 HIP, uint8 byte length L, L bytes UTF-8 proper name
Stars are written in HIP order; the loader arranges them in sky cells.
"""
import gzip
import json
import math
import os
import struct
import sys


def main(data_dir: str, output: str) -> None:
    with open(f"{data_dir}/stars.14.json", encoding="utf-8") as f:
        features = json.load(f)["features"]
    with open(f"{data_dir}/starnames.json", encoding="utf-8") as f:
        names = json.load(f)

    features.sort(key=lambda feature: int(feature["id"]))
    stars = bytearray()
    present = set()
    for feature in features:
        hip = int(feature["id"])
        lon, lat = feature["geometry"]["coordinates"]
        ra = math.radians(lon % 360.0)
        dec = math.radians(lat)
        x, y, z = math.cos(dec) * math.cos(ra), math.cos(dec) * math.sin(ra), math.sin(dec)
        colour = feature["properties"]["bv"].strip()
        bv = float(colour) if colour else float("nan")
        stars += struct.pack("<i5f", hip, x, y, z, float(feature["properties"]["mag"]), bv)
        present.add(hip)

    named = bytearray()
    count = 0
    for key, entry in sorted(names.items(), key=lambda item: int(item[0])):
        name = entry.get("name", "").strip()
        if not name or int(key) not in present:
            continue
        encoded = name.encode("utf-8")
        named += struct.pack("<iB", int(key), len(encoded)) + encoded
        count += 1

    # Written beside the target and renamed into place, so a failed run never leaves half an asset.
    temporary = output + ".partial"
    # No file name and no time stamp in the gzip header: the same input always gives the same bytes.
    with open(temporary, "wb") as raw, gzip.GzipFile("", "wb", 9, raw, mtime=0) as out:
        out.write(b"LWSTAR01" + struct.pack("<ii", len(features), count) + stars + named)
    os.replace(temporary, output)
    print(f"{output}: {len(features)} stars, {count} names")


if __name__ == "__main__":
    if len(sys.argv) != 3:
        sys.exit("usage: convert_hipparcos.py <d3-celestial data folder> <output .bin.gz>")
    main(sys.argv[1], sys.argv[2])
