// EstimateCache: keeps the last estimation window and moments so that an edit that leaves them
// unchanged (a quantity, a price override, the confidence, the horizon, the model) does not
// re-estimate the covariance. Estimating is the costly step for large books (a k × k covariance
// from n returns, and its eigenvalue repair when singular); everything after it is O(k²).
//
// The cache cannot see whether a price history changed, so the caller passes a revision number
// that it increments whenever it replaces the history (e.g. on import or open); entries from
// another revision never match. The cached figures are exactly those a fresh estimate gives: the
// key holds every input of the estimate (held assets in order, return type, window, estimator,
// λ, mean model). Not thread-safe: one cache per calling thread.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/date.h"
#include "tailwise/estimate.h"

#include <Eigen/Core>

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace tailwise {

struct EstimateKey {
    std::uint64_t pricesRevision = 0;
    std::vector<std::string> assets; // held assets, in holdings order
    ReturnType returns = ReturnType::Simple;
    std::optional<int> window;
    CovarianceEstimator estimator = CovarianceEstimator::Sample;
    double lambda = 0.0;
    MeanModel mean = MeanModel::Zero;

    friend bool operator==(const EstimateKey &, const EstimateKey &) = default;
};

struct EstimateEntry {
    Eigen::MatrixXd heldReturns; // window × held assets
    Date windowFirst;
    Date windowLast;
    Moments moments;
};

class EstimateCache {
public:
    const EstimateEntry *find(const EstimateKey &key) const
    {
        return m_key && *m_key == key ? &m_entry : nullptr;
    }
    void store(EstimateKey key, EstimateEntry entry)
    {
        m_key = std::move(key);
        m_entry = std::move(entry);
    }
    void clear() { m_key.reset(); }
    // Precondition: something was stored.
    const EstimateKey &lastKey() const { return *m_key; }

private:
    std::optional<EstimateKey> m_key;
    EstimateEntry m_entry;
};

} // namespace tailwise
