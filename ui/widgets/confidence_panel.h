// ConfidencePanel: edits the data confidence of the parameter under the cursor, or of
// the diet row under the cursor on the Diet page (DESIGN.md 3.1, 3.7): a grade A–D or an explicit CV (the CV wins), and a free-text
// note of where the value comes from. The grade's default CV comes from the project's
// rules (A 10 %, B 25 %, C 50 %, D 80 % by default — this project's own convention).
// Each change is one undoable edit.
#pragma once

#include <QWidget>
#include <optional>

#include "core/model/model.h"

class QComboBox;
class QLabel;
class QLineEdit;
class QPlainTextEdit;

namespace tl::ui {

class ProjectDocument;

class ConfidencePanel : public QWidget {
    Q_OBJECT
public:
    explicit ConfidencePanel(ProjectDocument* doc, QWidget* parent = nullptr);

    // The cell being shown: a compartment and one of its parameters (or nothing).
    void setTarget(std::optional<std::size_t> compartment, std::optional<tl::Param> param);
    // The diet row of a predator: one confidence for every share of the row.
    void setDietTarget(std::size_t predator);

private:
    void refresh();
    void applyGrade();
    void applyCv();
    void applySource();
    void apply(const tl::Confidence& c, const QString& what);
    bool hasTarget() const;
    const tl::Confidence& targetIn(const tl::Model& m) const;
    tl::Confidence& targetIn(tl::Model& m) const;
    QString targetName(const tl::Model& m) const;  // "P/B of perch", "the diet of perch"

    ProjectDocument* doc_;
    std::optional<std::size_t> compartment_;
    std::optional<tl::Param> param_;
    bool diet_ = false;  // the target is compartment_'s diet row, not a parameter
    QLabel* title_;
    QComboBox* grade_;
    QLineEdit* cv_;
    QLabel* effective_;
    QLineEdit* source_;
    QLabel* message_;
    bool updating_ = false;
};

}  // namespace tl::ui
