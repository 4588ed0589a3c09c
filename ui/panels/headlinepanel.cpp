#include "headlinepanel.h"

#include "document/resultsstore.h"
#include "document/workbook.h"
#include "panels/elidedlabel.h"
#include "text/headline.h"
#include "text/limitwords.h"
#include "text/numbers.h"

#include "tailwise/limits.h"
#include "tailwise/risk.h"

#include <QFrame>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QLocale>
#include <QLabel>
#include <QVBoxLayout>

namespace tailwise::ui {

namespace {

QLabel *makeLabel(const QString &objectName, QWidget *parent, double scale = 1.0, bool bold = false)
{
    auto *label = new QLabel(parent);
    label->setObjectName(objectName);
    QFont font = label->font();
    if (scale != 1.0)
        font.setPointSizeF(font.pointSizeF() * scale);
    font.setBold(bold);
    label->setFont(font);
    label->setTextInteractionFlags(Qt::TextSelectableByMouse);
    return label;
}

// One figure: a caption above the money amount and its share of value.
QWidget *figureBlock(const QString &caption, const QString &tip, QLabel *money, QLabel *share, QWidget *parent)
{
    auto *box = new QWidget(parent);
    auto *layout = new QVBoxLayout(box);
    layout->setContentsMargins(0, 0, 24, 0);
    layout->setSpacing(0);
    auto *title = new QLabel(caption, box);
    title->setToolTip(tip);
    money->setToolTip(tip);
    layout->addWidget(title);
    auto *row = new QHBoxLayout;
    row->addWidget(money);
    row->addSpacing(8);
    row->addWidget(share, 0, Qt::AlignBottom);
    row->addStretch();
    layout->addLayout(row);
    return box;
}

} // namespace

HeadlinePanel::HeadlinePanel(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    m_varMoney = makeLabel(QStringLiteral("varMoney"), this, 1.8, true);
    m_varShare = makeLabel(QStringLiteral("varShare"), this, 1.1);
    m_esMoney = makeLabel(QStringLiteral("esMoney"), this, 1.8, true);
    m_esShare = makeLabel(QStringLiteral("esShare"), this, 1.1);
    m_value = makeLabel(QStringLiteral("portfolioValue"), this, 1.8);
    // Beside the portfolio value: the workbook's currency, which every money figure here is in.
    m_currency = makeLabel(QStringLiteral("headlineCurrency"), this, 1.1);

    m_figures = new QWidget(this);
    auto *figures = new QHBoxLayout(m_figures);
    figures->setContentsMargins(0, 0, 0, 0);
    figures->addWidget(figureBlock(tr("Value-at-Risk"),
                                   tr("The loss that should not be exceeded over the horizon with the chosen "
                                      "confidence — under the model, and if the holdings stay as they are."),
                                   m_varMoney, m_varShare, m_figures));
    figures->addWidget(figureBlock(tr("Expected Shortfall"),
                                   tr("The average loss in the cases where the loss is larger than VaR."), m_esMoney,
                                   m_esShare, m_figures));
    figures->addWidget(figureBlock(tr("Portfolio value"), tr("Net market value of the holdings (shorts count negative)."),
                                   m_value, m_currency, m_figures));
    figures->addStretch();

    // Elided, never wider than the panel: a long title must not widen the window.
    m_title = new ElidedLabel(this);
    m_title->setObjectName(QStringLiteral("workbookTitle"));
    QFont titleFont = m_title->font();
    titleFont.setPointSizeF(titleFont.pointSizeF() * 1.2);
    titleFont.setBold(true);
    m_title->setFont(titleFont);
    m_sentence = makeLabel(QStringLiteral("headlineSentence"), this);
    m_sentence->setWordWrap(true);
    m_notes = makeLabel(QStringLiteral("headlineNotes"), this);
    m_notes->setWordWrap(true);
    m_limits = makeLabel(QStringLiteral("headlineLimits"), this);
    m_limits->setWordWrap(true);
    m_limits->setToolTip(tr("The workbook's limits on VaR and ES: how much of each the figure uses, and its state "
                            "(ok below the warning level, warning from there up to the limit, breached above it)."));

    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(m_title);
    layout->addWidget(m_figures);
    layout->addWidget(m_limits);
    layout->addWidget(m_sentence);
    layout->addWidget(m_notes);

    connect(&workbook.results(), &ResultsStore::headlineChanged, this, &HeadlinePanel::refresh);
    connect(&workbook, &Workbook::contentsReset, this, &HeadlinePanel::refresh);
    connect(&workbook, &Workbook::titleChanged, this, &HeadlinePanel::refresh);
    connect(&workbook, &Workbook::currencyChanged, this, &HeadlinePanel::refresh);
    // While a background model runs, the figures on screen belong to the previous inputs: they
    // are greyed and say so until the new ones arrive (or the run is stopped).
    connect(&workbook.results(), &ResultsStore::headlineRunning, this, [this](bool computing) {
        m_figures->setEnabled(!computing);
        if (computing)
            m_sentence->setText(tr("Working out the figures for the new inputs…"));
        else
            refresh();
    });
    refresh();
}

void HeadlinePanel::refreshLimits(const RiskReport &report)
{
    const auto &limits = m_workbook.contents().limits;
    const auto uses = evaluateLimits(limits, {report.figures.var, report.figures.es, report.portfolioValue});
    QStringList parts;
    if (!uses) {
        parts << QString::fromStdString(uses.error().message);
    } else {
        for (const auto &u : uses.value()) {
            parts << tr("%1 limit %2: %3 used — %4")
                         .arg(limitMeasureName(u.limit.measure), moneyText(u.limitMoney), percentText(u.use),
                              limitStateWord(u.state));
        }
    }
    const bool breached = uses && anyBreached(uses.value());
    m_limits->setText(parts.isEmpty() ? QString()
                                      : (breached ? tr("Limits (one breached): %1.") : tr("Limits: %1."))
                                            .arg(parts.join(QStringLiteral("; "))));
    QFont font = m_limits->font();
    font.setBold(breached); // bold as well as the word, never colour alone
    m_limits->setFont(font);
    m_limits->setVisible(!parts.isEmpty());
}

void HeadlinePanel::refresh()
{
    m_title->setFullText(m_workbook.title());
    m_title->setVisible(!m_workbook.title().isEmpty());
    m_currency->setText(m_workbook.currency());
    m_currency->setToolTip(m_workbook.currency().isEmpty()
                               ? QString()
                               : tr("Every money figure is in %1 (the workbook's currency; nothing is converted).")
                                     .arg(m_workbook.currency()));
    const auto &report = m_workbook.results().report();
    const auto &error = m_workbook.results().headlineError();
    if (report) {
        m_figures->setVisible(true);
        const ResultsStore &store = m_workbook.results();
        // Stopped before the figures of the current inputs arrived: the ones shown are older.
        const bool stopped = store.state(Part::Headline) == PartState::OutOfDate && !store.isWatched(Part::Headline);
        m_figures->setEnabled(!stopped && !store.isRunning(Part::Headline));
        m_varMoney->setText(moneyText(report->figures.var));
        m_varShare->setText(percentText(report->varFraction));
        m_esMoney->setText(moneyText(report->figures.es));
        m_esShare->setText(percentText(report->esFraction));
        m_value->setText(moneyText(report->portfolioValue, 0));
        m_sentence->setText(stopped ? tr("Stopped: these figures are of the earlier inputs; change an input to compute "
                                         "them again.")
                                    : store.isRunning(Part::Headline) ? tr("Working out the figures for the new inputs…")
                                                                      : headlineSentence(*report));
        QStringList notes;
        for (const auto &w : report->warnings)
            notes << QString::fromStdString(w);
        m_notes->setText(notes.isEmpty() ? QString() : tr("Note: %1.").arg(notes.join(QStringLiteral("; "))));
        m_notes->setVisible(!notes.isEmpty());
        refreshLimits(*report);
        return;
    }
    m_figures->setVisible(false);
    m_notes->setVisible(false);
    m_limits->setVisible(false);
    // Nothing to measure yet is not an error: say how to start instead.
    if (!m_workbook.hasPrices()) {
        m_sentence->setText(tr("To start, open a workbook (File ▸ Open), or import a price history and then holdings "
                               "(File ▸ Import). The figures appear here as soon as there is something to measure."));
    } else if (m_workbook.holdings().empty()) {
        m_sentence->setText(tr("Add holdings to see their risk: Add Holding below, paste rows copied from a "
                               "spreadsheet, or File ▸ Import Holdings."));
    } else if (error) {
        m_sentence->setText(tr("No figures for these inputs: %1.").arg(QString::fromStdString(error->message)));
    } else {
        m_sentence->setText(tr("Working out the figures…"));
    }
}

} // namespace tailwise::ui
