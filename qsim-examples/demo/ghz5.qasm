// Five-qubit GHZ state, as run on the Pallet-5 test chip of the (invented) Fernhill
// Quantum Lab: ideally only 00000 and 11111, half the time each.
OPENQASM 3.0;
include "stdgates.inc";

// Entangle qubit b with qubit a.
gate link a, b {
  cx a, b;
}

qubit[5] q;
bit[5] c;

h q[0];
link q[0], q[1];
link q[1], q[2];
link q[2], q[3];
link q[3], q[4];
barrier q;
c = measure q;
