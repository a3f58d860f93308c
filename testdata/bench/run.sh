#!/usr/bin/env bash
# Performance check of hatsieve (see RESULTS.md for figures measured with it).
#
#   testdata/bench/run.sh [--repeats N]
#
# Builds hatsieve and hatsieve-gen, generates synthetic libraries (invented
# couples) in a temporary folder, then times whole processes:
#   - top 100 of 10^4 donors x 10^4 acceptors by dG: hatsieve rank against a
#     numpy peer (numpy_rank.py) on the same file, checking both give the same
#     100 pairs, and their ratio;
#   - top 100 by other metrics and under an H2 filter;
#   - loading (and resolving) 10^5 couples from CSV and from YAML, with peak RSS.
# Nothing is written outside the temporary folder, which is removed at the end.
set -euo pipefail

here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
work=$(mktemp -d "${TMPDIR:-/tmp}/hatsieve-bench.XXXXXX")
trap 'rm -rf "$work"' EXIT

# hatsieve is built as DEVELOPERS.md says to build it for use: statically
# linked (CGO_ENABLED=0), which starts about 4 ms sooner than the cgo build
# (the only cgo in it is os/user's, under lipgloss's terminal detection).
echo "building hatsieve and hatsieve-gen ..." >&2
(cd "$root" && CGO_ENABLED=0 go build -o "$work/hatsieve" ./cmd/hatsieve && go build -o "$work/hatsieve-gen" ./cmd/hatsieve-gen)

# A python3 that can import numpy: the one on PATH, else Debian's; install
# Debian's python3-numpy when neither has it and apt-get is there.
py=""
for p in python3 /usr/bin/python3; do
	if command -v "$p" >/dev/null 2>&1 && "$p" -c 'import numpy' 2>/dev/null; then
		py=$p
		break
	fi
done
if [ -z "$py" ]; then
	if command -v apt-get >/dev/null 2>&1; then
		echo "numpy not found: installing python3-numpy with apt-get ..." >&2
		if [ "$(id -u)" = 0 ]; then
			apt-get install -y python3-numpy >&2
		else
			sudo -n apt-get install -y python3-numpy >&2
		fi
		py=/usr/bin/python3
	else
		echo "run.sh: numpy is needed for the peer and apt-get is not available" >&2
		exit 1
	fi
fi

"$py" "$here/bench.py" --bin "$work" --work "$work" --python "$py" "$@"
