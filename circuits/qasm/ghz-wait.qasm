// A GHZ state on a data register and an ancilla, held for a while and then undone, in
// OpenQASM 3: a modifier on a standard gate and its inverse, a delay on two registers.
// Ideally every run reads 0000; the waiting four-qubit GHZ state loses its coherence
// four times as fast as one qubit would (common practice).
//   fray run circuits/qasm/ghz-wait.qasm --device circuits/devices/ring4-qasm.yaml
OPENQASM 3.0;
include "stdgates.inc";

qubit[3] data;
qubit[1] anc;
bit[3] out;
bit[1] flag;

h data[0];
cx data[0], data[1];
cx data[1], data[2];
ctrl @ x data[2], anc[0];
delay[2us] data, anc;
inv @ ctrl @ x data[2], anc[0];
cx data[1], data[2];
cx data[0], data[1];
h data[0];
out = measure data;
flag[0] = measure anc[0];
