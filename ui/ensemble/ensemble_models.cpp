#include "ui/ensemble/ensemble_models.h"

#include <cmath>

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }

std::string quantityKey(const std::string& name)
{
    const auto dot = name.rfind('.');
    return dot == std::string::npos ? name : name.substr(dot + 1);
}

QVariant figure(const std::optional<double>& v, int role)
{
    if (role == PercentileTableModel::kSortRole) return v ? QVariant(*v) : QVariant(-HUGE_VAL);
    if (role == Qt::DisplayRole) return v ? formatFigure(*v) : QObject::tr("n/a");
    return {};
}

}  // namespace

QString formatFigure(double v)
{
    if (!std::isfinite(v)) return QObject::tr("n/a");
    return QString::number(v, 'g', 4);
}

QString outputCompartment(const std::string& name)
{
    const auto dot = name.rfind('.');
    return dot == std::string::npos ? QString() : qs(name.substr(0, dot));
}

QString outputQuantityLabel(const std::string& name)
{
    const std::string q = quantityKey(name);
    if (q == "biomass") return QObject::tr("B");
    if (q == "pb") return QObject::tr("P/B");
    if (q == "qb") return QObject::tr("Q/B");
    if (q == "ee") return QObject::tr("EE");
    if (q == "pq") return QObject::tr("P/Q");
    if (q == "tl") return QObject::tr("Trophic level");
    if (q.rfind("te_", 0) == 0) return QObject::tr("TE level %1").arg(qs(q.substr(3)));
    if (q == "mean_te") return QObject::tr("TE, geometric mean II-IV");
    if (q == "primary_production_consumed") return QObject::tr("Share of primary production consumed");
    if (q == "detritus_inflow_consumed") return QObject::tr("Share of detritus inflow consumed");
    return qs(q);
}

QString outputLabel(const std::string& name)
{
    const QString c = outputCompartment(name);
    return c.isEmpty() || c == QStringLiteral("system") ? outputQuantityLabel(name)
                                                        : QStringLiteral("%1: %2").arg(c, outputQuantityLabel(name));
}

// --- percentiles ---------------------------------------------------------------------

void PercentileTableModel::setSummary(const tl::ensemble::EnsembleSummary& summary)
{
    beginResetModel();
    rows_ = summary.outputs;
    endResetModel();
}

void PercentileTableModel::clear()
{
    beginResetModel();
    rows_.clear();
    endResetModel();
}

int PercentileTableModel::rowCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : int(rows_.size()); }
int PercentileTableModel::columnCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : kColumnCount; }

QVariant PercentileTableModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || index.row() >= int(rows_.size())) return {};
    const auto& o = rows_[std::size_t(index.row())];
    if (role == kOutputNameRole) return qs(o.name);
    if (role == Qt::TextAlignmentRole && index.column() >= kP2_5)
        return QVariant::fromValue(Qt::AlignRight | Qt::AlignVCenter);
    if (role == Qt::ToolTipRole) {
        if (o.outOfWindow) return tr("Some percentiles fall outside the statistics' range of magnitudes and are bounds only.");
        if (o.undefined) return tr("%1 balanced draws left this output undefined.").arg(o.undefined);
        return {};
    }
    if (role != Qt::DisplayRole && role != kSortRole) return {};
    switch (index.column()) {
    case kCompartment: return outputCompartment(o.name);
    case kQuantity: return outputQuantityLabel(o.name);
    case kP2_5: return figure(o.p2_5, role);
    case kP25: return figure(o.p25, role);
    case kP50: return figure(o.p50, role);
    case kP75: return figure(o.p75, role);
    case kP97_5: return figure(o.p97_5, role);
    case kMean: return figure(o.mean, role);
    case kDraws: return role == kSortRole ? QVariant(qulonglong(o.count)) : QVariant(QString::number(o.count));
    default: return {};
    }
}

QVariant PercentileTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal) return {};
    if (role == Qt::ToolTipRole) {
        if (section >= kP2_5 && section <= kP97_5)
            return tr("Percentile over the balanced draws (nearest rank, within 0.78 %)");
        if (section == kDraws) return tr("Balanced draws in which the output is defined");
        return {};
    }
    if (role != Qt::DisplayRole) return {};
    switch (section) {
    case kCompartment: return tr("Compartment");
    case kQuantity: return tr("Output");
    case kP2_5: return tr("2.5 %");
    case kP25: return tr("25 %");
    case kP50: return tr("Median");
    case kP75: return tr("75 %");
    case kP97_5: return tr("97.5 %");
    case kMean: return tr("Mean");
    case kDraws: return tr("Draws");
    default: return {};
    }
}

// --- breakers ------------------------------------------------------------------------

void BreakersModel::setSummary(const tl::ensemble::EnsembleSummary& summary)
{
    beginResetModel();
    rows_ = summary.breakers;
    endResetModel();
}

void BreakersModel::clear()
{
    beginResetModel();
    rows_.clear();
    endResetModel();
}

int BreakersModel::rowCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : int(rows_.size()); }
int BreakersModel::columnCount(const QModelIndex& parent) const { return parent.isValid() ? 0 : kColumnCount; }

QVariant BreakersModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || index.row() >= int(rows_.size())) return {};
    const auto& b = rows_[std::size_t(index.row())];
    if (role == Qt::TextAlignmentRole && index.column() != kCompartment)
        return QVariant::fromValue(Qt::AlignRight | Qt::AlignVCenter);
    if (role != Qt::DisplayRole && role != kSortRole) return {};
    auto n = [&](std::uint64_t v) { return role == kSortRole ? QVariant(qulonglong(v)) : QVariant(QString::number(v)); };
    switch (index.column()) {
    case kCompartment: return qs(b.compartment);
    case kDraws: return n(b.draws);
    case kShare: return role == kSortRole ? QVariant(b.share) : QVariant(QStringLiteral("%1 %").arg(100.0 * b.share, 0, 'f', 1));
    case kEeAboveMax: return n(b.eeAboveMax);
    case kNegativeRespiration: return n(b.negativeRespiration);
    case kNegativeValue: return n(b.negativeValue);
    case kResidual: return n(b.residual);
    case kDetritusOverConsumed: return n(b.detritusOverConsumed);
    default: return {};
    }
}

QVariant BreakersModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole) return {};
    switch (section) {
    case kCompartment: return tr("Compartment");
    case kDraws: return tr("Draws broken");
    case kShare: return tr("Share of draws");
    case kEeAboveMax: return tr("EE above max");
    case kNegativeRespiration: return tr("Respiration < 0");
    case kNegativeValue: return tr("Solved value < 0");
    case kResidual: return tr("Equation not closed");
    case kDetritusOverConsumed: return tr("Detritus over-consumed");
    default: return {};
    }
}

}  // namespace tl::ui
