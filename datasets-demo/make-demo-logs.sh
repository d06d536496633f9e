#!/usr/bin/env bash
# Rewrites the demo logs from the invented parameters in README.md.
# Usage: datasets-demo/make-demo-logs.sh build/coilspin
set -euo pipefail
coilspin=${1:-build/coilspin}
here=$(cd "$(dirname "$0")" && pwd)
motor="--resistance 1.35 --inductance 0.82e-3 --brush-drop 0.9 --resistance-temperature 20 --temperature 23"
mechanics="--back-emf-constant 0.021 --inertia 3.2e-5 --viscous-friction 1.1e-5 --coulomb-friction 4.5e-3"
# Logger at 1 kHz with a thermocouple on the case; the winding warms 0.3 K per level.
"$coilspin" simulate locked-rotor --out "$here/locked-rotor-plateaus.csv" $motor \
  --levels 2,3,4,5,6,-2.5,-4 --hold 0.4 --sample-period 1e-3 \
  --voltage-noise 0.003 --current-noise 0.004 --voltage-lsb 0.005 --current-lsb 0.0025 \
  --heating-per-plateau 0.3 --log-temperature --seed 7
# Scope at 200 kS/s, 8-bit channels, bench supply with 0.15 ohm of internal resistance and leads.
"$coilspin" simulate locked-rotor --out "$here/locked-rotor-step.csv" $motor \
  --step 0:4 --before 0.5e-3 --after 6e-3 --sample-period 5e-6 --supply-resistance 0.15 \
  --voltage-noise 0.02 --current-noise 0.012 --voltage-lsb 0.02 --current-lsb 0.012 \
  --time-unit ms --voltage-unit mV --header current=I_shunt --seed 8
# Free shaft, hand-held tachometer logged in rpm under its own column name.
"$coilspin" simulate no-load --out "$here/no-load.csv" $motor $mechanics \
  --levels 2,3,4,5,6 --hold 1.5 --voltage-noise 0.003 --current-noise 0.002 --speed-noise 0.3 \
  --speed-unit rpm --header "speed=Tach (RPM)" --seed 9
# Run up at 6 V, then the supply is unplugged; a 500-count encoder and the open terminals are logged.
"$coilspin" simulate spin-down --out "$here/spin-down.csv" $motor $mechanics \
  --supply 6 --cpr 500 --no-coast-current --voltage-noise 0.003 --seed 10
# Free-shaft voltage step, 0 -> 6 V from rest through the bench supply and leads (0.1 ohm), clamped
# body, free shaft; a fast logger at 40 kS/s (about 22 samples per electrical time constant) and
# the 500-count encoder; 5 ms before the step, 0.4 s (about 4 mechanical time constants) after.
"$coilspin" simulate step --out "$here/step.csv" $motor $mechanics \
  --step 0:6 --before 5e-3 --after 0.4 --sample-period 25e-6 --supply-resistance 0.1 --cpr 500 \
  --voltage-noise 0.003 --current-noise 0.004 --voltage-lsb 0.005 --current-lsb 0.0025 --seed 11
