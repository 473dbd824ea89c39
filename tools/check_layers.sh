#!/usr/bin/env bash
# Layering check (DESIGN.md): a folder of src/ includes only itself and folders earlier in
#   core <- tool <- cusp <- path <- sweep <- texture <- finish <- job <- infer <- io <- report <- cli
# Prints each offending include and exits 1; exits 0 when the layering holds.
set -u
src=${1:-$(dirname "$0")/../src}
layers=(core tool cusp path sweep texture finish job infer io report cli)
rank() { local k; for k in "${!layers[@]}"; do [ "${layers[$k]}" = "$1" ] && { echo "$k"; return; }; done; echo -1; }
bad=0
for dir in "${layers[@]}"; do
  [ -d "$src/$dir" ] || continue
  mine=$(rank "$dir")
  while IFS= read -r line; do
    file=${line%%:*}
    inc=$(sed -E 's/.*#include[[:space:]]*"([^/"]+)\/.*/\1/' <<<"${line#*:}")
    theirs=$(rank "$inc")
    if [ "$theirs" -gt "$mine" ]; then
      echo "layering: $file includes $inc/, which comes after $dir/ in DESIGN.md's order"
      bad=1
    fi
  done < <(grep -rnH -E '^[[:space:]]*#include[[:space:]]*"[a-z]+/' "$src/$dir" | sed -E 's/^([^:]+):[0-9]+:/\1:/')
done
[ "$bad" -eq 0 ] && echo "layering ok: ${layers[*]}"
exit "$bad"
