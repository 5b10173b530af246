// Power-on self-test of the (invented) Quillfield Instruments "Ratchet-5" demonstrator: five
// qubits, ten classical bits. It uses every construct the qsim reader supports (see
// docs/openqasm.md); EveryConstructTest checks the distribution it must give, derived at the
// end of this file. Read it with the input tilt = pi/3 and dt = 1 ns.
OPENQASM 3.0;
include "stdgates.inc";
pragma ratchet5 calibration-table 7     // a pragma: ignored

/* ---- declarations ---- */
input float tilt;                    // from the reader's settings
const int rounds = 3;
qubit[3] q;                          // qubits 0-2
qreg anc[1];                         // qubit 3
qubit spare;                         // qubit 4
bit[3] c;                            // clbits 0-2
creg flags[2];                       // clbits 3-4
bit seen = 0;                        // clbit 5, starts 0
bit check;                           // clbit 6
bit zero = measure spare;            // clbit 7: spare is still |0>
output int[8] tries = 0;
uint[4] counter;
float[64] scale = 0.5;
angle[16] turn = 3 * pi;             // an angle: pi once reduced to [0, 2 pi)
bool ready = true;
let pair = q[0] ++ q[1];             // an alias of qubits
let low = c[0:1];                    // an alias of bits

/* ---- constants: every operator and function, folded when read ---- */
const int mask = ((0xF & ~0b0101) ^ (1 << 2)) | "001";              // 15
const int small = (mask % 4) + (64 >> 3);                           // 11
const int eighths = int[8](arccos(0.5) * 2 * 8 / pi);               // 5
const bool ok = (mask == 15) && !(small < 0) && small != 12 && small >= 11 && small <= 11
    && small > 10 && (eighths == 5) && uint[2](7) == 3 && bool(2) || false;
const float total = sin(pi / 6) + cos(0) + tan(0) + arcsin(1) - arctan(1) * 2 + exp(0)
    + log(euler) + sqrt(4.0) + ln(1) + floor(2.7) + ceiling(0.2) + popcount(7) + mod(7, 4)
    + pow(2, 3) + 2 ** 2 + tau / (2 * π) - float(3) / 2;            // 26 (to rounding)
const bool fine = floor(total + 0.5) == 26;
const float theta = 2 * pi / 3;

/* ---- gates and subroutines ---- */
gate mirror(a) u, v {
  rz(a) u;
  cx u, v;
  barrier u, v;
  gphase(a / 2);
}
def parity(bit a, bit b) -> bit {
  return a ^ b;
}
def nudge(qubit t, float a) {
  rz(a) t;
  rz(-a) t;
  return;
}
def probe(qubit t) -> bit {
  return measure t;
}

/* ---- the test ---- */
x spare;
measure spare;                       // result discarded: the extra clbit 9 reads 1
reset spare;

for int i in [0:rounds * 4 - 2] {    // 0..10, cut short by break
  if (i == 1) { continue; }
  ry(tilt) q[i];                     // q[0] and q[2]: P(1) = sin^2(pi/6) = 1/4
  if (i == 2) break;
}
if (ok && fine) {
  cx pair[0], pair[1];               // q[1] copies q[0]
} else {
  x spare;
}

// Every gate of stdgates.inc and every modifier, each undone by another spelling of its
// inverse: together the identity.
h q[1]; h q[1];
x q[2]; CX q[0], q[2]; cx q[0], q[2]; x q[2];
y q[0]; y q[0];
z q[1]; z q[1];
s q[0]; sdg q[0];
t q[2]; inv @ t q[2];
tdg q[1]; pow(-1) @ tdg q[1];
sx q[0]; inv @ sx q[0];
id q[1];
rx(theta) q[2]; rx(-theta) q[2];
ry(0.3) q[1]; inv @ ry(0.3) q[1];
rz(1.1) q[0]; pow(-2) @ rz(0.55) q[0];
p(0.4) q[2]; phase(-0.4) q[2];
u1(0.9) q[1]; inv @ u1(0.9) q[1];
u2(0.2, 0.5) q[0]; inv @ u2(0.2, 0.5) q[0];
u3(0.7, 0.1, 0.2) q[2]; inv @ u3(0.7, 0.1, 0.2) q[2];
U(0.3, 0.6, 0.9) q[1]; inv @ U(0.3, 0.6, 0.9) q[1];
cy q[0], q[2]; cy q[0], q[2];
cz q[1], q[2]; cz q[1], q[2];
ch q[2], q[0]; ch q[2], q[0];
cp(0.8) q[0], q[1]; cphase(-0.8) q[0], q[1];
crx(0.6) q[1], q[2]; inv @ crx(0.6) q[1], q[2];
cry(0.6) q[2], q[0]; cry(-0.6) q[2], q[0];
crz(0.6) q[0], q[2]; crz(-0.6) q[0], q[2];
swap q[0], q[2]; swap q[2], q[0];
ccx q[0], q[1], q[2]; ccx q[0], q[1], q[2];
cswap q[2], q[0], q[1]; cswap q[2], q[0], q[1];
cu(0.5, 0.4, 0.3, 0.2) q[1], q[2]; inv @ cu(0.5, 0.4, 0.3, 0.2) q[1], q[2];
gphase(0.25); gphase(-0.25);
ctrl @ gphase(pi) q[0]; z q[0];              // a controlled global phase: phase on the control
ctrl(2) @ x q[0], q[1], q[2]; ccx q[0], q[1], q[2];
negctrl @ x q[2], q[1]; x q[2]; cx q[2], q[1]; x q[2];
pow(0.5) @ rz(1.0) q[1]; rz(-0.5) q[1];      // the principal square root
inv @ ctrl @ s q[0], q[2]; ctrl @ s q[0], q[2];
negctrl @ ctrl @ h q[0], q[1], q[2]; negctrl @ ctrl @ h q[0], q[1], q[2];
mirror(0.3) q[0], q[2]; inv @ mirror(0.3) q[0], q[2];
ctrl @ mirror(0.7) q[1], q[0], q[2]; inv @ ctrl @ mirror(0.7) q[1], q[0], q[2];
pow(2) @ mirror(0.2) q[2], q[1]; pow(-2) @ mirror(0.2) q[2], q[1];
negctrl @ mirror(0.1) q[1], q[2], q[0]; inv @ negctrl @ mirror(0.1) q[1], q[2], q[0];
h q[0:1]; h q[{1, 0}];                       // a range and a set, broadcast
x q[0:2:2]; x q[{2, 0}];                     // a stepped range: q[0], q[2]
z q[-1]; z q[2];                             // a negative index: the last qubit
for uint j in {2, 0} { t q[j]; tdg q[j]; }
for int k in [2:-2:0] { sx q[k]; inv @ sx q[k]; }
counter = 15;
counter += 3;                                // wraps to 2 in four bits
scale *= 2;
nudge(q[1], scale * 2.0);                    // angles known only during the shot
barrier q, anc;
delay[100ns] q[0];
delay[2us] anc;
delay[1µs];
delay[3ms] spare;
delay[1s] q[1];
delay[50dt] q[2];

// Repeat until the ancilla reads 1, at most four times.
@note the bound below is part of the test
@max_iterations 4
while (flags[0] == 0) {
  h anc[0];
  flags[0] = measure anc[0];
  tries += 1;
}
tries %= 100;
if (flags[0] == 1) { x anc[0]; }             // back to |0>
U(turn, 0, turn) anc[0];                     // U(pi, 0, pi) = X: |1>
check = probe(anc[0]);                       // clbit 8 and check both read 1

measure q[0:1] -> c[0:1];
c[2] = measure q[-1];
rx((c[2] ^ c[0]) * pi) spare;                // spare = |c0 xor c2>
flags[1] = measure spare;
if (parity(low[0], c[2]) != flags[1]) {
  seen = 1;                                  // never: both are c0 xor c2
} else if (c == 7) {
  seen = (counter == 2) && ready;
} else seen = false;

// The distribution. With a = q[0] (P(a = 1) = 1/4), b = q[2] (P = 1/4) and f the last
// reading of the ancilla (P(f = 0) = (1/2)^4 = 1/16 after four tries), independent:
//   c0 = c1 = a, c2 = b, flags0 = f, flags1 = a xor b, seen = a and b, check = 1,
//   zero = 0, clbit 8 (the measurement probe returns) = 1, clbit 9 (the discarded result of
//   spare) = 1,
// so the outcome a + 2a + 4b + 8f + 16(a xor b) + 32(a and b) + 64 + 256 + 512 has
// probability P(a) P(b) P(f); the eight such outcomes sum to 1.
