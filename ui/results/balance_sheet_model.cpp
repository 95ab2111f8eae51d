#include "ui/results/balance_sheet_model.h"

#include <QBrush>
#include <QFont>
#include <algorithm>
#include <cmath>

#include "core/model/text.h"
#include "core/balance/solver.h"
#include "ui/style/palette.h"
#include "ui/style/value_marks.h"

namespace tl::ui {
namespace {

using Column = BalanceSheetModel::Column;

std::optional<Param> inputParam(Column c)
{
    switch (c) {
    case Column::BiomassIn: case Column::Biomass: return Param::Biomass;
    case Column::PbIn: case Column::Pb: return Param::PB;
    case Column::QbIn: case Column::Qb: return Param::QB;
    case Column::EeIn: case Column::Ee: return Param::EE;
    case Column::PqIn: case Column::Pq: return Param::PQ;
    default: return std::nullopt;
    }
}

bool isInputColumn(Column c)
{
    return c == Column::BiomassIn || c == Column::PbIn || c == Column::QbIn || c == Column::EeIn || c == Column::PqIn;
}

bool isTextColumn(Column c) { return c == Column::Name || c == Column::Kind || c == Column::Status; }

QString displayNumber(double v)
{
    if (!std::isfinite(v)) return {};
    return QString::number(v, 'g', 4);
}

}  // namespace

BalanceSheetModel::BalanceSheetModel(QObject* parent) : QAbstractTableModel(parent) {}

void BalanceSheetModel::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    beginResetModel();
    model_ = model;
    sheet_ = sheet;
    rowProblems_.assign(model_.size(), {});
    for (const Problem& p : sheet_.problems) {
        if (p.compartment.empty()) continue;
        if (auto i = model_.indexOf(p.compartment)) rowProblems_[*i].push_back(&p);
    }
    endResetModel();
}

int BalanceSheetModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(model_.size());
}

int BalanceSheetModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(Column::Count) + (ensemble_ ? 1 : 0);
}

QString BalanceSheetModel::jsonKey(Column c)
{
    switch (c) {
    case Column::Name: return "name";
    case Column::Kind: return "kind";
    case Column::Biomass: return "biomass";
    case Column::Pb: return "pb";
    case Column::Qb: return "qb";
    case Column::Ee: return "ee";
    case Column::Pq: return "pq";
    case Column::TrophicLevel: return "tl";
    case Column::Omnivory: return "oi";
    case Column::Production: return "production";
    case Column::Consumption: return "consumption";
    case Column::Respiration: return "respiration";
    case Column::FlowToDetritus: return "flow_to_detritus";
    default: return {};
    }
}

QString BalanceSheetModel::shortHeader(Column c)
{
    switch (c) {
    case Column::Name: return tr("Compartment");
    case Column::Kind: return tr("Kind");
    case Column::Status: return tr("Status");
    case Column::BiomassIn: return tr("B (input)");
    case Column::Biomass: return tr("B");
    case Column::PbIn: return tr("P/B (input)");
    case Column::Pb: return tr("P/B");
    case Column::QbIn: return tr("Q/B (input)");
    case Column::Qb: return tr("Q/B");
    case Column::EeIn: return tr("EE (input)");
    case Column::Ee: return tr("EE");
    case Column::PqIn: return tr("P/Q (input)");
    case Column::Pq: return tr("P/Q");
    case Column::Unassim: return tr("U");
    case Column::Production: return tr("P");
    case Column::Consumption: return tr("Q");
    case Column::Respiration: return tr("R");
    case Column::FlowToDetritus: return tr("To detritus");
    case Column::Catch: return tr("Catch");
    case Column::M0: return tr("M0");
    case Column::M2: return tr("M2");
    case Column::F: return tr("F");
    case Column::Z: return tr("Z");
    case Column::NetEfficiency: return tr("P/(Q(1-U))");
    case Column::TrophicLevel: return tr("TL");
    case Column::Omnivory: return tr("Omnivory");
    case Column::Count: break;
    }
    return {};
}

QString BalanceSheetModel::unit(Column c) const
{
    const Units& u = model_.units;
    switch (c) {
    case Column::BiomassIn: case Column::Biomass: return QString::fromStdString(u.biomass());
    case Column::PbIn: case Column::Pb: case Column::QbIn: case Column::Qb:
    case Column::M0: case Column::M2: case Column::F: case Column::Z:
        return QString::fromStdString(u.rate());
    case Column::Production: case Column::Consumption: case Column::Respiration:
    case Column::FlowToDetritus: case Column::Catch:
        return QString::fromStdString(u.flow());
    case Column::EeIn: case Column::Ee: case Column::PqIn: case Column::Pq: case Column::Unassim:
    case Column::NetEfficiency: case Column::TrophicLevel: case Column::Omnivory:
        return tr("dimensionless");
    default: return {};
    }
}

std::optional<double> BalanceSheetModel::input(int row, Column c) const
{
    const auto p = inputParam(c);
    if (!p) return std::nullopt;
    return model_.compartment(static_cast<std::size_t>(row)).value(*p);
}

double BalanceSheetModel::value(int row, Column c) const
{
    if (isInputColumn(c)) return input(row, c).value_or(kNotApplicable);
    if (static_cast<std::size_t>(row) >= sheet_.rows.size()) return kNotApplicable;
    const CompartmentBalance& b = sheet_.rows[static_cast<std::size_t>(row)];
    switch (c) {
    case Column::Biomass: return b.biomass;
    case Column::Pb: return b.pb;
    case Column::Qb: return b.qb;
    case Column::Ee: return b.ee;
    case Column::Pq: return b.pq;
    case Column::Unassim: return b.unassim;
    case Column::Production: return b.production;
    case Column::Consumption: return b.consumption;
    case Column::Respiration: return b.respiration;
    case Column::FlowToDetritus: return b.flowToDetritus;
    case Column::Catch: return b.catchTotal;
    case Column::M0: return b.m0;
    case Column::M2: return b.m2;
    case Column::F: return b.f;
    case Column::Z: return b.z;
    case Column::NetEfficiency: return b.netEfficiency;
    case Column::TrophicLevel: return b.tl;
    case Column::Omnivory: return b.oi;
    default: return kNotApplicable;
    }
}

bool BalanceSheetModel::isSolved(int row, Column c) const
{
    if (isInputColumn(c) || static_cast<std::size_t>(row) >= sheet_.rows.size()) return false;
    const auto p = inputParam(c);
    if (!p) return false;
    const auto& solved = sheet_.rows[static_cast<std::size_t>(row)].solved;
    return std::find(solved.begin(), solved.end(), *p) != solved.end();
}

std::optional<Severity> BalanceSheetModel::worstSeverity(int row) const
{
    std::optional<Severity> worst;
    for (const Problem* p : rowProblems_[static_cast<std::size_t>(row)])
        if (!worst || static_cast<int>(p->severity) < static_cast<int>(*worst)) worst = p->severity;
    return worst;
}

QString BalanceSheetModel::statusText(int row) const
{
    const auto& problems = rowProblems_[static_cast<std::size_t>(row)];
    if (problems.empty()) return tr("OK");
    const Problem* first = problems.front();
    for (const Problem* p : problems)
        if (static_cast<int>(p->severity) < static_cast<int>(first->severity)) first = p;
    QString text = severityLabel(first->severity) + ": " + QString::fromStdString(first->message);
    if (problems.size() > 1) text += tr(" (+%n more)", nullptr, static_cast<int>(problems.size() - 1));
    return text;
}

QString BalanceSheetModel::statusToolTip(int row) const
{
    const auto& problems = rowProblems_[static_cast<std::size_t>(row)];
    if (problems.empty()) return tr("No problem found for this compartment.");
    QStringList lines;
    for (const Problem* p : problems) {
        QString line = severityLabel(p->severity) + ": " + QString::fromStdString(p->message);
        if (!p->hint.empty()) line += " — " + QString::fromStdString(p->hint);
        lines << line.toHtmlEscaped();
    }
    return "<p>" + lines.join("<br>") + "</p>";
}

void BalanceSheetModel::setEnsemble(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin)
{
    beginResetModel();
    ensemble_ = std::move(summary);
    ensembleOrigin_ = origin;
    endResetModel();
}

QString BalanceSheetModel::intervalText(int row, const char* quantity) const
{
    if (!ensemble_) return {};
    const auto band = tl::ensemble::interval95(*ensemble_, model_.compartment(static_cast<std::size_t>(row)).name, quantity);
    return band ? QStringLiteral("%1 – %2").arg(displayNumber(band->low), displayNumber(band->high)) : QString();
}

QString BalanceSheetModel::cellText(int row, Column c) const
{
    const Compartment& comp = model_.compartment(static_cast<std::size_t>(row));
    if (static_cast<int>(c) == kEeIntervalColumn) return intervalText(row, "ee");
    switch (c) {
    case Column::Name: return QString::fromStdString(comp.name);
    case Column::Kind: return QString::fromStdString(std::string(kindKey(comp.kind)));
    case Column::Status: return statusText(row);
    default: break;
    }
    const double v = value(row, c);
    return std::isfinite(v) ? QString::fromStdString(formatNumber(v)) : QString();
}

QVariant BalanceSheetModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount() || index.column() >= columnCount()) return {};
    const int row = index.row();
    const auto c = static_cast<Column>(index.column());
    const Compartment& comp = model_.compartment(static_cast<std::size_t>(row));
    if (index.column() == kEeIntervalColumn) {
        if (role == Qt::DisplayRole || role == kValueRole) return cellText(row, c);
        if (role == Qt::TextAlignmentRole) return QVariant::fromValue(Qt::AlignRight | Qt::AlignVCenter);
        if (role == Qt::ToolTipRole)
            return tr("EE over the middle 95 % of the balanced draws (%1)").arg(ensembleOrigin_);
        return {};
    }

    // An EE above the rules' maximum: error icon and words, as in Checks (issue 13).
    const bool eeAbove = c == Column::Ee && comp.isLiving() && std::isfinite(value(row, c)) &&
                         value(row, c) > model_.rules.eeMax + kBoundTolerance;
    switch (role) {
    case Qt::DisplayRole:
        if (c == Column::Name) return QString::fromStdString(comp.name);
        if (c == Column::Kind) return kindLabel(comp.kind);
        if (c == Column::Status) return statusText(row);
        if (eeAbove) return eeAboveMaxText(displayNumber(value(row, c)), model_.rules.eeMax);
        return displayNumber(value(row, c));
    case kValueRole:
        if (isTextColumn(c)) return cellText(row, c);
        return value(row, c);
    case kSolvedRole:
        return isSolved(row, c);
    case Qt::DecorationRole:
        if (c == Column::Status) return statusIcon(worstSeverity(row));
        if (eeAbove) return severityIcon(Severity::Error);
        if (isSolved(row, c)) return solvedIcon();
        return {};
    case Qt::ToolTipRole: {
        const char* quantity = c == Column::Biomass ? "biomass" : c == Column::Pb ? "pb" : c == Column::Qb ? "qb"
                             : c == Column::Ee ? "ee" : c == Column::Pq ? "pq" : c == Column::TrophicLevel ? "tl" : nullptr;
        const QString band = quantity ? intervalText(row, quantity) : QString();
        if (!band.isEmpty())
            return tr("%1 = %2; middle 95 % of the balanced draws: %3 (%4)")
                .arg(shortHeader(c), cellText(row, c), band, ensembleOrigin_);
        if (c == Column::Status) return statusToolTip(row);
        if (eeAbove)
            return tr("EE = %1 is above the maximum %2: more of the production is used than is produced%3.")
                .arg(cellText(row, c), QString::number(model_.rules.eeMax, 'g', 4),
                     isSolved(row, c) ? tr(" (") + solvedLegend() + tr(")") : QString());
        if (isSolved(row, c)) return tr("%1 = %2 %3, %4").arg(shortHeader(c), cellText(row, c), unit(c), solvedLegend());
        if (isInputColumn(c) && !input(row, c)) return tr("No value entered");
        return {};
    }
    case Qt::TextAlignmentRole:
        if (isTextColumn(c)) return QVariant::fromValue(Qt::AlignLeft | Qt::AlignVCenter);
        return QVariant::fromValue(Qt::AlignRight | Qt::AlignVCenter);
    case Qt::ForegroundRole:
        if (isInputColumn(c)) return QBrush(QColor(0x40, 0x40, 0x40));
        return {};
    case Qt::FontRole:
        if (isSolved(row, c)) {
            QFont f;
            f.setBold(true);
            return f;
        }
        return {};
    default:
        return {};
    }
}

QVariant BalanceSheetModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation == Qt::Vertical) {
        // The compartment's name heads its row, so it stays in view while the table
        // scrolls sideways (the page hides the Name column; copies keep it).
        if (section < 0 || section >= rowCount()) return {};
        const Compartment& comp = model_.compartment(static_cast<std::size_t>(section));
        if (role == Qt::DisplayRole) return QString::fromStdString(comp.name);
        if (role == Qt::DecorationRole) return kindIcon(comp.kind);
        if (role == Qt::TextAlignmentRole) return QVariant::fromValue(Qt::AlignLeft | Qt::AlignVCenter);
        if (role == Qt::ToolTipRole) return tr("%1, %2").arg(QString::fromStdString(comp.name), kindLabel(comp.kind).toLower());
        return {};
    }
    if (section < 0 || section >= columnCount()) return {};
    if (section == kEeIntervalColumn) {
        if (role == Qt::DisplayRole) return tr("EE, 95 % of draws\n–");
        if (role == Qt::ToolTipRole) return tr("EE over the middle 95 % of the balanced draws of the scenario's newest "
                                               "stored ensemble run (%1)").arg(ensembleOrigin_);
        return {};
    }
    const auto c = static_cast<Column>(section);
    if (role == Qt::DisplayRole) {
        const QString u = unit(c);
        if (u.isEmpty()) return shortHeader(c);
        return shortHeader(c) + "\n" + (u == tr("dimensionless") ? QStringLiteral("–") : u);
    }
    if (role == Qt::ToolTipRole) {
        switch (c) {
        case Column::M0: return tr("Other mortality, (P/B)(1 - EE)");
        case Column::M2: return tr("Predation mortality rate");
        case Column::F: return tr("Fishing mortality, catch / B");
        case Column::Z: return tr("Total mortality, equal to P/B at steady state");
        case Column::NetEfficiency: return tr("Net efficiency, P / (Q (1 - U))");
        case Column::Omnivory: return tr("Omnivory index (Pauly et al. 1993)");
        case Column::TrophicLevel: return tr("Effective trophic level");
        case Column::Unassim: return tr("Unassimilated fraction of consumption");
        case Column::FlowToDetritus: return tr("Flow to detritus, (1-EE)P + UQ + dead discards");
        default: return shortHeader(c) + (unit(c).isEmpty() ? QString() : " [" + unit(c) + "]");
        }
    }
    return {};
}

QString BalanceSheetModel::toText(const std::vector<int>& rows, QChar separator) const
{
    auto quote = [separator](QString s) {
        if (separator == ',' && (s.contains(',') || s.contains('"') || s.contains('\n'))) {
            s.replace("\"", "\"\"");
            return "\"" + s + "\"";
        }
        if (separator != ',') s.replace(separator, ' ').replace('\n', ' ');
        return s;
    };
    QStringList lines;
    QStringList header;
    for (int c = 0; c < columnCount(); ++c) {
        const auto col = static_cast<Column>(c);
        const QString u = unit(col);
        if (c == kEeIntervalColumn) header << quote(tr("EE, 95 % of draws"));
        else header << quote(shortHeader(col) + (u.isEmpty() ? QString() : " [" + u + "]"));
    }
    lines << header.join(separator);
    for (int r : rows) {
        QStringList cells;
        for (int c = 0; c < columnCount(); ++c) cells << quote(cellText(r, static_cast<Column>(c)));
        lines << cells.join(separator);
    }
    return lines.join('\n') + '\n';
}

}  // namespace tl::ui
