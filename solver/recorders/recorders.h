/// \file recorders.h
/// \brief Every recorder that runs inside the time loop, for those who use them all (the
/// run folder, the tests): probes, snapshots, power spectra, spectral maps. Each builds,
/// records and lists its own state; io/ writes what they hold.
#pragma once
#include "solver/recorders/power_spectrum.h"
#include "solver/recorders/probe.h"
#include "solver/recorders/sampling.h"
#include "solver/recorders/snapshots.h"
#include "solver/recorders/spectral_map.h"
