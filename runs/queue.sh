#!/bin/bash
# usage: queue.sh NAME CAP module[:fresh][:prefix] ...
cd /work/wt/mut14/mutants
q=$1; cap=$2; shift 2
for spec in "$@"; do
  IFS=: read -r mod mode prefix <<< "$spec"
  short=${mod#deckload.core.}
  args=(--cap $cap)
  [ "$mode" = fresh ] && args+=(--fresh)
  [ -n "$prefix" ] && args+=($prefix)
  echo "== $(date +%T) $spec" >> ../runs/$q.queue
  PYTHONPATH=$PWD:$PWD/tests nice -n 2 /work/venv/bin/python ../tests/tools/mutants_in_one_session.py $mod ../runs/$short.json "${args[@]}" >> ../runs/$short.log 2>&1
  tail -1 ../runs/$short.log >> ../runs/$q.queue
done
echo "== $(date +%T) done" >> ../runs/$q.queue
