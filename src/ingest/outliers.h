#pragma once
// Isolated bad readings set aside before anything else looks at a log.
//
// Real loggers drop samples: a tachometer reads 0 for one sample, a current
// probe picks up a spike when a relay switches, a serial link garbles a value.
// One such reading in a thousand moves a least-squares fit by far more than
// its noise, and, worse, the statistics behind the intervals (the noise σ and
// the residuals' autocorrelation) and the segmentation (noise floors, the
// power-off instant) are built on the data: ten dropouts in a 30 000-sample
// coast pulled its measured lag-1 autocorrelation from 0.998 to 0.29.
//
// Detection (a Hampel-type test, Hampel, J. Amer. Statist. Assoc. 69, 1974 —
// from memory, made one-sided per neighbourhood). For reading x_k with w
// neighbours on each side,
//     d_k = x_k − median(x_{k−w} … x_{k+w} without x_k),
//     d_L = x_k − median(x_{k−w} … x_{k−1}),   d_R = x_k − median(x_{k+1} … x_{k+w}),
// and the scale S = 1.4826·MAD(d) (the normal-consistent median absolute
// deviation) over the block of kScaleBlock samples around k and the blocks either
// side — local, because a channel's noise changes along a log (commutation ripple
// rides on a coast's back-EMF, not on the supply-held run before it) — floored at
// the channel's reading step. x_k is
// an outlier when |d_k| > kOutlierScales·S and x_k departs from BOTH sides,
// in the same direction, by more than half that, and by more than the two
// sides' medians differ from each other: a lone spike does, the first sample
// after a step edge agrees with the side it belongs to, and a sample on a ramp
// departs from its two sides in opposite directions. Near a level change of
// any channel (medians of the kEdgeNeighbours readings either side further
// apart than that channel's limit:
// a supply step, power off) nothing is flagged in any channel: the current's
// one-sample inrush peak at a voltage step, or the terminal voltage's peak
// before the supply's resistance pulls it down, is the motor's answer, not a
// bad reading (both were flagged, and moved L by 1 %, before this rule). Runs
// of up to w − 1 bad readings are caught (the medians still see a majority of
// good ones).
//
// What is done with them. An outlier is replaced by the straight line between
// the nearest good readings on either side (so a model driven by a logged
// input, the step fit's voltage, stays continuous), and every one is recorded
// with its file line: the result lists them per test and channel, never
// silently. Position (encoder counts are whole numbers, not noisy readings),
// time and temperature are not examined.
//
// When it breaks. A burst longer than w − 1 samples is a feature, not an
// outlier; a channel whose noise is mostly larger spikes has a large S and
// keeps them; a genuine one-sample event (an inductive kick at switch-off) is
// set aside like a spike, which is what the models want anyway.

#include <cstddef>
#include <vector>

#include "src/ingest/bench_log.h"

namespace coilspin {

// Neighbours on each side (w): runs of up to 2 bad readings are found.
inline constexpr std::size_t kOutlierNeighbours = 3;

// The blocks over which the scale S is taken: long enough for a median of |d| to be
// steady (its relative standard error ≈ 1.2/√64 ≈ 15 %), short beside a log (common practice).
inline constexpr std::size_t kScaleBlock = 64;

// Level changes (edges) are judged on the medians of this many readings either
// side: a run of up to w − 1 bad readings is a minority there, so a dropout is
// not mistaken for an edge.
inline constexpr std::size_t kEdgeNeighbours = 2 * kOutlierNeighbours + 1;

// |d| beyond 8 scales: for Gaussian noise d has about 1.12 σ (a sample less a
// median of six), so a clean channel trips this with a chance of about 10⁻¹⁵
// per sample (normal tail), while a dropout of a reading sits tens or
// thousands of scales away (common practice for "far from everything else").
inline constexpr double kOutlierScales = 8.0;

// The row indices (0-based) of the isolated outliers of one channel; empty
// for channels shorter than 2w + 1 samples.
std::vector<std::size_t> FindIsolatedOutliers(const std::vector<double>& channel);

// Finds and repairs the outliers of the log's voltage, current, speed and
// torque channels, recording them in log->set_aside.
void SetAsideOutliers(BenchLog* log);

}  // namespace coilspin
