#include "modelcomparisonview.h"

#include "backgroundrun.h"
#include "document/workbook.h"
#include "localnumbers.h"
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
    : QWidget(parent), m_workbook(workbook), m_model(new ModelComparisonModel(this)), m_run(new BackgroundRun(this))
{
    auto *intro = new QLabel(tr("The same holdings, window and assumptions under each model. Models disagree most in "
                                "the far tail; none of them is the worst case."),
                             this);
    intro->setWordWrap(true);
    m_table = new QTableView(this);
    m_table->setObjectName(QStringLiteral("modelComparisonTable"));
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

    connect(&workbook, &Workbook::resultsChanged, this, &ModelComparisonView::inputsChanged);
    connect(m_run, &BackgroundRun::progress, this, [this](double f) { m_progress->setValue(static_cast<int>(f * 100.0)); });
    connect(m_run, &BackgroundRun::runningChanged, this, [this](bool running) {
        m_progress->setVisible(running);
        m_stop->setVisible(running);
        if (running)
            m_progress->setValue(0);
    });
    connect(m_stop, &QToolButton::clicked, this, &ModelComparisonView::stop);
}

bool ModelComparisonView::isComputing() const
{
    return m_run->isRunning();
}

bool ModelComparisonView::isCurrent() const
{
    return !m_stale && !m_run->isRunning();
}

void ModelComparisonView::inputsChanged()
{
    m_stale = true;
    m_run->cancel();
    if (isVisible())
        start();
}

void ModelComparisonView::showEvent(QShowEvent *event)
{
    QWidget::showEvent(event);
    if (m_stale && !m_run->isRunning())
        start();
}

void ModelComparisonView::stop()
{
    m_run->cancel();
    m_status->setText(tr("Stopped: the table shows the last complete comparison, if any."));
}

void ModelComparisonView::start()
{
    if (!m_workbook.report()) {
        m_model->clear();
        m_status->setText(tr("No figures to compare yet."));
        m_stale = false;
        return;
    }
    m_stale = false;
    m_status->setText(tr("Computing every model…"));
    const double value = m_workbook.report()->portfolioValue;
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    m_run->start<std::vector<ModelRow>>(
        [prices, holdings, assumptions](const RunControl &control) {
            return compareModels(*prices, *holdings, assumptions, control);
        },
        [this, value](Result<std::vector<ModelRow>> rows) {
            if (!rows) {
                m_model->clear();
                m_status->setText(tr("No comparison: %1").arg(QString::fromStdString(rows.error().message)));
                return;
            }
            m_model->setRows(std::move(rows).value(), value);
            m_table->resizeColumnsToContents();
            m_status->setText(tr("Estimates from the window's data under each model's assumptions, not forecasts."));
        });
}

void ModelComparisonView::computeNow()
{
    m_run->cancel();
    m_stale = false;
    if (!m_workbook.report()) {
        m_model->clear();
        return;
    }
    auto rows = compareModels(m_workbook.prices(), m_workbook.holdings(), m_workbook.assumptions());
    if (!rows) {
        m_model->clear();
        m_status->setText(tr("No comparison: %1").arg(QString::fromStdString(rows.error().message)));
        return;
    }
    m_model->setRows(std::move(rows).value(), m_workbook.report()->portfolioValue);
    m_table->resizeColumnsToContents();
    m_status->setText(tr("Estimates from the window's data under each model's assumptions, not forecasts."));
}

} // namespace tailwise::ui
