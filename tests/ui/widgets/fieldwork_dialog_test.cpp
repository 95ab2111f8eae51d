// The Fieldwork dialog (ui/widgets/fieldwork_dialog.h): it previews the value and its
// interval from the same core functions as tledger fieldwork, writes nothing before
// Write, writes the value with its CV and note as ONE undoable edit, lets the catch
// curve's points be chosen, names the cell of a bad survey file, and fits a window of
// 1024 x 700. With TL_SNAPSHOT_DIR set it keeps pictures at the two window sizes.
#include <QApplication>
#include <QDir>
#include <QPushButton>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>

#include "core/fieldwork/length_mortality.h"
#include "core/fieldwork/swept_area.h"
#include "tests/support/test_support.h"
#include "ui/document/project_document.h"
#include "ui/widgets/fieldwork_dialog.h"

using namespace tl::ui;
using Kind = FieldworkDialog::Kind;

namespace {

const QString kSurvey = QStringLiteral(TL_SAMPLES_DIR "/reservoir_survey/");

void keepSnapshot(QWidget& widget, const QString& name)
{
    if (qEnvironmentVariableIsEmpty("TL_SNAPSHOT_DIR")) return;
    QDir().mkpath(qEnvironmentVariable("TL_SNAPSHOT_DIR"));
    widget.grab().save(qEnvironmentVariable("TL_SNAPSHOT_DIR") + "/" + name + ".png");
}

double valueOf(const ProjectDocument& doc, const char* compartment, tl::Param p)
{
    return doc.model().compartment(*doc.model().indexOf(compartment)).value(p).value_or(-1);
}

}  // namespace

class FieldworkDialogTest : public QObject {
    Q_OBJECT

private:
    ProjectDocument doc_;

    void openReservoir()
    {
        QString error;
        QVERIFY2(doc_.open(QStringLiteral(TL_SAMPLES_DIR "/reservoir.tledger"), &error, true), qPrintable(error));
        doc_.setCurrentIndex(0);
    }

private slots:
    void biomassPreviewThenWriteThenUndo()
    {
        openReservoir();
        FieldworkDialog dialog(&doc_);
        dialog.setKind(Kind::Biomass);
        dialog.setCompartment("Roach adults");
        dialog.setField("hauls", kSurvey + "hauls.csv");
        dialog.setField("taxa", kSurvey + "taxa.csv");
        dialog.setField("strata", kSurvey + "strata.csv");
        dialog.setField("catchability", "0.5");
        QVERIFY(!dialog.writeButton()->isEnabled());
        QVERIFY(dialog.preview());
        QVERIFY(dialog.writeButton()->isEnabled());
        QCOMPARE(valueOf(doc_, "Roach adults", tl::Param::Biomass), 13.0);  // nothing written by a preview

        // The same number tledger fieldwork and the core give.
        const auto hauls = tl::fieldwork::readHauls((kSurvey + "hauls.csv").toStdString());
        const auto taxa = tl::fieldwork::readTaxa((kSurvey + "taxa.csv").toStdString());
        const auto strata = tl::fieldwork::readStrata((kSurvey + "strata.csv").toStdString());
        tl::fieldwork::SweptAreaOptions o;
        o.catchability = 0.5;
        const auto r = tl::fieldwork::sweptAreaBiomass(*hauls.value, *taxa.value, "Roach adults", *strata.value, o);
        QVERIFY(dialog.previewText().contains("CI"));
        QVERIFY(dialog.previewText().contains("catchability X1 = 0.5"));

        const int commands = doc_.undoStack()->count();
        QVERIFY(dialog.write());
        QCOMPARE(doc_.undoStack()->count(), commands + 1);
        QCOMPARE(valueOf(doc_, "Roach adults", tl::Param::Biomass), r.estimate.value);
        const tl::Confidence& c = doc_.model().compartment(*doc_.model().indexOf("Roach adults")).confidenceOf(tl::Param::Biomass);
        QCOMPARE(*c.cv, *r.estimate.cv);
        QVERIFY(c.source.find("swept area") != std::string::npos);
        dialog.show();
        dialog.resize(1200, 760);
        QApplication::processEvents();
        keepSnapshot(dialog, "fieldwork-biomass");
        doc_.undoStack()->undo();
        QCOMPARE(valueOf(doc_, "Roach adults", tl::Param::Biomass), 13.0);
        doc_.undoStack()->redo();
        QCOMPARE(valueOf(doc_, "Roach adults", tl::Param::Biomass), r.estimate.value);
    }

    void catchCurvePointsAreSelectable()
    {
        openReservoir();
        FieldworkDialog dialog(&doc_);
        dialog.setKind(Kind::LengthMortality);
        dialog.setCompartment("Perch adults");
        dialog.setField("lengths", kSurvey + "lengths.csv");
        dialog.setField("taxon", "perch adult");
        dialog.setField("linf", "40");
        dialog.setField("k", "0.25");
        QVERIFY(dialog.preview());
        QTableWidget* points = dialog.pointsTable();
        QVERIFY(points->rowCount() > 5);
        const QString before = dialog.previewText();
        // Untick the first used point: the regression runs again on the rest.
        int first = -1;
        for (int i = 0; i < points->rowCount() && first < 0; ++i)
            if (points->item(i, 0)->checkState() == Qt::Checked) first = i;
        QVERIFY(first >= 0);
        points->item(first, 0)->setCheckState(Qt::Unchecked);
        QVERIFY(dialog.previewText() != before);
        QVERIFY(dialog.previewText().contains("Z ="));
        dialog.show();
        dialog.resize(1200, 760);  // what the main window gives it at 1600 x 1000
        QApplication::processEvents();
        keepSnapshot(dialog, "fieldwork-catch-curve-1600x1000");
        dialog.resize(921, 630);  // what the main window gives it at 1024 x 700 (90 %)
        QApplication::processEvents();
        QVERIFY(dialog.writeButton()->isVisible());
        QCOMPARE(dialog.size(), QSize(921, 630));  // the dialog's minimum size allows it
        const QRect button(dialog.writeButton()->mapTo(&dialog, QPoint(0, 0)), dialog.writeButton()->size());
        QVERIFY2(dialog.rect().contains(button), "the Write button is inside the dialog at 1024 x 700");
        keepSnapshot(dialog, "fieldwork-catch-curve-1024x700");
        QVERIFY(dialog.write());
        QVERIFY(std::abs(valueOf(doc_, "Perch adults", tl::Param::PB) - 0.95) < 0.3);
        doc_.undoStack()->undo();
        QCOMPARE(valueOf(doc_, "Perch adults", tl::Param::PB), 0.95);
    }

    void badSurveyFileNamesTheCell()
    {
        openReservoir();
        QTemporaryDir dir;
        const QString file = dir.filePath("hauls.csv");
        tl::testing::writeText(file.toStdString(), "station,haul,date,swept_area_km2,taxon,catch_kg\n"
                                                   "A,1,2026-07-01,0.02,roach adult,4\n"
                                                   "B,1,2026-07-01,0.02,roach adult,four\n");
        FieldworkDialog dialog(&doc_);
        dialog.setKind(Kind::Biomass);
        dialog.setCompartment("Roach adults");
        dialog.setField("hauls", file);
        dialog.setField("taxa", kSurvey + "taxa.csv");
        QVERIFY(!dialog.preview());
        QVERIFY2(dialog.previewText().contains("hauls.csv:3:6:"), qPrintable(dialog.previewText()));
        QVERIFY(!dialog.writeButton()->isEnabled());
        dialog.setKind(Kind::Consumption);
        dialog.setField("winf", "lots");
        QVERIFY(!dialog.preview());
        QVERIFY2(dialog.previewText().contains("'lots' is not a number"), qPrintable(dialog.previewText()));
        dialog.show();
        dialog.resize(1200, 760);
        QApplication::processEvents();
        keepSnapshot(dialog, "fieldwork-bad-input");
    }

    void dietAndDescriptionAreOneUndoableEdit()
    {
        openReservoir();
        FieldworkDialog dialog(&doc_);
        dialog.setKind(Kind::Diet);
        dialog.setCompartment("Zander adults");
        dialog.setField("stomachs", kSurvey + "stomachs.csv");
        dialog.setField("d_taxa", kSurvey + "taxa.csv");
        QVERIFY(dialog.preview());
        const tl::Project before = doc_.project();
        QVERIFY(dialog.write());
        const tl::Model& m = doc_.model();
        const std::size_t z = *m.indexOf("Zander adults");
        QVERIFY(std::abs(m.dietRowSum(z) - 1.0) < 1e-12);
        QVERIFY(doc_.scenario().description.find("diet of Zander adults") != std::string::npos);
        dialog.show();
        dialog.resize(1200, 760);
        QApplication::processEvents();
        keepSnapshot(dialog, "fieldwork-diet");
        doc_.undoStack()->undo();
        QVERIFY(doc_.project() == before);
    }

    void naturalMortalityShowsWhatWillBeWritten()
    {
        openReservoir();
        FieldworkDialog dialog(&doc_);
        dialog.setKind(Kind::NaturalMortality);
        dialog.setCompartment("Pike");
        dialog.setField("equation", "then-tmax");
        dialog.setField("tmax", "15");
        QVERIFY(dialog.preview());
        QVERIFY(dialog.previewText().contains("To be written"));
        QVERIFY(dialog.previewText().contains("P/B"));
        QVERIFY(dialog.write());
        const tl::Model& m = doc_.model();
        const std::size_t pike = *m.indexOf("Pike");
        QVERIFY(std::abs(*m.compartment(pike).value(tl::Param::PB) -
                         (4.899 * std::pow(15.0, -0.916) + m.totalCatch(pike) / 0.9)) < 1e-12);
    }
};

QTEST_MAIN(FieldworkDialogTest)
#include "fieldwork_dialog_test.moc"
