#include "ui/widgets/help_window.h"

#include <QAction>
#include <QDialogButtonBox>
#include <QFile>
#include <QMenu>
#include <QSet>
#include <QTextBrowser>
#include <QVBoxLayout>

#include "core/model/problem_codes.h"
#include "ui/style/palette.h"

// Qt's resource initialiser lives outside every namespace.
static void initHelpResources() { Q_INIT_RESOURCE(help); }

namespace tl::ui {

void initGuideResources()
{
    static const bool done = (initHelpResources(), true);
    (void)done;
}

namespace {

QString html(std::string_view s) { return QString::fromUtf8(s.data(), qsizetype(s.size())).toHtmlEscaped(); }

QString problemCodeTableHtml()
{
    QString out = QStringLiteral("<table border=\"1\" cellspacing=\"0\" cellpadding=\"4\">"
                                 "<tr><th>Severity</th><th>Code</th><th>What it means</th></tr>");
    for (const tl::ProblemCodeInfo& info : tl::problemCodes())
        out += QStringLiteral("<tr><td>%1</td><td><tt>%2</tt></td><td>%3</td></tr>")
                   .arg(severityLabel(info.severity).toHtmlEscaped(), html(info.code), html(info.explanation));
    return out + QStringLiteral("</table>");
}

void collectShortcuts(const QList<QAction*>& actions, QStringList* rows, QSet<QAction*>* seen)
{
    for (QAction* a : actions) {
        if (!a || seen->contains(a)) continue;
        seen->insert(a);
        if (QMenu* sub = a->menu()) {
            collectShortcuts(sub->actions(), rows, seen);
            continue;
        }
        if (a->isSeparator() || a->shortcut().isEmpty()) continue;
        QString text = a->text();
        text.remove(QLatin1Char('&'));
        text.remove(QStringLiteral("…"));
        rows->append(QStringLiteral("<tr><td>%1</td><td><b>%2</b></td></tr>")
                         .arg(text.trimmed().toHtmlEscaped(),
                              a->shortcut().toString(QKeySequence::NativeText).toHtmlEscaped()));
    }
}

}  // namespace

QString shortcutTableHtml(const QList<QAction*>& actions)
{
    QStringList rows;
    QSet<QAction*> seen;
    collectShortcuts(actions, &rows, &seen);
    return QStringLiteral("<table cellspacing=\"0\" cellpadding=\"3\">") + rows.join(QString()) + QStringLiteral("</table>");
}

QString userGuideHtml(const QList<QAction*>& actions)
{
    initGuideResources();
    QFile file(QStringLiteral(":/tl/help/guide.html"));
    if (!file.open(QIODevice::ReadOnly)) return QObject::tr("<p>The user guide is missing from this build.</p>");
    QString text = QString::fromUtf8(file.readAll());
    text.replace(QStringLiteral("<!--problem-codes-->"), problemCodeTableHtml());
    text.replace(QStringLiteral("<!--shortcuts-->"), shortcutTableHtml(actions));
    return text;
}

HelpWindow::HelpWindow(const QList<QAction*>& actions, QWidget* parent) : QDialog(parent)
{
    setObjectName(QStringLiteral("userGuide"));
    setWindowTitle(tr("Trophic Ledger user guide"));
    auto* layout = new QVBoxLayout(this);
    browser_ = new QTextBrowser(this);
    browser_->setOpenLinks(true);
    browser_->setOpenExternalLinks(false);
    browser_->setHtml(userGuideHtml(actions));
    layout->addWidget(browser_);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    layout->addWidget(buttons);
    resize(820, 640);
}

void HelpWindow::showSection(const QString& anchor) { browser_->scrollToAnchor(anchor); }

}  // namespace tl::ui
