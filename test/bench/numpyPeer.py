"""A numpy peer of fray's noisy run, written from scratch the way a practitioner would.

Reads a JSON file (written by test/bench/bench.mjs from fray's instruction list of a circuit):
  {"n": n, "ops": [{"op": "unitary"|"channel"|"reset", "qubits": [...], "step": s,
                    "matrix": [[[re, im], ...], ...]  or  "kraus": [matrix, ...]}, ...]}
Qubit 0 is the most significant bit (leftmost tensor factor), as in fray. The density matrix
is a tensor of shape [2] * (2n): axes 0..n-1 are the row qubits, n..2n-1 the column qubits.

Variants (argv[2]):
  practitioner  every operation on its own: tensordot + moveaxis, K rho K^dagger per Kraus op;
  fused         each gate fused by hand with the noise channels of the same step into one
                superoperator, applied with one tensordot;
  folded        as fused, and every pending 1-qubit superoperator folded into the next
                2-qubit superoperator on its qubit (what fray's plan does).
Prints one JSON line: {"variant", "seconds" (simulation only, no import/start-up), "purity", "p0"}.
"""
import json
import sys
import time

import numpy as np


def mat(m):
    a = np.array(m, dtype=float)
    return a[..., 0] + 1j * a[..., 1]


def apply_op(rho, n, op_matrix, qubits):
    """rho <- A rho on the row axes of `qubits` (A is 2^k x 2^k)."""
    k = len(qubits)
    a = op_matrix.reshape([2] * (2 * k))
    out = np.tensordot(a, rho, axes=(list(range(k, 2 * k)), list(qubits)))
    return np.moveaxis(out, list(range(k)), list(qubits))


def apply_op_right(rho, n, op_matrix, qubits):
    """rho <- rho A^dagger on the column axes of `qubits`."""
    k = len(qubits)
    a = op_matrix.conj().reshape([2] * (2 * k))
    cols = [n + q for q in qubits]
    out = np.tensordot(a, rho, axes=(list(range(k, 2 * k)), cols))
    return np.moveaxis(out, list(range(k)), cols)


def kraus_of(op):
    if op["op"] == "unitary":
        return [mat(op["matrix"])]
    if op["op"] == "channel":
        return [mat(k) for k in op["kraus"]]
    return [np.array([[1, 0], [0, 0]], dtype=complex), np.array([[0, 1], [0, 0]], dtype=complex)]


def qubits_of(op):
    return op["qubits"]


def superop(kraus):
    """S[(a, b), (c, d)] = sum_K K[a, c] conj(K[b, d])  (row-major pairs: rho'[a, b] = sum S rho[c, d])."""
    d = kraus[0].shape[0]
    s = np.zeros((d, d, d, d), dtype=complex)
    for k in kraus:
        s += np.einsum("ac,bd->abcd", k, k.conj())
    return s.reshape(d * d, d * d)


def embed_superop(s, sub, group):
    """Superoperator s on qubits `sub` lifted to the qubit list `group` (identity elsewhere)."""
    if list(sub) == list(group):
        return s
    k = len(group)
    d = 2 ** k
    eye = np.eye(2 ** (k - len(sub)), dtype=complex)
    ks = len(sub)
    # order: sub qubits first, then the rest; then permute back
    rest = [q for q in group if q not in sub]
    order = list(sub) + rest
    s4 = s.reshape([2] * (4 * ks))
    e4 = np.einsum("ac,bd->abcd", eye, eye).reshape([2] * (4 * (k - ks)))
    full = np.tensordot(s4, e4, axes=0)  # axes: a_s b_s c_s d_s a_r b_r c_r d_r
    # to a_s a_r b_s b_r c_s c_r d_s d_r
    ax = lambda blk, part: list(range(blk * ks, (blk + 1) * ks)) if part == 0 else list(range(4 * ks + blk * (k - ks), 4 * ks + (blk + 1) * (k - ks)))
    perm = ax(0, 0) + ax(0, 1) + ax(1, 0) + ax(1, 1) + ax(2, 0) + ax(2, 1) + ax(3, 0) + ax(3, 1)
    full = np.transpose(full, perm)
    # now indices follow `order`; permute to `group`
    pos = [order.index(q) for q in group]
    perm2 = []
    for blk in range(4):
        perm2 += [blk * k + p for p in pos]
    full = np.transpose(full.reshape([2] * (4 * k)), perm2)
    return full.reshape(d * d, d * d)


def apply_superop(rho, n, s, qubits):
    k = len(qubits)
    s_t = s.reshape([2] * (4 * k))
    axes_in = list(qubits) + [n + q for q in qubits]
    out = np.tensordot(s_t, rho, axes=(list(range(2 * k, 4 * k)), axes_in))
    return np.moveaxis(out, list(range(2 * k)), axes_in)


def run_practitioner(n, ops, rho):
    for op in ops:
        q = qubits_of(op)
        ks = kraus_of(op)
        if len(ks) == 1:
            rho = apply_op_right(apply_op(rho, n, ks[0], q), n, ks[0], q)
        else:
            acc = None
            for k in ks:
                term = apply_op_right(apply_op(rho, n, k, q), n, k, q)
                acc = term if acc is None else acc + term
            rho = acc
    return rho


def fused_groups(ops):
    """Gate + the channels of the same step (on the gate's qubits) as one superoperator, in order."""
    groups = []
    for op in ops:
        q = qubits_of(op)
        s = superop(kraus_of(op))
        last = groups[-1] if groups else None
        if last is not None and op["op"] == "channel" and last["step"] == op["step"] and set(q) <= set(last["qubits"]):
            last["s"] = embed_superop(s, q, last["qubits"]) @ last["s"]
        else:
            groups.append({"qubits": list(q), "s": s, "step": op["step"]})
    return groups


def run_fused(n, ops, rho):
    for g in fused_groups(ops):
        rho = apply_superop(rho, n, g["s"], g["qubits"])
    return rho


def run_folded(n, ops, rho):
    pending = {}
    for g in fused_groups(ops):
        q = g["qubits"]
        if len(q) == 1:
            p = pending.get(q[0])
            pending[q[0]] = g["s"] if p is None else g["s"] @ p
            continue
        s = g["s"]
        before = None
        for i, x in enumerate(q):
            p = pending.pop(x, None)
            if p is not None:
                e = embed_superop(p, [x], q)
                before = e if before is None else e @ before
        if before is not None:
            s = s @ before
        rho = apply_superop(rho, n, s, q)
    for x, p in pending.items():
        rho = apply_superop(rho, n, p, [x])
    return rho


def main():
    data = json.load(open(sys.argv[1]))
    variant = sys.argv[2]
    n = data["n"]
    ops = data["ops"]
    d = 2 ** n
    rho = np.zeros((d, d), dtype=complex)
    rho[0, 0] = 1
    rho = rho.reshape([2] * (2 * n))
    run = {"practitioner": run_practitioner, "fused": run_fused, "folded": run_folded}[variant]
    t0 = time.perf_counter()
    rho = run(n, ops, rho)
    seconds = time.perf_counter() - t0
    m = rho.reshape(d, d)
    print(json.dumps({"variant": variant, "seconds": seconds, "purity": float(np.real(np.vdot(m, m))), "p0": float(np.real(m[0, 0]))}))


if __name__ == "__main__":
    main()
