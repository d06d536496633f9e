#!/usr/bin/env bash
# Rewrites the invented lot of six DR-2 motors (README.md in this folder):
# for each motor its incoming-inspection logs and a session file naming them.
# Usage: datasets-demo/lot/make-lot-logs.sh build/coilspin
set -euo pipefail
coilspin=${1:-build/coilspin}
here=$(cd "$(dirname "$0")" && pwd)
# serial  R at 20 degC [ohm]  L [H]  Vb [V]  Ke [V*s/rad]  J [kg*m^2]  B [N*m*s/rad]  Tc [N*m]
# Motor 0104 has a weak magnet: Ke 14 % below the others.
motors="0101 1.35 0.82e-3 0.90 0.0210 3.20e-5 1.10e-5 4.5e-3
0102 1.33 0.80e-3 0.88 0.0212 3.18e-5 1.05e-5 4.3e-3
0103 1.38 0.84e-3 0.92 0.0209 3.22e-5 1.15e-5 4.7e-3
0104 1.36 0.83e-3 0.90 0.0181 3.21e-5 1.12e-5 4.6e-3
0105 1.34 0.81e-3 0.91 0.0211 3.19e-5 1.08e-5 4.4e-3
0106 1.37 0.82e-3 0.89 0.0208 3.20e-5 1.13e-5 4.6e-3"
seed=100
while read -r serial r l vb ke j b tc; do
  name=motor-$serial
  motor="--resistance $r --inductance $l --brush-drop $vb --resistance-temperature 20 --temperature 23"
  mechanics="--back-emf-constant $ke --inertia $j --viscous-friction $b --coulomb-friction $tc"
  # Shaft clamped: a 500 Hz logger, supply stepped 2, 4, 6, -3 V for 0.2 s each.
  "$coilspin" simulate locked-rotor --out "$here/$name-locked-rotor.csv" $motor \
    --levels 2,4,6,-3 --hold 0.2 --sample-period 2e-3 \
    --voltage-noise 0.003 --current-noise 0.004 --voltage-lsb 0.005 --current-lsb 0.0025 --seed $((seed + 1))
  # Shaft clamped: a scope captures a 0 -> 4 V step at 100 kS/s (about 60 samples per L/R).
  "$coilspin" simulate locked-rotor --out "$here/$name-step-capture.csv" $motor \
    --step 0:4 --before 0.3e-3 --after 4e-3 --sample-period 1e-5 --supply-resistance 0.15 \
    --voltage-noise 0.01 --current-noise 0.006 --voltage-lsb 0.01 --current-lsb 0.006 --seed $((seed + 4))
  # Free shaft at 2, 4, 6 V, a 200 Hz logger and a tachometer in rpm.
  "$coilspin" simulate no-load --out "$here/$name-no-load.csv" $motor $mechanics \
    --levels 2,4,6 --sample-period 5e-3 --voltage-noise 0.003 --current-noise 0.002 --speed-noise 0.3 \
    --speed-unit rpm --seed $((seed + 2))
  # Run up at 6 V, supply unplugged; the open terminals and the tachometer logged.
  "$coilspin" simulate spin-down --out "$here/$name-spin-down.csv" $motor $mechanics \
    --supply 6 --sample-period 5e-3 --no-coast-current --voltage-noise 0.003 --speed-noise 0.3 \
    --seed $((seed + 3))
  cat >"$here/$name.toml" <<SESSION
# Incoming inspection of DR-2 serial $serial (invented lot, see README.md).
[motor]
label = "DR-2 serial $serial"

[bench]
reference_temperature = 25.0   # degC: report R as at 25 degC, as the datasheet states it
winding_temperature = 23.0     # degC, the lab's temperature (no thermocouple on these logs)

[[test]]
kind = "locked-rotor"
file = "$name-locked-rotor.csv"

[[test]]
kind = "locked-rotor"
file = "$name-step-capture.csv"

[[test]]
kind = "no-load"
file = "$name-no-load.csv"

[[test]]
kind = "spin-down"
file = "$name-spin-down.csv"
SESSION
  seed=$((seed + 10))
done <<<"$motors"
