#include "src/verify/verification.h"

namespace coilspin::verify {

Verification Verify(const Datasheet& sheet, const std::vector<NamedResult>& results) {
  Verification v;
  v.sheet = sheet;
  v.consistency = CheckSheet(sheet);
  for (const NamedResult& r : results) v.motors.push_back(CheckMotor(sheet, r.estimate, r.name));
  v.lot = SummariseLot(v.motors);
  return v;
}

}  // namespace coilspin::verify
