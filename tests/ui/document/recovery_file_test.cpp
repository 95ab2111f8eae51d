// Autosave and crash recovery (ui/document/recovery_file.*): unsaved work is written to
// a recovery project file on the timer, found again by a later session, loaded as
// unsaved work equal to what was being edited, and removed once saved.
#include <QDir>
#include <QFileInfo>
#include <QSignalSpy>
#include <QTemporaryDir>
#include <QTest>

#include "core/store/project.h"
#include "ui/document/project_document.h"
#include "ui/document/recovery_file.h"

namespace {

tl::Project demoProject()  // invented demo data
{
    tl::Project p;
    p.info.title = "Demo pond";
    tl::Scenario s;
    s.name = "Base";
    tl::Compartment algae;
    algae.name = "Algae";
    algae.kind = tl::CompartmentKind::Producer;
    algae.value(tl::Param::Biomass) = 10.0;
    s.model.addCompartment(algae);
    tl::Compartment det;
    det.name = "Detritus";
    det.kind = tl::CompartmentKind::Detritus;
    s.model.addCompartment(det);
    p.scenarios.push_back(s);
    tl::Scenario t = s;
    t.name = "Dry year";
    t.parent = "Base";
    p.scenarios.push_back(t);
    return p;
}

}  // namespace

class RecoveryFileTest : public QObject {
    Q_OBJECT
private slots:
    void autosaveIsWrittenOnTheTimerAndRecovered()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        tl::Model edited;
        {
            tl::ui::ProjectDocument doc;
            doc.setProject(demoProject(), 1, tl::ui::ProjectDocument::Origin::Untitled, {}, false);
            tl::ui::RecoveryKeeper keeper(&doc, dir.path());
            keeper.setInterval(50);
            QSignalSpy written(&keeper, &tl::ui::RecoveryKeeper::written);
            // Nothing is written while there is nothing unsaved.
            QTest::qWait(150);
            QCOMPARE(written.count(), 0);
            tl::Model m = doc.model();
            m.compartment(0).value(tl::Param::Biomass) = 12.5;
            doc.editModel(m, QStringLiteral("Set B of Algae to 12.5"));
            QVERIFY(written.wait(2000));
            QVERIFY(QFileInfo::exists(keeper.recoveryFile()));
            edited = doc.model();
            // Simulate a crash: the keeper is destroyed without discard().
        }
        const auto found = tl::ui::RecoveryKeeper::findRecoverable(dir.path(), /*includeLive=*/true);
        QCOMPARE(found.size(), 1);
        QCOMPARE(found.front().currentScenario, 1);

        tl::ui::ProjectDocument restored;
        QString error;
        QVERIFY2(tl::ui::RecoveryKeeper::recover(found.front(), &restored, &error), qPrintable(error));
        QCOMPARE(restored.project().scenarios.size(), std::size_t(2));
        QCOMPARE(QString::fromStdString(restored.scenario().name), QStringLiteral("Dry year"));
        QVERIFY(restored.model() == edited);
        QCOMPARE(QString::fromStdString(restored.project().scenarios[1].parent), QStringLiteral("Base"));
        QVERIFY(restored.isModified());  // recovered work is unsaved until saved
        QVERIFY(tl::ui::RecoveryKeeper::findRecoverable(dir.path(), true).isEmpty());
    }

    void savingDiscardsTheRecoveryFile()
    {
        QTemporaryDir dir;
        tl::ui::ProjectDocument doc;
        doc.setProject(demoProject(), 0, tl::ui::ProjectDocument::Origin::Untitled, {}, false);
        tl::ui::RecoveryKeeper keeper(&doc, dir.path() + QStringLiteral("/recovery"));
        tl::Model m = doc.model();
        m.compartment(0).value(tl::Param::Biomass) = 3.0;
        doc.editModel(m, QStringLiteral("edit"));
        QString error;
        QVERIFY2(keeper.writeNow(&error), qPrintable(error));
        QVERIFY(QFileInfo::exists(keeper.recoveryFile()));
        QVERIFY2(doc.saveAs(dir.path() + QStringLiteral("/pond.tledger"), &error), qPrintable(error));
        QVERIFY(!doc.isModified());
        QVERIFY(!QFileInfo::exists(keeper.recoveryFile()));
        // The saved file reads back to the same project.
        tl::ui::ProjectDocument reopened;
        QVERIFY2(reopened.open(dir.path() + QStringLiteral("/pond.tledger"), &error), qPrintable(error));
        QVERIFY(reopened.model() == doc.model());
        QCOMPARE(reopened.project().scenarios.size(), std::size_t(2));
        QVERIFY(!QFileInfo::exists(dir.path() + QStringLiteral("/pond.tledger.saving")));
    }
};

QTEST_MAIN(RecoveryFileTest)
#include "recovery_file_test.moc"
