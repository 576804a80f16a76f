"""Reference for the standard normal quantile function: scipy.special.ndtri (Cephes), Debian python3-scipy.

Usage: python3 normal_quantile_scipy.py PROBABILITIES.txt
The file holds one probability per line as a hexadecimal float (Java's Double.toHexString), so that no digit
is lost on the way. Prints one line per probability: ndtri(p) as Python's repr (shortest round-trip digits).
"""
import sys

from scipy.special import ndtri

with open(sys.argv[1], encoding="ascii") as f:
    for line in f:
        line = line.strip()
        if line:
            print(repr(float(ndtri(float.fromhex(line)))))
