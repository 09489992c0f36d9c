#!/usr/bin/env bash
# The shard test (test/sweep/gnu-parallel.test.ts) runs sweep shards under GNU parallel (Debian's package
# `parallel`, /usr/bin/parallel): installed with apt-get when it is missing and this user may.
exec bash "$(dirname "$0")/ensure-debian-package.sh" parallel /usr/bin/parallel "the shard test"
