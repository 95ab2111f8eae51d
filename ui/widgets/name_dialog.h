// NameDialog: asks for a name and checks it before closing, so a name that clashes
// (or is empty) is corrected in place, with the reason shown under the field,
// instead of closing the dialog and opening a message box (issue 13).
#pragma once

#include <QDialog>
#include <functional>

class QLabel;
class QLineEdit;

namespace tl::ui {

class NameDialog : public QDialog {
    Q_OBJECT
public:
    // `check` returns why a name cannot be taken, or an empty string when it can.
    using Check = std::function<QString(const QString& name)>;
    NameDialog(const QString& title, const QString& label, const QString& initial, Check check, QWidget* parent = nullptr);

    QString name() const;
    void accept() override;

    // Runs the dialog; returns the accepted name, or an empty string when cancelled.
    static QString ask(QWidget* parent, const QString& title, const QString& label, const QString& initial, Check check);

private:
    QLineEdit* edit_;
    QLabel* reason_;
    Check check_;
};

}  // namespace tl::ui
