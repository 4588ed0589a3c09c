// A RiskReport of the invented sample fund (samples/), for the chart tests.
#pragma once

#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <QtTest>

#include <string>

namespace chartfixture {

inline const tailwise::PriceHistory &samplePrices()
{
    static const tailwise::PriceHistory prices = [] {
        auto p = tailwise::readPriceCsv(std::string(TAILWISE_SOURCE_DIR) + "/samples/prices.csv");
        if (!p)
            qFatal("samples/prices.csv: %s", p.error().message.c_str());
        return p.value();
    }();
    return prices;
}

inline const tailwise::Holdings &sampleHoldings()
{
    static const tailwise::Holdings holdings = [] {
        auto h = tailwise::readHoldingsCsv(std::string(TAILWISE_SOURCE_DIR) + "/samples/holdings.csv", &samplePrices());
        if (!h)
            qFatal("samples/holdings.csv: %s", h.error().message.c_str());
        return h.value();
    }();
    return holdings;
}

inline tailwise::RiskReport sampleReport(tailwise::Assumptions a = {})
{
    auto r = tailwise::computeRisk(samplePrices(), sampleHoldings(), a);
    if (!r)
        qFatal("computeRisk: %s", r.error().message.c_str());
    return r.value();
}

// One position of value V with annual volatility and drift (the CLI's single-position mode).
inline tailwise::RiskReport positionReport(double value, double volatility, double drift, tailwise::Assumptions a = {})
{
    a.mean = tailwise::MeanModel::Sample;
    auto r = tailwise::computeSinglePositionRisk({value, volatility, drift}, a);
    if (!r)
        qFatal("computeSinglePositionRisk: %s", r.error().message.c_str());
    return r.value();
}

} // namespace chartfixture
