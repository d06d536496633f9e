#include "fitters/core/require.h"

#include <cstdio>
#include <cstdlib>

namespace coilspin::core {

void Require(bool condition, std::string_view what) {
  if (condition) return;
  std::fprintf(stderr, "coilspin fitting core: broken precondition: %.*s\n",
               static_cast<int>(what.size()), what.data());
  std::abort();
}

}  // namespace coilspin::core
