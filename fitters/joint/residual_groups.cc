#include "fitters/joint/residual_groups.h"

namespace coilspin::joint {
namespace {

ResidualGroup Samples(std::size_t summary, int group, const char* channel, const char* unit,
                      const std::vector<double>* logged, std::size_t first_sample, double sign) {
  ResidualGroup g{summary, group, channel, unit, true, {}, 0, 1.0, {}, {}};
  g.logged = logged;
  g.first_sample = first_sample;
  g.sign = sign;
  return g;
}

// A group of plateau means: each plateau's settled span and the mean that `mean_of` picks.
template <class Plateau, class MeanOf>
ResidualGroup Plateaus(std::size_t summary, int group, const char* channel, const char* unit,
                       const std::vector<Plateau>& plateaus, MeanOf mean_of) {
  ResidualGroup g{summary, group, channel, unit, false, nullptr, 0, 1.0, {}, {}};
  for (const Plateau& p : plateaus) {
    g.spans.push_back({p.begin, p.end});
    g.means.push_back(mean_of(p));
  }
  return g;
}

}  // namespace

std::vector<ResidualGroup> ResidualGroups(const locked_rotor::LockedRotorPlan& lr, const no_load::NoLoadPlan& nl,
                                          const spin_down::SpinDownPlan& sd, const step::StepTestPlan& st) {
  std::vector<ResidualGroup> groups;
  for (std::size_t k = 0; k < lr.plateau_logs.size(); ++k) {
    const auto& pl = lr.plateau_logs[k];
    groups.push_back(Plateaus(lr.summary_index[k], pl.voltage_group, "voltage", "V", pl.plateaus,
                              [](const locked_rotor::LockedPlateau& p) { return p.mean_voltage_V; }));
    groups.push_back(Plateaus(lr.summary_index[k], pl.torque_group, "torque", "N*m", pl.plateaus,
                              [](const locked_rotor::LockedPlateau& p) { return p.mean_torque_N_m; }));
  }
  for (std::size_t s = 0; s < lr.step_logs.size(); ++s) {
    const auto& sl = lr.step_logs[s];
    groups.push_back(Samples(lr.summary_index[lr.plateau_logs.size() + s], sl.group, "current", "A",
                             &sl.log->current_A, 0, 1.0));
  }
  for (std::size_t k = 0; k < nl.logs.size(); ++k) {
    const auto& l = nl.logs[k];
    groups.push_back(Plateaus(nl.summary_index[k], l.voltage_group, "voltage", "V", l.plateaus,
                              [](const no_load::NoLoadPlateau& p) { return p.mean_voltage_V; }));
    groups.push_back(Plateaus(nl.summary_index[k], l.current_group, "current", "A", l.plateaus,
                              [](const no_load::NoLoadPlateau& p) { return p.mean_current_A; }));
  }
  for (const auto& c : sd.logs) {
    const bool speed = c.position_rad.empty();
    groups.push_back(Samples(c.summary, c.motion_group, speed ? "speed" : "position", speed ? "rad/s" : "rad",
                             speed ? &c.log->speed_rad_s : &c.log->position_rad, c.power_off, c.direction));
    groups.push_back(Samples(c.summary, c.voltage_group, "voltage", "V", &c.log->voltage_V, c.power_off, c.direction));
    // The readings at zero current run to the end of the log (spin_down_fit.cc).
    groups.push_back(Samples(c.summary, c.zero_current_group, "current", "A", &c.log->current_A,
                             c.log->current_A.size() - c.zero_current_A.size(), 1.0));
  }
  for (const auto& s : st.logs) {
    groups.push_back(Samples(s.summary, s.current_group, "current", "A", &s.log->current_A, 0, 1.0));
    groups.push_back(Samples(s.summary, s.motion_group, s.fit_position ? "position" : "speed",
                             s.fit_position ? "rad" : "rad/s",
                             s.fit_position ? &s.log->position_rad : &s.log->speed_rad_s, 0, 1.0));
  }
  return groups;
}

std::vector<ModelTrace> ModelTraces(const std::vector<ResidualGroup>& groups,
                                    const std::vector<Eigen::VectorXd>& residuals) {
  std::vector<ModelTrace> traces;
  for (const ResidualGroup& g : groups) {
    if (g.group < 0 || static_cast<std::size_t>(g.group) >= residuals.size()) continue;
    const Eigen::VectorXd& r = residuals[static_cast<std::size_t>(g.group)];
    ModelTrace t;
    t.test = g.summary;
    t.channel = g.channel;
    t.unit = g.unit;
    t.plateau_means = !g.sample_by_sample;
    t.first_sample = g.first_sample;
    t.spans = g.spans;
    const std::size_t n = static_cast<std::size_t>(r.size());
    if (g.sample_by_sample && (g.logged == nullptr || g.first_sample + n > g.logged->size())) continue;
    if (!g.sample_by_sample && g.means.size() != n) continue;
    for (std::size_t k = 0; k < n; ++k) {
      const double rk = r(static_cast<Eigen::Index>(k));
      if (g.sample_by_sample) {
        t.model.push_back((*g.logged)[g.first_sample + k] - g.sign * rk);  // model = y − s·r
        t.residual.push_back(g.sign * rk);
      } else {
        t.model.push_back(g.means[k] - rk);  // model = ȳ − r
        t.residual.push_back(rk);
      }
    }
    traces.push_back(std::move(t));
  }
  return traces;
}

}  // namespace coilspin::joint
