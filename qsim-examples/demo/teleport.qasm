// Teleport the state ry(2*pi/3)|0> from qubit 0 to qubit 2.
OPENQASM 3.0;
include "stdgates.inc";

qubit[3] q;
bit[3] c;

ry(2 * pi / 3) q[0];      // the message: P(1) = sin^2(pi/3) = 3/4
h q[1];
cx q[1], q[2];            // shared pair on qubits 1 and 2
cx q[0], q[1];
h q[0];
c[0] = measure q[0];
c[1] = measure q[1];
if (c[1] == 1) x q[2];
if (c[0] == 1) z q[2];
c[2] = measure q[2];
