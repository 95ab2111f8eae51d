// Table models over core::Model (ui/tables/*): every edit is one undo step, bad text is
// refused with a message and leaves the model unchanged, block paste takes what it can
// and reports the rest, structure edits keep diet rows/columns aligned and undo exactly.
// The model is an invented demo lake built here (no real data).
#include <QSignalSpy>
#include <QTest>
#include <QUndoStack>

#include "core/store/project.h"
#include "ui/document/project_document.h"
#include "ui/tables/compartment_table_model.h"
#include "ui/tables/diet_table_model.h"
#include "ui/tables/harvest_table_model.h"
#include "ui/tables/routing_table_model.h"

using tl::CompartmentKind;
using tl::Param;
using tl::ui::CompartmentTableModel;

namespace {

tl::Compartment comp(const char* name, CompartmentKind kind, std::optional<double> b, std::optional<double> pb,
                     std::optional<double> qb)
{
    tl::Compartment c;
    c.name = name;
    c.kind = kind;
    c.value(Param::Biomass) = b;
    c.value(Param::PB) = pb;
    c.value(Param::QB) = qb;
    return c;
}

// Invented demo lake: Algae, Zooplankton, Perch, Detritus.
tl::Model demoLake()
{
    tl::Model m;
    m.addCompartment(comp("Algae", CompartmentKind::Producer, 20, 150, std::nullopt));
    m.addCompartment(comp("Zooplankton", CompartmentKind::Consumer, 12, 30, 120));
    m.addCompartment(comp("Perch", CompartmentKind::Consumer, std::nullopt, 1.2, 8));
    m.addCompartment(comp("Detritus", CompartmentKind::Detritus, 50, std::nullopt, std::nullopt));
    m.setDiet(1, 0, 0.7);
    m.setDiet(1, 3, 0.3);
    m.setDiet(2, 1, 0.8);
    m.setDiet(2, 3, 0.2);
    return m;
}

void load(tl::ui::ProjectDocument& doc, const tl::Model& m)
{
    tl::Project p;
    tl::Scenario s;
    s.name = "Base";
    s.model = m;
    p.scenarios.push_back(s);
    doc.setProject(p, 0, tl::ui::ProjectDocument::Origin::Untitled, {}, false);
}

}  // namespace

class TableModelsTest : public QObject {
    Q_OBJECT
private slots:
    void editingACellChangesTheModelAndUndoRestoresIt()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        const QModelIndex cell = table.index(1, CompartmentTableModel::columnOf(Param::Biomass));
        QVERIFY(table.setData(cell, QStringLiteral("12.5")));
        QCOMPARE(*doc.model().compartment(1).value(Param::Biomass), 12.5);
        QCOMPARE(doc.undoStack()->undoText(), QStringLiteral("Set B of Zooplankton to 12.5"));
        QVERIFY(doc.isModified());
        doc.undoStack()->undo();
        QCOMPARE(*doc.model().compartment(1).value(Param::Biomass), 12.0);
        QVERIFY(!doc.isModified());
        doc.undoStack()->redo();
        QCOMPARE(*doc.model().compartment(1).value(Param::Biomass), 12.5);
        // Clearing a cell makes the value unknown, not zero.
        QVERIFY(table.setData(cell, QString()));
        QVERIFY(!doc.model().compartment(1).value(Param::Biomass).has_value());
        QCOMPARE(doc.undoStack()->undoText(), QStringLiteral("Clear B of Zooplankton"));
    }

    void textInANumericCellIsRefusedWithItsMessage()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        QSignalSpy refused(&table, &tl::ui::ScenarioTableModel::inputRefused);
        const tl::Model before = doc.model();
        const QModelIndex cell = table.index(2, CompartmentTableModel::columnOf(Param::PB));
        QVERIFY(!table.setData(cell, QStringLiteral("about 3")));
        QCOMPARE(refused.count(), 1);
        const QString message = refused.front().front().toString();
        QVERIFY2(message.contains(QStringLiteral("P/B of Perch")), qPrintable(message));
        QVERIFY2(message.contains(QStringLiteral("number")), qPrintable(message));
        QVERIFY2(message.contains(QStringLiteral("about 3")), qPrintable(message));
        // A decimal comma is refused too, and the message says how to write it.
        QVERIFY(!table.setData(cell, QStringLiteral("1,5")));
        QVERIFY2(table.lastRefusal().contains(QStringLiteral("1.5")), qPrintable(table.lastRefusal()));
        // Negative biomass is refused; the range is named.
        QVERIFY(!table.setData(table.index(0, CompartmentTableModel::columnOf(Param::Biomass)), QStringLiteral("-4")));
        QVERIFY(table.lastRefusal().contains(QStringLiteral("negative")));
        QVERIFY(doc.model() == before);
        QCOMPARE(doc.undoStack()->count(), 0);
        QVERIFY(!doc.isModified());
    }

    void pastingA3x3BlockIsOneUndoStep()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        // Name, kind and B of the first three rows: text, a kind and numbers in one block.
        const QString block = QStringLiteral("Green algae\tproducer\t21\nZooplankton\tconsumer\t11\nPerch\tconsumer\t2.5\n");
        const auto report = table.pasteText(table.index(0, CompartmentTableModel::kNameColumn), block);
        QCOMPARE(report.taken, 9);
        QVERIFY(report.refused.empty());
        QCOMPARE(report.outside, 0);
        const tl::Model& m = doc.model();
        QCOMPARE(m.compartment(0).name, std::string("Green algae"));
        QCOMPARE(*m.compartment(0).value(Param::Biomass), 21.0);
        QCOMPARE(*m.compartment(1).value(Param::Biomass), 11.0);
        QCOMPARE(*m.compartment(2).value(Param::Biomass), 2.5);
        QCOMPARE(m.compartment(2).kind, CompartmentKind::Consumer);
        QCOMPARE(*m.compartment(2).value(Param::PB), 1.2);  // outside the block: untouched
        QCOMPARE(doc.undoStack()->count(), 1);
        QCOMPARE(doc.undoStack()->undoText(), QStringLiteral("Paste 9 cells"));
        doc.undoStack()->undo();
        QVERIFY(doc.model() == demoLake());
    }

    void pasteReportsCellsItCouldNotTake()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        // From Perch's B: row 2 takes 1 and refuses "x"; Detritus (row 3) takes 4 and has
        // no P/B (the empty cell asks nothing of it); the third line is below the table.
        const QString block = QStringLiteral("1\tx\n4\t\n7\t8\n");
        const auto report = table.pasteText(table.index(2, CompartmentTableModel::columnOf(Param::Biomass)), block);
        QCOMPARE(report.taken, 2);
        QCOMPARE(int(report.refused.size()), 1);
        QCOMPARE(report.refused.front().row, 2);
        QCOMPARE(report.refused.front().column, CompartmentTableModel::columnOf(Param::PB));
        QVERIFY(report.refused.front().reason.contains(QStringLiteral("P/B of Perch")));
        QCOMPARE(report.outside, 2);
        QCOMPARE(*doc.model().compartment(3).value(Param::Biomass), 4.0);
        QVERIFY(report.summary().contains(QStringLiteral("refused")));
        // The refused cell kept its old value.
        QCOMPARE(*doc.model().compartment(2).value(Param::PB), 1.2);
    }

    void fillDownAndClear()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        const int ee = CompartmentTableModel::columnOf(Param::EE);
        QVERIFY(table.setData(table.index(0, ee), QStringLiteral("0.5")));
        const auto filled = table.fillDown({table.index(0, ee), table.index(1, ee), table.index(2, ee)});
        QCOMPARE(filled.taken, 2);
        QCOMPARE(*doc.model().compartment(2).value(Param::EE), 0.5);
        const auto cleared = table.clearCells({table.index(1, ee), table.index(2, ee)});
        QCOMPARE(cleared.taken, 2);
        QVERIFY(!doc.model().compartment(1).value(Param::EE).has_value());
        QCOMPARE(*doc.model().compartment(0).value(Param::EE), 0.5);
    }

    void deletingACompartmentTakesItsDietRowAndColumnAndUndoBringsThemBack()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel compartments(&doc);
        tl::ui::DietTableModel diet(&doc);
        QCOMPARE(diet.rowCount(), 2);                  // Zooplankton, Perch
        QCOMPARE(diet.columnCount(), 4 + 2);           // four prey + import + sum
        compartments.removeCompartments({1});          // Zooplankton
        const tl::Model& m = doc.model();
        QCOMPARE(int(m.size()), 3);
        QVERIFY(!m.indexOf("Zooplankton"));
        QCOMPARE(diet.rowCount(), 1);                  // Perch only
        QCOMPARE(diet.columnCount(), 3 + 2);
        QCOMPARE(diet.headerData(0, Qt::Vertical, Qt::DisplayRole).toString(), QStringLiteral("Perch"));
        // Perch's detritus share survived the removal; its Zooplankton share went with the column.
        QCOMPARE(m.diet(*m.indexOf("Perch"), *m.indexOf("Detritus")), 0.2);
        QCOMPARE(m.dietRowSum(*m.indexOf("Perch")), 0.2);
        QCOMPARE(doc.undoStack()->undoText(), QStringLiteral("Remove compartment Zooplankton"));
        doc.undoStack()->undo();
        QVERIFY(doc.model() == demoLake());
        QCOMPARE(diet.rowCount(), 2);
        QCOMPARE(diet.columnCount(), 6);
        QCOMPARE(diet.index(1, 1).data(Qt::EditRole).toString(), QStringLiteral("0.8"));  // Perch eats Zooplankton
        QCOMPARE(diet.index(0, 0).data(Qt::EditRole).toString(), QStringLiteral("0.7"));  // Zooplankton eats Algae
    }

    void addAndMoveCompartmentsAreUndoable()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        const int row = table.addCompartment(1, CompartmentKind::Consumer);
        QCOMPARE(row, 1);
        QCOMPARE(QString::fromStdString(doc.model().compartment(1).name), QStringLiteral("New consumer"));
        QCOMPARE(table.moveCompartment(3, -1), 2);  // Perch up
        QCOMPARE(QString::fromStdString(doc.model().compartment(2).name), QStringLiteral("Perch"));
        // Moving keeps each predator's diet with it.
        QCOMPARE(doc.model().diet(2, *doc.model().indexOf("Zooplankton")), 0.8);
        doc.undoStack()->undo();
        doc.undoStack()->undo();
        QVERIFY(doc.model() == demoLake());
    }

    void namesMustBeUniqueAndKindsKnown()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        CompartmentTableModel table(&doc);
        QVERIFY(!table.setData(table.index(2, CompartmentTableModel::kNameColumn), QStringLiteral("Algae")));
        QVERIFY(table.lastRefusal().contains(QStringLiteral("unique")));
        // Names equal up to capitals and spaces are refused too (issue 13); names are trimmed.
        QVERIFY(!table.setData(table.index(2, CompartmentTableModel::kNameColumn), QStringLiteral(" algae ")));
        QVERIFY(table.lastRefusal().contains(QStringLiteral("Algae")));
        QCOMPARE(table.uniqueName(QStringLiteral("ALGAE")), QStringLiteral("ALGAE 2"));
        QVERIFY(!table.setData(table.index(2, CompartmentTableModel::kKindColumn), QStringLiteral("fish")));
        QVERIFY(table.setData(table.index(2, CompartmentTableModel::kNameColumn), QStringLiteral("Yellow perch")));
        QCOMPARE(doc.undoStack()->undoText(), QStringLiteral("Set the name of Perch to Yellow perch"));
        QVERIFY(table.setData(table.index(0, CompartmentTableModel::kKindColumn), QStringLiteral("consumer")));
        QCOMPARE(doc.model().compartment(0).kind, CompartmentKind::Consumer);
    }

    void unitsAppearInHeaders()
    {
        tl::ui::ProjectDocument doc;
        tl::Model m = demoLake();
        m.units.currency = "g C";
        m.units.area = "m²";
        load(doc, m);
        CompartmentTableModel table(&doc);
        const QString header = table.headerData(CompartmentTableModel::columnOf(Param::Biomass), Qt::Horizontal, Qt::DisplayRole).toString();
        QVERIFY2(header.contains(QStringLiteral("g C/m²")), qPrintable(header));
        QVERIFY(table.headerData(CompartmentTableModel::columnOf(Param::PB), Qt::Horizontal, Qt::DisplayRole).toString().contains(QStringLiteral("/year")));
    }

    void dietRowsSumAndNormalise()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        tl::ui::DietTableModel diet(&doc);
        // Perch row (1): set Zooplankton share to 0.6 -> sum 0.8, flagged short.
        QVERIFY(diet.setData(diet.index(1, 1), QStringLiteral("0.6")));
        QVERIFY(diet.index(1, diet.sumColumn()).data(Qt::DisplayRole).toString().contains(QStringLiteral("short by 0.200")));
        QVERIFY(!diet.setData(diet.index(1, 1), QStringLiteral("1.4")));  // a share above 1 is refused
        QVERIFY(diet.normaliseRow(1));
        const tl::Model& m = doc.model();
        QVERIFY(std::abs(m.dietRowSum(2) - 1.0) < 1e-12);
        QVERIFY(std::abs(m.diet(2, 1) - 0.75) < 1e-12);  // 0.6 / 0.8
        QVERIFY(diet.index(1, diet.sumColumn()).data(Qt::DisplayRole).toString().contains(QStringLiteral("sums to 1")));
        // Only Algae, Zooplankton and Detritus are eaten; Perch is not.
        const std::vector<bool> used = diet.usedPrey();
        QCOMPARE(used, (std::vector<bool>{true, true, false, true}));
    }

    void harvestFleetsAndCells()
    {
        tl::ui::ProjectDocument doc;
        load(doc, demoLake());
        tl::ui::HarvestTableModel harvest(&doc);
        QCOMPARE(harvest.columnCount(), 0);
        QCOMPARE(harvest.addFleet(QStringLiteral("Gill nets")), QStringLiteral("Gill nets"));
        QCOMPARE(harvest.columnCount(), 3);
        const int perchRow = harvest.rowOfCompartment(2);
        QVERIFY(harvest.setData(harvest.index(perchRow, 0), QStringLiteral("0.4")));
        QVERIFY(!harvest.setData(harvest.index(perchRow, 2), QStringLiteral("2")));  // survival is a fraction
        QCOMPARE(doc.model().landings(2), 0.4);
        doc.undoStack()->undo();
        QCOMPARE(doc.model().landings(2), 0.0);
        doc.undoStack()->undo();
        QCOMPARE(harvest.columnCount(), 0);
    }
};

QTEST_MAIN(TableModelsTest)
#include "table_models_test.moc"
