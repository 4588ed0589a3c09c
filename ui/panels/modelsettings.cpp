#include "modelsettings.h"

#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "text/assumptionlabels.h"
#include "text/numbers.h"

#include "tailwise/assumptions.h"

#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QLocale>
#include <QRegularExpressionValidator>
#include <QSignalBlocker>
#include <QSpinBox>

#include <charconv>
#include <string>

namespace tailwise::ui {

namespace {

// Kinds offered for ν, as item data of the combo box.
enum DofChoice { DofFit = 0, DofGiven = 1, DofNormalDraws = 2 };

} // namespace

ModelSettings::ModelSettings(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    m_form = new QFormLayout(this);
    m_form->setContentsMargins(0, 0, 0, 0);
    m_form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    m_form->setLabelAlignment(Qt::AlignRight | Qt::AlignVCenter);

    m_dofKind = new QComboBox(this);
    m_dofKind->setObjectName(QStringLiteral("dofKind"));
    m_dofKind->setToolTip(tr("Degrees of freedom ν of the Student-t: fitted from the excess kurtosis of the "
                             "window's daily P&L (ν = 4 + 6/K), or given. Smaller ν means fatter tails."));
    m_form->addRow(tr("Tails (ν)"), m_dofKind);
    m_dof = new QDoubleSpinBox(this);
    m_dof->setObjectName(QStringLiteral("dof"));
    m_dof->setRange(2.05, 1000.0);
    m_dof->setDecimals(2);
    m_dof->setSingleStep(0.5);
    m_dof->setKeyboardTracking(false);
    m_dof->setToolTip(tr("ν must be above 2 for the variance to exist; 3 to 8 is typical of daily returns."));
    m_form->addRow(tr("ν"), m_dof);

    m_historicalHorizon = new QComboBox(this);
    m_historicalHorizon->setObjectName(QStringLiteral("historicalHorizon"));
    m_historicalHorizon->addItem(tr("One-day figures × √horizon"), int(HistoricalHorizon::SquareRoot));
    m_historicalHorizon->addItem(tr("Sums of consecutive days (overlapping)"), int(HistoricalHorizon::Overlapping));
    m_historicalHorizon->setToolTip(tr("How the replayed daily P&L reach the horizon: scale the one-day VaR by the "
                                       "square root of the horizon, or take every run of consecutive days in the "
                                       "window (overlapping runs share days, so they are fewer independent "
                                       "observations than they seem)."));
    m_form->addRow(tr("Horizon by"), m_historicalHorizon);

    m_scaling = new QComboBox(this);
    m_scaling->setObjectName(QStringLiteral("scaling"));
    m_scaling->addItem(scalingLabel(MultiDayScaling::SquareRoot), int(MultiDayScaling::SquareRoot));
    m_scaling->addItem(scalingLabel(MultiDayScaling::Aggregate), int(MultiDayScaling::Aggregate));
    m_scaling->setToolTip(tr("How a horizon of H days is reached. √H: the one-day figure times √H, keeping one "
                             "day's fat tails (a common regulatory convention). H-day sum: the model is applied "
                             "to the sum of H independent days, whose tails are thinner (skewness S/√H, excess "
                             "kurtosis K/H; for Student-t, ν = 4 + H(ν − 4), kept when ν is 4 or less)."));
    m_form->addRow(tr("Longer horizons"), m_scaling);

    m_simulations = new QSpinBox(this);
    m_simulations->setObjectName(QStringLiteral("simulations"));
    m_simulations->setRange(1000, 10000000);
    m_simulations->setSingleStep(10000);
    m_simulations->setGroupSeparatorShown(true);
    m_simulations->setKeyboardTracking(false);
    m_simulations->setToolTip(tr("Number of random scenarios drawn. More draws give a steadier figure (the "
                                 "headline shows its standard error) and take longer."));
    m_form->addRow(tr("Draws"), m_simulations);
    m_seed = new QLineEdit(this);
    m_seed->setObjectName(QStringLiteral("seed"));
    m_seed->setValidator(new QRegularExpressionValidator(QRegularExpression(QStringLiteral("[0-9]{1,20}")), m_seed));
    m_seed->setToolTip(tr("The same seed and inputs give the same figures, on any computer and thread count."));
    m_form->addRow(tr("Seed"), m_seed);

    m_note = new QLabel(this);
    m_note->setWordWrap(true);
    m_note->setObjectName(QStringLiteral("modelNote"));
    m_form->addRow(m_note);

    connect(m_dofKind, &QComboBox::currentIndexChanged, this, &ModelSettings::commitDof);
    connect(m_dof, &QDoubleSpinBox::valueChanged, this, &ModelSettings::commitDof);
    connect(m_historicalHorizon, &QComboBox::currentIndexChanged, this, [this](int) {
        Assumptions a = m_workbook.assumptions();
        a.historicalHorizon = HistoricalHorizon(m_historicalHorizon->currentData().toInt());
        if (a.historicalHorizon == m_workbook.assumptions().historicalHorizon)
            return;
        edit::setAssumptions(m_workbook, a, tr("Set historical horizon to %1").arg(m_historicalHorizon->currentText()));
    });
    connect(m_scaling, &QComboBox::currentIndexChanged, this, [this](int) {
        Assumptions a = m_workbook.assumptions();
        a.scaling = MultiDayScaling(m_scaling->currentData().toInt());
        if (a.scaling == m_workbook.assumptions().scaling)
            return;
        edit::setAssumptions(m_workbook, a, tr("Set longer horizons to “%1”").arg(m_scaling->currentText()));
    });
    connect(m_simulations, &QSpinBox::valueChanged, this, [this](int n) {
        Assumptions a = m_workbook.assumptions();
        if (a.simulations == n)
            return;
        a.simulations = n;
        edit::setAssumptions(m_workbook, a, tr("Set draws to %1").arg(QLocale().toString(n)), edit::MergeKey::Other);
    });
    connect(m_seed, &QLineEdit::editingFinished, this, &ModelSettings::commitSeed);
    connect(&workbook, &Workbook::assumptionsChanged, this, &ModelSettings::refresh);
    connect(&workbook.results(), &ResultsStore::headlineChanged, this, &ModelSettings::refresh);
    refresh();
}

void ModelSettings::showRow(QWidget *field, bool visible)
{
    field->setVisible(visible);
    if (QWidget *label = m_form->labelForField(field))
        label->setVisible(visible);
}

void ModelSettings::commitDof()
{
    Assumptions a = m_workbook.assumptions();
    const int choice = m_dofKind->currentData().toInt();
    DegreesOfFreedom dof;
    if (choice == DofGiven)
        dof = DegreesOfFreedom::given(m_dof->value());
    else if (choice == DofFit)
        dof = DegreesOfFreedom::fit();
    if (dof == a.dof)
        return;
    a.dof = dof;
    const QString text = choice == DofGiven ? tr("Set ν to %1").arg(QLocale().toString(m_dof->value(), 'f', 2))
                                            : (choice == DofFit ? tr("Fit ν from the window") : tr("Draw from the normal"));
    edit::setAssumptions(m_workbook, a, text, choice == DofGiven ? edit::MergeKey::Other : edit::MergeKey::None);
}

void ModelSettings::commitSeed()
{
    const std::string digits = m_seed->text().toStdString();
    std::uint64_t seed = 0;
    const auto [end, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), seed);
    Assumptions a = m_workbook.assumptions();
    if (digits.empty() || ec != std::errc() || end != digits.data() + digits.size()) {
        // Too large for 64 bits or empty: put the stored seed back rather than guess.
        m_seed->setText(QString::number(a.seed));
        return;
    }
    if (a.seed == seed)
        return;
    a.seed = seed;
    edit::setAssumptions(m_workbook, a, tr("Set seed to %1").arg(QString::number(seed)));
}

void ModelSettings::refresh()
{
    const Assumptions &a = m_workbook.assumptions();
    const QSignalBlocker b1(m_dofKind), b2(m_dof), b3(m_historicalHorizon), b4(m_simulations), b5(m_seed),
        b6(m_scaling);
    const bool t = a.model == RiskModel::StudentT;
    const bool mc = a.model == RiskModel::MonteCarlo;
    const bool hs = a.model == RiskModel::Historical;

    m_dofKind->clear();
    if (mc)
        m_dofKind->addItem(tr("Normal draws"), int(DofNormalDraws));
    m_dofKind->addItem(mc ? tr("Student-t draws, ν fitted") : tr("Fitted from the window"), int(DofFit));
    m_dofKind->addItem(mc ? tr("Student-t draws, ν given") : tr("Given"), int(DofGiven));
    int choice = DofFit;
    if (a.dof.kind == DegreesOfFreedom::Kind::Given)
        choice = DofGiven;
    else if (a.dof.kind == DegreesOfFreedom::Kind::Unset)
        choice = mc ? DofNormalDraws : DofFit; // unset means fitted for the Student-t model
    m_dofKind->setCurrentIndex(std::max(0, m_dofKind->findData(choice)));
    if (a.dof.kind == DegreesOfFreedom::Kind::Given && m_dof->value() != a.dof.value)
        m_dof->setValue(a.dof.value);
    m_historicalHorizon->setCurrentIndex(std::max(0, m_historicalHorizon->findData(int(a.historicalHorizon))));
    m_scaling->setCurrentIndex(std::max(0, m_scaling->findData(int(a.scaling))));
    if (m_simulations->value() != a.simulations)
        m_simulations->setValue(a.simulations);
    if (!m_seed->hasFocus())
        m_seed->setText(QString::number(a.seed));

    showRow(m_dofKind, t || mc);
    showRow(m_dof, (t || mc) && choice == DofGiven);
    showRow(m_historicalHorizon, hs);
    showRow(m_scaling, modelHasScaling(a.model));
    showRow(m_simulations, mc);
    showRow(m_seed, mc);

    // What the model actually used (a fitted ν, a fallback), from the latest figures.
    QString note;
    if (const auto &report = m_workbook.results().report(); report && report->assumptions.model == a.model) {
        const ModelDetails &m = report->model;
        if (m.used != a.model)
            note = tr("Fell back to the normal model: see the notes under the figures.");
        else if (m.dof && m.dofFitted)
            note = tr("Fitted ν = %1 from the window's daily P&L.").arg(QLocale().toString(*m.dof, 'f', 2));
        else if (m.shape && a.model == RiskModel::CornishFisher)
            note = tr("Skewness %1, excess kurtosis %2 of the window's daily P&L.")
                       .arg(QLocale().toString(m.shape->skewness, 'f', 2), QLocale().toString(m.shape->excessKurtosis, 'f', 2));
        else if (m.scenarios > 0 && hs)
            note = tr("Quantile taken over %1 P&L.").arg(QLocale().toString(m.scenarios));
        // The multi-day convention in words, with what it used at this horizon.
        if (const QString scaling = scalingSentence(*report); !scaling.isEmpty())
            note += (note.isEmpty() ? QString() : QStringLiteral(" ")) + scaling;
    }
    m_note->setText(note);
    m_note->setVisible(!note.isEmpty());
}

} // namespace tailwise::ui
