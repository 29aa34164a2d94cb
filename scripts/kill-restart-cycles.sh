#!/usr/bin/env bash
# Kill-restart cycles on one results folder: start 'linetest demo', sometimes a second writer at the same moment (or
# two starts racing for the folder), kill -9 at a random moment (during recovery, mid-batch, between batches), start
# again. Afterwards: every run a demo printed as stored is stored (0 lost), no unit of a cycle is stored twice
# (0 duplicates), every start either ran or was refused with "is in use" (0 wedged), and 'linetest verify' is intact.
#
# Usage: scripts/kill-restart-cycles.sh [CYCLES] [RESULTS_FOLDER]
#   LINETEST  command that runs linetest (default: dotnet src/LineTest.Station/bin/Debug/net10.0/linetest.dll)
#   SEED      seed of the random kill moments (default 14)
set -u
cycles=${1:-100}
results=${2:-$(mktemp -d)}
linetest=${LINETEST:-"dotnet src/LineTest.Station/bin/Debug/net10.0/linetest.dll"}
RANDOM=${SEED:-14}
work=$(mktemp -d)
db="$results/results.db"
starts=0; refused=0; ran=0; wedged=0; killed=0; concurrent=0; printed=0

start_demo() { # $1 tag, $2 units; runs in the background, its pid in $pid
  $linetest demo --units "$2" --seed "$RANDOM" --lot "$1" --results "$results" >"$work/$1.out" 2>"$work/$1.err" &
  pid=$!
}

judge() { # $1 tag, $2 exit code: ran, refused, killed or wedged
  starts=$((starts + 1))
  if [ "$2" -eq 137 ]; then killed=$((killed + 1))
  elif [ "$2" -eq 0 ]; then ran=$((ran + 1))
  elif [ "$2" -eq 1 ] && grep -q "is in use by process" "$work/$1.err"; then refused=$((refused + 1))
  else wedged=$((wedged + 1)); echo "cycle $1: exit $2: $(tail -3 "$work/$1.err")" >&2
  fi
}

for ((i = 1; i <= cycles; i++)); do
  kind=$((i % 4))
  start_demo "K$i" 40; a=$pid
  b=""
  if [ $kind -eq 1 ]; then start_demo "C$i" 40; b=$pid; concurrent=$((concurrent + 1)); fi          # two starts racing
  # a random moment between 2 s and 10 s after the start (on a loaded 2-core machine .NET start-up alone takes 1-5 s,
  # so this covers start-up, recovery, mid-batch and between batches)
  sleep "$(awk -v r=$RANDOM 'BEGIN { printf "%.2f", 2 + (r % 800) / 100 }')"
  if [ $kind -eq 3 ]; then                                                                      # a second writer while the first runs
    $linetest demo --units 1 --lot "S$i" --results "$results" >"$work/S$i.out" 2>"$work/S$i.err"
    judge "S$i" $?; concurrent=$((concurrent + 1))
  fi
  kill -9 "$a" $b 2>/dev/null
  wait "$a"; judge "K$i" $?
  if [ -n "$b" ]; then wait "$b"; judge "C$i" $?; fi
done

# The last start runs to the end: it recovers what the last kill left and empties the journal.
$linetest demo --units 4 --lot FINAL --results "$results" >"$work/FINAL.out" 2>"$work/FINAL.err"
judge FINAL $?

# Every unit line a demo printed ("SERIAL slot N VERDICT") is printed after its run is stored.
lost=0
for out in "$work"/*.out; do
  lot=$(basename "$out" .out)
  while read -r serial _; do
    printed=$((printed + 1))
    n=$(sqlite3 "$db" "SELECT count(*) FROM runs WHERE lot = '$lot' AND serial = '$serial';")
    [ "$n" -ge 1 ] || { lost=$((lost + 1)); echo "lost: $lot $serial" >&2; }
  done < <(grep -E '^[A-Z0-9-]+ +slot [0-9]+ +(PASS|FAIL|ERROR)' "$out")
done
duplicates=$(sqlite3 "$db" "SELECT coalesce(sum(n - 1), 0) FROM (SELECT count(*) AS n FROM runs GROUP BY lot, serial HAVING n > 1);")
interrupted=$(sqlite3 "$db" "SELECT count(*) FROM runs WHERE reason = 'interrupted';")
journal=$(sqlite3 "$db" "SELECT count(*) FROM runs_in_progress;")
runs=$(sqlite3 "$db" "SELECT count(*) FROM runs;")
$linetest verify --results "$results" >"$work/verify.out" 2>&1; verify=$?
[ $verify -eq 0 ] || { wedged=$((wedged + 1)); cat "$work/verify.out" >&2; }

echo "cycles $cycles, starts $starts (ran $ran, killed $killed, refused as in use $refused, concurrent starts $concurrent)"
echo "runs stored $runs (interrupted $interrupted), unit lines printed $printed, journal left $journal"
echo "lost $lost, duplicates $duplicates, wedged $wedged, verify exit $verify"
echo "results in $results"
[ "$lost" -eq 0 ] && [ "$duplicates" -eq 0 ] && [ "$wedged" -eq 0 ] && [ "$journal" -eq 0 ]
