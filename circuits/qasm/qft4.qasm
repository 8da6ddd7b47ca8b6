// A four-qubit quantum Fourier transform of the basis state |0101>, written the way a
// compiler emits OpenQASM 2.0: controlled phases as cu1, the final bit reversal as swaps.
// Run it on the invented ring device:
//   fray run circuits/qasm/qft4.qasm --device circuits/devices/ring4-qasm.yaml
OPENQASM 2.0;
include "qelib1.inc";
qreg q[4];
creg c[4];
x q[1];
x q[3];
barrier q;
h q[0];
cu1(pi/2) q[1], q[0];
cu1(pi/4) q[2], q[0];
cu1(pi/8) q[3], q[0];
h q[1];
cu1(pi/2) q[2], q[1];
cu1(pi/4) q[3], q[1];
h q[2];
cu1(pi/2) q[3], q[2];
h q[3];
swap q[0], q[3];
swap q[1], q[2];
measure q -> c;
