#pragma once
// A sensor's zero offset: what it reads when the quantity is zero.
//
// Current probes and shunt amplifiers read a few tenths of a per cent of full
// scale at zero current; on a bench that is tens of milliamperes, the same order
// as a small motor's no-load current, so an offset left in the data moves the
// friction from a no-load test by 10 % and the brush drop by as much. The
// measurement model is
//     i_logged = i + i_z
// with i_z one nuisance parameter per session (the logs of one bench come from one
// current sensor). It is estimated where a log shows the current at zero (a
// coast with open terminals, the rest before a step from 0 V) and then corrects
// every log; where no log shows it, it is held at 0 and the parameters that rest
// on the current say so.

namespace coilspin::model {

// The nuisance parameter's name in the joint problem.
inline constexpr const char* kCurrentOffsetKey = "current_offset";

}  // namespace coilspin::model
