#!/usr/bin/env python3
"""Driver of run.sh: generates the libraries, times whole processes and
prints the figures with the targets README.md gives (Performance).

Each timing is the wall time of one child process, from time.perf_counter
around its start and os.wait4, its CPU time (user + system) and its peak RSS
from the rusage that wait4 returns. Each command runs --repeats times; the
median and the best are shown. hatsieve and the numpy peer run in turn, so
both meet the same load from other jobs; under such load the CPU-time ratio
is the steadier figure (hatsieve uses both cores, the peer one, so on an idle
machine the wall-time ratio is at least the CPU-time ratio).
"""
import argparse
import os
import platform
import statistics
import subprocess
import sys
import time


def timed(cmd, env=None):
    """Run cmd once; return (seconds, peak RSS in MB, stdout bytes, CPU seconds)."""
    t0 = time.perf_counter()
    p = subprocess.Popen(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE, env=env)
    # Read stdout fully before reaping so a large output cannot block the child.
    out = p.stdout.read()
    errb = p.stderr.read()  # small: warnings at most
    _, status, ru = os.wait4(p.pid, 0)
    t1 = time.perf_counter()
    p.returncode = os.waitstatus_to_exitcode(status)
    if p.returncode != 0:
        sys.exit(f"bench: {' '.join(cmd)} failed ({p.returncode}): {errb.decode(errors='replace').strip()}")
    return t1 - t0, ru.ru_maxrss / 1024.0, out, ru.ru_utime + ru.ru_stime


def summary(runs):
    secs = [r[0] for r in runs]
    return statistics.median(secs), min(secs), max(r[1] for r in runs), runs[-1][2], statistics.median(r[3] for r in runs)


def measure(cmd, repeats, env=None):
    return summary([timed(cmd, env) for _ in range(repeats)])[:4]


def measure_pair(a, b, repeats):
    """Run a and b in turn, repeats times each; a summary of each."""
    ra, rb = [], []
    for _ in range(repeats):
        ra.append(timed(a))
        rb.append(timed(b))
    return summary(ra), summary(rb)


def pairs_of(csv_bytes, header):
    lines = csv_bytes.decode().splitlines()
    if header:
        lines = lines[1:]
    return [tuple(l.split(",")[:2]) for l in lines if l]


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--bin", required=True)
    ap.add_argument("--work", required=True)
    ap.add_argument("--python", default=sys.executable)
    ap.add_argument("--repeats", type=int, default=5)
    a = ap.parse_args()
    hs = os.path.join(a.bin, "hatsieve")
    gen = os.path.join(a.bin, "hatsieve-gen")
    peer = os.path.join(os.path.dirname(os.path.abspath(__file__)), "numpy_rank.py")
    w = lambda name: os.path.join(a.work, name)

    print(f"machine: {platform.machine()}, {os.cpu_count()} cores, load average {os.getloadavg()[0]:.2f} at start; repeats {a.repeats} (median, best)")
    print("generating libraries (hatsieve-gen, invented couples) ...", file=sys.stderr)
    subprocess.run([gen, "-donors", "10000", "-acceptors", "10000", "-seed", "1", "-o", w("rank.csv")], check=True)
    subprocess.run([gen, "-n", "100000", "-seed", "2", "-o", w("lib.csv")], check=True)
    subprocess.run([gen, "-n", "100000", "-seed", "2", "-format", "yaml", "-o", w("lib.yaml")], check=True)

    rows = []  # (what, median, best, rss, target text, ok)

    # 1. top 100 by dG, hatsieve against the numpy peer
    hs_cmd = [hs, "rank", "-l", w("rank.csv"), "--top", "100", "--format", "csv"]
    np_cmd = [a.python, peer, w("rank.csv"), "100"]
    (hmed, hbest, hrss, hout, hcpu), (nmed, nbest, nrss, nout, ncpu) = measure_pair(hs_cmd, np_cmd, a.repeats)
    hp, npairs = pairs_of(hout, True), pairs_of(nout, False)
    same = hp == npairs and len(hp) == 100
    ratio = nmed / hmed
    rows.append(("rank top 100 by dG, 10^4 x 10^4 (hatsieve)", hmed, hbest, hrss, "", None))
    rows.append(("rank top 100 by dG, 10^4 x 10^4 (numpy peer)", nmed, nbest, nrss, "", None))
    print()
    print(f"same 100 pairs in the same order: {'yes' if same else 'NO'}")
    if not same:
        only_h = set(hp) - set(npairs)
        only_n = set(npairs) - set(hp)
        print(f"  only hatsieve: {sorted(only_h)[:5]} ...; only numpy: {sorted(only_n)[:5]} ...")
    print(f"numpy / hatsieve wall time (medians): {ratio:.1f}x  (target >= 10x)")
    print(f"numpy / hatsieve CPU time (medians): {ncpu / hcpu:.1f}x  ({ncpu:.3f} s against {hcpu:.3f} s)")

    # 2. other metrics and filters, target <= 1 s
    for what, extra in [
        ("rank top 100 by z (dG/sigma)", ["--sort", "z"]),
        ("rank top 100 by sigma", ["--sort", "sigma"]),
        ("rank top 100 by z, --h2 uphill", ["--sort", "z", "--h2", "uphill"]),
        ("rank top 100 by dG, --h2 downhill", ["--h2", "downhill"]),
        ("rank top 100 by donor_bdfe, dG in [-5, 0]", ["--sort", "donor_bdfe", "--dg-min", "-5", "--dg-max", "0"]),
    ]:
        med, best, rss, _ = measure(hs_cmd + extra, a.repeats)
        rows.append((what + ", 10^4 x 10^4", med, best, rss, "<= 1 s", med <= 1.0))

    # 3. loading 10^5 couples: 'rank --top 1' (read, check, resolve, rank)
    # and 'check' (read, check, resolve on both C_G bases)
    for fmt_, f, target in [("CSV", "lib.csv", 0.3), ("YAML", "lib.yaml", 2.0)]:
        for cmd, label in [([hs, "rank", "-l", w(f), "--top", "1"], "rank --top 1"), ([hs, "check", w(f)], "check")]:
            med, best, rss, _ = measure(cmd, a.repeats)
            rows.append((f"load 10^5 couples, {fmt_} ({label})", med, best, rss, f"<= {target} s, <= 200 MB", med <= target and rss <= 200))

    print()
    print(f"{'what':58} {'median s':>9} {'best s':>8} {'peak MB':>8}  target")
    for what, med, best, rss, target, ok in rows:
        mark = "" if ok is None else ("  ok" if ok else "  MISSED")
        print(f"{what:58} {med:9.3f} {best:8.3f} {rss:8.1f}  {target}{mark}")
    print(f"{'numpy / hatsieve, top 100 by dG':58} {ratio:9.1f}x {'':8} {'':8}  >= 10x{'  ok' if ratio >= 10 and same else '  MISSED'}")
    print(f"{'numpy / hatsieve, top 100 by dG, CPU time':58} {ncpu / hcpu:9.1f}x")
    print(f"load average at the end: {os.getloadavg()[0]:.2f}")
    return 0 if same else 1


if __name__ == "__main__":
    sys.exit(main())
