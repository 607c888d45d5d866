#!/bin/sh
# render.sh regenerates the PNG renders of the example diagrams kept beside this script for
# review: one PNG per example and diagram kind, named EXAMPLE.KIND.png, and one per sweep of an
# example, EXAMPLE.sweep-NAME.png.
#
#   testdata/report/render.sh               # the Ts diagram and the flowsheet of every example
#   KINDS="Ts hs ph" testdata/report/render.sh
#
# Needs the Go toolchain and rsvg-convert (Debian package librsvg2-bin). Works from any
# directory. Each PNG is written to a temporary file here and renamed into place. PNGs of
# examples that no longer exist are removed.
set -eu

here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
kinds=${KINDS:-Ts flowsheet}

if ! command -v rsvg-convert >/dev/null 2>&1; then
	echo "render.sh: rsvg-convert not found; install it with: apt-get install -y librsvg2-bin" >&2
	exit 2
fi

tmp=$(mktemp -d)
trap 'rm -rf "$tmp"; rm -f "$here"/.*.png.tmp' EXIT INT TERM
(cd "$root" && go build -o "$tmp/hmb" ./cmd/hmb)

n=0
for f in "$root"/testdata/examples/*.hmb; do
	[ -e "$f" ] || continue
	name=$(basename "$f" .hmb)
	for k in $kinds; do
		# Exit status 1 only says the file has findings; the diagram is written all the same.
		status=0
		"$tmp/hmb" plot --kind "$k" -o "$tmp/$name.$k.svg" "$f" || status=$?
		if [ "$status" -gt 1 ] || [ ! -s "$tmp/$name.$k.svg" ]; then
			echo "render.sh: hmb plot --kind $k $f failed (exit $status)" >&2
			exit 1
		fi
		part="$here/.$name.$k.png.tmp"
		rsvg-convert --background-color=white -o "$part" "$tmp/$name.$k.svg"
		mv -f "$part" "$here/$name.$k.png"
		n=$((n + 1))
	done
	# Each sweep of the example, drawn against its swept value.
	for sw in $(sed -n 's/^sweep \([A-Za-z_][A-Za-z0-9_-]*\).*/\1/p' "$f"); do
		status=0
		"$tmp/hmb" plot --sweep "$sw" -o "$tmp/$name.sweep-$sw.svg" "$f" || status=$?
		if [ "$status" -gt 1 ] || [ ! -s "$tmp/$name.sweep-$sw.svg" ]; then
			echo "render.sh: hmb plot --sweep $sw $f failed (exit $status)" >&2
			exit 1
		fi
		part="$here/.$name.sweep-$sw.png.tmp"
		rsvg-convert --background-color=white -o "$part" "$tmp/$name.sweep-$sw.svg"
		mv -f "$part" "$here/$name.sweep-$sw.png"
		n=$((n + 1))
	done
done

for png in "$here"/*.png; do
	[ -e "$png" ] || continue
	name=$(basename "$png" .png)
	case $name in *.*) ;; *) continue ;; esac # not EXAMPLE.KIND: another picture (report-page.png)
	name=${name%.*}
	if [ ! -e "$root/testdata/examples/$name.hmb" ]; then
		rm -f "$png"
		echo "render.sh: removed $(basename "$png"): no such example"
	fi
done
echo "render.sh: wrote $n PNG(s) to $here"
