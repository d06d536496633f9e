#include "src/result/parameter_covariance.h"

#include <algorithm>
#include <stdexcept>

namespace coilspin::result {
namespace {

// Where each of the estimate's parameters takes its row from: an index into
// correlation_names, or -1 for a given (constant) one. Parameters outside the
// covariance altogether are left out.
struct Row {
  std::string name;
  int source;  // index into correlation_names, or -1
};

int IndexOf(const std::vector<std::string>& names, const std::string& name) {
  const auto it = std::find(names.begin(), names.end(), name);
  return it == names.end() ? -1 : static_cast<int>(it - names.begin());
}

bool TiedToKe(const QuantityEstimate& q) { return q.key == "torque_constant" && q.basis == kTiedToKeBasis; }
bool Given(const QuantityEstimate& q) { return q.basis == kGivenBasis; }

std::vector<Row> Rows(const MotorEstimate& e) {
  std::vector<Row> rows;
  if (e.correlation_names.empty()) return rows;
  for (const auto& q : e.parameters) {
    const int own = IndexOf(e.correlation_names, q.key);
    if (own >= 0) {
      rows.push_back({q.key, own});
    } else if (TiedToKe(q)) {
      const int ke = IndexOf(e.correlation_names, "back_emf_constant");
      if (ke >= 0) rows.push_back({q.key, ke});
    } else if (Given(q)) {
      rows.push_back({q.key, -1});
    }
  }
  return rows;
}

NamedMatrix Expand(const std::vector<Row>& rows, const std::vector<std::vector<double>>& own) {
  NamedMatrix full;
  for (const auto& r : rows) full.names.push_back(r.name);
  full.matrix.assign(rows.size(), std::vector<double>(rows.size(), 0.0));
  for (std::size_t a = 0; a < rows.size(); ++a)
    for (std::size_t b = 0; b < rows.size(); ++b)
      if (rows[a].source >= 0 && rows[b].source >= 0)
        full.matrix[a][b] = own[static_cast<std::size_t>(rows[a].source)][static_cast<std::size_t>(rows[b].source)];
  return full;
}

// The rows of `full` named in `names`, in that order.
std::vector<std::vector<double>> Restrict(const NamedMatrix& full, const std::vector<std::string>& names,
                                          const char* what) {
  std::vector<int> index;
  for (const auto& n : names) {
    const int k = IndexOf(full.names, n);
    if (k < 0) throw std::invalid_argument(std::string(what) + " has no row for " + n);
    index.push_back(k);
  }
  std::vector<std::vector<double>> m(names.size(), std::vector<double>(names.size(), 0.0));
  for (std::size_t a = 0; a < names.size(); ++a)
    for (std::size_t b = 0; b < names.size(); ++b) {
      const auto& row = full.matrix.at(static_cast<std::size_t>(index[a]));
      m[a][b] = row.at(static_cast<std::size_t>(index[b]));
    }
  return m;
}

}  // namespace

NamedMatrix FullCovariance(const MotorEstimate& e) { return Expand(Rows(e), e.covariance); }

NamedMatrix FullCorrelation(const MotorEstimate& e) {
  std::vector<Row> rows = Rows(e);
  rows.erase(std::remove_if(rows.begin(), rows.end(), [](const Row& r) { return r.source < 0; }), rows.end());
  return Expand(rows, e.correlation);
}

void SetFromFull(const NamedMatrix& covariance, const NamedMatrix& correlation, MotorEstimate* e) {
  for (const auto& name : covariance.names)
    if (!e->Find(name)) throw std::invalid_argument("covariance names " + name + ", which is not among the parameters");
  std::vector<std::string> own;
  for (const auto& name : covariance.names) {
    const QuantityEstimate& q = *e->Find(name);
    if (!TiedToKe(q) && !Given(q)) own.push_back(name);
  }
  e->correlation_names = own;
  e->covariance = Restrict(covariance, own, "covariance");
  e->correlation = Restrict(correlation, own, "correlation");
}

}  // namespace coilspin::result
