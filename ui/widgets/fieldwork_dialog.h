// Fieldwork dialog (Project > Fieldwork…): turns survey files or published equations into
// one parameter of the current scenario (core/fieldwork), previews the value, its CV and
// interval (for the catch curve also the points and the regression line, each point
// selectable), and writes it as ONE undoable edit: the value, its CV and a source note for
// B, P/B or Q/B (ModelEditCommand), or a diet row with its note in the scenario
// description (ProjectEditCommand). No science here: every number comes from
// core/fieldwork, the same functions tledger fieldwork calls.
#pragma once

#include <QDialog>
#include <optional>
#include <vector>

#include "core/fieldwork/estimate.h"
#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/stomach_diet.h"

class QComboBox;
class QCustomPlot;
class QLabel;
class QLineEdit;
class QPlainTextEdit;
class QPushButton;
class QStackedWidget;
class QTableWidget;

namespace tl::ui {

class ProjectDocument;

class FieldworkDialog : public QDialog {
    Q_OBJECT
public:
    enum class Kind { Biomass, LengthMortality, NaturalMortality, Consumption, Diet };

    explicit FieldworkDialog(ProjectDocument* doc, QWidget* parent = nullptr);

    // Works the estimate out from the fields and shows it; false (the reason in the
    // preview, naming the file, line and column or the field) when it cannot.
    bool preview();
    // Writes the previewed estimate into the current scenario (undoable); false with the
    // reason shown when refused.
    bool write();

    // For tests and the snapshot: the fields by name.
    void setKind(Kind kind);
    void setCompartment(const QString& name);
    void setField(const QString& name, const QString& text);
    QString previewText() const;
    QPushButton* writeButton() const { return write_; }
    QTableWidget* pointsTable() const { return points_; }

private:
    QLineEdit* addFileRow(QWidget* page, const QString& name, const QString& label, const QString& filter);
    QLineEdit* addNumberRow(QWidget* page, const QString& name, const QString& label, const QString& placeholder);
    QWidget* newPage(const QString& intro);
    void kindChanged();
    void fillTaxa();
    void showCatchCurve(const tl::fieldwork::CatchCurveResult& r);
    void showFailure(const tl::Problems& problems, const QString& what);
    std::optional<double> number(const QString& name, bool required, QString* why) const;
    QString text(const QString& name) const;
    Kind kind() const;
    tl::Param targetParam() const;

    ProjectDocument* doc_;
    QComboBox* kind_ = nullptr;
    QComboBox* compartment_ = nullptr;
    QStackedWidget* pages_ = nullptr;
    QComboBox* taxon_ = nullptr;
    QComboBox* lengthMethod_ = nullptr;
    QComboBox* equation_ = nullptr;
    QComboBox* food_ = nullptr;
    QComboBox* summary_ = nullptr;
    std::vector<std::pair<QString, QLineEdit*>> fields_;
    QTableWidget* points_ = nullptr;
    QCustomPlot* plot_ = nullptr;
    QLabel* headline_ = nullptr;  // the value and its interval, or why there is none
    QPlainTextEdit* report_ = nullptr;
    QLabel* status_ = nullptr;
    QPushButton* write_ = nullptr;
    bool fillingPoints_ = false;

    // The previewed result, written by write().
    std::optional<tl::fieldwork::Estimate> estimate_;
    std::optional<tl::fieldwork::StomachDiet> diet_;
    tl::Param param_ = tl::Param::Biomass;
};

}  // namespace tl::ui
