#!/usr/bin/env bash
# regenerate.sh BIN: rebuilds baseline.json and every command output in
# README.md with the revbound binary BIN, so that the walkthrough shows what
# the tool really prints. Run it after any change of the demo circuits or of
# revbound's output; the CTest test Demo.ReadmeUpToDate fails until you do.
#
# In README.md a line
#   <!-- revbound: ARGS -->   (or <!-- awk: ARGS -->)
# must be followed by a fenced block (```text); the block is replaced by
# "$ revbound ARGS", the command's standard output and standard error, and
# its exit status. ARGS are split at spaces (no quoting). A line
#   <!-- file: NAME -->
# followed by a fenced block (```toml) gets the file NAME verbatim. Commands
# run in this folder, so every path in the outputs is relative. The output is
# deterministic.
set -euo pipefail

if [ $# -ne 1 ]; then
  echo "usage: $0 path/to/revbound" >&2
  exit 2
fi
case "$1" in
  /*) bin="$1" ;;
  *) bin="$PWD/$1" ;;
esac
if [ ! -x "$bin" ]; then
  echo "$0: '$1' is not an executable revbound binary" >&2
  exit 2
fi

cd "$(dirname "$0")"
export LC_ALL=C

# The baseline of the check walkthrough: the eager block as saved on main.
"$bin" report --format json -o baseline.json eager.qasm

tmp=$(mktemp README.md.XXXXXX)
trap 'rm -f "$tmp"' EXIT

marker='^<!-- (revbound|awk|file): (.*) -->$'
lineno=0
skipping=0
{
  while IFS= read -r line || [ -n "$line" ]; do
    lineno=$((lineno + 1))
    if [ "$skipping" = 1 ]; then
      [ "$line" = '```' ] && skipping=0
      continue
    fi
    printf '%s\n' "$line"
    if [[ $line =~ $marker ]]; then
      kind=${BASH_REMATCH[1]}
      read -r -a args <<<"${BASH_REMATCH[2]}"
      # The old block's opening fence (```text, ```toml) is kept; its body
      # is replaced, up to and including the closing fence.
      IFS= read -r fence || fence=''
      lineno=$((lineno + 1))
      if [[ ! $fence =~ ^\`\`\`[a-z]+$ ]]; then
        echo "README.md:$lineno: expected a fenced block (\`\`\`text) after the marker" >&2
        exit 2
      fi
      printf '%s\n' "$fence"
      if [ "$kind" = file ]; then
        cat -- "${args[0]}"
      else
        if [ "$kind" = revbound ]; then
          set +e; out=$("$bin" "${args[@]}" </dev/null 2>&1); rc=$?; set -e
        else
          set +e; out=$(awk "${args[@]}" </dev/null 2>&1); rc=$?; set -e
        fi
        printf '$ %s %s\n' "$kind" "${args[*]}"
        [ -n "$out" ] && printf '%s\n' "$out"
        printf '[exit status %d]\n' "$rc"
      fi
      printf '```\n'
      skipping=1
    fi
  done
  if [ "$skipping" = 1 ]; then
    echo "README.md: a marker's \`\`\`text block is not closed" >&2
    exit 2
  fi
} <README.md >"$tmp"
# Written over, not renamed, so that README.md keeps its mode.
cat "$tmp" >README.md
