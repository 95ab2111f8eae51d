#include "ui/tables/compartment_table_model.h"

#include <QBrush>
#include <QColor>
#include <QFont>
#include <algorithm>
#include <cmath>
#include <limits>

#include "core/model/names.h"
#include "core/model/text.h"
#include "core/balance/solver.h"
#include "ui/style/value_marks.h"
#include "ui/document/project_document.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// Which parameters a kind of compartment uses (DESIGN.md 3.1): producers do not
// consume; detritus pools have only biomass, accumulation and import.
bool applies(tl::CompartmentKind kind, tl::Param p)
{
    using P = tl::Param;
    switch (kind) {
    case tl::CompartmentKind::Consumer: return p != P::DetritusImport;
    case tl::CompartmentKind::Producer:
        return p == P::Biomass || p == P::PB || p == P::EE || p == P::BiomassAccum || p == P::NetEmigration;
    case tl::CompartmentKind::Detritus: return p == P::Biomass || p == P::BiomassAccum || p == P::DetritusImport;
    }
    return false;
}

// Range a typed value must lie in: rates and stocks are non-negative, U is a fraction;
// BA and E may be negative (a stock shrinking, net immigration).
std::pair<double, double> rangeOf(tl::Param p)
{
    switch (p) {
    case tl::Param::Unassim: return {0.0, 1.0};
    case tl::Param::BiomassAccum:
    case tl::Param::NetEmigration: return {-kInf, kInf};
    default: return {0.0, kInf};
    }
}

double solvedValue(const tl::CompartmentBalance& row, tl::Param p)
{
    switch (p) {
    case tl::Param::Biomass: return row.biomass;
    case tl::Param::PB: return row.pb;
    case tl::Param::QB: return row.qb;
    case tl::Param::EE: return row.ee;
    case tl::Param::PQ: return row.pq;
    default: return std::numeric_limits<double>::quiet_NaN();
    }
}

// Solved values are shown to four significant digits, without exponents for field magnitudes.
QString shortNumber(double v)
{
    const double a = std::abs(v);
    if (a >= 1000.0 && a < 1e15) return QString::number(v, 'f', 0);
    return QString::number(v, 'g', 4);
}

}  // namespace

CompartmentTableModel::CompartmentTableModel(ProjectDocument* doc, QObject* parent) : ScenarioTableModel(doc, parent)
{
    refreshFromDocument();
}

std::optional<tl::Param> CompartmentTableModel::paramOf(int column)
{
    const int i = column - kFirstParamColumn;
    if (i < 0 || i >= int(tl::kParamCount)) return std::nullopt;
    return tl::kAllParams[std::size_t(i)];
}

QString CompartmentTableModel::unitOf(const tl::Model& m, tl::Param p)
{
    switch (p) {
    case tl::Param::Biomass: return QString::fromStdString(m.units.biomass());
    case tl::Param::PB:
    case tl::Param::QB: return QString::fromStdString(m.units.rate());
    case tl::Param::BiomassAccum:
    case tl::Param::NetEmigration:
    case tl::Param::DetritusImport: return QString::fromStdString(m.units.flow());
    default: return {};
    }
}

QStringList CompartmentTableModel::rowKeys(const tl::Model& m) const
{
    QStringList keys;
    for (const auto& c : m.compartments()) keys << QString::fromStdString(c.name);
    return keys;
}

QStringList CompartmentTableModel::columnKeys(const tl::Model&) const
{
    QStringList keys{QStringLiteral("name"), QStringLiteral("kind")};
    for (tl::Param p : tl::kAllParams) keys << QString::fromStdString(std::string(tl::paramKey(p)));
    return keys;
}

QVariant CompartmentTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation == Qt::Vertical) {
        if (role == Qt::DisplayRole) return section + 1;
        return {};
    }
    if (role == Qt::DisplayRole) {
        if (section == kNameColumn) return tr("Name");
        if (section == kKindColumn) return tr("Kind");
        if (auto p = paramOf(section)) {
            QString label = QString::fromUtf8(tl::paramSymbol(*p).data(), qsizetype(tl::paramSymbol(*p).size()));
            const QString unit = unitOf(model(), *p);
            return unit.isEmpty() ? label : label + QLatin1Char('\n') + QLatin1Char('(') + unit + QLatin1Char(')');
        }
    }
    if (role == Qt::ToolTipRole) {
        if (auto p = paramOf(section)) {
            switch (*p) {
            case tl::Param::Biomass: return tr("Biomass B. Leave empty if unknown (to be solved).");
            case tl::Param::PB: return tr("Production per unit biomass P/B (at steady state equal to total mortality Z).");
            case tl::Param::QB: return tr("Consumption per unit biomass Q/B.");
            case tl::Param::EE: return tr("Ecotrophic efficiency: share of production used by predators, fleets, migration or accumulation.");
            case tl::Param::PQ: return tr("Gross efficiency P/Q; may stand in for P/B or Q/B.");
            case tl::Param::Unassim: return tr("Unassimilated fraction U of consumption; empty means 0.2 for consumers.");
            case tl::Param::BiomassAccum: return tr("Biomass accumulation BA per year (negative when the stock shrinks).");
            case tl::Param::NetEmigration: return tr("Net emigration E: emigration minus immigration, per year.");
            case tl::Param::DetritusImport: return tr("External import into a detritus pool, per year.");
            }
        }
    }
    return {};
}

QString CompartmentTableModel::cellName(int row, int column) const
{
    const QString name = row < int(model().size()) ? QString::fromStdString(model().compartment(std::size_t(row)).name)
                                                   : QString();
    if (column == kNameColumn) return tr("the name of %1").arg(name);
    if (column == kKindColumn) return tr("the kind of %1").arg(name);
    if (auto p = paramOf(column))
        return tr("%1 of %2").arg(QString::fromUtf8(tl::paramSymbol(*p).data(), qsizetype(tl::paramSymbol(*p).size())), name);
    return name;
}

QString CompartmentTableModel::nameRefusal(const tl::Model& m, int row, const QString& text)
{
    const QString name = text.trimmed();
    const QString current = row >= 0 && row < int(m.size()) ? QString::fromStdString(m.compartment(std::size_t(row)).name) : QString();
    if (name.isEmpty()) return tr("A compartment needs a name; %1 was left as it is.").arg(current);
    for (std::size_t i = 0; i < m.size(); ++i)
        if (int(i) != row && tl::sameName(m.compartment(i).name, name.toStdString()))
            return tr("\"%1\" is taken: compartment %2 is called \"%3\"; names must be unique, and differ by more "
                      "than capitals and spaces.")
                .arg(name).arg(i + 1).arg(QString::fromStdString(m.compartment(i).name));
    return {};
}

bool CompartmentTableModel::takesTyping(int row, int column) const
{
    return column != kKindColumn && isEditable(row, column);
}

bool CompartmentTableModel::isEditable(int row, int column) const
{
    if (row < 0 || row >= int(model().size())) return false;
    if (column == kNameColumn || column == kKindColumn) return true;
    const auto p = paramOf(column);
    if (!p) return false;
    const tl::Compartment& c = model().compartment(std::size_t(row));
    return applies(c.kind, *p) || c.value(*p).has_value();  // a stray value can still be cleared
}

QString CompartmentTableModel::cellText(const tl::Model& m, int row, int column) const
{
    if (row < 0 || row >= int(m.size())) return {};
    const tl::Compartment& c = m.compartment(std::size_t(row));
    if (column == kNameColumn) return QString::fromStdString(c.name);
    if (column == kKindColumn) return QString::fromUtf8(tl::kindKey(c.kind).data(), qsizetype(tl::kindKey(c.kind).size()));
    if (auto p = paramOf(column)) {
        const auto& v = c.value(*p);
        return v ? numberText(*v) : QString();
    }
    return {};
}

QString CompartmentTableModel::applyText(tl::Model& m, int row, int column, const QString& text) const
{
    tl::Compartment& c = m.compartment(std::size_t(row));
    if (column == kNameColumn) {
        if (const QString why = nameRefusal(m, row, text); !why.isEmpty()) return why;
        c.name = text.trimmed().toStdString();
        return {};
    }
    if (column == kKindColumn) {
        const QString t = text.trimmed().toLower();
        std::optional<tl::CompartmentKind> kind = tl::parseKind(t.toStdString());
        for (auto k : {tl::CompartmentKind::Producer, tl::CompartmentKind::Consumer, tl::CompartmentKind::Detritus})
            if (t == kindLabel(k).toLower()) kind = k;
        if (!kind) return tr("The kind of %1 must be producer, consumer or detritus; \"%2\" is none of these.")
                       .arg(QString::fromStdString(c.name), text.trimmed());
        c.kind = *kind;
        return {};
    }
    const auto p = paramOf(column);
    if (!p) return tr("This column cannot be edited.");
    const auto [lo, hi] = rangeOf(*p);
    const Parsed parsed = parseCell(text, cellName(row, column), true, lo, hi);
    if (!parsed.error.isEmpty()) return parsed.error;
    c.value(*p) = parsed.value;
    return {};
}

QVariant CompartmentTableModel::extraData(const tl::Model& m, int row, int column, int role) const
{
    if (row < 0 || row >= int(m.size())) return {};
    const tl::Compartment& c = m.compartment(std::size_t(row));
    const auto p = paramOf(column);
    const tl::CompartmentBalance* solved =
        (sheet().rows.size() == m.size() && sheet().rows[std::size_t(row)].name == c.name) ? &sheet().rows[std::size_t(row)]
                                                                                        : nullptr;
    // An EE above the rules' maximum is marked by an icon and words (issue 13), as in Checks.
    const bool eeAbove = p == tl::Param::EE && solved && c.isLiving() && std::isfinite(solved->ee) &&
                         solved->ee > m.rules.eeMax + tl::kBoundTolerance;
    switch (role) {
    case Qt::DisplayRole:
        if (column == kKindColumn) return kindLabel(c.kind);
        if (eeAbove) return eeAboveMaxText(shortNumber(solved->ee), m.rules.eeMax);
        if (p && !c.value(*p) && applies(c.kind, *p)) {
            if (solved && std::isfinite(solvedValue(*solved, *p))) return shortNumber(solvedValue(*solved, *p));
            if (*p == tl::Param::Unassim && c.kind == tl::CompartmentKind::Consumer) return shortNumber(c.unassimilatedOrDefault());
        }
        if (p && !applies(c.kind, *p) && !c.value(*p)) return QStringLiteral("–");
        return {};
    case Qt::EditRole:
        return {};
    case Qt::DecorationRole:
        if (column == kKindColumn) return kindIcon(c.kind);
        if (eeAbove) return severityIcon(tl::Severity::Error);
        return {};
    case Qt::TextAlignmentRole:
        if (column == kNameColumn || column == kKindColumn) return int(Qt::AlignLeft | Qt::AlignVCenter);
        if (p && !applies(c.kind, *p)) return int(Qt::AlignCenter);
        return {};
    case Qt::FontRole:
        if (p && !c.value(*p)) {
            QFont f;
            f.setItalic(true);
            return f;
        }
        return {};
    case Qt::ForegroundRole:
        if (p && !c.value(*p)) return QBrush(QColor(0x70, 0x70, 0x70));
        return {};
    case Qt::BackgroundRole:
        if (p && !applies(c.kind, *p)) return QBrush(QColor(0xF1, 0xF1, 0xF1));
        return {};
    case Qt::ToolTipRole: {
        if (!p) return {};
        QStringList lines;
        if (eeAbove)
            lines << tr("EE %1 is above the maximum %2: more of the production is used than is produced.")
                         .arg(shortNumber(solved->ee), shortNumber(m.rules.eeMax));
        if (!applies(c.kind, *p)) lines << tr("Not used for a %1.").arg(kindLabel(c.kind).toLower());
        else if (!c.value(*p)) {
            if (solved && std::isfinite(solvedValue(*solved, *p)))
                lines << tr("Unknown; solved value %1.").arg(shortNumber(solvedValue(*solved, *p)));
            else if (*p == tl::Param::Unassim && c.kind == tl::CompartmentKind::Consumer)
                lines << tr("Empty: the default 0.2 is used (common practice).");
            else lines << tr("Unknown (empty).");
        }
        const tl::Confidence& conf = c.confidenceOf(*p);
        if (conf.cv) lines << tr("Data confidence: CV %1").arg(*conf.cv);
        else if (conf.grade != tl::Confidence::Grade::None)
            lines << tr("Data confidence: grade %1").arg(QString::fromStdString(std::string(tl::gradeKey(conf.grade))));
        if (!conf.source.empty()) lines << tr("Source: %1").arg(QString::fromStdString(conf.source));
        return lines.join(QLatin1Char('\n'));
    }
    default: return {};
    }
}

QString CompartmentTableModel::uniqueName(const QString& stem) const
{
    QString name = stem;
    for (int n = 2; !nameRefusal(model(), -1, name).isEmpty(); ++n) name = QStringLiteral("%1 %2").arg(stem).arg(n);
    return name;
}

int CompartmentTableModel::addCompartment(int at, tl::CompartmentKind kind)
{
    tl::Model copy = model();
    tl::Compartment c;
    c.kind = kind;
    c.name = uniqueName(kind == tl::CompartmentKind::Detritus ? tr("New detritus pool")
                        : kind == tl::CompartmentKind::Producer ? tr("New producer")
                                                                : tr("New consumer"))
                 .toStdString();
    const std::size_t where = copy.addCompartment(c, at < 0 ? std::nullopt : std::optional<std::size_t>(std::size_t(at)));
    document()->editModel(copy, tr("Add compartment %1").arg(QString::fromStdString(c.name)));
    return int(where);
}

void CompartmentTableModel::removeCompartments(QList<int> rows)
{
    std::sort(rows.begin(), rows.end());
    rows.erase(std::unique(rows.begin(), rows.end()), rows.end());
    if (rows.isEmpty()) return;
    tl::Model copy = model();
    QStringList names;
    for (auto it = rows.rbegin(); it != rows.rend(); ++it) {
        if (*it < 0 || *it >= int(copy.size())) continue;
        names.prepend(QString::fromStdString(copy.compartment(std::size_t(*it)).name));
        copy.removeCompartment(std::size_t(*it));
    }
    if (names.isEmpty()) return;
    document()->editModel(copy, names.size() == 1 ? tr("Remove compartment %1").arg(names.front())
                                                  : tr("Remove %n compartments", nullptr, int(names.size())));
}

int CompartmentTableModel::moveCompartment(int row, int delta)
{
    const int to = row + delta;
    if (row < 0 || row >= int(model().size()) || to < 0 || to >= int(model().size())) return row;
    tl::Model copy = model();
    const QString name = QString::fromStdString(copy.compartment(std::size_t(row)).name);
    copy.moveCompartment(std::size_t(row), std::size_t(to));
    document()->editModel(copy, delta < 0 ? tr("Move %1 up").arg(name) : tr("Move %1 down").arg(name));
    return to;
}

}  // namespace tl::ui
