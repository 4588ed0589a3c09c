#include "reportexport.h"

#include "reportpdf.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/risk.h"

namespace tailwise::ui {

ReportData computeReportData(WorkbookContents contents)
{
    ReportData data;
    data.contents = std::move(contents);
    const WorkbookContents &c = data.contents;
    data.report = computeRisk(c.prices, c.holdings, c.assumptions);
    if (!data.report)
        return data;
    if (c.backtest && !c.backtest->models.empty()) {
        report::BacktestPart part;
        part.testSize = c.backtest->testSize;
        for (std::size_t i = 0; i < c.backtest->models.size(); ++i) {
            BacktestRequest request{c.prices, c.holdings, c.assumptions};
            request.assumptions.window = c.backtest->window;
            request.assumptions.model = c.backtest->models[i];
            request.assumptions.horizonDays = 1; // a backtest of one-day VaR, as the window runs it
            if (i == 0)
                part.main = runBacktest(request);
            else
                part.others.emplace_back(c.backtest->models[i], runBacktest(request));
        }
        data.backtest = std::move(part);
    }
    data.models = compareModels(c.prices, c.holdings, c.assumptions);
    return data;
}

Result<int> writeReport(const ReportData &data, const QString &workbookName, const QString &pdfPath, QDate date)
{
    report::ReportInputs in;
    in.contents = &data.contents;
    in.workbookName = workbookName;
    in.date = date;
    in.report = data.report;
    in.backtest = data.backtest;
    in.models = data.models;
    return report::writePdf(report::buildReport(in), pdfPath);
}

} // namespace tailwise::ui
