#include "reportexport.h"

#include "document/backtestrequest.h"
#include "export/captions.h"
#include "export/chartrender.h"
#include "export/reportpdf.h"
#include "export/reportsections.h"

namespace tailwise::ui {

namespace {

// The charts are laid out as if for a page wider than the 170 mm text width (A4 less 20 mm
// margins, reportpdf.h) and drawn scaled into it: their labels then come out at about 8 pt on
// paper, the size of the report's tables, with room between them (printLabelPoints in
// chartrender.h). The backtest's legend of three long entries needs the widest.
double layoutWidthMm(ChartKind kind)
{
    return kind == ChartKind::Backtest ? 250.0 : 210.0;
}

// Height over width of each chart on the page.
double aspectOf(ChartKind kind)
{
    switch (kind) {
    case ChartKind::Tradeoff: return 0.62;
    case ChartKind::Contributions: return 0.56;
    case ChartKind::LossTail: return 0.52;
    case ChartKind::Backtest: return 0.48;
    case ChartKind::Models: return 0.45;
    }
    return 0.5;
}

report::ChartFigure figureFor(ChartKind kind, const WorkbookResults &results)
{
    report::ChartFigure figure;
    figure.aspect = aspectOf(kind);
    if (!chartUnavailableReason(kind, results).isEmpty())
        return figure; // no picture; the section's words and tables remain
    ChartPrintOptions options;
    options.sizeMm = QSizeF(layoutWidthMm(kind), layoutWidthMm(kind) * figure.aspect);
    figure.paint = [kind, &results, options](QPainter &painter, const QRectF &target) {
        paintChart(painter, target, kind, results, options);
    };
    figure.caption = captionFor(kind, results);
    return figure;
}

// A part's problem sentence (WorkbookResults) as the error the report's section shows.
Error problem(ErrorKind kind, const QString &sentence)
{
    Error e;
    e.kind = kind;
    e.message = sentence.toStdString();
    return e;
}

} // namespace

ReportData computeReportData(WorkbookContents contents)
{
    ReportData data;
    data.contents = std::move(contents);
    data.results = computeWorkbookResults(data.contents);
    if (data.results && data.contents.backtest) {
        const BacktestSettings &settings = *data.contents.backtest;
        for (std::size_t i = 1; i < settings.models.size(); ++i)
            data.otherBacktests.emplace_back(settings.models[i],
                                             runBacktest(backtestRequestFor(data.contents, settings, settings.models[i])));
    }
    return data;
}

namespace {

report::Document reportDocument(const ReportData &data, const QString &workbookName, QDate date)
{
    report::ReportInputs in;
    in.contents = &data.contents;
    in.workbookName = workbookName;
    in.date = date;
    if (!data.results) {
        in.report = data.results.error();
        return report::buildReport(in);
    }
    const WorkbookResults &results = data.results.value();
    in.report = results.report;
    // The backtest is reported when the workbook sets one (its settings are part of the analysis).
    if (data.contents.backtest) {
        report::BacktestPart part;
        part.testSize = results.backtestSettings.testSize;
        if (results.backtest)
            part.main = *results.backtest;
        else
            part.main = problem(ErrorKind::InsufficientData, results.backtestProblem);
        part.others = data.otherBacktests;
        in.backtest = std::move(part);
    }
    if (results.models)
        in.models = Result<std::vector<ModelRow>>(*results.models);
    else
        in.models = Result<std::vector<ModelRow>>(problem(ErrorKind::Numerical, results.modelsProblem));
    in.charts.lossTail = figureFor(ChartKind::LossTail, results);
    in.charts.tradeoff = figureFor(ChartKind::Tradeoff, results);
    in.charts.contributions = figureFor(ChartKind::Contributions, results);
    in.charts.backtest = figureFor(ChartKind::Backtest, results);
    in.charts.models = figureFor(ChartKind::Models, results);
    return report::buildReport(in);
}

} // namespace

Result<int> writeReport(const ReportData &data, const QString &workbookName, const QString &pdfPath, QDate date)
{
    return report::writePdf(reportDocument(data, workbookName, date), pdfPath);
}

int writeReport(const ReportData &data, const QString &workbookName, QIODevice &device, QDate date)
{
    return report::writePdf(reportDocument(data, workbookName, date), device);
}

} // namespace tailwise::ui
