#include "commands.h"

#include "currencycode.h"

#include <QUndoCommand>
#include <QUndoStack>

#include <algorithm>

namespace tailwise::ui::edit {

namespace {

class SetHoldingCommand : public QUndoCommand {
public:
    SetHoldingCommand(Workbook &wb, int row, Holding after, const QString &text)
        : QUndoCommand(text), m_wb(wb), m_row(row), m_before(wb.holdings()[static_cast<std::size_t>(row)]),
          m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyHolding(m_row, m_after); }
    void undo() override { m_wb.applyHolding(m_row, m_before); }

private:
    Workbook &m_wb;
    int m_row;
    Holding m_before;
    Holding m_after;
};

class InsertHoldingsCommand : public QUndoCommand {
public:
    InsertHoldingsCommand(Workbook &wb, int row, Holdings rows, const QString &text)
        : QUndoCommand(text), m_wb(wb), m_row(row), m_rows(std::move(rows))
    {
    }
    void redo() override { m_wb.applyInsertHoldings(m_row, m_rows); }
    void undo() override { m_wb.applyRemoveHoldings(m_row, static_cast<int>(m_rows.size())); }

private:
    Workbook &m_wb;
    int m_row;
    Holdings m_rows;
};

// Removes one contiguous block; several blocks become children of one parent command.
class RemoveBlockCommand : public QUndoCommand {
public:
    RemoveBlockCommand(Workbook &wb, int row, int count, QUndoCommand *parent)
        : QUndoCommand(parent), m_wb(wb), m_row(row),
          m_rows(wb.holdings().begin() + row, wb.holdings().begin() + row + count)
    {
    }
    void redo() override { m_wb.applyRemoveHoldings(m_row, static_cast<int>(m_rows.size())); }
    void undo() override { m_wb.applyInsertHoldings(m_row, m_rows); }

private:
    Workbook &m_wb;
    int m_row;
    Holdings m_rows;
};

class ReplaceHoldingsCommand : public QUndoCommand {
public:
    ReplaceHoldingsCommand(Workbook &wb, Holdings after, const QString &text)
        : QUndoCommand(text), m_wb(wb), m_before(wb.holdings()), m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyHoldings(m_after); }
    void undo() override { m_wb.applyHoldings(m_before); }

private:
    Workbook &m_wb;
    Holdings m_before;
    Holdings m_after;
};

class SetAssumptionsCommand : public QUndoCommand {
public:
    SetAssumptionsCommand(Workbook &wb, Assumptions after, const QString &text, MergeKey key)
        : QUndoCommand(text), m_wb(wb), m_before(wb.assumptions()), m_after(after), m_key(key)
    {
    }
    void redo() override { m_wb.applyAssumptions(m_after); }
    void undo() override { m_wb.applyAssumptions(m_before); }
    int id() const override { return m_key == MergeKey::None ? -1 : 1000 + static_cast<int>(m_key); }
    bool mergeWith(const QUndoCommand *other) override
    {
        if (other->id() != id())
            return false;
        m_after = static_cast<const SetAssumptionsCommand *>(other)->m_after;
        setText(other->text());
        return true;
    }

private:
    Workbook &m_wb;
    Assumptions m_before;
    Assumptions m_after;
    MergeKey m_key;
};

class ReplacePricesCommand : public QUndoCommand {
public:
    ReplacePricesCommand(Workbook &wb, PriceHistory after, const QString &text)
        : QUndoCommand(text), m_wb(wb), m_before(wb.prices()), m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyPrices(m_after); }
    void undo() override { m_wb.applyPrices(m_before); }

private:
    Workbook &m_wb;
    PriceHistory m_before;
    PriceHistory m_after;
};

class SetCurrencyCommand : public QUndoCommand {
public:
    SetCurrencyCommand(Workbook &wb, QString after)
        : QUndoCommand(QObject::tr("Set currency")), m_wb(wb), m_before(wb.currency()), m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyCurrency(m_after); }
    void undo() override { m_wb.applyCurrency(m_before); }

private:
    Workbook &m_wb;
    QString m_before;
    QString m_after;
};

class SetTitleCommand : public QUndoCommand {
public:
    SetTitleCommand(Workbook &wb, QString after)
        : QUndoCommand(QObject::tr("Rename workbook")), m_wb(wb), m_before(wb.title()), m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyTitle(m_after); }
    void undo() override { m_wb.applyTitle(m_before); }

private:
    Workbook &m_wb;
    QString m_before;
    QString m_after;
};

class SetScenariosCommand : public QUndoCommand {
public:
    SetScenariosCommand(Workbook &wb, std::vector<StressScenario> after, const QString &text)
        : QUndoCommand(text), m_wb(wb), m_before(wb.scenarios()), m_after(std::move(after))
    {
    }
    void redo() override { m_wb.applyScenarios(m_after); }
    void undo() override { m_wb.applyScenarios(m_before); }

private:
    Workbook &m_wb;
    std::vector<StressScenario> m_before;
    std::vector<StressScenario> m_after;
};

class SetBacktestSettingsCommand : public QUndoCommand {
public:
    SetBacktestSettingsCommand(Workbook &wb, BacktestSettings after, const QString &text, MergeKey key)
        : QUndoCommand(text), m_wb(wb), m_before(wb.contents().backtest), m_after(std::move(after)), m_key(key)
    {
    }
    void redo() override { m_wb.applyBacktestSettings(m_after); }
    void undo() override { m_wb.applyBacktestSettings(m_before); }
    // Apart from the assumptions' ids (1000 + key), so the two kinds never merge.
    int id() const override { return m_key == MergeKey::None ? -1 : 2000 + static_cast<int>(m_key); }
    bool mergeWith(const QUndoCommand *other) override
    {
        if (other->id() != id())
            return false;
        m_after = static_cast<const SetBacktestSettingsCommand *>(other)->m_after;
        setText(other->text());
        return true;
    }

private:
    Workbook &m_wb;
    std::optional<BacktestSettings> m_before; // unset when the workbook had none stored
    BacktestSettings m_after;
    MergeKey m_key;
};

} // namespace

void setHolding(Workbook &wb, int row, const Holding &holding, const QString &text)
{
    wb.undoStack()->push(new SetHoldingCommand(wb, row, holding, text));
}

void insertHoldings(Workbook &wb, int row, const Holdings &holdings, const QString &text)
{
    if (holdings.empty())
        return;
    wb.undoStack()->push(new InsertHoldingsCommand(wb, row, holdings, text));
}

void removeHoldings(Workbook &wb, std::vector<int> rows)
{
    std::sort(rows.begin(), rows.end());
    rows.erase(std::unique(rows.begin(), rows.end()), rows.end());
    rows.erase(std::remove_if(rows.begin(), rows.end(),
                              [&](int r) { return r < 0 || r >= static_cast<int>(wb.holdings().size()); }),
               rows.end());
    if (rows.empty())
        return;
    auto *parent = new QUndoCommand(rows.size() == 1
                                        ? QObject::tr("Remove holding %1").arg(QString::fromStdString(
                                              wb.holdings()[static_cast<std::size_t>(rows.front())].asset))
                                        : QObject::tr("Remove %n holdings", nullptr, static_cast<int>(rows.size())));
    // Blocks from the bottom up, so each block's row index stays valid when it runs.
    std::size_t end = rows.size();
    while (end > 0) {
        std::size_t start = end - 1;
        while (start > 0 && rows[start - 1] == rows[start] - 1)
            --start;
        new RemoveBlockCommand(wb, rows[start], static_cast<int>(end - start), parent);
        end = start;
    }
    wb.undoStack()->push(parent);
}

void replaceHoldings(Workbook &wb, const Holdings &holdings, const QString &text)
{
    wb.undoStack()->push(new ReplaceHoldingsCommand(wb, holdings, text));
}

void setAssumptions(Workbook &wb, const Assumptions &assumptions, const QString &text, MergeKey key)
{
    wb.undoStack()->push(new SetAssumptionsCommand(wb, assumptions, text, key));
}

void replacePrices(Workbook &wb, const PriceHistory &prices, const QString &text)
{
    wb.undoStack()->push(new ReplacePricesCommand(wb, prices, text));
}

void setTitle(Workbook &wb, const QString &title)
{
    if (title == wb.title())
        return;
    wb.undoStack()->push(new SetTitleCommand(wb, title));
}

tailwise::Result<QString> setCurrency(Workbook &wb, const QString &text)
{
    tailwise::Result<QString> code = parseCurrencyCode(text, "currency");
    if (code && code.value() != wb.currency())
        wb.undoStack()->push(new SetCurrencyCommand(wb, code.value()));
    return code;
}

void setScenarios(Workbook &wb, const std::vector<StressScenario> &scenarios, const QString &text)
{
    wb.undoStack()->push(new SetScenariosCommand(wb, scenarios, text));
}

void setBacktestSettings(Workbook &wb, const BacktestSettings &settings, const QString &text, MergeKey key)
{
    if (wb.contents().backtest == settings)
        return;
    wb.undoStack()->push(new SetBacktestSettingsCommand(wb, settings, text, key));
}

} // namespace tailwise::ui::edit
