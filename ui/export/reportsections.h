// The report's sections, written from core results into a report::Document (reportdocument.h):
// headline figures, the loss tail, what drives the risk, horizon and confidence, the backtest
// (when the workbook sets one), the models compared (when computed), every assumption, and the
// cautions. The text says only what core computed: every figure is a core figure, formatted as the
// window formats it (localnumbers.h), and nothing that is not finite is written (a dash instead).
#pragma once

#include "document/workbookcontents.h"
#include "reportdocument.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"

#include <QDate>
#include <QString>

#include <functional>
#include <optional>
#include <utility>
#include <vector>

namespace tailwise::ui::report {

// A chart drawn into a rectangle of the page, with the words printed under it. An empty painter
// leaves the chart out (its section's tables and words stay).
struct ChartFigure {
    std::function<void(QPainter &, const QRectF &)> paint;
    QString caption;
    double aspect = 0.55;
};

struct ReportCharts {
    ChartFigure lossTail;
    ChartFigure tradeoff;
    ChartFigure contributions;
    ChartFigure backtest;
    ChartFigure models;
};

struct BacktestPart {
    tailwise::Result<tailwise::BacktestResult> main = tailwise::Error{};
    double testSize = 0.05;
    // Further models backtested side by side with `main` (the settings' other models).
    std::vector<std::pair<tailwise::RiskModel, tailwise::Result<tailwise::BacktestResult>>> others;
};

struct ReportInputs {
    const WorkbookContents *contents = nullptr; // required
    QString workbookName;                       // the file's name, for the page headers
    QDate date;                                 // the day the report is made
    tailwise::Result<tailwise::RiskReport> report = tailwise::Error{};
    std::optional<BacktestPart> backtest;        // when the workbook sets a backtest
    std::optional<tailwise::Result<std::vector<tailwise::ModelRow>>> models;
    ReportCharts charts;
};

Document buildReport(const ReportInputs &inputs);

// The sections one by one (buildReport calls them in this order).
void addTitle(Document &doc, const ReportInputs &in);
void addHeadline(Document &doc, const tailwise::RiskReport &report);
void addLossTail(Document &doc, const tailwise::RiskReport &report, const ChartFigure &chart);
void addContributions(Document &doc, const tailwise::RiskReport &report, const ChartFigure &chart);
void addHorizonAndConfidence(Document &doc, const tailwise::RiskReport &report, const ChartFigure &chart);
void addBacktest(Document &doc, const BacktestPart &backtest, const ChartFigure &chart);
void addModelComparison(Document &doc, const tailwise::Result<std::vector<tailwise::ModelRow>> &rows,
                        const tailwise::RiskReport &report, const ChartFigure &chart);
void addAssumptions(Document &doc, const WorkbookContents &contents, const tailwise::RiskReport *report);
void addCautions(Document &doc, bool withBacktest);

// The horizons and confidences of the report's VaR table: the window's quick choices and the
// current setting, each once, in order.
std::vector<int> reportHorizons(const tailwise::Assumptions &a);
std::vector<double> reportConfidences(const tailwise::Assumptions &a);

} // namespace tailwise::ui::report
