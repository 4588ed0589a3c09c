#include "assumptionspane.h"

#include "assumptionlabels.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "localnumbers.h"
#include "modelsettings.h"
#include "workbookdetails.h"

#include "tailwise/assumptions.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLocale>
#include <QSignalBlocker>
#include <QSlider>
#include <QSpinBox>
#include <QToolButton>
#include <QUndoStack>
#include <QVBoxLayout>

#include <cmath>

namespace tailwise::ui {

namespace {

constexpr double kQuickConfidences[] = {0.95, 0.975, 0.99, 0.995, 0.999};
// The slider covers 90.0 % … 99.9 % in steps of 0.1 %; the spin box reaches further.
constexpr int kSliderMin = 900;
constexpr int kSliderMax = 999;

QLabel *sectionTitle(const QString &text, QWidget *parent)
{
    auto *label = new QLabel(QStringLiteral("<b>%1</b>").arg(text.toHtmlEscaped()), parent);
    label->setContentsMargins(0, 8, 0, 0);
    return label;
}

// Models the core knows, by their file names; the list follows the core as models are added.
const char *const kModels[] = {"normal", "student-t", "cornish-fisher", "historical", "monte-carlo"};

} // namespace

QList<int> AssumptionsPane::horizonChoices(int daysPerYear)
{
    return {1, 5, 10, 21, 63, daysPerYear};
}

AssumptionsPane::AssumptionsPane(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    buildWidgets();
    connectWidgets();
    connect(&workbook, &Workbook::assumptionsChanged, this, &AssumptionsPane::refresh);
    connect(&workbook, &Workbook::pricesChanged, this, &AssumptionsPane::refresh);
    connect(&workbook.results(), &ResultsStore::headlineChanged, this, &AssumptionsPane::refreshWindowRange);
    refresh();
}

void AssumptionsPane::buildWidgets()
{
    auto *form = new QFormLayout;
    form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    form->setLabelAlignment(Qt::AlignRight | Qt::AlignVCenter);

    // --- The workbook's title and currency ---
    form->addRow(sectionTitle(tr("Workbook"), this));
    form->addRow(new WorkbookDetails(m_workbook, this));

    // --- Confidence ---
    form->addRow(sectionTitle(tr("How sure"), this));
    m_confidence = new QDoubleSpinBox(this);
    m_confidence->setObjectName(QStringLiteral("confidence"));
    m_confidence->setRange(50.0, 99.99);
    m_confidence->setDecimals(2);
    m_confidence->setSingleStep(0.1);
    m_confidence->setSuffix(QStringLiteral("%"));
    m_confidence->setToolTip(tr("Confidence: how often the loss should stay below VaR. At 99%, a loss larger "
                                "than VaR is expected on about 1 horizon in 100."));
    m_confidenceSlider = new QSlider(Qt::Horizontal, this);
    m_confidenceSlider->setObjectName(QStringLiteral("confidenceSlider"));
    m_confidenceSlider->setRange(kSliderMin, kSliderMax);
    m_confidenceSlider->setToolTip(tr("Drag to change the confidence between 90% and 99.9%."));
    form->addRow(tr("Confidence"), m_confidence);
    form->addRow(QString(), m_confidenceSlider);
    auto *quick = new QHBoxLayout;
    quick->setSpacing(2);
    for (double c : kQuickConfidences) {
        auto *b = new QToolButton(this);
        b->setText(QLocale().toString(c * 100.0, 'g', 4));
        b->setToolTip(tr("Set the confidence to %1%").arg(b->text()));
        connect(b, &QToolButton::clicked, this, [this, c] { setConfidence(c, edit::MergeKey::None); });
        quick->addWidget(b);
    }
    quick->addStretch();
    form->addRow(tr("Quick choice"), quick);

    // --- Horizon ---
    form->addRow(sectionTitle(tr("How far ahead"), this));
    m_horizon = new QSpinBox(this);
    m_horizon->setObjectName(QStringLiteral("horizon"));
    m_horizon->setRange(1, 2520);
    m_horizon->setSuffix(tr(" trading days"));
    m_horizon->setToolTip(tr("Horizon: the number of trading days over which the loss is measured, as if the "
                             "holdings were kept unchanged for that long."));
    form->addRow(tr("Horizon"), m_horizon);
    auto *grid = new QGridLayout;
    grid->setSpacing(2);
    const QStringList names = {tr("1 day"), tr("1 week"), tr("2 weeks"), tr("1 month"), tr("1 quarter"), tr("1 year")};
    for (int i = 0; i < names.size(); ++i) {
        auto *b = new QToolButton(this);
        b->setText(names[i]);
        b->setToolButtonStyle(Qt::ToolButtonTextOnly);
        b->setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Fixed);
        connect(b, &QToolButton::clicked, this, [this, i] {
            setHorizon(horizonChoices(m_workbook.assumptions().daysPerYear).value(i, 1));
        });
        m_horizonButtons << b;
        grid->addWidget(b, i / 3, i % 3);
    }
    form->addRow(tr("Quick choice"), grid);
    m_daysPerYear = new QSpinBox(this);
    m_daysPerYear->setRange(1, 366);
    m_daysPerYear->setToolTip(tr("Trading days in a year: sets what \"1 year\" means above and how yearly "
                                 "figures are converted. 252 is usual for exchanges open on weekdays."));
    form->addRow(tr("Days a year"), m_daysPerYear);

    // --- Data ---
    form->addRow(sectionTitle(tr("Which data"), this));
    m_allReturns = new QCheckBox(tr("All of the history"), this);
    m_allReturns->setToolTip(tr("Estimate from every daily return in the price history."));
    m_window = new QSpinBox(this);
    m_window->setObjectName(QStringLiteral("window"));
    m_window->setSuffix(tr(" days"));
    m_window->setToolTip(tr("Estimation window: how many of the most recent daily returns the estimates use. "
                            "A short window follows recent markets; a long one is steadier but slower to react."));
    auto *windowRow = new QHBoxLayout;
    windowRow->addWidget(m_window, 1);
    windowRow->addWidget(m_allReturns);
    form->addRow(tr("Window"), windowRow);
    m_windowRange = new QLabel(this);
    m_windowRange->setObjectName(QStringLiteral("windowRange"));
    m_windowRange->setWordWrap(true);
    m_windowRange->setToolTip(tr("The dates of the first and last daily return in the window."));
    form->addRow(tr("Covers"), m_windowRange);
    m_returns = new QComboBox(this);
    for (ReturnType r : {ReturnType::Simple, ReturnType::Log})
        m_returns->addItem(returnTypeLabel(r), int(r));
    m_returns->setToolTip(tr("How a day's move is measured: the percentage change of the price, or the log of "
                             "its ratio. They differ little for small daily moves."));
    form->addRow(tr("Returns"), m_returns);

    // --- Estimation ---
    form->addRow(sectionTitle(tr("How it is estimated"), this));
    m_estimator = new QComboBox(this);
    for (CovarianceEstimator e : {CovarianceEstimator::Sample, CovarianceEstimator::Ewma})
        m_estimator->addItem(estimatorLabel(e), int(e));
    m_estimator->setToolTip(tr("How the window's days are weighted when estimating volatilities and "
                               "correlations: all alike, or recent days more (exponentially weighted)."));
    form->addRow(tr("Weighting"), m_estimator);
    m_lambda = new QDoubleSpinBox(this);
    m_lambda->setRange(0.5, 0.999);
    m_lambda->setDecimals(3);
    m_lambda->setSingleStep(0.005);
    m_lambda->setToolTip(tr("EWMA decay λ: each day back weighs λ times the day after it. Closer to 1 means "
                            "a longer memory; 0.94 is a common choice for daily data."));
    m_lambdaEffective = new QLabel(this);
    m_lambdaEffective->setToolTip(tr("The effective window 1/(1−λ): roughly how many recent days carry the weight."));
    auto *lambdaRow = new QHBoxLayout;
    lambdaRow->addWidget(m_lambda, 1);
    lambdaRow->addWidget(m_lambdaEffective);
    form->addRow(tr("Decay λ"), lambdaRow);
    m_mean = new QComboBox(this);
    for (MeanModel m : {MeanModel::Zero, MeanModel::Sample})
        m_mean->addItem(meanLabel(m), int(m));
    m_mean->setToolTip(tr("The expected daily gain: taken as zero (the cautious, usual choice), or the window's "
                          "average. An estimated gain lowers VaR, more so at long horizons."));
    form->addRow(tr("Expected gain"), m_mean);
    m_model = new QComboBox(this);
    for (const char *name : kModels) {
        if (const auto model = parseRiskModel(name)) {
            m_model->addItem(modelLabel(*model), int(*model));
            const QString tip = modelDescription(*model)
                                + (*model == RiskModel::MonteCarlo ? tr(" It runs in the background.") : QString());
            m_model->setItemData(m_model->count() - 1, tip, Qt::ToolTipRole);
        }
    }
    m_model->setToolTip(tr("The model that turns the estimates into a loss distribution."));
    form->addRow(tr("Model"), m_model);
    // The chosen model's own parameters (ν, historical horizon, draws and seed).
    form->addRow(new ModelSettings(m_workbook, this));

    // A typed number becomes one edit when it is confirmed (Return or leaving the field), not one
    // per keystroke; arrow steps still apply at once.
    for (QAbstractSpinBox *box : {static_cast<QAbstractSpinBox *>(m_confidence), static_cast<QAbstractSpinBox *>(m_horizon),
                                  static_cast<QAbstractSpinBox *>(m_daysPerYear), static_cast<QAbstractSpinBox *>(m_window),
                                  static_cast<QAbstractSpinBox *>(m_lambda)})
        box->setKeyboardTracking(false);

    auto *layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addStretch();
}

void AssumptionsPane::connectWidgets()
{
    using edit::MergeKey;
    connect(m_confidence, &QDoubleSpinBox::valueChanged, this,
            [this](double percent) { setConfidence(percent / 100.0, MergeKey::Confidence); });
    // A drag is one undo step of its own: what it pushes from its first move to the release is
    // grouped (a merge key alone would also fold a second, later drag into the first).
    connect(m_confidenceSlider, &QSlider::sliderReleased, this, [this] {
        if (m_dragOpen) {
            m_dragOpen = false;
            m_workbook.undoStack()->endMacro();
        }
    });
    connect(m_confidenceSlider, &QSlider::valueChanged, this, [this](int perMille) {
        if (m_confidenceSlider->isSliderDown() && !m_dragOpen) {
            m_dragOpen = true;
            m_workbook.undoStack()->beginMacro(tr("Drag confidence"));
        }
        setConfidence(perMille / 1000.0, MergeKey::Confidence);
    });
    connect(m_horizon, &QSpinBox::valueChanged, this, [this](int days) { setHorizon(days); });
    connect(m_daysPerYear, &QSpinBox::valueChanged, this, [this](int days) {
        Assumptions a = m_workbook.assumptions();
        a.daysPerYear = days;
        commit(a, tr("Set trading days a year to %1").arg(days), MergeKey::DaysPerYear);
    });
    connect(m_window, &QSpinBox::valueChanged, this, [this](int days) {
        Assumptions a = m_workbook.assumptions();
        a.window = days;
        commit(a, tr("Set window to %1 days").arg(days), MergeKey::Window);
    });
    connect(m_allReturns, &QCheckBox::toggled, this, [this](bool all) {
        Assumptions a = m_workbook.assumptions();
        a.window = all ? std::nullopt : std::optional<int>(m_window->value());
        commit(a, all ? tr("Use all of the history") : tr("Set window to %1 days").arg(m_window->value()), MergeKey::None);
    });
    connect(m_lambda, &QDoubleSpinBox::valueChanged, this, [this](double lambda) {
        Assumptions a = m_workbook.assumptions();
        a.lambda = lambda;
        commit(a, tr("Set decay λ to %1").arg(QLocale().toString(lambda, 'f', 3)), MergeKey::Lambda);
    });
    auto comboEdit = [this](QComboBox *combo, auto apply, const QString &what) {
        connect(combo, &QComboBox::currentIndexChanged, this, [this, combo, apply, what](int) {
            Assumptions a = m_workbook.assumptions();
            apply(a, combo->currentData().toInt());
            commit(a, tr("Set %1 to %2").arg(what, combo->currentText()), MergeKey::None);
        });
    };
    comboEdit(m_estimator, [](Assumptions &a, int v) { a.estimator = CovarianceEstimator(v); }, tr("weighting"));
    comboEdit(m_mean, [](Assumptions &a, int v) { a.mean = MeanModel(v); }, tr("expected gain"));
    comboEdit(m_returns, [](Assumptions &a, int v) { a.returns = ReturnType(v); }, tr("returns"));
    comboEdit(m_model, [](Assumptions &a, int v) { a.model = RiskModel(v); }, tr("model"));
}

void AssumptionsPane::setConfidence(double confidence, edit::MergeKey key)
{
    Assumptions a = m_workbook.assumptions();
    if (std::abs(a.confidence - confidence) < 1e-12)
        return;
    a.confidence = confidence;
    commit(a, tr("Set confidence to %1%").arg(QLocale().toString(confidence * 100.0, 'g', 4)), key);
}

void AssumptionsPane::setHorizon(int days)
{
    Assumptions a = m_workbook.assumptions();
    if (a.horizonDays == days)
        return;
    a.horizonDays = days;
    commit(a, tr("Set horizon to %1").arg(tradingDaysText(days)), edit::MergeKey::Horizon);
}

void AssumptionsPane::commit(const Assumptions &a, const QString &text, edit::MergeKey key)
{
    edit::setAssumptions(m_workbook, a, text, key);
}

void AssumptionsPane::refresh()
{
    const Assumptions &a = m_workbook.assumptions();
    const QList<QWidget *> widgets = {m_confidence, m_confidenceSlider, m_horizon, m_daysPerYear, m_allReturns,
                                      m_window, m_estimator, m_lambda, m_mean, m_returns, m_model};
    std::vector<std::unique_ptr<QSignalBlocker>> blockers;
    for (QWidget *w : widgets)
        blockers.push_back(std::make_unique<QSignalBlocker>(w));

    // Values are set only when they differ, so a refresh never disturbs a field being typed in.
    auto setIf = [](auto *box, auto value) {
        if (box->value() != value)
            box->setValue(value);
    };
    setIf(m_confidence, a.confidence * 100.0);
    setIf(m_confidenceSlider, static_cast<int>(std::lround(a.confidence * 1000.0)));
    setIf(m_horizon, a.horizonDays);
    m_horizon->setSuffix(a.horizonDays == 1 ? tr(" trading day") : tr(" trading days"));
    setIf(m_daysPerYear, a.daysPerYear);
    const int available = std::max(2, m_workbook.prices().dayCount() - 1);
    m_window->setRange(2, std::max(2, available));
    setIf(m_window, a.window.value_or(available));
    m_window->setEnabled(a.window.has_value());
    m_allReturns->setChecked(!a.window.has_value());
    m_allReturns->setText(m_workbook.prices().dayCount() > 1 ? tr("All %1").arg(QLocale().toString(available)) : tr("All"));
    auto select = [](QComboBox *combo, int value) { combo->setCurrentIndex(std::max(0, combo->findData(value))); };
    select(m_estimator, int(a.estimator));
    select(m_mean, int(a.mean));
    select(m_returns, int(a.returns));
    select(m_model, int(a.model));
    setIf(m_lambda, a.lambda);
    const bool ewma = a.estimator == CovarianceEstimator::Ewma;
    m_lambda->setEnabled(ewma);
    m_lambdaEffective->setEnabled(ewma);
    m_lambdaEffective->setText(tr("≈ %1 days").arg(QLocale().toString(ewmaEffectiveDays(a.lambda), 'f', 1)));
    const QList<int> choices = horizonChoices(a.daysPerYear);
    for (int i = 0; i < m_horizonButtons.size(); ++i)
        m_horizonButtons[i]->setToolTip(tr("Set the horizon to %1").arg(tradingDaysText(choices.value(i))));
    refreshWindowRange();
}

void AssumptionsPane::refreshWindowRange()
{
    // The window's dates follow from the price history alone (the last N returns, each dated by
    // its closing day), so they show before any result is computed.
    const auto &prices = m_workbook.prices();
    const int available = prices.dayCount() - 1;
    if (available < 1) {
        m_windowRange->setText(tr("No price history yet"));
        return;
    }
    const int n = std::clamp(m_workbook.assumptions().window.value_or(available), 1, available);
    const auto first = prices.dates[static_cast<std::size_t>(prices.dayCount() - n)];
    const auto last = prices.dates.back();
    m_windowRange->setText(tr("%1 to %2").arg(dateText(first), dateText(last)));
}

} // namespace tailwise::ui
