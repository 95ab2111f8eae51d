// ChecksPanel: every current problem and rule-of-thumb warning of the scenario
// (validation + the balance sheet), live. Each line shows its severity as an icon AND
// a word, where it sits (compartment, parameter, prey or fleet) and the message; the
// hint is the second line; the tooltip adds the problem's code and the registry's
// one-line explanation of it (core/model/problem_codes.h). Activating a line asks the
// window to select that cell.
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
    // After every setProblems: whether there is anything to list (the window gives an
    // empty panel only the height of its one-line summary).
    void emptinessChanged(bool empty);

private:
    QTreeWidget* tree_;
    QLabel* summary_;
    tl::Problems problems_;
};

// "Zooplankton · P/B", "Perch eats Zooplankton", "Gill nets · Perch" ...
QString whereText(const tl::Problem& p);

// The registry's explanation of `code`, or empty for an unknown code.
QString codeExplanation(const std::string& code);
// Help: a table of every problem code with its severity and explanation.
QWidget* problemCodesTable(QWidget* parent = nullptr);

}  // namespace tl::ui
