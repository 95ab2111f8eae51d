#include "ui/workbench_actions.h"

#include <QDir>
#include <QWidget>

#include "core/io/atomic_file.h"
#include "core/io/html_report.h"
#include "core/store/project.h"
#include "ui/document/project_document.h"
#if TL_UI_HAVE_RESULTS
#include "ui/results/figure_export.h"
#include "ui/results/flow_map_page.h"
#endif

namespace tl::ui {

FigureSource* figureOf(QWidget* page)
{
#if TL_UI_HAVE_RESULTS
    return dynamic_cast<FigureSource*>(page);
#else
    (void)page;
    return nullptr;
#endif
}

void setFigureContexts(const QList<QWidget*>& pages, const QString& scenario, const QString& project)
{
#if TL_UI_HAVE_RESULTS
    for (QWidget* page : pages)
        if (FigureSource* figure = figureOf(page)) figure->setFigureContext(scenario, project);
#else
    (void)pages, (void)scenario, (void)project;
#endif
}

#if TL_UI_HAVE_RESULTS
namespace {

QHash<QString, QPointF> toHash(const std::map<std::string, tl::LayoutPosition>& layout)
{
    QHash<QString, QPointF> out;
    for (const auto& [name, p] : layout) out.insert(QString::fromStdString(name), QPointF(p.x, p.y));
    return out;
}

std::map<std::string, tl::LayoutPosition> toLayout(const QHash<QString, QPointF>& moved)
{
    std::map<std::string, tl::LayoutPosition> out;
    for (auto it = moved.cbegin(); it != moved.cend(); ++it) out[it.key().toStdString()] = {it.value().x(), it.value().y()};
    return out;
}

}  // namespace
#endif

void bindFlowMapLayout(QWidget* flowMapPage, ProjectDocument* doc)
{
#if TL_UI_HAVE_RESULTS
    auto* page = qobject_cast<FlowMapPage*>(flowMapPage);
    if (!page) return;
    auto show = [page, doc] { page->replaceMovedPositions(toHash(doc->scenario().layout)); };
    QObject::connect(doc, &ProjectDocument::projectChanged, page, show);
    QObject::connect(doc, &ProjectDocument::modelChanged, page, show);
    // Queued: the drag's mouse release is still on the stack, and the edit re-solves and
    // may rebuild the scene under it.
    QObject::connect(
        page, &FlowMapPage::positionsChanged, doc,
        [page, doc] {
            const auto moved = toLayout(page->movedPositions());
            const tl::Scenario& s = doc->scenario();
            if (moved == s.layout) return;
            QString text;
            if (moved.empty()) {
                text = QObject::tr("Reset the flow-map layout of %1").arg(QString::fromStdString(s.name));
            } else {
                QStringList names;  // the boxes whose place changed
                for (const auto& [name, p] : moved)
                    if (auto it = s.layout.find(name); it == s.layout.end() || !(it->second == p))
                        names << QString(QString::fromStdString(name)).remove(QStringLiteral("fleet:"));
                text = names.isEmpty()       ? QObject::tr("Change the flow-map layout")
                       : names.size() == 1 ? QObject::tr("Move %1 on the flow map").arg(names.front())
                                         : QObject::tr("Move %n boxes on the flow map", nullptr, int(names.size()));
            }
            tl::Project after = doc->project();
            after.scenarios[std::size_t(doc->currentIndex())].layout = moved;
            doc->editProject(after, doc->currentIndex(), text);
        },
        Qt::QueuedConnection);
    show();
#else
    (void)flowMapPage, (void)doc;
#endif
}

bool writeProjectReport(const tl::Project& project, const QString& fallbackTitle, const QString& path, QString* error)
{
    tl::Project titled = project;
    if (titled.info.title.empty()) titled.info.title = fallbackTitle.toStdString();
    if (const auto failed = tl::writeFileAtomically(path.toStdString(), tl::htmlReport(titled))) {
        if (error) *error = QDir::toNativeSeparators(path) + QStringLiteral(": ") + QString::fromStdString(*failed);
        return false;
    }
    return true;
}

}  // namespace tl::ui
