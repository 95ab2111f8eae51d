#include "ui/tables/harvest_table_model.h"

#include "core/model/names.h"

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

// --- HarvestTableModel ----------------------------------------------------------------

HarvestTableModel::HarvestTableModel(ProjectDocument* doc, QObject* parent) : ScenarioTableModel(doc, parent)
{
    refreshFromDocument();
}

void HarvestTableModel::indexModel(const tl::Model& m) { rows_ = m.living(); }

QStringList HarvestTableModel::rowKeys(const tl::Model& m) const
{
    QStringList keys;
    for (std::size_t i : rows_) keys << qs(m.compartment(i).name);
    return keys;
}

QStringList HarvestTableModel::columnKeys(const tl::Model& m) const
{
    QStringList keys;
    for (const auto& f : m.fleets())
        keys << qs(f.name) + QStringLiteral("/landings") << qs(f.name) + QStringLiteral("/discards")
             << qs(f.name) + QStringLiteral("/survival");
    return keys;
}

int HarvestTableModel::rowOfCompartment(std::size_t compartment) const { return rowOf(rows_, compartment); }

QVariant HarvestTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    const tl::Model& m = model();
    if (orientation == Qt::Vertical)
        return section < 0 || section >= int(rows_.size()) ? QVariant() : compartmentHeader(rows_[std::size_t(section)], role);
    const int f = fleetOf(section);
    if (f >= int(m.fleets().size())) return {};
    const QString fleet = qs(m.fleet(std::size_t(f)).name);
    const QString flow = qs(m.units.flow());
    if (role == Qt::DisplayRole) {
        switch (fieldOf(section)) {
        case Field::Landings: return tr("%1\nlandings (%2)").arg(fleet, flow);
        case Field::Discards: return tr("%1\ndiscards (%2)").arg(fleet, flow);
        case Field::Survival: return tr("%1\ndiscards surviving").arg(fleet);
        }
    }
    if (role == Qt::ToolTipRole && fieldOf(section) == Field::Survival)
        return tr("Fraction of %1's discards returned alive (0–1); the rest goes to detritus.").arg(fleet);
    return {};
}

QString HarvestTableModel::cellName(int row, int column) const
{
    if (row < 0 || row >= int(rows_.size()) || fleetOf(column) >= int(model().fleets().size())) return {};
    const QString comp = qs(model().compartment(rows_[std::size_t(row)]).name);
    const QString fleet = qs(model().fleet(std::size_t(fleetOf(column))).name);
    switch (fieldOf(column)) {
    case Field::Landings: return tr("the landings of %1 by %2").arg(comp, fleet);
    case Field::Discards: return tr("the discards of %1 by %2").arg(comp, fleet);
    case Field::Survival: return tr("the discard survival of %1 in %2").arg(comp, fleet);
    }
    return {};
}

bool HarvestTableModel::isEditable(int row, int column) const
{
    return row >= 0 && row < int(rows_.size()) && column >= 0 && fleetOf(column) < int(model().fleets().size());
}

QString HarvestTableModel::cellText(const tl::Model& m, int row, int column) const
{
    if (!isEditable(row, column)) return {};
    const tl::Fleet& f = m.fleet(std::size_t(fleetOf(column)));
    const std::size_t i = rows_[std::size_t(row)];
    switch (fieldOf(column)) {
    case Field::Landings: return numberOrEmpty(f.landings[i]);
    case Field::Discards: return numberOrEmpty(f.discards[i]);
    case Field::Survival: return numberOrEmpty(f.discardSurvival[i]);
    }
    return {};
}

QString HarvestTableModel::applyText(tl::Model& m, int row, int column, const QString& text) const
{
    const bool fraction = fieldOf(column) == Field::Survival;
    const Parsed parsed = parseCell(text, cellName(row, column), true, 0.0,
                                    fraction ? 1.0 : std::numeric_limits<double>::infinity());
    if (!parsed.error.isEmpty()) return parsed.error;
    tl::Fleet& f = m.fleet(std::size_t(fleetOf(column)));
    const std::size_t i = rows_[std::size_t(row)];
    const double v = parsed.value.value_or(0.0);
    switch (fieldOf(column)) {
    case Field::Landings: f.landings[i] = v; break;
    case Field::Discards: f.discards[i] = v; break;
    case Field::Survival: f.discardSurvival[i] = v; break;
    }
    return {};
}

QVariant HarvestTableModel::extraData(const tl::Model&, int row, int column, int role) const
{
    if (role == Qt::BackgroundRole && fleetOf(column) % 2 == 1) return QBrush(QColor(0xF6, 0xF6, 0xF9));
    if (role == Qt::ToolTipRole) return cellName(row, column);
    return {};
}

namespace {
// The fleet (other than `except`) whose name equals `name` up to capitals and spaces.
std::optional<std::size_t> fleetNamed(const tl::Model& m, const QString& name, int except = -1)
{
    for (std::size_t f = 0; f < m.fleets().size(); ++f)
        if (int(f) != except && tl::sameName(m.fleet(f).name, name.toStdString())) return f;
    return std::nullopt;
}
}  // namespace

QString HarvestTableModel::addFleet(const QString& name, QString* why)
{
    QString stem = name.trimmed().isEmpty() ? tr("Fleet") : name.trimmed();
    QString unique = stem;
    for (int n = 2; fleetNamed(model(), unique); ++n) unique = QStringLiteral("%1 %2").arg(stem).arg(n);
    if (!name.trimmed().isEmpty() && unique != stem) {
        if (why) *why = tr("A fleet called \"%1\" already exists.").arg(stem);
        return {};
    }
    tl::Model copy = model();
    copy.addFleet(unique.toStdString());
    document()->editModel(copy, tr("Add fleet %1").arg(unique));
    return unique;
}

bool HarvestTableModel::renameFleet(int fleet, const QString& name, QString* why)
{
    const QString n = name.trimmed();
    if (fleet < 0 || fleet >= int(model().fleets().size())) return false;
    if (n.isEmpty()) {
        if (why) *why = tr("A fleet needs a name.");
        return false;
    }
    if (const auto other = fleetNamed(model(), n, fleet)) {
        if (why) *why = tr("A fleet called \"%1\" already exists.").arg(qs(model().fleet(*other).name));
        return false;
    }
    tl::Model copy = model();
    const QString old = qs(copy.fleet(std::size_t(fleet)).name);
    copy.fleet(std::size_t(fleet)).name = n.toStdString();
    document()->editModel(copy, tr("Rename fleet %1 to %2").arg(old, n));
    return true;
}

void HarvestTableModel::removeFleet(int fleet)
{
    if (fleet < 0 || fleet >= int(model().fleets().size())) return;
    tl::Model copy = model();
    const QString old = qs(copy.fleet(std::size_t(fleet)).name);
    copy.removeFleet(std::size_t(fleet));
    document()->editModel(copy, tr("Remove fleet %1").arg(old));
}

}  // namespace tl::ui
