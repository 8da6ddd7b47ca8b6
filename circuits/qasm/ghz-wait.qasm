// A GHZ state on a data register and an ancilla, held for a while and then undone, in
// OpenQASM 3: a gate definition, a modifier, a delay. Ideally every run reads 0000;
// the waiting GHZ state dephases four times as fast as one qubit would.
//   fray run circuits/qasm/ghz-wait.qasm --device circuits/devices/ring4-qasm.yaml
OPENQASM 3.0;
include "stdgates.inc";

gate fanout a, b, c {
  cx a, b;
  cx b, c;
}

qubit[3] data;
qubit[1] anc;
bit[3] out;
bit[1] flag;

h data[0];
fanout data[0], data[1], data[2];
ctrl @ x data[2], anc[0];
delay[2us] data, anc;
inv @ ctrl @ x data[2], anc[0];
inv @ fanout data[0], data[1], data[2];
h data[0];
out = measure data;
flag[0] = measure anc[0];
