#include "export/chartexportdialog.h"

#include "export/captions.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPixmap>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QRegularExpression>
#include <QRegularExpressionValidator>
#include <QSignalBlocker>
#include <QTimer>
#include <QVBoxLayout>

namespace tailwise::ui {

namespace {

constexpr int customSize = -1; // the size choice's data for "Custom size"

} // namespace

ChartExportDialog::ChartExportDialog(const WorkbookResults &results, ChartKind kind, const ChartExportSettings &last,
                                     QWidget *parent)
    : QDialog(parent), m_results(results)
{
    setWindowTitle(tr("Export Chart"));
    m_chart = new QComboBox(this);
    for (const ChartKind k : allChartKinds)
        m_chart->addItem(chartKindTitle(k), static_cast<int>(k));
    m_chart->setCurrentIndex(m_chart->findData(static_cast<int>(kind)));

    m_size = new QComboBox(this);
    for (const SizePreset p : allSizePresets)
        m_size->addItem(sizePresetTitle(p), static_cast<int>(p));
    m_size->addItem(tr("Custom size"), customSize);
    m_width = new QDoubleSpinBox(this);
    m_height = new QDoubleSpinBox(this);
    for (QDoubleSpinBox *box : {m_width, m_height}) {
        box->setRange(minExportMm, maxExportMm);
        box->setDecimals(0);
        box->setSuffix(tr(" mm"));
    }
    m_width->setValue(last.print.sizeMm.width());
    m_height->setValue(last.print.sizeMm.height());
    int sizeIndex = m_size->findData(customSize);
    for (const SizePreset p : allSizePresets)
        if (sizePresetMm(p) == last.print.sizeMm)
            sizeIndex = m_size->findData(static_cast<int>(p));
    m_size->setCurrentIndex(sizeIndex);
    auto *sizeRow = new QHBoxLayout;
    sizeRow->addWidget(m_size, 1);
    sizeRow->addWidget(m_width);
    sizeRow->addWidget(new QLabel(QStringLiteral("×"), this));
    sizeRow->addWidget(m_height);

    m_format = new QComboBox(this);
    m_format->addItem(tr("PNG picture"), static_cast<int>(ExportFormat::Png));
    m_format->addItem(tr("SVG drawing (vector)"), static_cast<int>(ExportFormat::Svg));
    m_format->addItem(tr("PDF page (vector)"), static_cast<int>(ExportFormat::Pdf));
    m_format->setCurrentIndex(m_format->findData(static_cast<int>(last.format)));
    m_dpi = new QComboBox(this);
    for (const int dpi : exportDpiChoices)
        m_dpi->addItem(tr("%1 dpi").arg(dpi), dpi);
    m_dpi->setCurrentIndex(std::max(0, m_dpi->findData(last.dpi)));
    m_dpi->setToolTip(tr("Dots per inch of a PNG: 150 for the screen, 300 for print, 600 for fine print."));

    m_currency = new QLineEdit(last.print.currency, this);
    m_currency->setPlaceholderText(tr("e.g. EUR (empty: the workbook’s, else “money”)"));
    m_currency->setToolTip(tr("The currency code named on money axes; the workbook’s own is filled in."));
    // Only the letters of a code (upper-cased when collected), so no axis gets a stray word.
    m_currency->setValidator(new QRegularExpressionValidator(QRegularExpression(QStringLiteral("[A-Za-z]{0,3}")), m_currency));

    m_percent = new QCheckBox(tr("Loss tail: P&&L axis in % of portfolio value"), this);
    m_percent->setChecked(last.print.lossTailUnit == LossTailUnit::PercentOfValue);

    m_caption = new QPlainTextEdit(this);
    m_caption->setTabChangesFocus(true);
    m_caption->setMinimumHeight(90);
    m_caption->setToolTip(tr("Written from the results; edit it as you like. Leave it empty for no caption."));

    m_preview = new QLabel(this);
    m_preview->setObjectName(QStringLiteral("exportPreview"));
    m_preview->setAlignment(Qt::AlignCenter);
    m_preview->setMinimumSize(420, 280);
    m_preview->setFrameShape(QFrame::StyledPanel);
    m_unavailable = new QLabel(this);
    m_unavailable->setWordWrap(true);
    m_unavailable->hide();

    auto *form = new QFormLayout;
    form->addRow(tr("&Chart:"), m_chart);
    auto *sizeLabel = new QLabel(tr("&Size:"), this);
    sizeLabel->setBuddy(m_size);
    form->addRow(sizeLabel, sizeRow);
    form->addRow(tr("&Format:"), m_format);
    form->addRow(tr("&Resolution:"), m_dpi);
    form->addRow(tr("Curr&ency:"), m_currency);
    form->addRow(QString(), m_percent);
    form->addRow(tr("Ca&ption:"), m_caption);

    auto *buttons = new QDialogButtonBox(QDialogButtonBox::Cancel, this);
    m_save = buttons->addButton(tr("Save &as…"), QDialogButtonBox::AcceptRole);
    QPushButton *copy = buttons->addButton(tr("C&opy"), QDialogButtonBox::ActionRole);
    copy->setToolTip(tr("Put the chart on the clipboard (a picture at the chosen resolution, and SVG)."));
    connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(copy, &QPushButton::clicked, this, [this] { emit copyRequested(settings()); });

    auto *layout = new QVBoxLayout(this);
    layout->addLayout(form);
    layout->addWidget(m_unavailable);
    layout->addWidget(m_preview, 1);
    layout->addWidget(new QLabel(tr("<small>The figures are estimates from past prices: VaR is not the worst case, "
                                    "and none of this is advice.</small>"),
                                 this));
    layout->addWidget(buttons);

    connect(m_chart, &QComboBox::currentIndexChanged, this, &ChartExportDialog::chartChanged);
    connect(m_size, &QComboBox::currentIndexChanged, this, &ChartExportDialog::sizeChanged);
    for (QDoubleSpinBox *box : {m_width, m_height})
        connect(box, &QDoubleSpinBox::valueChanged, this, [this] {
            if (m_size->currentData().toInt() != customSize && settings().print.sizeMm != sizePresetMm(static_cast<SizePreset>(m_size->currentData().toInt()))) {
                const QSignalBlocker block(m_size);
                m_size->setCurrentIndex(m_size->findData(customSize));
            }
            updatePreview();
        });
    connect(m_format, &QComboBox::currentIndexChanged, this, [this] {
        m_dpi->setEnabled(m_format->currentData().toInt() == static_cast<int>(ExportFormat::Png));
    });
    m_dpi->setEnabled(last.format == ExportFormat::Png);
    connect(m_currency, &QLineEdit::textChanged, this, &ChartExportDialog::updatePreview);
    connect(m_percent, &QCheckBox::toggled, this, &ChartExportDialog::updatePreview);
    connect(m_caption, &QPlainTextEdit::textChanged, this, [this] {
        if (!m_settingCaption)
            m_captionEdited = true;
        updatePreview();
    });
    chartChanged();
}

ChartExportSettings ChartExportDialog::settings() const
{
    ChartExportSettings s;
    s.kind = static_cast<ChartKind>(m_chart->currentData().toInt());
    s.format = static_cast<ExportFormat>(m_format->currentData().toInt());
    s.dpi = m_dpi->currentData().toInt();
    s.print.sizeMm = QSizeF(m_width->value(), m_height->value());
    s.print.caption = m_caption->toPlainText();
    s.print.currency = m_currency->text().trimmed().toUpper();
    s.print.lossTailUnit = m_percent->isChecked() ? LossTailUnit::PercentOfValue : LossTailUnit::Money;
    return s;
}

void ChartExportDialog::chartChanged()
{
    const ChartKind kind = static_cast<ChartKind>(m_chart->currentData().toInt());
    const QString reason = chartUnavailableReason(kind, m_results);
    m_unavailable->setText(reason);
    m_unavailable->setVisible(!reason.isEmpty());
    m_save->setEnabled(reason.isEmpty());
    m_percent->setEnabled(kind == ChartKind::LossTail);
    if (!m_captionEdited) {
        m_settingCaption = true;
        m_caption->setPlainText(reason.isEmpty() ? captionFor(kind, m_results) : QString());
        m_settingCaption = false;
    }
    updatePreview();
}

void ChartExportDialog::sizeChanged()
{
    const int preset = m_size->currentData().toInt();
    if (preset != customSize) {
        const QSizeF mm = sizePresetMm(static_cast<SizePreset>(preset));
        const QSignalBlocker bw(m_width), bh(m_height);
        m_width->setValue(mm.width());
        m_height->setValue(mm.height());
    }
    updatePreview();
}

void ChartExportDialog::updatePreview()
{
    // The picture at a resolution that fits the preview: the same layout as the file, smaller.
    const ChartExportSettings s = settings();
    const QSize room = m_preview->contentsRect().size().expandedTo(QSize(420, 280));
    const double dpiFit = std::min(room.width() / (s.print.sizeMm.width() / 25.4), room.height() / (s.print.sizeMm.height() / 25.4));
    const int dpi = std::clamp(static_cast<int>(dpiFit), 20, 300);
    m_preview->setPixmap(QPixmap::fromImage(renderChartImage(s.kind, m_results, s.print, dpi)));
}

} // namespace tailwise::ui
