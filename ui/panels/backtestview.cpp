#include "panels/backtestview.h"

#include "text/assumptionlabels.h"
#include "text/backtestwords.h"

#include "charts/backtestchart.h"
#include "charts/chartstyle.h"
#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDate>
#include <QDoubleSpinBox>
#include <QGridLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLocale>
#include <QProgressBar>
#include <QPushButton>
#include <QScrollArea>
#include <QSignalBlocker>
#include <QSpinBox>
#include <QSplitter>
#include <QStackedWidget>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {

using namespace backtestwords;

QString number(double value, int decimals)
{
    if (!std::isfinite(value))
        return QStringLiteral("–");
    return QLocale().toString(value, 'f', decimals);
}

QString dateText(Date date)
{
    return QLocale().toString(QDate(1970, 1, 1).addDays(date.serial), QLocale::ShortFormat);
}

// Light fills with dark text: the zone's word carries the meaning, the colour only repeats it.
QString zoneStyle(Zone zone)
{
    const char *fill = "#dcebd5", *edge = "#5b8a4a";
    if (zone == Zone::Yellow) {
        fill = "#f5e6a6";
        edge = "#a8891f";
    } else if (zone == Zone::Red) {
        fill = "#f1c6bc";
        edge = "#a3402b";
    }
    return QStringLiteral("QLabel { background: %1; border: 2px solid %2; border-radius: 4px; color: #1d242b; padding: 6px; }")
        .arg(QLatin1String(fill), QLatin1String(edge));
}

QTableWidgetItem *cell(const QString &text, Qt::Alignment align = Qt::AlignRight | Qt::AlignVCenter)
{
    auto *item = new QTableWidgetItem(text);
    item->setTextAlignment(align);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
    return item;
}

QTableWidget *makeTable(const QStringList &headers, QWidget *parent)
{
    auto *t = new QTableWidget(0, static_cast<int>(headers.size()), parent);
    t->setHorizontalHeaderLabels(headers);
    t->verticalHeader()->setVisible(false);
    t->setEditTriggers(QAbstractItemView::NoEditTriggers);
    t->setSelectionBehavior(QAbstractItemView::SelectRows);
    t->setAlternatingRowColors(true);
    t->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    t->horizontalHeader()->setStretchLastSection(true);
    t->verticalHeader()->setDefaultSectionSize(t->fontMetrics().height() + 6);
    return t;
}

} // namespace

QString BacktestView::modelTitle(RiskModel model)
{
    return modelLabel(model); // the one list of model names, assumptionlabels.h
}

BacktestView::BacktestView(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    setObjectName(QStringLiteral("backtestView"));

    // --- Settings and status ---
    m_window = new QSpinBox(this);
    m_window->setObjectName(QStringLiteral("backtestWindow"));
    m_window->setRange(2, 100000);
    m_window->setSingleStep(10);
    m_window->setKeyboardTracking(false);
    m_window->setSuffix(tr(" returns"));
    m_window->setToolTip(tr("Each day's VaR is forecast from this many daily returns before it; the window rolls "
                            "forward one day at a time."));
    m_testSize = new QDoubleSpinBox(this);
    m_testSize->setObjectName(QStringLiteral("backtestTestSize"));
    m_testSize->setRange(0.1, 50.0);
    m_testSize->setDecimals(1);
    m_testSize->setSingleStep(1.0);
    m_testSize->setKeyboardTracking(false);
    m_testSize->setSuffix(QStringLiteral("%"));
    m_testSize->setToolTip(tr("A test rejects the model when its p-value is below this size (5% is usual)."));
    m_model = new QComboBox(this);
    m_model->setObjectName(QStringLiteral("backtestModel"));
    for (const RiskModel m : backtestModels())
        m_model->addItem(modelTitle(m), static_cast<int>(m));
    m_model->setToolTip(tr("The model whose forecasts are drawn and listed. Confidence, returns, estimator and mean "
                           "are the workbook's assumptions."));
    m_compare = new QCheckBox(tr("Compare all models"), this);
    m_compare->setObjectName(QStringLiteral("backtestCompare"));
    m_compare->setToolTip(tr("Backtest every model the backtest runs and show them side by side."));

    m_status = new QLabel(this);
    m_progress = new QProgressBar(this);
    m_progress->setRange(0, 100);
    m_progress->setMaximumWidth(160);
    m_progress->setTextVisible(true);
    m_stop = new QPushButton(tr("Stop"), this);
    m_stop->setToolTip(tr("Stop the running backtest. Nothing of it is shown."));
    m_again = new QPushButton(tr("Run again"), this);

    auto *settings = new QHBoxLayout;
    settings->addWidget(new QLabel(tr("Rolling window"), this));
    settings->addWidget(m_window);
    settings->addSpacing(12);
    settings->addWidget(new QLabel(tr("Test size"), this));
    settings->addWidget(m_testSize);
    settings->addSpacing(12);
    settings->addWidget(new QLabel(tr("Model"), this));
    settings->addWidget(m_model);
    settings->addWidget(m_compare);
    settings->addStretch();
    settings->addWidget(m_status);
    settings->addWidget(m_progress);
    settings->addWidget(m_stop);
    settings->addWidget(m_again);

    // --- Results ---
    m_message = new QLabel(this);
    m_message->setAlignment(Qt::AlignCenter);
    m_message->setWordWrap(true);

    auto *results = new QWidget(this);
    m_zone = new QLabel(results);
    m_zone->setObjectName(QStringLiteral("backtestZone"));
    m_zone->setWordWrap(true);
    m_zone->setTextFormat(Qt::RichText);
    m_verdict = new QLabel(results);
    m_verdict->setObjectName(QStringLiteral("backtestVerdict"));
    m_verdict->setWordWrap(true);
    m_verdict->setTextFormat(Qt::RichText);
    m_chart = new BacktestChart(results);

    auto *testsBox = new QGroupBox(tr("Tests"), results);
    m_tests = new QLabel(testsBox);
    m_tests->setTextFormat(Qt::RichText);
    m_tests->setWordWrap(true);
    m_tests->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    m_tests->setTextInteractionFlags(Qt::TextSelectableByMouse);
    auto *testsLayout = new QVBoxLayout(testsBox);
    testsLayout->addWidget(m_tests);

    m_exceptionsBox = new QGroupBox(tr("Exceptions"), results);
    m_exceptions = makeTable({tr("Date"), tr("P&L"), tr("VaR"), tr("Beyond VaR")}, m_exceptionsBox);
    m_exceptions->setAccessibleName(tr("Backtest exceptions"));
    m_exceptions->setToolTip(tr("Each day whose loss was greater than its VaR forecast, and by how much."));
    auto *exceptionsLayout = new QVBoxLayout(m_exceptionsBox);
    exceptionsLayout->addWidget(m_exceptions);

    m_comparisonBox = new QGroupBox(tr("Models side by side"), results);
    m_comparison = makeTable({tr("Model"), tr("Exceptions"), tr("Kupiec p"), tr("Independence p"), tr("Coverage p"),
                              tr("Zone"), tr("Verdict")},
                             m_comparisonBox);
    m_comparison->setAccessibleName(tr("Backtest models"));
    m_comparison->setToolTip(tr("Every model backtested over the same days at the same window, confidence and test size."));
    // Room for the four models without scrolling.
    m_comparison->setMinimumHeight((m_comparison->fontMetrics().height() + 6) * 6 + 4);
    auto *comparisonLayout = new QVBoxLayout(m_comparisonBox);
    comparisonLayout->addWidget(m_comparison);

    auto *lower = new QWidget(results);
    auto *lowerLayout = new QHBoxLayout(lower);
    lowerLayout->setContentsMargins(0, 0, 0, 0);
    // The tests and the models side by side in one column (both read across), the list of
    // exceptions beside them.
    auto *left = new QVBoxLayout;
    left->addWidget(testsBox, 0);
    left->addWidget(m_comparisonBox, 1);
    lowerLayout->addLayout(left, 3);
    lowerLayout->addWidget(m_exceptionsBox, 2);

    auto *split = new QSplitter(Qt::Vertical, results);
    split->addWidget(m_chart);
    split->addWidget(lower);
    split->setStretchFactor(0, 1);
    split->setStretchFactor(1, 1);
    split->setChildrenCollapsible(false);
    // A chart tall enough to read; when the tab is shorter than chart and figures together, the
    // details scroll (the zone and the verdict above stay in view).
    m_chart->setMinimumHeight(260);
    auto *details = new QWidget(results);
    auto *detailsLayout = new QVBoxLayout(details);
    detailsLayout->setContentsMargins(0, 0, 0, 0);
    detailsLayout->addWidget(split, 1);
    auto *scroll = new QScrollArea(results);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    scroll->setWidget(details);

    m_warnings = new QLabel(results);
    m_warnings->setWordWrap(true);
    m_warnings->setFont(chartstyle::noteFont());

    auto *resultsLayout = new QVBoxLayout(results);
    resultsLayout->setContentsMargins(0, 0, 0, 0);
    auto *lines = new QHBoxLayout;
    lines->addWidget(m_zone, 1);
    lines->addWidget(m_verdict, 1);
    resultsLayout->addLayout(lines);
    resultsLayout->addWidget(scroll, 1);
    detailsLayout->addWidget(m_warnings);

    m_stack = new QStackedWidget(this);
    m_stack->addWidget(m_message);
    m_stack->addWidget(results);

    auto *cautions = new QLabel(caution(), this);
    cautions->setWordWrap(true);
    cautions->setFont(chartstyle::noteFont());

    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addLayout(settings);
    layout->addWidget(m_stack, 1);
    layout->addWidget(cautions);

    // --- Edits become undo commands; refresh from the document and the runner ---
    connect(m_window, &QSpinBox::valueChanged, this, [this](int w) {
        BacktestSettings s = m_workbook.backtestSettings();
        s.window = w;
        editSettings(s, tr("Set backtest window to %1 returns").arg(QLocale().toString(w)),
                     static_cast<int>(edit::MergeKey::BacktestWindow));
    });
    connect(m_testSize, &QDoubleSpinBox::valueChanged, this, [this](double percent) {
        BacktestSettings s = m_workbook.backtestSettings();
        s.testSize = percent / 100.0;
        editSettings(s, tr("Set backtest test size to %1").arg(sizeText(s.testSize)),
                     static_cast<int>(edit::MergeKey::BacktestTestSize));
    });
    auto modelsEdited = [this] {
        BacktestSettings s = m_workbook.backtestSettings();
        const auto chosen = static_cast<RiskModel>(m_model->currentData().toInt());
        s.models = {chosen};
        if (m_compare->isChecked())
            for (const RiskModel m : backtestModels())
                if (m != chosen)
                    s.models.push_back(m);
        editSettings(s, m_compare->isChecked() ? tr("Backtest %1 and compare the models").arg(modelTitle(chosen))
                                               : tr("Backtest %1").arg(modelTitle(chosen)),
                     static_cast<int>(edit::MergeKey::None));
    };
    connect(m_model, &QComboBox::currentIndexChanged, this, modelsEdited);
    connect(m_compare, &QCheckBox::toggled, this, modelsEdited);
    ResultsStore &store = workbook.results();
    connect(m_stop, &QPushButton::clicked, this, [this] {
        m_stopped = true;
        m_workbook.results().setWatched(Part::Backtest, false);
        m_workbook.results().cancel(Part::Backtest);
    });
    connect(m_again, &QPushButton::clicked, this, [this] {
        m_stopped = false;
        m_workbook.results().setWatched(Part::Backtest, isVisible());
        m_workbook.results().request(Part::Backtest);
    });

    connect(&workbook, &Workbook::backtestSettingsChanged, this, &BacktestView::refreshSettings);
    connect(&workbook, &Workbook::contentsReset, this, &BacktestView::refreshSettings);
    connect(&store, &ResultsStore::backtestChanged, this, &BacktestView::refreshResults);
    // A stopped run waits for "Run again" or a change of what it computes from.
    auto inputChanged = [this] {
        if (!m_stopped)
            return;
        m_stopped = false;
        if (isVisible())
            m_workbook.results().setWatched(Part::Backtest, true);
        refreshResults();
    };
    connect(&workbook, &Workbook::inputsChanged, this, inputChanged);
    connect(&workbook, &Workbook::backtestSettingsChanged, this, inputChanged);
    connect(&workbook, &Workbook::currencyChanged, this, &BacktestView::refreshResults);
    connect(&store, &ResultsStore::statusChanged, this, [this](Part part) {
        if (part != Part::Backtest)
            return;
        if (m_workbook.results().isRunning(Part::Backtest))
            m_stopped = false;
        refreshResults();
    });
    connect(&store, &ResultsStore::progress, this, [this](Part part, double f) {
        if (part == Part::Backtest)
            m_progress->setValue(static_cast<int>(std::lround(f * 100.0)));
    });

    refreshSettings();
    refreshResults();
}

void BacktestView::editSettings(const BacktestSettings &settings, const QString &text, int mergeKey)
{
    edit::setBacktestSettings(m_workbook, settings, text, static_cast<edit::MergeKey>(mergeKey));
}

void BacktestView::refreshSettings()
{
    const BacktestSettings s = m_workbook.backtestSettings();
    const QSignalBlocker b1(m_window), b2(m_testSize), b3(m_model), b4(m_compare);
    m_window->setValue(s.window);
    m_testSize->setValue(s.testSize * 100.0);
    if (!s.models.empty())
        m_model->setCurrentIndex(std::max(0, m_model->findData(static_cast<int>(s.models.front()))));
    m_compare->setChecked(s.models.size() > 1);
}

void BacktestView::showEvent(QShowEvent *event)
{
    QWidget::showEvent(event);
    // Computed while it is in view; a hidden tab costs nothing per edit.
    m_workbook.results().setWatched(Part::Backtest, !m_stopped);
}

void BacktestView::hideEvent(QHideEvent *event)
{
    QWidget::hideEvent(event);
    m_workbook.results().setWatched(Part::Backtest, false);
}

void BacktestView::refreshStatus()
{
    const PartStatus &status = m_workbook.results().status(Part::Backtest);
    const bool running = status.state == PartState::Running;
    const bool stopped = m_stopped && status.state == PartState::OutOfDate;
    m_progress->setVisible(running);
    m_stop->setVisible(running);
    m_again->setVisible(stopped);
    if (running)
        m_progress->setValue(static_cast<int>(std::lround(status.progress * 100.0)));
    m_status->setText(running ? tr("Backtesting…") : stopped ? tr("Stopped.") : QString());
}

void BacktestView::refreshResults()
{
    refreshStatus();
    const ResultsStore &store = m_workbook.results();
    const BacktestRun &run = store.backtest();
    const PartState state = store.state(Part::Backtest);
    auto showMessage = [this](const QString &text) {
        m_message->setText(text);
        m_stack->setCurrentWidget(m_message);
    };
    if (state == PartState::Failed && run.problem)
        return showMessage(tr("No backtest: %1.").arg(QString::fromStdString(run.problem->message)));
    const bool current = state == PartState::Running || state == PartState::Ready;
    if (!current || run.models.empty() || !run.models.front().result) {
        // Figures of older inputs are never shown as the current ones.
        if (m_stopped && state == PartState::OutOfDate)
            return showMessage(tr("The backtest was stopped. Press “Run again” to run it, or change a setting."));
        if (!m_workbook.hasPrices() || m_workbook.holdings().empty())
            return showMessage(tr("The backtest appears here once there is a price history and holdings."));
        const BacktestSettings settings = m_workbook.backtestSettings();
        return showMessage(tr("Backtesting the %1 model over the price history…")
                               .arg(settings.models.empty() ? QString() : modelTitle(settings.models.front())));
    }
    const auto &main = *run.models.front().result;
    if (!main)
        return showMessage(tr("The backtest could not run: %1").arg(QString::fromStdString(main.error().message)));
    showResult(main.value());
    fillComparison();
    m_stack->setCurrentIndex(1);
}

void BacktestView::showResult(const BacktestResult &r)
{
    const BacktestRun &run = m_workbook.results().backtest();
    const double size = run.settings.testSize;
    const BacktestVerdict v = verdictAt(r, size);
    const QString model = modelTitle(r.assumptions.model);
    const QLocale locale;

    m_zone->setStyleSheet(zoneStyle(r.zone.zone));
    m_zone->setText(tr("<b>%1 zone</b> — %2 exceptions in %3 days, %4 expected at %5: %6.")
                        .arg(zoneName(r.zone.zone), locale.toString(r.exceptions), locale.toString(r.observations),
                             number(r.expectedExceptions, 1), chartstyle::confidenceText(r.assumptions.confidence),
                             zoneMeaning(r.zone.zone)));
    QStringList rejected;
    if (v.kupiecRejected)
        rejected << tr("Kupiec (%1)").arg(v.tooManyExceptions ? tr("too many exceptions") : tr("too few exceptions"));
    if (v.independenceRejected)
        rejected << tr("independence (%1)").arg(v.clustering ? tr("exceptions cluster") : tr("too evenly spread"));
    if (v.coverageRejected)
        rejected << tr("conditional coverage");
    m_verdict->setStyleSheet(QStringLiteral("QLabel { border: 1px solid #9aa3ab; border-radius: 4px; padding: 6px; }"));
    m_verdict->setText((v.passed ? tr("<b>Passed</b> at the %1 test size: no test rejects the %2 model.").arg(sizeText(size), model)
                                 : tr("<b>Not passed</b> at the %1 test size: rejected by %2.")
                                       .arg(sizeText(size), rejected.join(tr(", "))))
                       + QStringLiteral("<br><small>")
                       + tr("The zone counts the exceptions alone; the tests weigh them, and their timing, against chance.")
                       + QStringLiteral("</small>"));

    m_chart->setData(buildBacktestChartData(r, model, m_workbook.currency()));

    const auto &c = r.christoffersen;
    const QString row = QStringLiteral("<tr><td>%1</td><td align=right>&nbsp;%2&nbsp;</td><td>%3</td></tr>");
    QString tests = QStringLiteral("<table cellspacing=2>");
    tests += row.arg(tr("Observations"), locale.toString(r.observations), tr("days tested, window %1 returns").arg(locale.toString(r.window)));
    tests += row.arg(tr("Exceptions"), locale.toString(r.exceptions),
                     tr("expected %1 (%2 of days)").arg(number(r.expectedExceptions, 1), chartstyle::percent(r.tailProbability, 1)));
    tests += row.arg(tr("Kupiec"), tr("p = %1").arg(pValueText(r.kupiec.pValue)),
                     tr("LR %1; %2").arg(number(r.kupiec.lr, 2), kupiecWords(r, v)));
    tests += row.arg(tr("Independence"), tr("p = %1").arg(pValueText(c.independence.pValue)),
                     tr("LR %1; %2").arg(number(c.independence.lr, 2), independenceWords(r, v)));
    tests += row.arg(tr("Coverage"), tr("p = %1").arg(pValueText(c.conditionalCoverage.pValue)),
                     tr("LR %1; %2").arg(number(c.conditionalCoverage.lr, 2), coverageWords(v)));
    tests += row.arg(tr("Transitions"), QString(),
                     tr("n00 %1, n01 %2, n10 %3, n11 %4")
                         .arg(locale.toString(c.transitions.n00), locale.toString(c.transitions.n01),
                              locale.toString(c.transitions.n10), locale.toString(c.transitions.n11)));
    tests += QStringLiteral("</table>");
    m_tests->setText(tests);

    m_exceptionsBox->setTitle(tr("Exceptions (%1)").arg(locale.toString(r.exceptions)));
    m_exceptions->setRowCount(0);
    for (const BacktestDay &d : r.days) {
        if (!d.exception)
            continue;
        const int i = m_exceptions->rowCount();
        m_exceptions->insertRow(i);
        m_exceptions->setItem(i, 0, cell(dateText(d.date), Qt::AlignLeft | Qt::AlignVCenter));
        m_exceptions->setItem(i, 1, cell(chartstyle::signedMoney(d.pnl)));
        m_exceptions->setItem(i, 2, cell(chartstyle::money(d.var)));
        m_exceptions->setItem(i, 3, cell(chartstyle::money(-d.pnl - d.var)));
    }

    QStringList notes;
    for (const auto &w : r.warnings)
        notes << QString::fromStdString(w);
    m_warnings->setText(notes.isEmpty() ? QString() : tr("Note: %1.").arg(notes.join(QStringLiteral("; "))));
    m_warnings->setVisible(!notes.isEmpty());
}

void BacktestView::fillComparison()
{
    const BacktestRun &run = m_workbook.results().backtest();
    m_comparisonBox->setVisible(run.models.size() > 1);
    const auto &main = run.models.front().result;
    m_comparisonBox->setTitle(main && main->ok() ? tr("Models side by side (%1 exceptions expected)")
                                                       .arg(number(main->value().expectedExceptions, 1))
                                                 : tr("Models side by side"));
    m_comparison->setRowCount(static_cast<int>(run.models.size()));
    const QLocale locale;
    for (int i = 0; i < static_cast<int>(run.models.size()); ++i) {
        const BacktestModelRun &m = run.models[static_cast<std::size_t>(i)];
        m_comparison->setItem(i, 0, cell(modelTitle(m.model), Qt::AlignLeft | Qt::AlignVCenter));
        for (int col = 1; col < m_comparison->columnCount(); ++col)
            m_comparison->setItem(i, col, cell(QString()));
        if (!m.result) {
            m_comparison->setItem(i, 1, cell(tr("running…"), Qt::AlignLeft | Qt::AlignVCenter));
            continue;
        }
        if (!*m.result) {
            m_comparison->setItem(i, 6, cell(tr("could not run: %1").arg(QString::fromStdString(m.result->error().message)),
                                             Qt::AlignLeft | Qt::AlignVCenter));
            continue;
        }
        const BacktestResult &r = m.result->value();
        const BacktestVerdict v = verdictAt(r, run.settings.testSize);
        m_comparison->setItem(i, 1, cell(locale.toString(r.exceptions)));
        m_comparison->setItem(i, 2, cell(pValueText(r.kupiec.pValue)));
        m_comparison->setItem(i, 3, cell(pValueText(r.christoffersen.independence.pValue)));
        m_comparison->setItem(i, 4, cell(pValueText(r.christoffersen.conditionalCoverage.pValue)));
        m_comparison->setItem(i, 5, cell(zoneName(r.zone.zone), Qt::AlignLeft | Qt::AlignVCenter));
        m_comparison->setItem(i, 6, cell(v.passed ? tr("passed") : tr("not passed"), Qt::AlignLeft | Qt::AlignVCenter));
    }
}

QString BacktestView::zoneText() const
{
    return m_stack->currentIndex() == 1 ? m_zone->text() : QString();
}

QString BacktestView::verdictText() const
{
    return m_stack->currentIndex() == 1 ? m_verdict->text() : QString();
}

QString BacktestView::messageText() const
{
    return m_stack->currentIndex() == 0 ? m_message->text() : QString();
}

} // namespace tailwise::ui
