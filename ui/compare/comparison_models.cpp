#include "ui/compare/comparison_models.h"

#include <cmath>

#include <QApplication>
#include <QFont>
#include <QIcon>
#include <QStyle>

#include "core/compare/comparison_report.h"
#include "core/io/text_table.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }

QString number(double v) { return qs(tl::displayNumber(v)); }

QIcon changeIcon(const tl::OutputDifference& d)
{
    QStyle* style = QApplication::style();
    if (!d.differs) return {};
    if (std::isnan(d.absolute)) return style->standardIcon(QStyle::SP_MessageBoxInformation);
    return style->standardIcon(d.absolute > 0 ? QStyle::SP_ArrowUp : QStyle::SP_ArrowDown);
}

}  // namespace

// --- inputs -----------------------------------------------------------------------------

void InputDifferencesModel::setComparison(const tl::ScenarioComparison* comparison)
{
    beginResetModel();
    c_ = comparison;
    endResetModel();
}

int InputDifferencesModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() || !c_ ? 0 : static_cast<int>(c_->inputs.size());
}

int InputDifferencesModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() || !c_ ? 0 : kFirstScenarioColumn + static_cast<int>(c_->scenarios.size()) + 2;
}

int InputDifferencesModel::scenarioOfColumn(int column) const
{
    if (!c_) return -1;
    const int s = column - kFirstScenarioColumn;
    return s >= 0 && s < static_cast<int>(c_->scenarios.size()) ? s : -1;
}

const tl::InputDifference* InputDifferencesModel::row(int r) const
{
    return c_ && r >= 0 && r < rowCount() ? &c_->inputs[static_cast<std::size_t>(r)] : nullptr;
}

QVariant InputDifferencesModel::data(const QModelIndex& index, int role) const
{
    const tl::InputDifference* d = row(index.row());
    if (!d) return {};
    const int n = static_cast<int>(c_->scenarios.size());
    const int col = index.column();
    if (role == Qt::DisplayRole) {
        if (col == 0) return d->compartment.empty() ? tr("(fleet)") : qs(d->compartment);
        if (col == 1) return qs(d->label);
        if (const int s = scenarioOfColumn(col); s >= 0) return qs(d->shown[static_cast<std::size_t>(s)]);
        if (col == kFirstScenarioColumn + n) {
            QStringList what;
            if (d->valueDiffers) what << tr("value");
            if (d->confidenceDiffers) what << tr("confidence");
            if (d->sourceDiffers) what << tr("source note");
            return what.join(QStringLiteral(", "));
        }
        if (col == kFirstScenarioColumn + n + 1) {
            QStringList notes;
            for (std::size_t s = 0; s < d->sources.size(); ++s)
                if (!d->sources[s].empty()) notes << qs(c_->scenarios[s] + ": " + d->sources[s]);
            return notes.join(QStringLiteral("; "));
        }
    }
    if (role == Qt::ToolTipRole && scenarioOfColumn(col) >= 0) {
        const auto s = static_cast<std::size_t>(scenarioOfColumn(col));
        QString tip = qs(c_->scenarios[s]) + QStringLiteral(": ") + qs(d->shown[s]);
        if (s < d->confidence.size() && !d->confidence[s].empty()) tip += tr("\nData confidence: %1").arg(qs(d->confidence[s]));
        if (s < d->sources.size() && !d->sources[s].empty()) tip += tr("\nSource: %1").arg(qs(d->sources[s]));
        return tip + tr("\nDouble-click to open this cell in scenario '%1'.").arg(qs(c_->scenarios[s]));
    }
    if (role == Qt::TextAlignmentRole && scenarioOfColumn(col) >= 0)
        return QVariant::fromValue(Qt::AlignRight | Qt::AlignVCenter);
    return {};
}

QVariant InputDifferencesModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole || !c_) return {};
    const int n = static_cast<int>(c_->scenarios.size());
    if (section == 0) return tr("Compartment");
    if (section == 1) return tr("Input");
    if (const int s = scenarioOfColumn(section); s >= 0)
        return s == 0 ? tr("%1 (reference)").arg(qs(c_->scenarios[0])) : qs(c_->scenarios[static_cast<std::size_t>(s)]);
    if (section == kFirstScenarioColumn + n) return tr("What differs");
    return tr("Source notes");
}

// --- outputs ----------------------------------------------------------------------------

void ComparedOutputsModel::setComparison(const tl::ScenarioComparison* comparison)
{
    beginResetModel();
    c_ = comparison;
    rebuild();
    endResetModel();
}

void ComparedOutputsModel::setOnlyDiffering(bool only)
{
    if (only == only_) return;
    beginResetModel();
    only_ = only;
    rebuild();
    endResetModel();
}

void ComparedOutputsModel::rebuild()
{
    rows_.clear();
    if (!c_) return;
    for (std::size_t k = 0; k < c_->outputs.size(); ++k)
        if (!only_ || c_->outputs[k].differs()) rows_.push_back(static_cast<int>(k));
}

int ComparedOutputsModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(rows_.size());
}

int ComparedOutputsModel::columnCount(const QModelIndex& parent) const
{
    if (parent.isValid() || !c_) return 0;
    const int n = static_cast<int>(c_->scenarios.size());
    return kFirstValueColumn + n + (n - 1);
}

int ComparedOutputsModel::scenarioOfColumn(int column) const
{
    if (!c_) return -1;
    const int n = static_cast<int>(c_->scenarios.size());
    const int k = column - kFirstValueColumn;
    if (k >= 0 && k < n) return k;
    if (k >= n && k < 2 * n - 1) return k - n + 1;
    return -1;
}

const tl::ComparedOutput* ComparedOutputsModel::row(int r) const
{
    return c_ && r >= 0 && r < rowCount() ? &c_->outputs[static_cast<std::size_t>(rows_[static_cast<std::size_t>(r)])] : nullptr;
}

QString ComparedOutputsModel::changeText(const tl::OutputDifference& d)
{
    if (!d.differs) return tr("= no change");
    if (std::isnan(d.absolute)) return tr("≠ in one only");
    const QString arrow = d.absolute > 0 ? QStringLiteral("▲ ") : QStringLiteral("▼ ");
    return arrow + (d.absolute > 0 ? QStringLiteral("+") : QString()) + number(d.absolute) + QStringLiteral("  (") +
           qs(tl::percentText(d)) + QStringLiteral(")");
}

QVariant ComparedOutputsModel::data(const QModelIndex& index, int role) const
{
    const tl::ComparedOutput* o = row(index.row());
    if (!o) return {};
    const int n = static_cast<int>(c_->scenarios.size());
    const int col = index.column();
    const bool isChange = col >= kFirstValueColumn + n;
    if (role == Qt::DisplayRole) {
        if (col == 0) {
            if (o->group == tl::OutputGroup::Level) return tr("level %1").arg(qs(o->subject));
            if (o->group == tl::OutputGroup::System) return tr("system");
            return qs(o->subject);
        }
        if (col == 1) return qs(o->label);
        if (col == 2) return qs(o->unit);
        const int s = scenarioOfColumn(col);
        if (s < 0) return {};
        if (!isChange) return number(o->values[static_cast<std::size_t>(s)]);
        return changeText(o->differences[static_cast<std::size_t>(s)]);
    }
    if (role == Qt::DecorationRole && isChange) {
        const int s = scenarioOfColumn(col);
        if (s > 0) return changeIcon(o->differences[static_cast<std::size_t>(s)]);
    }
    if (role == Qt::FontRole && o->differs() && col <= 1) {
        QFont f;
        f.setBold(true);
        return f;
    }
    if (role == Qt::TextAlignmentRole && col >= kFirstValueColumn)
        return QVariant::fromValue((isChange ? Qt::AlignLeft : Qt::AlignRight) | Qt::AlignVCenter);
    if (role == Qt::ToolTipRole && o->group == tl::OutputGroup::Compartment) {
        const int s = scenarioOfColumn(col);
        return tr("Double-click to open %1 in scenario '%2'.")
            .arg(qs(o->subject), qs(c_->scenarios[static_cast<std::size_t>(s > 0 ? s : (n > 1 ? 1 : 0))]));
    }
    return {};
}

QVariant ComparedOutputsModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole || !c_) return {};
    const int n = static_cast<int>(c_->scenarios.size());
    if (section == 0) return tr("Subject");
    if (section == 1) return tr("Output");
    if (section == 2) return tr("Unit");
    const int s = scenarioOfColumn(section);
    if (s < 0) return {};
    if (section < kFirstValueColumn + n)
        return s == 0 ? tr("%1 (reference)").arg(qs(c_->scenarios[0])) : qs(c_->scenarios[static_cast<std::size_t>(s)]);
    return tr("Change, %1").arg(qs(c_->scenarios[static_cast<std::size_t>(s)]));
}

}  // namespace tl::ui
