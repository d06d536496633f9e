#include "fitters/core/quiet_ceres_log.h"

#include <glog/logging.h>

#include <mutex>

namespace coilspin::core {
namespace {

std::mutex guard_mutex;
int active_guards = 0;
int saved_level = 0;

}  // namespace

QuietCeresLog::QuietCeresLog() {
  const std::lock_guard<std::mutex> lock(guard_mutex);
  if (active_guards++ == 0) {
    saved_level = FLAGS_minloglevel;
    FLAGS_minloglevel = google::GLOG_FATAL;
  }
}

QuietCeresLog::~QuietCeresLog() {
  const std::lock_guard<std::mutex> lock(guard_mutex);
  if (--active_guards == 0) FLAGS_minloglevel = saved_level;
}

}  // namespace coilspin::core
