#!/bin/sh
# Runs a command line: sh scripts/cli.sh design|optimize|rate|uncertainty [arguments]
# (what `npm run design` and the others run). From the start-up snapshot of the compiled command
# lines (dist-server/cli.blob, every module already loaded: node's own start-up time) when it
# is current: made by this node binary in this folder (cli.blob.id), no source newer than the
# build (the rule of scripts/run-built.mjs), and no NODE_OPTIONS (V8 refuses a snapshot made
# with other flags). Otherwise through scripts/run-built.mjs, which builds what is stale first
# and runs the plain bundle.
# The command lines open no network connections: node would otherwise read and parse every
# certificate NODE_EXTRA_CA_CERTS names before starting (most of its start-up time where it is set).
unset NODE_EXTRA_CA_CERTS
root=$(cd "$(dirname "$0")/.." && pwd)
out="$root/dist-server"
if [ -z "${NODE_OPTIONS:-}" ] && [ -f "$out/cli.blob" ] && [ -f "$out/BUILT" ]; then
  id=$(cat "$out/cli.blob.id" 2>/dev/null)
  node_bin=$(command -v node)
  if [ -n "$node_bin" ] && [ "$id" = "$root $(stat -L -c '%s %Y' "$node_bin" 2>/dev/null)" ]; then
    # the first source newer than the build, if any (find failing counts as stale)
    newer=$(cd "$root" && find server shared data package-lock.json scripts/build-server.mjs \( -name '*.ts' -o -name '*.json' -o -name '*.mjs' \) -newer "$out/BUILT" -print -quit 2>/dev/null) &&
      [ -z "$newer" ] && exec node --snapshot-blob "$out/cli.blob" "$@"
  fi
fi
exec node "$root/scripts/run-built.mjs" "$@"
