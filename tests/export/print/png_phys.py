# Reads PNG files (base64 on stdin, a JSON list) chunk by chunk as the PNG specification
# (ISO/IEC 15948:2004, section 5.3) lays them out, checking each chunk's CRC-32 with zlib.crc32,
# and returns the image size (IHDR) and the resolution of pHYs in dots per inch (unit 1 = metre).
import base64, json, struct, sys, zlib

out = []
for b64 in json.load(sys.stdin):
    data = base64.b64decode(b64)
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "signature"
    p, res, crc_ok, order = 8, {}, True, []
    while p < len(data):
        (n,) = struct.unpack(">I", data[p:p + 4])
        kind = data[p + 4:p + 8]
        body = data[p + 8:p + 8 + n]
        (crc,) = struct.unpack(">I", data[p + 8 + n:p + 12 + n])
        crc_ok = crc_ok and zlib.crc32(kind + body) & 0xFFFFFFFF == crc
        order.append(kind.decode("ascii"))
        if kind == b"IHDR":
            res["width"], res["height"] = struct.unpack(">II", body[:8])
        if kind == b"pHYs":
            x, y, unit = struct.unpack(">IIB", body)
            res["dpiX"], res["dpiY"], res["unit"] = x * 0.0254, y * 0.0254, unit
        p += 12 + n
    res["crcOk"] = crc_ok
    res["chunks"] = order
    out.append(res)
json.dump(out, sys.stdout)
