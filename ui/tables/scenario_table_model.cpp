#include "ui/tables/scenario_table_model.h"

#include "ui/style/palette.h"

#include <QFont>
#include <QLocale>
#include <cmath>
#include <QPalette>
#include <algorithm>
#include <climits>
#include <limits>
#include <map>
#include <tuple>

#include "core/model/text.h"
#include "ui/document/project_document.h"

namespace tl::ui {

QString BlockEditReport::summary() const
{
    QStringList parts;
    parts << QObject::tr("%n cell(s) taken", nullptr, taken);
    if (!refused.empty()) parts << QObject::tr("%n refused", nullptr, static_cast<int>(refused.size()));
    if (outside > 0) parts << QObject::tr("%n outside the table, ignored", nullptr, outside);
    QString text = parts.join(QStringLiteral(", ")) + QLatin1Char('.');
    const std::size_t shown = std::min<std::size_t>(refused.size(), 6);
    for (std::size_t i = 0; i < shown; ++i) text += QLatin1Char('\n') + refused[i].reason;
    if (refused.size() > shown) text += QLatin1Char('\n') + QObject::tr("… and %n more.", nullptr, int(refused.size() - shown));
    return text;
}

QString ScenarioTableModel::numberText(double v)
{
    const double a = std::abs(v);
    const bool plain = a == 0.0 || (a >= 1e-6 && a < 1e15);
    return QString::number(v, plain ? 'f' : 'g', QLocale::FloatingPointShortest);
}

ScenarioTableModel::ScenarioTableModel(ProjectDocument* doc, QObject* parent) : QAbstractTableModel(parent), doc_(doc)
{
    connect(doc_, &ProjectDocument::modelChanged, this, &ScenarioTableModel::refreshFromDocument);
}

const tl::Model& ScenarioTableModel::model() const { return doc_->model(); }

void ScenarioTableModel::indexModel(const tl::Model&) {}

QVariant ScenarioTableModel::compartmentHeader(std::size_t c, int role) const
{
    const tl::Model& m = model();
    if (c >= m.size()) return {};
    if (role == Qt::DisplayRole) return QString::fromStdString(m.compartment(c).name);
    if (role == Qt::DecorationRole) return kindIcon(m.compartment(c).kind);
    return {};
}

int ScenarioTableModel::rowOf(const std::vector<std::size_t>& rows, std::size_t c)
{
    for (std::size_t r = 0; r < rows.size(); ++r)
        if (rows[r] == c) return int(r);
    return -1;
}

namespace {
// Same layout: as many keys, and none that changed is found elsewhere in the old list —
// a rename, not an insertion, removal or move. A rename keeps the view (and an open
// editor, the current cell and Tab navigation); anything else resets it.
bool sameLayout(const QStringList& before, const QStringList& after)
{
    if (before.size() != after.size()) return false;
    for (qsizetype i = 0; i < after.size(); ++i)
        if (before[i] != after[i] && before.contains(after[i])) return false;
    return true;
}
}  // namespace

void ScenarioTableModel::refreshFromDocument()
{
    indexModel(model());
    const QStringList rows = rowKeys(model());
    const QStringList cols = columnKeys(model());
    if (!sameLayout(rowKeys_, rows) || !sameLayout(columnKeys_, cols)) {
        beginResetModel();
        rowKeys_ = rows;
        columnKeys_ = cols;
        endResetModel();
        return;
    }
    rowKeys_ = rows;
    columnKeys_ = cols;
    if (!rows.isEmpty() && !cols.isEmpty()) emit dataChanged(index(0, 0), index(int(rows.size()) - 1, int(cols.size()) - 1));
    emit headerDataChanged(Qt::Horizontal, 0, std::max<int>(0, int(cols.size()) - 1));
    emit headerDataChanged(Qt::Vertical, 0, std::max<int>(0, int(rows.size()) - 1));
}

void ScenarioTableModel::setBalanceSheet(const tl::BalanceSheet& sheet)
{
    sheet_ = sheet;
    if (rowCount() > 0 && columnCount() > 0) emit dataChanged(index(0, 0), index(rowCount() - 1, columnCount() - 1));
}

int ScenarioTableModel::rowCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : int(rowKeys_.size()); }
int ScenarioTableModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : int(columnKeys_.size());
}

QVariant ScenarioTableModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount() || index.column() >= columnCount()) return {};
    if (role == Qt::DisplayRole || role == Qt::EditRole) {
        // The subclass may show something else than the edit text (a label, a solved value).
        if (role == Qt::DisplayRole) {
            const QVariant extra = extraData(model(), index.row(), index.column(), role);
            if (extra.isValid()) return extra;
        }
        return cellText(model(), index.row(), index.column());
    }
    if (role == Qt::TextAlignmentRole) {
        const QVariant extra = extraData(model(), index.row(), index.column(), role);
        return extra.isValid() ? extra : QVariant(int(Qt::AlignRight | Qt::AlignVCenter));
    }
    return extraData(model(), index.row(), index.column(), role);
}

QVariant ScenarioTableModel::extraData(const tl::Model&, int, int, int) const { return {}; }

Qt::ItemFlags ScenarioTableModel::flags(const QModelIndex& index) const
{
    if (!index.isValid()) return Qt::NoItemFlags;
    Qt::ItemFlags f = Qt::ItemIsSelectable | Qt::ItemIsEnabled;
    if (isEditable(index.row(), index.column())) f |= Qt::ItemIsEditable;
    return f;
}

ScenarioTableModel::Parsed ScenarioTableModel::parseCell(const QString& text, const QString& cell, bool allowEmpty,
                                                         double min, double max)
{
    Parsed out;
    const QString t = text.trimmed();
    if (t.isEmpty()) {
        if (!allowEmpty) out.error = QObject::tr("%1 needs a number; an empty cell is not allowed here.").arg(cell);
        return out;
    }
    const std::optional<double> v = tl::parseNumber(t.toStdString());
    if (!v) {
        QString hint = QObject::tr("a number such as 12.5, with '.' as the decimal mark");
        if (t.contains(QLatin1Char(',')) && tl::parseNumber(QString(t).replace(',', '.').toStdString()))
            hint += QObject::tr(" (write %1 instead of %2)").arg(QString(t).replace(',', '.'), t);
        if (allowEmpty) hint += QObject::tr(", or an empty cell for unknown");
        out.error = QObject::tr("%1 expects %2; \"%3\" is not a number.").arg(cell, hint, t);
        return out;
    }
    if (*v < min || *v > max) {
        if (max == std::numeric_limits<double>::infinity())
            out.error = QObject::tr("%1 cannot be negative; \"%2\" was refused.").arg(cell, t);
        else
            out.error = QObject::tr("%1 must lie between %2 and %3; \"%4\" was refused.").arg(cell).arg(min).arg(max).arg(t);
        return out;
    }
    out.value = v;
    return out;
}

bool ScenarioTableModel::setData(const QModelIndex& index, const QVariant& value, int role)
{
    if (role != Qt::EditRole || !index.isValid() || !isEditable(index.row(), index.column())) return false;
    const QString text = value.toString();
    if (text == cellText(model(), index.row(), index.column())) return true;  // unchanged
    tl::Model copy = model();
    const QString error = applyText(copy, index.row(), index.column(), text);
    if (!error.isEmpty()) {
        lastRefusal_ = error;
        emit inputRefused(error);
        return false;
    }
    lastRefusal_.clear();
    const QString shown = text.trimmed();
    const QString undoText = shown.isEmpty() ? tr("Clear %1").arg(cellName(index.row(), index.column()))
                                             : tr("Set %1 to %2").arg(cellName(index.row(), index.column()), shown);
    doc_->editModel(copy, undoText);
    return true;
}

BlockEditReport ScenarioTableModel::applyBlock(const std::vector<std::tuple<int, int, QString>>& cells,
                                               const QString& undoText)
{
    BlockEditReport report;
    tl::Model copy = model();
    for (const auto& [r, c, text] : cells) {
        if (r < 0 || c < 0 || r >= rowCount() || c >= columnCount()) {
            ++report.outside;
            continue;
        }
        if (!isEditable(r, c)) {
            if (text.trimmed().isEmpty()) continue;  // nothing asked of a cell that takes nothing
            report.refused.push_back({r, c, text, tr("%1 cannot be edited.").arg(cellName(r, c))});
            continue;
        }
        // Apply on a scratch copy so a refused cell leaves no partial change behind.
        tl::Model trial = copy;
        const QString error = applyText(trial, r, c, text);
        if (!error.isEmpty()) {
            report.refused.push_back({r, c, text, error});
            continue;
        }
        copy = std::move(trial);
        ++report.taken;
    }
    if (report.taken > 0) doc_->editModel(copy, undoText.arg(report.taken));
    lastRefusal_ = report.refused.empty() ? QString() : report.refused.front().reason;
    return report;
}

BlockEditReport ScenarioTableModel::pasteText(const QModelIndex& topLeft, const QString& tabSeparated)
{
    QString text = tabSeparated;
    text.replace(QStringLiteral("\r\n"), QStringLiteral("\n")).replace(QLatin1Char('\r'), QLatin1Char('\n'));
    if (text.endsWith(QLatin1Char('\n'))) text.chop(1);  // spreadsheets end the block with a newline
    const int r0 = topLeft.isValid() ? topLeft.row() : 0;
    const int c0 = topLeft.isValid() ? topLeft.column() : 0;
    std::vector<std::tuple<int, int, QString>> cells;
    const QStringList lines = text.split(QLatin1Char('\n'));
    for (int i = 0; i < lines.size(); ++i) {
        const QStringList fields = lines[i].split(QLatin1Char('\t'));
        for (int j = 0; j < fields.size(); ++j) cells.emplace_back(r0 + i, c0 + j, fields[j]);
    }
    return applyBlock(cells, tr("Paste %1 cells"));
}

BlockEditReport ScenarioTableModel::fillDown(const QModelIndexList& selection)
{
    // For each selected column, the topmost selected cell is copied into the others.
    std::map<int, std::vector<int>> rowsByColumn;
    for (const QModelIndex& i : selection) rowsByColumn[i.column()].push_back(i.row());
    std::vector<std::tuple<int, int, QString>> cells;
    for (auto& [c, rows] : rowsByColumn) {
        std::sort(rows.begin(), rows.end());
        if (rows.size() == 1) {  // a single cell takes the value above it, as in a spreadsheet
            if (rows.front() > 0) cells.emplace_back(rows.front(), c, cellText(model(), rows.front() - 1, c));
            continue;
        }
        const QString source = cellText(model(), rows.front(), c);
        for (std::size_t k = 1; k < rows.size(); ++k) cells.emplace_back(rows[k], c, source);
    }
    return applyBlock(cells, tr("Fill down %1 cells"));
}

BlockEditReport ScenarioTableModel::clearCells(const QModelIndexList& selection)
{
    std::vector<std::tuple<int, int, QString>> cells;
    for (const QModelIndex& i : selection)
        if (isEditable(i.row(), i.column()) && !cellText(model(), i.row(), i.column()).isEmpty())
            cells.emplace_back(i.row(), i.column(), QString());
    return applyBlock(cells, tr("Clear %1 cells"));
}

QString ScenarioTableModel::copyText(const QModelIndexList& selection) const
{
    if (selection.isEmpty()) return {};
    int r0 = INT_MAX, r1 = -1, c0 = INT_MAX, c1 = -1;
    for (const QModelIndex& i : selection) {
        r0 = std::min(r0, i.row()), r1 = std::max(r1, i.row());
        c0 = std::min(c0, i.column()), c1 = std::max(c1, i.column());
    }
    QStringList lines;
    for (int r = r0; r <= r1; ++r) {
        QStringList fields;
        for (int c = c0; c <= c1; ++c)
            fields << (selection.contains(index(r, c)) ? cellText(model(), r, c) : QString());
        lines << fields.join(QLatin1Char('\t'));
    }
    return lines.join(QLatin1Char('\n')) + QLatin1Char('\n');
}

}  // namespace tl::ui
