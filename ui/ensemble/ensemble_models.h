// Table models of the Ensemble page: the percentiles of every output, and the
// compartments that break the balance. Both read an EnsembleSummary (core), so a run
// just made and a stored one look the same. Sorting: Qt::UserRole holds the number (or
// the text) of a cell, for a QSortFilterProxyModel with that sort role.
#pragma once

#include <QAbstractTableModel>

#include "core/ensemble/ensemble_summary.h"

namespace tl::ui {

class PercentileTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { kCompartment, kQuantity, kP2_5, kP25, kP50, kP75, kP97_5, kMean, kDraws, kColumnCount };
    static constexpr int kSortRole = Qt::UserRole;
    static constexpr int kOutputNameRole = Qt::UserRole + 1;  // "Perch.ee"

    using QAbstractTableModel::QAbstractTableModel;
    void setSummary(const tl::ensemble::EnsembleSummary& summary);
    void clear();

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    std::vector<tl::ensemble::OutputSummary> rows_;
};

class BreakersModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { kCompartment, kDraws, kShare, kEeAboveMax, kNegativeRespiration, kNegativeValue, kResidual,
                  kDetritusOverConsumed, kColumnCount };
    static constexpr int kSortRole = Qt::UserRole;

    using QAbstractTableModel::QAbstractTableModel;
    void setSummary(const tl::ensemble::EnsembleSummary& summary);
    void clear();

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    std::vector<tl::ensemble::BreakerSummary> rows_;
};

// "Perch.ee" -> ("Perch", "EE"); "system.te_II" -> ("system", "TE level II"): the
// words the tables and charts show for an output.
QString outputCompartment(const std::string& name);
QString outputQuantityLabel(const std::string& name);
QString outputLabel(const std::string& name);  // "Perch: EE"
// Four significant digits, as the balance sheet shows numbers.
QString formatFigure(double v);

}  // namespace tl::ui
