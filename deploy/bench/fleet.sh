#!/bin/sh
# The fleet benchmark: N copies of the regenerative example's unit at 1 Hz per sensor through a
# Mosquitto of its own (a free port, never 1883 or 8086) into `steamtally.jar run` (a child JVM,
# -Xmx512m, embedded store in a temporary directory, or store=influx: an influxd of its own on free
# loopback ports, data in the same directory), with one live stream per unit open on the
# dashboard; prints the figures and one PASS or FAIL line, exit status 1 when a target is missed.
# Both children are stopped on exit or Ctrl-C. The driver is FleetLoadDriver (deploy, test scope).
#
# Build first:  mvn -B -q package -DskipTests
# Run from the repository root:
#   sh deploy/bench/fleet.sh [units=100] [warmup=60] [measure=300] [lateness=500ms] [heap=512m]
#                            [drain=300] [keep=true] [jvm='-XX:+UseSerialGC'] [report=FILE] [store=influx]
#                            [spread=400ms] [influx_nice=10] [scrape=15] [trace=5] [stall=60@30]
# spread: unit u publishes its readings of second T (stamped T) at T + u × spread / units instead of
# all units at T at once; influx_nice: start the driver's influxd under nice; trace: log the store's
# backlog every N s to backlog.tsv; stall (store=influx): stop influxd (SIGSTOP) for SECONDS from AT
# seconds after publishing starts, then resume it.
# Needs the `mosquitto` binary (Debian package mosquitto) and the JDK's jstat on the PATH; store=influx
# also `influxd` (Debian package influxdb, 1.x).
set -eu

jar=deploy/target/steamtally.jar
classes=deploy/target/test-classes
if [ ! -f "$jar" ] || [ ! -f "$classes/org/steamtally/deploy/bench/FleetLoadDriver.class" ]; then
    echo "no $jar or driver classes; build them first with: mvn -B -q package -DskipTests" >&2
    exit 2
fi
exec java -Xmx256m -cp "$classes:$jar" org.steamtally.deploy.bench.FleetLoadDriver "$@"
