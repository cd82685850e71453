"""Reference for the app's seeded generator, written independently in Python.

xoshiro128** 1.1: Blackman & Vigna, "Scrambled linear pseudorandom number
generators", ACM Transactions on Mathematical Software 47(4), 2021; the steps
follow the authors' reference C code (xoshiro128starstar.c, prng.di.unimi.it).
SplitMix64: Steele, Lea & Flood, "Fast splittable pseudorandom number
generators", OOPSLA 2014 (the authors' splitmix64.c), used to seed the state
as the xoshiro authors recommend. Written from memory of those published
algorithms and checked against public copies of the reference code.
Normals: Marsaglia's polar method (Marsaglia & Bray 1964).

stdin: {"seed": int (negative: two's complement modulo 2^64), "count": int, "fork": int | null}
stdout: {"splitmix0": first SplitMix64 output from state 0 (hex),
         "u32": first `count` 32-bit outputs, "uniform": next `count` uniforms
         (from a fresh generator), "normal": `count` normals (fresh generator)}
"""
import json
import math
import sys

M64 = (1 << 64) - 1
M32 = (1 << 32) - 1
GOLDEN = 0x9E3779B97F4A7C15


def mix64(z):
    z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & M64
    z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & M64
    return z ^ (z >> 31)


def rotl(x, k):
    return ((x << k) | (x >> (32 - k))) & M32


class Xoshiro128ss:
    def __init__(self, key):
        self.key = key & M64
        s = self.key
        words = []
        for _ in range(2):
            s = (s + GOLDEN) & M64
            z = mix64(s)
            words += [z & M32, z >> 32]
        if not any(words):
            words[0] = 1
        self.s = words
        self.spare = None

    def next_u32(self):
        s = self.s
        result = (rotl((s[1] * 5) & M32, 7) * 9) & M32
        t = (s[1] << 9) & M32
        s[2] ^= s[0]
        s[3] ^= s[1]
        s[1] ^= s[2]
        s[0] ^= s[3]
        s[2] ^= t
        s[3] = rotl(s[3], 11)
        return result

    def uniform(self):
        a = self.next_u32()
        b = self.next_u32()
        return (a * 2**21 + (b >> 11)) / 2**53

    def normal(self):
        if self.spare is not None:
            x, self.spare = self.spare, None
            return x
        while True:
            u = 2 * self.uniform() - 1
            v = 2 * self.uniform() - 1
            q = u * u + v * v
            if 0 < q < 1:
                break
        m = math.sqrt(-2 * math.log(q) / q)
        self.spare = v * m
        return u * m

    def fork(self, k):
        return Xoshiro128ss(mix64((self.key + (k + 1) * GOLDEN) & M64))


d = json.load(sys.stdin)


def make():
    g = Xoshiro128ss(d["seed"])
    return g.fork(d["fork"]) if d.get("fork") is not None else g


n = d["count"]
g1, g2, g3 = make(), make(), make()
print(json.dumps({
    "splitmix0": hex(mix64(GOLDEN)),
    "u32": [g1.next_u32() for _ in range(n)],
    "uniform": [g2.uniform() for _ in range(n)],
    "normal": [g3.normal() for _ in range(n)],
}))
