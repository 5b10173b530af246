#!/usr/bin/env python3
"""Counts VEX-encoded double-precision add/mul/sub instructions in HotSpot's printed machine code,
packed (vaddpd/vmulpd/vsubpd: vectorised) against scalar (vaddsd/vmulsd/vsubsd), per C2-compiled
method. Usage: tools/jit-vector-check.py FILE, where FILE holds the output of a JVM run with
  -XX:+UnlockDiagnosticVMOptions -XX:CompileCommand=print,*Kernels::*
(every class whose name ends in Kernels: DenseKernels, DenseSingleQubitKernels, DiagonalKernels,
PermutationKernels, FloatSingleQubitKernels, ...; HotSpot takes a wildcard only at the start or
end of a class name) and a HotSpot disassembler plugin installed (see DEVELOPERS.md, "Is a kernel
vectorised?").
Decoding: two-byte VEX prefix C5, opcode 58/59/5C, and the prefix's pp bits (01 = packed double,
11 = scalar double), from the Intel 64 and IA-32 Architectures Software Developer's Manual,
vol. 2, section 2.3 (VEX prefix)."""
import re, sys
text = open(sys.argv[1]).read()
methods = re.split(r"Compiled method \(c2\)", text)[1:]
for m in methods:
    name = m.split("\n", 1)[0].strip()
    hexs = ""
    for line in m.split("\n"):
        mm = re.match(r"\s*0x[0-9a-f]+: ([0-9a-f |]+)$", line)
        if mm:
            hexs += re.sub(r"[^0-9a-f]", "", mm.group(1))
    b = bytes.fromhex(hexs[: len(hexs) // 2 * 2])
    packed = scalar = 0
    for i in range(len(b) - 2):
        if b[i] == 0xC5 and b[i + 2] in (0x58, 0x59, 0x5C):
            pp = b[i + 1] & 3
            if pp == 1:
                packed += 1
            elif pp == 3:
                scalar += 1
    print(f"{name[:90]:90s} packed-double ops {packed:4d}  scalar-double ops {scalar:4d}")
