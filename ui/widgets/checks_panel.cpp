#include "ui/widgets/checks_panel.h"

#include <QAction>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMenu>
#include <QPushButton>
#include <QStyledItemDelegate>
#include <QTimer>
#include <QTreeWidget>
#include <QVBoxLayout>
#include <algorithm>

#include "core/model/compartment.h"
#include "core/model/problem_codes.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

// Rows as tall as their wrapped text at the column's current width: the default size
// hint counts only the explicit line breaks, so a long message wrapped on a narrow
// window was cut off ("…") under the next row.
class WrappedRowDelegate : public QStyledItemDelegate {
public:
    explicit WrappedRowDelegate(QTreeView* view) : QStyledItemDelegate(view), view_(view) {}
    QSize sizeHint(const QStyleOptionViewItem& option, const QModelIndex& index) const override
    {
        QSize size = QStyledItemDelegate::sizeHint(option, index);
        const int width = view_->header()->sectionSize(index.column()) - 10;
        if (width <= 0) return size;
        const QRect text = QFontMetrics(option.font).boundingRect(QRect(0, 0, width, 1 << 20), Qt::TextWordWrap,
                                                                  index.data(Qt::DisplayRole).toString());
        return QSize(size.width(), std::max(size.height(), text.height() + 6));
    }

private:
    QTreeView* view_;
};

}  // namespace

QString whereText(const tl::Problem& p)
{
    QStringList parts;
    const QString comp = QString::fromStdString(p.compartment);
    if (!p.fleet.empty()) parts << QString::fromStdString(p.fleet);
    if (p.parameter == "diet" && !p.prey.empty())
        parts << QObject::tr("%1 eats %2").arg(comp, QString::fromStdString(p.prey));
    else {
        if (!comp.isEmpty()) parts << comp;
        if (auto param = tl::parseParamKey(p.parameter))
            parts << QString::fromUtf8(tl::paramSymbol(*param).data(), qsizetype(tl::paramSymbol(*param).size()));
        else if (p.parameter == "diet") parts << QObject::tr("diet");
        else if (p.parameter == "routing") parts << QObject::tr("detritus routing") + (p.prey.empty() ? QString() : QStringLiteral(" → ") + QString::fromStdString(p.prey));
        else if (p.parameter == "harvest") parts << QObject::tr("harvest");
        else if (!p.parameter.empty()) parts << QString::fromStdString(p.parameter);
    }
    return parts.isEmpty() ? QObject::tr("whole scenario") : parts.join(QStringLiteral(" · "));
}

QString codeExplanation(const std::string& code)
{
    const tl::ProblemCodeInfo* info = tl::findProblemCode(code);
    return info ? QString::fromUtf8(info->explanation.data(), qsizetype(info->explanation.size())) : QString();
}

QWidget* problemCodesTable(QWidget* parent)
{
    auto* tree = new QTreeWidget(parent);
    tree->setObjectName(QStringLiteral("problemCodes"));
    tree->setColumnCount(3);
    tree->setHeaderLabels({QObject::tr("Severity"), QObject::tr("Code"), QObject::tr("What it means")});
    tree->setRootIsDecorated(false);
    tree->setWordWrap(true);
    tree->setAlternatingRowColors(true);
    for (const tl::ProblemCodeInfo& info : tl::problemCodes()) {
        auto* item = new QTreeWidgetItem(tree);
        item->setIcon(0, severityIcon(info.severity));
        item->setText(0, severityLabel(info.severity));
        item->setText(1, QString::fromUtf8(info.code.data(), qsizetype(info.code.size())));
        item->setText(2, QString::fromUtf8(info.explanation.data(), qsizetype(info.explanation.size())));
    }
    tree->header()->setSectionResizeMode(0, QHeaderView::ResizeToContents);
    tree->header()->setSectionResizeMode(1, QHeaderView::ResizeToContents);
    tree->header()->setStretchLastSection(true);
    return tree;
}

ChecksPanel::ChecksPanel(QWidget* parent) : QWidget(parent)
{
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    summary_ = new QLabel(this);
    summary_->setObjectName(QStringLiteral("checksSummary"));
    tree_ = new QTreeWidget(this);
    tree_->setColumnCount(3);
    tree_->setHeaderLabels({tr("Severity"), tr("Where"), tr("What and what to do")});
    tree_->setRootIsDecorated(false);
    tree_->setUniformRowHeights(false);
    tree_->setWordWrap(true);
    tree_->setAlternatingRowColors(true);
    tree_->setItemDelegate(new WrappedRowDelegate(tree_));
    tree_->header()->setSectionResizeMode(0, QHeaderView::ResizeToContents);
    tree_->header()->setSectionResizeMode(1, QHeaderView::ResizeToContents);
    tree_->header()->setStretchLastSection(true);
    summary_->setWordWrap(true);
    fixButton_ = new QPushButton(tr("Fix"), this);
    fixButton_->setObjectName(QStringLiteral("checksFix"));
    fixButton_->setToolTip(tr("Apply the one-click fix of the selected line (one undo step)"));
    fixButton_->setAutoDefault(false);
    auto* top = new QHBoxLayout;
    top->setContentsMargins(0, 0, 0, 0);
    top->addWidget(summary_, 1);
    top->addWidget(fixButton_);
    layout->addLayout(top);
    layout->addWidget(tree_);
    connect(tree_, &QTreeWidget::itemActivated, this, [this](QTreeWidgetItem* item) { activate(tree_->indexOfTopLevelItem(item)); });
    connect(tree_, &QTreeWidget::itemClicked, this, [this](QTreeWidgetItem* item) { activate(tree_->indexOfTopLevelItem(item)); });
    connect(tree_, &QTreeWidget::currentItemChanged, this, &ChecksPanel::updateFixButton);
    connect(fixButton_, &QPushButton::clicked, this, [this] { fix(tree_->indexOfTopLevelItem(tree_->currentItem())); });
    // Rows of wrapped text keep the height computed at the old width unless laid out
    // again when a column (or the panel) changes width: once per burst of resizes.
    connect(tree_->header(), &QHeaderView::sectionResized, this, [this] {
        if (relayoutPending_) return;
        relayoutPending_ = true;
        QTimer::singleShot(0, this, [this] {
            relayoutPending_ = false;
            tree_->doItemsLayout();
        });
    });
    tree_->setContextMenuPolicy(Qt::CustomContextMenu);
    connect(tree_, &QWidget::customContextMenuRequested, this, [this](QPoint at) {
        const int line = tree_->indexOfTopLevelItem(tree_->itemAt(at));
        if (fixLabel(line).isEmpty()) return;
        QMenu menu(this);
        menu.addAction(tr("Fix: %1").arg(fixLabel(line)), this, [this, line] { fix(line); });
        menu.exec(tree_->viewport()->mapToGlobal(at));
    });
    setProblems({});
}

QString ChecksPanel::fixLabel(int i) const
{
    return i >= 0 && i < int(fixLabels_.size()) ? fixLabels_[std::size_t(i)] : QString();
}

bool ChecksPanel::fix(int i)
{
    if (fixLabel(i).isEmpty()) return false;
    emit fixRequested(problems_[std::size_t(i)]);
    return true;
}

void ChecksPanel::updateFixButton()
{
    const QString label = fixLabel(tree_->indexOfTopLevelItem(tree_->currentItem()));
    fixButton_->setEnabled(!label.isEmpty());
    fixButton_->setText(label.isEmpty() ? tr("Fix") : tr("Fix: %1").arg(label));
    // Shown only while some line has a fix: the panel stays small otherwise.
    fixButton_->setVisible(std::any_of(fixLabels_.begin(), fixLabels_.end(), [](const QString& l) { return !l.isEmpty(); }));
}

void ChecksPanel::setProblems(const tl::Problems& problems)
{
    problems_ = problems;
    // Errors first, then warnings, then notes; the order inside each group is kept.
    std::stable_sort(problems_.begin(), problems_.end(),
                     [](const tl::Problem& a, const tl::Problem& b) { return int(a.severity) < int(b.severity); });
    fixLabels_.clear();
    for (const auto& p : problems_) fixLabels_.push_back(fixLabeler_ ? fixLabeler_(p) : QString());
    tree_->clear();
    int counts[3] = {0, 0, 0};
    for (std::size_t line = 0; line < problems_.size(); ++line) {
        const tl::Problem& p = problems_[line];
        ++counts[int(p.severity)];
        auto* item = new QTreeWidgetItem(tree_);
        item->setIcon(0, severityIcon(p.severity));
        item->setText(0, severityLabel(p.severity));
        item->setText(1, whereText(p));
        QString text = QString::fromStdString(p.message);
        if (!p.hint.empty()) text += QLatin1Char('\n') + QString::fromStdString(p.hint);
        if (!fixLabels_[line].isEmpty()) text += QLatin1Char('\n') + tr("One-click fix (Fix button): %1.").arg(fixLabels_[line]);
        item->setText(2, text);
        QString tip = text + QStringLiteral("\n[") + QString::fromStdString(p.code) + QLatin1Char(']');
        if (const QString why = codeExplanation(p.code); !why.isEmpty()) tip += QLatin1Char(' ') + why;
        item->setToolTip(2, tip);
    }
    if (problems_.empty()) summary_->setText(tr("No problems found: inputs are complete and consistent."));
    else
        summary_->setText(tr("%1 error(s), %2 warning(s), %3 note(s). Click a line to go to its cell.")
                              .arg(counts[0]).arg(counts[1]).arg(counts[2]));
    tree_->setVisible(!problems_.empty());
    emit emptinessChanged(problems_.empty());
    // Lay the rows out now, with the column widths they will be drawn at, and repaint
    // the whole list: rows of wrapped text must not keep the heights (or pixels) of
    // the problems they replace (issue 13: a fixed problem stayed on screen).
    tree_->doItemsLayout();
    tree_->viewport()->update();
    updateFixButton();
}

void ChecksPanel::activate(int i)
{
    if (i < 0 || i >= int(problems_.size())) return;
    emit problemActivated(problems_[std::size_t(i)]);
}

}  // namespace tl::ui
