import { tempFile } from '../helpers/cli.js';

/** A small invented device and two small variants of one circuit on it, written to temp files (scenarios of our own). */
export const TINY_DEVICE = `name: tiny test line (invented)
qubits:
  all: { t1: 40us, t2: 30us, readout: 0.02 }
  2: { t1: 12us, t2: 10us }
gates:
  all: { duration: 30ns, error: 0.001 }
  cx: { duration: 250ns, error: 0.01 }
  "cx 0 2": { error: 0.04 }
  measure: { duration: 500ns }
`;

/** Writes the device and returns its path. */
export function tinyDevice(): string {
  return tempFile('tiny.yaml', TINY_DEVICE);
}

/** A 3-qubit GHZ chain 0→1→2 on the given device path, with a parameterised idle. */
export function ghzChain(device: string, name = 'ghz chain'): string {
  return tempFile(
    'chain.yaml',
    `name: ${name}
qubits: 3
device: ${device}
params: { wait: 0 }
observe: [ZZI]
steps:
  - h: 0
  - cx: [0, 1]
  - cx: [1, 2]
  - idle: 2
    for: wait us
  - measure: all
`,
  );
}

/** The same GHZ state as a fan from qubit 0 (its cx 0 2 is the device's worst pair). */
export function ghzFan(device: string): string {
  return tempFile(
    'fan.yaml',
    `name: ghz fan
qubits: 3
device: ${device}
observe: [ZZI]
steps:
  - h: 0
  - cx: [0, 1]
  - cx: [0, 2]
  - measure: all
`,
  );
}
