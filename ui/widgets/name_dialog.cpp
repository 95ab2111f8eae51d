#include "ui/widgets/name_dialog.h"

#include <QDialogButtonBox>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

#include "ui/style/palette.h"

namespace tl::ui {

NameDialog::NameDialog(const QString& title, const QString& label, const QString& initial, Check check, QWidget* parent)
    : QDialog(parent), check_(std::move(check))
{
    setWindowTitle(title);
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(new QLabel(label, this));
    edit_ = new QLineEdit(initial, this);
    edit_->selectAll();
    layout->addWidget(edit_);
    reason_ = new QLabel(this);
    reason_->setObjectName(QStringLiteral("nameReason"));
    reason_->setWordWrap(true);
    reason_->setVisible(false);
    layout->addWidget(reason_);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
    connect(buttons, &QDialogButtonBox::accepted, this, &NameDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &NameDialog::reject);
    layout->addWidget(buttons);
    connect(edit_, &QLineEdit::textEdited, reason_, [this] { reason_->setVisible(false); });
    setMinimumWidth(360);
}

QString NameDialog::name() const { return edit_->text().trimmed(); }

void NameDialog::accept()
{
    const QString why = check_ ? check_(edit_->text()) : QString();
    if (why.isEmpty()) return QDialog::accept();
    // Shown as icon + text under the field; the dialog stays open for a correction.
    reason_->setText(QStringLiteral("<img src=\":/tl/icons/status-error.svg\" width=14 height=14> ") + why.toHtmlEscaped());
    reason_->setVisible(true);
    edit_->setFocus();
    edit_->selectAll();
}

QString NameDialog::ask(QWidget* parent, const QString& title, const QString& label, const QString& initial, Check check)
{
    initResources();
    NameDialog dialog(title, label, initial, std::move(check), parent);
    return dialog.exec() == QDialog::Accepted ? dialog.name() : QString();
}

}  // namespace tl::ui
