#include "ui/tables/diet_table_model.h"

#include <QBrush>
#include <QColor>
#include <QFont>
#include <cmath>

#include "core/model/text.h"
#include "ui/document/project_document.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

std::vector<std::size_t> consumersOf(const tl::Model& m)
{
    std::vector<std::size_t> out;
    for (std::size_t i = 0; i < m.size(); ++i)
        if (m.compartment(i).kind == tl::CompartmentKind::Consumer) out.push_back(i);
    return out;
}

QString qs(const std::string& s) { return QString::fromStdString(s); }

}  // namespace

DietTableModel::DietTableModel(ProjectDocument* doc, QObject* parent) : ScenarioTableModel(doc, parent)
{
    refreshFromDocument();
}

void DietTableModel::indexModel(const tl::Model& m) { predators_ = consumersOf(m); }

QStringList DietTableModel::rowKeys(const tl::Model& m) const
{
    QStringList keys;
    for (std::size_t i : predators_) keys << qs(m.compartment(i).name);
    return keys;
}

QStringList DietTableModel::columnKeys(const tl::Model& m) const
{
    QStringList keys;
    for (const auto& c : m.compartments()) keys << qs(c.name);
    keys << QStringLiteral("\x01import") << QStringLiteral("\x01sum");
    return keys;
}

int DietTableModel::rowOfPredator(std::size_t compartment) const { return rowOf(predators_, compartment); }

std::vector<bool> DietTableModel::usedPrey() const
{
    std::vector<bool> used(model().size(), false);
    for (std::size_t pred : predators_)
        for (std::size_t prey = 0; prey < model().size(); ++prey)
            if (model().diet(pred, prey) != 0.0) used[prey] = true;
    return used;
}

QVariant DietTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    const tl::Model& m = model();
    if (orientation == Qt::Vertical) {
        if (section < 0 || section >= int(predators_.size())) return {};
        if (role == Qt::DisplayRole) return qs(m.compartment(predators_[std::size_t(section)]).name);
        if (role == Qt::DecorationRole) {
            // The row's sum status also at its start, so it shows on wide matrices without scrolling.
            const double sum = m.dietRowSum(predators_[std::size_t(section)]);
            return std::abs(sum - 1.0) <= m.rules.dietSumTolerance ? okIcon() : severityIcon(tl::Severity::Warning);
        }
        if (role == Qt::ToolTipRole) return tr("Diet of %1: fractions of its food, summing to 1").arg(qs(m.compartment(predators_[std::size_t(section)]).name));
        return {};
    }
    if (role == Qt::DisplayRole) {
        if (section < int(m.size())) return qs(m.compartment(std::size_t(section)).name);
        if (section == importColumn()) return tr("Import");
        if (section == sumColumn()) return tr("Row sum");
    }
    if (role == Qt::DecorationRole && section < int(m.size())) return kindIcon(m.compartment(std::size_t(section)).kind);
    if (role == Qt::ToolTipRole) {
        if (section < int(m.size())) return tr("Prey: %1 (%2)").arg(qs(m.compartment(std::size_t(section)).name), kindLabel(m.compartment(std::size_t(section)).kind).toLower());
        if (section == importColumn()) return tr("Food taken outside the modelled area");
        if (section == sumColumn()) return tr("Each predator's diet should sum to 1");
    }
    return {};
}

QString DietTableModel::cellName(int row, int column) const
{
    if (row < 0 || row >= int(predators_.size())) return {};
    const QString pred = qs(model().compartment(predators_[std::size_t(row)]).name);
    if (column < int(model().size())) return tr("the diet share of %1 in %2").arg(qs(model().compartment(std::size_t(column)).name), pred);
    if (column == importColumn()) return tr("the imported diet share of %1").arg(pred);
    return tr("the diet sum of %1").arg(pred);
}

bool DietTableModel::isEditable(int row, int column) const
{
    return row >= 0 && row < int(predators_.size()) && column >= 0 && column <= importColumn();
}

QString DietTableModel::cellText(const tl::Model& m, int row, int column) const
{
    if (row < 0 || row >= int(predators_.size())) return {};
    const std::size_t pred = predators_[std::size_t(row)];
    double v = 0.0;
    if (column < int(m.size())) v = m.diet(pred, std::size_t(column));
    else if (column == int(m.size())) v = m.dietImport(pred);
    else return QString::number(m.dietRowSum(pred), 'f', 3);
    return v == 0.0 ? QString() : numberText(v);
}

QString DietTableModel::applyText(tl::Model& m, int row, int column, const QString& text) const
{
    const Parsed parsed = parseCell(text, cellName(row, column), true, 0.0, 1.0);
    if (!parsed.error.isEmpty()) return parsed.error;
    const std::size_t pred = predators_[std::size_t(row)];
    const double v = parsed.value.value_or(0.0);  // empty = not eaten
    if (column < int(m.size())) m.setDiet(pred, std::size_t(column), v);
    else m.setDietImport(pred, v);
    return {};
}

QVariant DietTableModel::extraData(const tl::Model& m, int row, int column, int role) const
{
    if (row < 0 || row >= int(predators_.size())) return {};
    const std::size_t pred = predators_[std::size_t(row)];
    const double tol = m.rules.dietSumTolerance;
    const double sum = m.dietRowSum(pred);
    const bool sumOk = std::abs(sum - 1.0) <= tol;
    if (column == sumColumn()) {
        switch (role) {
        case Qt::DisplayRole:
            if (sum == 0.0) return tr("0 — no diet yet");
            if (sumOk) return tr("%1 — sums to 1").arg(sum, 0, 'f', 3);
            return sum < 1.0 ? tr("%1 — short by %2").arg(sum, 0, 'f', 3).arg(1.0 - sum, 0, 'f', 3)
                             : tr("%1 — over by %2").arg(sum, 0, 'f', 3).arg(sum - 1.0, 0, 'f', 3);
        case Qt::DecorationRole: return sumOk ? okIcon() : severityIcon(tl::Severity::Warning);
        case Qt::TextAlignmentRole: return int(Qt::AlignLeft | Qt::AlignVCenter);
        case Qt::FontRole: {
            QFont f;
            f.setBold(!sumOk);
            return f;
        }
        case Qt::BackgroundRole: return QBrush(QColor(0xF4, 0xF4, 0xF0));
        case Qt::ToolTipRole:
            return sumOk ? tr("The diet of %1 sums to 1.").arg(qs(m.compartment(pred).name))
                         : tr("The diet of %1 sums to %2; use \"Normalise row\" to scale it to 1.").arg(qs(m.compartment(pred).name)).arg(sum);
        default: return {};
        }
    }
    if (role == Qt::BackgroundRole) {
        const double v = column < int(m.size()) ? m.diet(pred, std::size_t(column)) : m.dietImport(pred);
        if (v <= 0.0) return {};
        // Light shading by value: sky blue whose strength follows the share.
        QColor c = okabe_ito::kSkyBlue;
        c.setAlphaF(float(0.12 + 0.5 * std::min(1.0, v)));
        return QBrush(c);
    }
    if (role == Qt::ToolTipRole) return cellName(row, column);
    return {};
}

bool DietTableModel::normaliseRow(int row, QString* why)
{
    if (row < 0 || row >= int(predators_.size())) return false;
    tl::Model copy = model();
    const std::size_t pred = predators_[std::size_t(row)];
    const double sum = copy.dietRowSum(pred);
    const QString name = qs(copy.compartment(pred).name);
    if (sum <= 0.0) {
        if (why) *why = tr("The diet of %1 is empty; there is nothing to scale.").arg(name);
        return false;
    }
    for (std::size_t prey = 0; prey < copy.size(); ++prey) copy.setDiet(pred, prey, copy.diet(pred, prey) / sum);
    copy.setDietImport(pred, copy.dietImport(pred) / sum);
    document()->editModel(copy, tr("Normalise the diet of %1").arg(name));
    return true;
}

}  // namespace tl::ui
