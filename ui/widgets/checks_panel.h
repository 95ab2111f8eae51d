// ChecksPanel: every current problem and rule-of-thumb warning of the scenario
// (validation + the balance sheet), live. Each line shows its severity as an icon AND
// a word, where it sits (compartment, parameter, prey or fleet) and the message; the
// hint is the second line. Activating a line asks the window to select that cell.
#pragma once

#include <QWidget>

#include "core/model/problem.h"

class QTreeWidget;
class QTreeWidgetItem;
class QLabel;

namespace tl::ui {

class ChecksPanel : public QWidget {
    Q_OBJECT
public:
    explicit ChecksPanel(QWidget* parent = nullptr);

    void setProblems(const tl::Problems& problems);
    const tl::Problems& problems() const { return problems_; }
    int count() const { return int(problems_.size()); }
    // Activates line `i` as a click would (tests, keyboard).
    void activate(int i);

signals:
    void problemActivated(const tl::Problem& problem);

private:
    QTreeWidget* tree_;
    QLabel* summary_;
    tl::Problems problems_;
};

// "Zooplankton · P/B", "Perch eats Zooplankton", "Gill nets · Perch" ...
QString whereText(const tl::Problem& p);

}  // namespace tl::ui
