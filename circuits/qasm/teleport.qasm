// Teleportation of the state u3(1.1, 0.6, 0)|0> from src[0] to dst[0] with the two
// corrections fed forward from the measured bits, as OpenQASM 2.0 writes it (one bit
// register per correction; C. H. Bennett et al., Phys. Rev. Lett. 70, 1895 (1993), for the
// protocol). Ideally dst[0] ends in the sent state whatever the bits read.
//   fray run circuits/qasm/teleport.qasm --device circuits/devices/ring4-qasm.yaml --observe IIX,IIY,IIZ
OPENQASM 2.0;
include "qelib1.inc";
qreg src[1];
qreg link[1];
qreg dst[1];
creg a[1];
creg b[1];
u3(1.1, 0.6, 0) src[0];
h link[0];
cx link[0], dst[0];
barrier src, link, dst;
cx src[0], link[0];
h src[0];
measure src[0] -> a[0];
measure link[0] -> b[0];
if (b == 1) x dst[0];
if (a == 1) z dst[0];
