// Project settings (Project > Project settings…): the project's units (currency, area,
// time), its check rules (highest EE accepted, the accepted P/Q range of consumers, the
// tolerance on diet sums) and, for the scenario being edited, where each fleet's dead
// discards go. OK applies everything as ONE undoable edit of the project; the units
// and rules are the project's (every scenario carries a copy, kept in step here) and
// are written by the next save.
#pragma once

#include <QDialog>
#include <QString>
#include <array>
#include <optional>
#include <vector>

#include "core/store/project.h"

class QComboBox;
class QDialogButtonBox;
class QLabel;
class QLineEdit;

namespace tl::ui {

class ProjectDocument;

struct ProjectSettings {
    tl::Units units;
    tl::BalanceRules rules;
    // Per fleet of the current scenario: index of its discard pool, or nullopt for
    // the first detritus pool (the default).
    std::vector<std::optional<std::size_t>> discardPools;
};

ProjectSettings currentSettings(const tl::Project& project, int scenario);
// Empty when `s` can be applied; otherwise one sentence naming the field and what it needs.
QString checkSettings(const ProjectSettings& s, const tl::Model& model);
// `project` with `s` applied: units and rules in the project and in every scenario,
// discard pools in scenario `scenario`.
tl::Project withSettings(tl::Project project, int scenario, const ProjectSettings& s);
// Applies `s` to the document as one undoable edit. False with `why` when refused;
// false with `why` empty when nothing would change (no command is pushed).
bool applySettings(ProjectDocument* doc, const ProjectSettings& s, QString* why = nullptr);

class ProjectSettingsDialog : public QDialog {
    Q_OBJECT
public:
    explicit ProjectSettingsDialog(ProjectDocument* doc, QWidget* parent = nullptr);

    // What the fields hold now; a field that does not parse names itself in `why`.
    std::optional<ProjectSettings> settings(QString* why) const;

    QLineEdit* currencyEdit() const { return currency_; }
    QLineEdit* areaEdit() const { return area_; }
    QLineEdit* timeEdit() const { return time_; }
    QLineEdit* eeMaxEdit() const { return eeMax_; }
    QLineEdit* pqMinEdit() const { return pqMin_; }
    QLineEdit* pqMaxEdit() const { return pqMax_; }
    QLineEdit* dietToleranceEdit() const { return dietTolerance_; }
    QLineEdit* biomassMaxEdit() const { return biomassMax_; }
    QLineEdit* rateMaxEdit() const { return rateMax_; }
    QLineEdit* flowMaxEdit() const { return flowMax_; }
    QLineEdit* gradeCvEdit(int grade) const { return gradeCv_[std::size_t(grade)]; }  // 0 = A ... 3 = D
    const std::vector<QComboBox*>& poolCombos() const { return poolCombos_; }
    QLabel* errorLabel() const { return error_; }

    void accept() override;  // applies, or shows what is wrong and stays open

private:
    ProjectDocument* doc_;
    QLineEdit *currency_, *area_, *time_, *eeMax_, *pqMin_, *pqMax_, *dietTolerance_;
    QLineEdit *biomassMax_, *rateMax_, *flowMax_;  // plausible ranges (warnings only)
    std::array<QLineEdit*, 4> gradeCv_{};           // CV each confidence grade stands for, A to D
    std::vector<QComboBox*> poolCombos_;
    std::vector<std::size_t> pools_;  // detritus pools of the scenario, in model order
    QLabel* error_;
};

}  // namespace tl::ui
