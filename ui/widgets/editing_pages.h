// The editing pages of the workbench, one per input table of a scenario (DESIGN.md 4):
// Compartments, Diet matrix, Harvest, Detritus routing. Each is a LedgerTableView over
// its ScenarioTableModel plus the few actions that belong to that table.
#pragma once

#include <QWidget>

#include "ui/tables/compartment_table_model.h"
#include "ui/tables/diet_table_model.h"
#include "ui/tables/harvest_table_model.h"
#include "ui/tables/routing_table_model.h"
#include "ui/tables/ledger_table_view.h"

class QCheckBox;
class QLabel;

namespace tl::ui {

class ProjectDocument;
class WrappingRow;

class EditingPage : public QWidget {
    Q_OBJECT
public:
    EditingPage(ProjectDocument* doc, const QString& title, const QString& key, const QString& note, QWidget* parent);
    QString title() const { return title_; }
    QString key() const { return key_; }
    LedgerTableView* view() const { return view_; }
    ScenarioTableModel* tableModel() const { return view_->ledgerModel(); }
    // Width at which the header of `column` shows its longest word whole (fitColumns
    // never makes a column narrower).
    int headerWidthNeeded(int column) const;

signals:
    void message(const QString& text);  // for the status bar

protected:
    void setTableModel(ScenarioTableModel* model);
    // Columns as wide as their content, within bounds (after every reset of the table).
    void fitColumns();
    void setColumnBounds(int minWidth, int maxWidth) { minWidth_ = minWidth, maxWidth_ = maxWidth; }
    // The page's buttons; they wrap onto a second line on a narrow window.
    WrappingRow* actions() const { return actions_; }
    ProjectDocument* doc_;

private:
    QString title_, key_;
    int minWidth_ = 72, maxWidth_ = 240;
    WrappingRow* actions_;
    LedgerTableView* view_;
};

class CompartmentsPage : public EditingPage {
    Q_OBJECT
public:
    explicit CompartmentsPage(ProjectDocument* doc, QWidget* parent = nullptr);
    CompartmentTableModel* compartments() const { return model_; }

private:
    QList<int> selectedRows() const;
    CompartmentTableModel* model_;
};

class DietPage : public EditingPage {
    Q_OBJECT
public:
    explicit DietPage(ProjectDocument* doc, QWidget* parent = nullptr);
    DietTableModel* diet() const { return model_; }
    void setHideUnusedPrey(bool hide);
    bool hidesUnusedPrey() const;

private:
    void updateHiddenColumns();
    DietTableModel* model_;
    QCheckBox* hideUnused_;
};

class HarvestPage : public EditingPage {
    Q_OBJECT
public:
    explicit HarvestPage(ProjectDocument* doc, QWidget* parent = nullptr);
    HarvestTableModel* harvest() const { return model_; }

private:
    void updateEmptyNote();
    HarvestTableModel* model_;
    QLabel* emptyNote_;
};

class RoutingPage : public EditingPage {
    Q_OBJECT
public:
    explicit RoutingPage(ProjectDocument* doc, QWidget* parent = nullptr);
    RoutingTableModel* routing() const { return model_; }

private:
    RoutingTableModel* model_;
};

}  // namespace tl::ui
