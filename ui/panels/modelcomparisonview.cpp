#include "modelcomparisonview.h"

#include "document/resultsstore.h"
#include "document/workbook.h"
#include "text/numbers.h"
#include "models/modelcomparisonmodel.h"

#include "tailwise/comparison.h"

#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QProgressBar>
#include <QTableView>
#include <QToolButton>
#include <QVBoxLayout>

namespace tailwise::ui {

ModelComparisonView::ModelComparisonView(Workbook &workbook, QWidget *parent)
    : QWidget(parent), m_workbook(workbook), m_model(new ModelComparisonModel(this))
{
    auto *intro = new QLabel(tr("The same holdings, window and assumptions under each model. Models disagree most in "
                                "the far tail; none of them is the worst case."),
                             this);
    intro->setWordWrap(true);
    m_table = new QTableView(this);
    m_table->setObjectName(QStringLiteral("modelComparisonTable"));
    m_table->setAccessibleName(tr("Models side by side")); // the sheet's name when the table is exported
    m_table->setModel(m_model);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_table->verticalHeader()->hide();
    m_table->horizontalHeader()->setStretchLastSection(true);
    m_table->setWordWrap(false);
    m_status = new QLabel(this);
    m_status->setWordWrap(true);
    m_progress = new QProgressBar(this);
    m_progress->setRange(0, 100);
    m_progress->setMaximumWidth(160);
    m_stop = new QToolButton(this);
    m_stop->setText(tr("Stop"));
    m_stop->setToolTip(tr("Stop computing the comparison; it starts again when an input changes."));
    auto *statusRow = new QHBoxLayout;
    statusRow->addWidget(m_status, 1);
    statusRow->addWidget(m_progress);
    statusRow->addWidget(m_stop);
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(intro);
    layout->addWidget(m_table, 1);
    layout->addLayout(statusRow);
    m_progress->hide();
    m_stop->hide();

    ResultsStore &store = workbook.results();
    connect(&store, &ResultsStore::comparisonChanged, this, &ModelComparisonView::refresh);
    connect(&store, &ResultsStore::statusChanged, this, [this](Part part) {
        if (part == Part::Comparison)
            refreshStatus();
    });
    connect(&store, &ResultsStore::progress, this, [this](Part part, double f) {
        if (part == Part::Comparison)
            m_progress->setValue(static_cast<int>(f * 100.0));
    });
    connect(m_stop, &QToolButton::clicked, this, &ModelComparisonView::stop);
    // A stopped comparison starts again when an input changes.
    connect(&workbook, &Workbook::inputsChanged, this, [this] {
        if (!m_stopped)
            return;
        m_stopped = false;
        if (isVisible())
            m_workbook.results().setWatched(Part::Comparison, true);
    });
    refresh();
}

bool ModelComparisonView::isComputing() const
{
    return m_workbook.results().isRunning(Part::Comparison);
}

bool ModelComparisonView::isCurrent() const
{
    return m_workbook.results().isReady(Part::Comparison);
}

void ModelComparisonView::showEvent(QShowEvent *event)
{
    QWidget::showEvent(event);
    // Computed while it is in view; a hidden tab costs nothing per edit.
    m_workbook.results().setWatched(Part::Comparison, !m_stopped);
}

void ModelComparisonView::hideEvent(QHideEvent *event)
{
    QWidget::hideEvent(event);
    m_workbook.results().setWatched(Part::Comparison, false);
}

void ModelComparisonView::stop()
{
    m_stopped = true;
    m_workbook.results().setWatched(Part::Comparison, false);
    m_workbook.results().cancel(Part::Comparison);
    m_status->setText(tr("Stopped: the table shows the last complete comparison, if any."));
}

void ModelComparisonView::refreshStatus()
{
    const ResultsStore &store = m_workbook.results();
    const bool running = store.isRunning(Part::Comparison);
    m_progress->setVisible(running);
    m_stop->setVisible(running);
    if (running) {
        m_stopped = false;
        m_progress->setValue(static_cast<int>(store.status(Part::Comparison).progress * 100.0));
        m_status->setText(tr("Computing every model…"));
    }
}

void ModelComparisonView::refresh()
{
    refreshStatus();
    const ResultsStore &store = m_workbook.results();
    const auto &rows = store.comparison();
    if (!rows) {
        m_model->clear();
        if (!store.report())
            m_status->setText(tr("No figures to compare yet."));
        return;
    }
    if (!*rows) {
        m_model->clear();
        m_status->setText(tr("No comparison: %1").arg(QString::fromStdString(rows->error().message)));
        return;
    }
    m_model->setRows(rows->value(), store.comparisonValue());
    m_table->resizeColumnsToContents();
    m_status->setText(tr("Estimates from the window's data under each model's assumptions, not forecasts."));
}

void ModelComparisonView::computeNow()
{
    m_workbook.results().computeNow(Part::Comparison);
}

} // namespace tailwise::ui
