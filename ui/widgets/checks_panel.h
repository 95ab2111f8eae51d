// ChecksPanel: every current problem and rule-of-thumb warning of the scenario
// (validation + the balance sheet), live. Each line shows its severity as an icon AND
// a word, where it sits (compartment, parameter, prey or fleet) and the message; the
// hint is the second line; the tooltip adds the problem's code and the registry's
// one-line explanation of it (core/model/problem_codes.h). Activating a line asks the
// window to select that cell. A line whose problem has an unambiguous remedy (core
// problem_fixes.h) says so, and its Fix button (or context menu) asks the window to
// apply it as one undoable edit.
#pragma once

#include <QWidget>
#include <functional>
#include <vector>

#include "core/model/problem.h"

class QTreeWidget;
class QTreeWidgetItem;
class QLabel;
class QPushButton;

namespace tl::ui {

class ChecksPanel : public QWidget {
    Q_OBJECT
public:
    explicit ChecksPanel(QWidget* parent = nullptr);

    // Says, for a problem, what its one-click fix would do (empty: none). Set by the window.
    using FixLabeler = std::function<QString(const tl::Problem&)>;
    void setFixLabeler(FixLabeler labeler) { fixLabeler_ = std::move(labeler); }

    void setProblems(const tl::Problems& problems);
    const tl::Problems& problems() const { return problems_; }
    int count() const { return int(problems_.size()); }
    // Activates line `i` as a click would (tests, keyboard).
    void activate(int i);
    // The fix of line `i` ("" when none), and asking for it as the Fix button does.
    QString fixLabel(int i) const;
    bool fix(int i);

signals:
    void problemActivated(const tl::Problem& problem);
    // After every setProblems: whether there is anything to list (the window gives an
    // empty panel only the height of its one-line summary).
    void emptinessChanged(bool empty);
    void fixRequested(const tl::Problem& problem);

private:
    void updateFixButton();

    QTreeWidget* tree_;
    QLabel* summary_;
    QPushButton* fixButton_;
    tl::Problems problems_;
    std::vector<QString> fixLabels_;  // per line, "" when none
    FixLabeler fixLabeler_;
    bool relayoutPending_ = false;
};

// "Zooplankton · P/B", "Perch eats Zooplankton", "Gill nets · Perch" ...
QString whereText(const tl::Problem& p);

// The registry's explanation of `code`, or empty for an unknown code.
QString codeExplanation(const std::string& code);
// Help: a table of every problem code with its severity and explanation.
QWidget* problemCodesTable(QWidget* parent = nullptr);

}  // namespace tl::ui
