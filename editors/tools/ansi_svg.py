#!/usr/bin/env python3
"""Render a terminal capture with ANSI colours (tmux capture-pane -e -p) as an SVG picture.

usage: ansi_svg.py < capture.txt > picture.svg

Only the SGR sequences a terminal editor emits are understood: reset, bold, italic, underline,
reverse, the 16 colours, xterm's 256-colour palette and 24-bit colour.
"""
import html
import re
import sys
import unicodedata

FG, BG = "#d0d0d0", "#1c1c1c"
BASE16 = ["#000000", "#cd3131", "#0dbc79", "#e5e510", "#2472c8", "#bc3fbc", "#11a8cd", "#e5e5e5",
          "#666666", "#f14c4c", "#23d18b", "#f5f543", "#3b8eea", "#d670d6", "#29b8db", "#ffffff"]


def xterm256(n):
    if n < 16:
        return BASE16[n]
    if n < 232:  # the 6x6x6 colour cube
        n -= 16
        steps = [0, 95, 135, 175, 215, 255]
        return "#%02x%02x%02x" % (steps[n // 36], steps[n // 6 % 6], steps[n % 6])
    v = 8 + (n - 232) * 10  # the grey ramp
    return "#%02x%02x%02x" % (v, v, v)


def sgr(state, params):
    codes = [int(p) if p else 0 for p in params.split(";")] if params else [0]
    i = 0
    while i < len(codes):
        c = codes[i]
        if c == 0:
            state.update(fg=None, bg=None, bold=False, italic=False, under=False, rev=False)
        elif c == 1:
            state["bold"] = True
        elif c == 3:
            state["italic"] = True
        elif c == 4:
            state["under"] = True
        elif c == 7:
            state["rev"] = True
        elif c == 22:
            state["bold"] = False
        elif c == 23:
            state["italic"] = False
        elif c == 24:
            state["under"] = False
        elif c == 27:
            state["rev"] = False
        elif 30 <= c <= 37:
            state["fg"] = BASE16[c - 30]
        elif 90 <= c <= 97:
            state["fg"] = BASE16[c - 90 + 8]
        elif 40 <= c <= 47:
            state["bg"] = BASE16[c - 40]
        elif 100 <= c <= 107:
            state["bg"] = BASE16[c - 100 + 8]
        elif c == 39:
            state["fg"] = None
        elif c == 49:
            state["bg"] = None
        elif c in (38, 48, 58) and i + 1 < len(codes):
            key = {38: "fg", 48: "bg", 58: "ul"}[c]  # 58: underline colour, not drawn
            if codes[i + 1] == 5 and i + 2 < len(codes):
                state[key] = xterm256(codes[i + 2])
                i += 2
            elif codes[i + 1] == 2 and i + 4 < len(codes):
                state[key] = "#%02x%02x%02x" % tuple(codes[i + 2:i + 5])
                i += 4
        i += 1


def cells(line, state):
    """Yield (column, char, style) for one captured line, tracking wide characters."""
    col = 0
    for m in re.finditer(r"\x1b\[([0-9;]*)m|\x1b\[[0-9;?]*[A-Za-z]|(.)", line):
        if m.group(2) is None:
            if m.group(0).endswith("m"):
                sgr(state, m.group(1))
            continue
        ch = m.group(2)
        fg, bg = state["fg"] or FG, state["bg"] or BG
        if state["rev"]:
            fg, bg = bg, fg
        width = 2 if unicodedata.east_asian_width(ch) in "WF" else 1
        yield col, ch, width, (fg, bg, state["bold"], state["italic"], state["under"])
        col += width


def main():
    lines = sys.stdin.read().rstrip("\n").split("\n")
    cw, ch, pad = 8.4, 18, 12
    ncols = 0
    state = dict(fg=None, bg=None, bold=False, italic=False, under=False, rev=False)
    rows = []
    for line in lines:
        row = list(cells(line, state))
        rows.append(row)
        if row:
            ncols = max(ncols, row[-1][0] + row[-1][2])
    w, h = int(ncols * cw + 2 * pad), int(len(rows) * ch + 2 * pad)
    out = [f'<svg xmlns="http://www.w3.org/2000/svg" width="{w}" height="{h}" viewBox="0 0 {w} {h}">',
           f'<rect width="{w}" height="{h}" fill="{BG}"/>',
           '<g font-family="DejaVu Sans Mono, monospace" font-size="14" xml:space="preserve">']
    for r, row in enumerate(rows):
        y = pad + r * ch
        for col, c, width, (fg, bg, bold, italic, under) in row:
            x = pad + col * cw
            if bg != BG:
                out.append(f'<rect x="{x:.1f}" y="{y}" width="{cw * width + 0.5:.1f}" height="{ch}" fill="{bg}"/>')
            if c != " ":
                attrs = f'fill="{fg}"'
                if bold:
                    attrs += ' font-weight="bold"'
                if italic:
                    attrs += ' font-style="italic"'
                if under:
                    attrs += ' text-decoration="underline"'
                out.append(f'<text x="{x:.1f}" y="{y + 14}" {attrs}>{html.escape(c)}</text>')
    out.append("</g></svg>")
    sys.stdout.write("\n".join(out) + "\n")


if __name__ == "__main__":
    main()
