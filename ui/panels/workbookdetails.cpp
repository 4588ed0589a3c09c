#include "workbookdetails.h"

#include "document/commands.h"
#include "document/workbook.h"

#include "tailwise/textlimits.h"

#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QSignalBlocker>

namespace tailwise::ui {

WorkbookDetails::WorkbookDetails(Workbook &workbook, QWidget *parent) : QWidget(parent), m_workbook(workbook)
{
    auto *form = new QFormLayout(this);
    form->setContentsMargins(0, 0, 0, 0);
    form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    form->setLabelAlignment(Qt::AlignRight | Qt::AlignVCenter);

    m_title = new QLineEdit(this);
    m_title->setObjectName(QStringLiteral("workbookTitleEdit"));
    m_title->setPlaceholderText(tr("untitled"));
    m_title->setMaxLength(static_cast<int>(tailwise::maxTitleChars)); // the bound a workbook file is read with
    m_title->setToolTip(tr("The workbook's title, shown in the window title and on reports."));
    form->addRow(tr("Title"), m_title);

    m_currency = new QLineEdit(this);
    m_currency->setObjectName(QStringLiteral("workbookCurrency"));
    m_currency->setPlaceholderText(tr("e.g. EUR"));
    m_currency->setMaxLength(8); // room to type a wrong one and be told why
    m_currency->setToolTip(tr("The currency the prices and values are in, as three capital letters (EUR, GBP, "
                              "USD). Only a label for money figures and axes: nothing is converted."));
    form->addRow(tr("Currency"), m_currency);

    m_problem = new QLabel(this);
    m_problem->setWordWrap(true);
    m_problem->setStyleSheet(QStringLiteral("QLabel { color: #a4262c; }"));
    m_problem->hide();
    form->addRow(QString(), m_problem);

    connect(m_title, &QLineEdit::editingFinished, this, &WorkbookDetails::commitTitle);
    connect(m_currency, &QLineEdit::editingFinished, this, &WorkbookDetails::commitCurrency);
    connect(&workbook, &Workbook::titleChanged, this, &WorkbookDetails::refresh);
    connect(&workbook, &Workbook::currencyChanged, this, [this] {
        m_problem->hide(); // a new currency (an edit, an undo, another file) ends the refusal's note
        refresh();
    });
    refresh();
}

void WorkbookDetails::commitTitle()
{
    edit::setTitle(m_workbook, m_title->text().trimmed());
}

void WorkbookDetails::commitCurrency()
{
    const auto code = edit::setCurrency(m_workbook, m_currency->text());
    if (!code) {
        // Nothing changed; the reason stays beside the field until the next good entry.
        m_problem->setText(tr("Not changed: %1").arg(QString::fromStdString(code.error().message)));
        m_problem->show();
        return;
    }
    m_problem->hide();
    refresh(); // shows the code as stored (trimmed)
}

void WorkbookDetails::refresh()
{
    const QSignalBlocker titleBlocker(m_title);
    const QSignalBlocker currencyBlocker(m_currency);
    if (m_title->text() != m_workbook.title())
        m_title->setText(m_workbook.title());
    if (m_currency->text() != m_workbook.currency() && !m_problem->isVisible())
        m_currency->setText(m_workbook.currency()); // a refused entry stays beside its reason
}

} // namespace tailwise::ui
