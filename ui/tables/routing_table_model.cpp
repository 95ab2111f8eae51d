#include "ui/tables/routing_table_model.h"

#include <QBrush>
#include <QColor>
#include <QFont>
#include <cmath>
#include <limits>

#include "core/model/text.h"
#include "ui/document/project_document.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }
QString numberOrEmpty(double v) { return v == 0.0 ? QString() : ScenarioTableModel::numberText(v); }

}  // namespace

RoutingTableModel::RoutingTableModel(ProjectDocument* doc, QObject* parent) : ScenarioTableModel(doc, parent)
{
    refreshFromDocument();
}

void RoutingTableModel::indexModel(const tl::Model& m)
{
    rows_ = m.living();
    pools_ = m.detritusPools();
}

QStringList RoutingTableModel::rowKeys(const tl::Model& m) const
{
    QStringList keys;
    for (std::size_t i : rows_) keys << qs(m.compartment(i).name);
    return keys;
}

QStringList RoutingTableModel::columnKeys(const tl::Model& m) const
{
    QStringList keys;
    for (std::size_t i : pools_) keys << qs(m.compartment(i).name);
    keys << QStringLiteral("\x01sum");
    return keys;
}

int RoutingTableModel::rowOfCompartment(std::size_t compartment) const { return rowOf(rows_, compartment); }

QVariant RoutingTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    const tl::Model& m = model();
    if (orientation == Qt::Vertical)
        return section < 0 || section >= int(rows_.size()) ? QVariant() : compartmentHeader(rows_[std::size_t(section)], role);
    if (section == sumColumn()) return role == Qt::DisplayRole ? QVariant(tr("Row sum")) : QVariant();
    if (section < 0 || section >= int(pools_.size())) return {};
    if (role == Qt::DisplayRole) return qs(m.compartment(pools_[std::size_t(section)]).name);
    if (role == Qt::DecorationRole) return kindIcon(tl::CompartmentKind::Detritus);
    if (role == Qt::ToolTipRole) return tr("Share of each compartment's detritus flow going to %1").arg(qs(m.compartment(pools_[std::size_t(section)]).name));
    return {};
}

QString RoutingTableModel::cellName(int row, int column) const
{
    if (row < 0 || row >= int(rows_.size())) return {};
    const QString src = qs(model().compartment(rows_[std::size_t(row)]).name);
    if (column < 0 || column >= int(pools_.size())) return tr("the routing sum of %1").arg(src);
    return tr("the share of %1's detritus flow going to %2").arg(src, qs(model().compartment(pools_[std::size_t(column)]).name));
}

bool RoutingTableModel::isEditable(int row, int column) const
{
    return row >= 0 && row < int(rows_.size()) && column >= 0 && column < int(pools_.size());
}

QString RoutingTableModel::cellText(const tl::Model& m, int row, int column) const
{
    if (row < 0 || row >= int(rows_.size())) return {};
    const std::size_t src = rows_[std::size_t(row)];
    if (column == sumColumn()) {
        double sum = 0.0;
        for (std::size_t p : pools_) sum += m.effectiveRouting(src, p);
        return QString::number(sum, 'f', 3);
    }
    if (column < 0 || column >= int(pools_.size())) return {};
    return numberOrEmpty(m.routing(src, pools_[std::size_t(column)]));
}

QString RoutingTableModel::applyText(tl::Model& m, int row, int column, const QString& text) const
{
    const Parsed parsed = parseCell(text, cellName(row, column), true, 0.0, 1.0);
    if (!parsed.error.isEmpty()) return parsed.error;
    m.setRouting(rows_[std::size_t(row)], pools_[std::size_t(column)], parsed.value.value_or(0.0));
    return {};
}

QVariant RoutingTableModel::extraData(const tl::Model& m, int row, int column, int role) const
{
    if (row < 0 || row >= int(rows_.size())) return {};
    const std::size_t src = rows_[std::size_t(row)];
    const bool isDefault = !m.hasExplicitRouting(src);
    if (column == sumColumn()) {
        double sum = 0.0;
        for (std::size_t p : pools_) sum += m.effectiveRouting(src, p);
        const bool ok = pools_.empty() || std::abs(sum - 1.0) <= 1e-6;
        if (role == Qt::DecorationRole) return ok ? okIcon() : severityIcon(tl::Severity::Warning);
        if (role == Qt::DisplayRole)
            return isDefault ? tr("1 — all to the first pool (default)")
                             : ok ? tr("%1 — sums to 1").arg(sum, 0, 'f', 3) : tr("%1 — should be 1").arg(sum, 0, 'f', 3);
        if (role == Qt::TextAlignmentRole) return int(Qt::AlignLeft | Qt::AlignVCenter);
        if (role == Qt::BackgroundRole) return QBrush(QColor(0xF4, 0xF4, 0xF0));
        return {};
    }
    if (column < 0 || column >= int(pools_.size())) return {};
    if (isDefault) {
        const double eff = m.effectiveRouting(src, pools_[std::size_t(column)]);
        if (role == Qt::DisplayRole && eff > 0.0) return tr("%1 (default)").arg(eff);
        if (role == Qt::FontRole) {
            QFont f;
            f.setItalic(true);
            return f;
        }
        if (role == Qt::ForegroundRole) return QBrush(QColor(0x70, 0x70, 0x70));
    }
    if (role == Qt::ToolTipRole) return cellName(row, column);
    return {};
}

}  // namespace tl::ui
