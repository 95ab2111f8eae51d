#include "ui/analysis/impact_matrix_model.h"

#include <QBrush>
#include <QFont>
#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include "ui/analysis/impact_colour_map.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

QIcon swatch(const QColor& colour)
{
    QPixmap pm(10, 10);
    pm.fill(colour);
    return QIcon(pm);
}
}  // namespace

ImpactMatrixModel::ImpactMatrixModel(QObject* parent) : QAbstractTableModel(parent) {}

void ImpactMatrixModel::setAnalysis(std::shared_ptr<const ScenarioAnalysis> analysis)
{
    beginResetModel();
    analysis_ = analysis && analysis->available() ? std::move(analysis) : nullptr;
    const std::size_t n = analysis_ ? analysis_->mti.names.size() : 0;
    keystone_.assign(n, kNaN);
    overall_.assign(n, 0.0);
    range_ = 0.0;
    if (analysis_) {
        const Eigen::MatrixXd& m = analysis_->mti.total;
        for (const KeystoneEntry& k : analysis_->keystone)
            if (k.node < n) keystone_[k.node] = k.keystoneIndex;
        for (std::size_t i = 0; i < n; ++i) {
            double sum = 0;
            for (std::size_t j = 0; j < n; ++j) {
                const double v = m(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
                if (!std::isfinite(v)) continue;
                range_ = std::max(range_, std::abs(v));
                if (j != i) sum += v * v;
            }
            overall_[i] = std::sqrt(sum);
        }
    }
    reorder();
    endResetModel();
}

void ImpactMatrixModel::setRowOrder(ImpactRowOrder order)
{
    if (order == order_) return;
    beginResetModel();
    order_ = order;
    reorder();
    endResetModel();
}

void ImpactMatrixModel::reorder()
{
    const std::size_t n = analysis_ ? analysis_->mti.names.size() : 0;
    const std::size_t nodes = analysis_ ? analysis_->mti.nodeCount : 0;
    rowOrder_.resize(n);
    std::iota(rowOrder_.begin(), rowOrder_.end(), std::size_t{0});
    const auto groups = [nodes](std::size_t i) { return i < nodes ? 0 : 1; };  // fleets last
    const auto descending = [](double a, double b) {  // NaN (no value) after every number
        if (std::isnan(a) != std::isnan(b)) return std::isnan(b);
        return a > b;
    };
    std::stable_sort(rowOrder_.begin(), rowOrder_.end(), [&](std::size_t a, std::size_t b) {
        if (groups(a) != groups(b)) return groups(a) < groups(b);
        switch (order_) {
        case ImpactRowOrder::AsEntered: return a < b;
        case ImpactRowOrder::ByName:
            return QString::localeAwareCompare(name(a), name(b)) < 0;
        case ImpactRowOrder::ByKeystoneIndex:
            if (keystone_[a] == keystone_[b]) return false;
            return descending(keystone_[a], keystone_[b]);
        case ImpactRowOrder::ByOverallEffect: return descending(overall_[a], overall_[b]);
        }
        return a < b;
    });
}

int ImpactMatrixModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(rowOrder_.size());
}

int ImpactMatrixModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(rowOrder_.size());
}

bool ImpactMatrixModel::singular() const { return analysis_ && analysis_->mti.singular; }

bool ImpactMatrixModel::isFleet(std::size_t i) const { return analysis_ && i >= analysis_->mti.nodeCount; }

int ImpactMatrixModel::firstFleetRow() const
{
    for (std::size_t r = 0; r < rowOrder_.size(); ++r)
        if (isFleet(rowOrder_[r])) return static_cast<int>(r);
    return -1;
}

QString ImpactMatrixModel::name(std::size_t i) const
{
    return analysis_ && i < analysis_->mti.names.size() ? QString::fromStdString(analysis_->mti.names[i]) : QString();
}

double ImpactMatrixModel::keystoneIndex(std::size_t i) const { return i < keystone_.size() ? keystone_[i] : kNaN; }
double ImpactMatrixModel::overallEffect(std::size_t i) const { return i < overall_.size() ? overall_[i] : kNaN; }

double ImpactMatrixModel::value(int row, int column) const
{
    if (!analysis_ || row < 0 || column < 0 || row >= rowCount() || column >= columnCount()) return kNaN;
    return analysis_->mti.total(static_cast<Eigen::Index>(matrixRow(row)), static_cast<Eigen::Index>(column));
}

QString ImpactMatrixModel::kindText(std::size_t i) const
{
    if (isFleet(i)) return tr("Fleet");
    return analysis_ && i < analysis_->kinds.size() ? kindLabel(analysis_->kinds[i]) : QString();
}

QVariant ImpactMatrixModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || !analysis_) return {};
    const double v = value(index.row(), index.column());
    const std::size_t from = matrixRow(index.row());
    const std::size_t to = static_cast<std::size_t>(index.column());
    switch (role) {
    case Qt::DisplayRole:
        if (!std::isfinite(v)) return tr("–");
        if (std::abs(v) < kBlankBelow) return QString();
        return QString::number(v, 'f', 2);
    case ValueRole: return v;
    case IsFleetRole: return isFleet(from);
    case MatrixIndexRole: return static_cast<qulonglong>(from);
    case Qt::BackgroundRole: return QBrush(impactColour(v, range_));
    case Qt::ForegroundRole: return QBrush(textColourOn(impactColour(v, range_)));
    case Qt::TextAlignmentRole: return int(Qt::AlignCenter);
    case Qt::FontRole:
        if (isFleet(from)) {
            QFont f;
            f.setItalic(true);
            return f;
        }
        return {};
    case Qt::ToolTipRole: {
        if (!std::isfinite(v)) return tr("Not defined: the impact matrix is singular.");
        const QString sense = std::abs(v) < kBlankBelow ? tr("practically no effect")
                              : v < 0               ? tr("negative: more %1 means less %2").arg(name(from), name(to))
                                                    : tr("positive: more %1 means more %2").arg(name(from), name(to));
        return tr("Impact of %1 (row) on %2 (column): %3\n%4").arg(name(from), name(to), QString::number(v, 'g', 6), sense);
    }
    default: return {};
    }
}

QVariant ImpactMatrixModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (!analysis_ || section < 0 || section >= rowCount()) return {};
    const std::size_t i = orientation == Qt::Vertical ? matrixRow(section) : static_cast<std::size_t>(section);
    switch (role) {
    case Qt::DisplayRole: return name(i);
    case Qt::DecorationRole:
        if (isFleet(i)) return swatch(fleetColour());
        return i < analysis_->kinds.size() ? swatch(kindColour(analysis_->kinds[i])) : QVariant();
    case Qt::FontRole:
        if (isFleet(i)) {
            QFont f;
            f.setItalic(true);
            return f;
        }
        return {};
    case Qt::ToolTipRole: {
        QString text = orientation == Qt::Vertical
                           ? tr("%1 (%2), impacting group: the row shows what a small increase of its biomass "
                                "does to every column").arg(name(i), kindText(i).toLower())
                           : tr("%1 (%2), impacted group: the column shows how every row affects it")
                                 .arg(name(i), kindText(i).toLower());
        if (orientation == Qt::Vertical) {
            text += tr("\nOverall effect (root sum of squares of the row, itself excluded): %1")
                        .arg(QString::number(overall_[i], 'g', 4));
            if (std::isfinite(keystone_[i]))
                text += tr("\nKeystone index (Libralato et al. 2006): %1").arg(QString::number(keystone_[i], 'g', 4));
        }
        return text;
    }
    default: return {};
    }
}

}  // namespace tl::ui
