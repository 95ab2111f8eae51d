#include "ui/widgets/fieldwork_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QFontDatabase>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QLocale>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QScrollArea>
#include <QSplitter>
#include <QStackedWidget>
#include <QTableWidget>
#include <QVBoxLayout>
#include <cmath>
#include <set>

#include <qcustomplot.h>

#include "core/fieldwork/apply_estimate.h"
#include "core/fieldwork/empirical_equations.h"
#include "core/fieldwork/fieldwork_report.h"
#include "core/fieldwork/swept_area.h"
#include "core/store/project.h"
#include "ui/document/project_document.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

using namespace tl::fieldwork;

QString qs(const std::string& s) { return QString::fromStdString(s); }

std::filesystem::path pathOf(const QString& text) { return std::filesystem::path(text.trimmed().toStdString()); }

}  // namespace

FieldworkDialog::FieldworkDialog(ProjectDocument* doc, QWidget* parent) : QDialog(parent), doc_(doc)
{
    setWindowTitle(tr("Fieldwork: a parameter from survey data"));
    auto* outer = new QVBoxLayout(this);

    // Left: what to estimate, for which compartment, from what.
    auto* left = new QWidget;
    auto* leftLayout = new QVBoxLayout(left);
    leftLayout->setContentsMargins(0, 0, 0, 0);
    auto* head = new QFormLayout;
    kind_ = new QComboBox;
    kind_->addItems({tr("Biomass from trawl hauls (swept area)"), tr("P/B from lengths (total mortality Z)"),
                     tr("P/B from natural mortality (M + F)"), tr("Q/B from the consumption equation"),
                     tr("Diet from stomach contents")});
    head->addRow(tr("&Estimate"), kind_);
    compartment_ = new QComboBox;
    for (const tl::Compartment& c : doc_->model().compartments())
        if (c.isLiving()) compartment_->addItem(qs(c.name));
    head->addRow(tr("&Compartment"), compartment_);
    leftLayout->addLayout(head);

    pages_ = new QStackedWidget;
    // 1. Swept area.
    QWidget* p = newPage(tr("Sparre & Venema 1998. Catch per swept area of every haul (a haul without the "
                            "compartment's taxa counts as 0), stratified when a strata file is given. "
                            "Catchability X1 is an assumption you state, not an estimate."));
    addFileRow(p, "hauls", tr("Hauls"), tr("CSV (*.csv)"));
    addFileRow(p, "taxa", tr("Taxa → compartments"), tr("CSV (*.csv)"));
    addFileRow(p, "strata", tr("Strata (optional)"), tr("CSV (*.csv)"));
    addNumberRow(p, "catchability", tr("Catchability X1"), tr("1 = every fish in the net's path retained"));
    // 2. Lengths.
    p = newPage(tr("P/B = Z at steady state (Allen 1971). Z from the length-converted catch curve (Pauly 1983) or "
                   "from the mean length (Beverton & Holt 1956); K and L∞ are taken as exact."));
    addFileRow(p, "lengths", tr("Length frequencies"), tr("CSV (*.csv)"));
    taxon_ = new QComboBox;
    static_cast<QFormLayout*>(p->layout())->addRow(tr("Taxon"), taxon_);
    lengthMethod_ = new QComboBox;
    lengthMethod_->addItems({tr("Catch curve"), tr("Mean length")});
    static_cast<QFormLayout*>(p->layout())->addRow(tr("Method"), lengthMethod_);
    addNumberRow(p, "linf", tr("L∞ (cm)"), tr("asymptotic length"));
    addNumberRow(p, "k", tr("K (per year)"), tr("growth coefficient"));
    addNumberRow(p, "cutoff", tr("Cut-off L' (cm)"), tr("mean length only; empty: the modal class"));
    // 3. Natural mortality.
    p = newPage(tr("P/B = M + F with F = catch / B of the scenario (Allen 1971). M from a published empirical "
                   "equation; a warning says when an input lies outside the equation's data."));
    equation_ = new QComboBox;
    equation_->addItems({tr("Then et al. 2015, maximum age"), tr("Then et al. 2015, growth"), tr("Pauly 1980")});
    static_cast<QFormLayout*>(p->layout())->addRow(tr("Equation"), equation_);
    addNumberRow(p, "tmax", tr("Maximum age (years)"), tr("oldest fish aged"));
    addNumberRow(p, "m_linf", tr("L∞ (cm)"), tr("growth and Pauly 1980"));
    addNumberRow(p, "m_k", tr("K (per year)"), tr("growth and Pauly 1980"));
    addNumberRow(p, "m_temperature", tr("Temperature (°C)"), tr("Pauly 1980: mean annual"));
    // 4. Consumption.
    p = newPage(tr("Palomares & Pauly 1998: Q/B from asymptotic weight, temperature, the caudal fin's aspect "
                   "ratio and the food. No sampling CV (grade C)."));
    addNumberRow(p, "winf", tr("W∞ (g wet weight)"), tr("asymptotic weight"));
    addNumberRow(p, "q_temperature", tr("Temperature (°C)"), tr("mean annual water temperature"));
    addNumberRow(p, "aspect", tr("Aspect ratio A"), tr("caudal fin height² / surface"));
    food_ = new QComboBox;
    food_->addItems({tr("Carnivore"), tr("Herbivore"), tr("Detritivore")});
    static_cast<QFormLayout*>(p->layout())->addRow(tr("Food"), food_);
    // 5. Diet.
    p = newPage(tr("The compartment's diet row from prey weights or volumes; prey mapped to no compartment are "
                   "left out. CV per prey by bootstrap; grade from the number of stomachs."));
    addFileRow(p, "stomachs", tr("Stomach contents"), tr("CSV (*.csv)"));
    addFileRow(p, "d_taxa", tr("Taxa → compartments"), tr("CSV (*.csv)"));
    summary_ = new QComboBox;
    summary_->addItems({tr("Mean of proportions"), tr("Pooled")});
    static_cast<QFormLayout*>(p->layout())->addRow(tr("Summary"), summary_);

    auto* scroll = new QScrollArea;
    scroll->setWidget(pages_);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    leftLayout->addWidget(scroll, 1);
    auto* previewButton = new QPushButton(tr("&Preview"));
    leftLayout->addWidget(previewButton);

    // Right: the preview.
    auto* right = new QSplitter(Qt::Vertical);
    plot_ = new QCustomPlot;
    plot_->setMinimumHeight(190);
    plot_->xAxis->setLabel(tr("relative age (years)"));
    plot_->yAxis->setLabel(tr("ln(C / dt)"));
    // A catch curve descends to the right, so the lower left is where the legend hides nothing.
    plot_->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignBottom | Qt::AlignLeft);
    QFont legendFont = plot_->font();
    legendFont.setPointSizeF(legendFont.pointSizeF() * 0.85);
    plot_->legend->setFont(legendFont);
    plot_->legend->setRowSpacing(0);
    points_ = new QTableWidget(0, 5);
    points_->setHorizontalHeaderLabels({tr("Use"), tr("Length (cm)"), tr("Count"), tr("Age (years)"), tr("ln(C/dt)")});
    points_->horizontalHeader()->setStretchLastSection(true);
    points_->verticalHeader()->setVisible(false);
    points_->setToolTip(tr("Tick the points on the descending limb to use in the regression"));
    report_ = new QPlainTextEdit;
    report_->setReadOnly(true);
    report_->setFont(QFontDatabase::systemFont(QFontDatabase::FixedFont));
    report_->setLineWrapMode(QPlainTextEdit::WidgetWidth);
    report_->setPlaceholderText(tr("Choose the inputs and press Preview: the value, its CV and interval, how it was "
                                   "made and what it assumes appear here before anything is written."));
    headline_ = new QLabel(tr("No estimate yet."));
    headline_->setWordWrap(true);
    QFont bold = headline_->font();
    bold.setBold(true);
    bold.setPointSizeF(bold.pointSizeF() * 1.15);
    headline_->setFont(bold);
    headline_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    auto* reportBox = new QWidget;
    auto* reportLayout = new QVBoxLayout(reportBox);
    reportLayout->setContentsMargins(0, 0, 0, 0);
    reportLayout->addWidget(headline_);
    reportLayout->addWidget(report_, 1);
    right->addWidget(plot_);
    right->addWidget(points_);
    right->addWidget(reportBox);
    right->setStretchFactor(2, 1);

    auto* body = new QSplitter(Qt::Horizontal);
    body->addWidget(left);
    body->addWidget(right);
    body->setStretchFactor(1, 1);
    body->setChildrenCollapsible(false);
    outer->addWidget(body, 1);

    status_ = new QLabel(decisionSupportNotice());
    status_->setWordWrap(true);
    outer->addWidget(status_);
    auto* buttons = new QDialogButtonBox;
    write_ = buttons->addButton(tr("&Write into the scenario"), QDialogButtonBox::AcceptRole);
    write_->setEnabled(false);
    buttons->addButton(QDialogButtonBox::Close);
    outer->addWidget(buttons);

    connect(kind_, &QComboBox::currentIndexChanged, this, &FieldworkDialog::kindChanged);
    connect(compartment_, &QComboBox::currentIndexChanged, this, [this] { kindChanged(); });
    connect(previewButton, &QPushButton::clicked, this, &FieldworkDialog::preview);
    connect(write_, &QPushButton::clicked, this, &FieldworkDialog::write);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(points_, &QTableWidget::itemChanged, this, [this](QTableWidgetItem* item) {
        if (!fillingPoints_ && item->column() == 0) preview();  // a point (de)selected: regress again
    });
    connect(equation_, &QComboBox::currentIndexChanged, this, &FieldworkDialog::kindChanged);
    connect(lengthMethod_, &QComboBox::currentIndexChanged, this, &FieldworkDialog::kindChanged);
    kindChanged();
}

QWidget* FieldworkDialog::newPage(const QString& intro)
{
    auto* page = new QWidget;
    auto* form = new QFormLayout(page);
    form->setRowWrapPolicy(QFormLayout::WrapLongRows);
    auto* label = new QLabel(intro);
    label->setWordWrap(true);
    form->addRow(label);
    pages_->addWidget(page);
    return page;
}

QLineEdit* FieldworkDialog::addFileRow(QWidget* page, const QString& name, const QString& label, const QString& filter)
{
    auto* row = new QWidget;
    auto* h = new QHBoxLayout(row);
    h->setContentsMargins(0, 0, 0, 0);
    auto* edit = new QLineEdit;
    edit->setPlaceholderText(tr("path of a .csv file"));
    auto* browse = new QPushButton(tr("Browse…"));
    h->addWidget(edit, 1);
    h->addWidget(browse);
    static_cast<QFormLayout*>(page->layout())->addRow(label, row);
    fields_.emplace_back(name, edit);
    connect(browse, &QPushButton::clicked, this, [this, edit, label, filter] {
        const QString file = QFileDialog::getOpenFileName(this, label, edit->text(), filter);
        if (!file.isEmpty()) edit->setText(file);
    });
    if (name == "lengths") connect(edit, &QLineEdit::textChanged, this, &FieldworkDialog::fillTaxa);
    return edit;
}

QLineEdit* FieldworkDialog::addNumberRow(QWidget* page, const QString& name, const QString& label,
                                         const QString& placeholder)
{
    auto* edit = new QLineEdit;
    edit->setPlaceholderText(placeholder);
    static_cast<QFormLayout*>(page->layout())->addRow(label, edit);
    fields_.emplace_back(name, edit);
    return edit;
}

void FieldworkDialog::setKind(Kind kind) { kind_->setCurrentIndex(static_cast<int>(kind)); }
void FieldworkDialog::setCompartment(const QString& name) { compartment_->setCurrentText(name); }

void FieldworkDialog::setField(const QString& name, const QString& value)
{
    if (name == "taxon") return taxon_->setCurrentText(value);
    if (name == "length_method") return lengthMethod_->setCurrentIndex(value == "mean-length" ? 1 : 0);
    if (name == "equation")
        return equation_->setCurrentIndex(value == "then-growth" ? 1 : value == "pauly1980" ? 2 : 0);
    for (auto& [n, edit] : fields_)
        if (n == name) edit->setText(value);
}

QString FieldworkDialog::previewText() const { return headline_->text() + "\n" + report_->toPlainText(); }

QString FieldworkDialog::text(const QString& name) const
{
    for (const auto& [n, edit] : fields_)
        if (n == name) return edit->text().trimmed();
    return {};
}

FieldworkDialog::Kind FieldworkDialog::kind() const { return static_cast<Kind>(kind_->currentIndex()); }

tl::Param FieldworkDialog::targetParam() const
{
    switch (kind()) {
    case Kind::Biomass: return tl::Param::Biomass;
    case Kind::Consumption: return tl::Param::QB;
    default: return tl::Param::PB;
    }
}

// A number field; accepts the C locale and the user's. Names the field when it cannot be read.
std::optional<double> FieldworkDialog::number(const QString& name, bool required, QString* why) const
{
    const QString t = text(name);
    QString label = name;
    for (const auto& [n, edit] : fields_)
        if (n == name)
            if (auto* form = qobject_cast<QFormLayout*>(edit->parentWidget()->layout()))
                if (auto* l = qobject_cast<QLabel*>(form->labelForField(edit))) label = l->text();
    if (t.isEmpty()) {
        if (required && why->isEmpty()) *why = tr("%1: give a number.").arg(label);
        return std::nullopt;
    }
    bool ok = false;
    double v = t.toDouble(&ok);
    if (!ok) v = QLocale().toDouble(t, &ok);
    if (!ok || !std::isfinite(v)) {
        if (why->isEmpty()) *why = tr("%1: '%2' is not a number.").arg(label, t);
        return std::nullopt;
    }
    return v;
}

void FieldworkDialog::kindChanged()
{
    pages_->setCurrentIndex(kind_->currentIndex());
    const bool curve = kind() == Kind::LengthMortality && lengthMethod_->currentIndex() == 0;
    plot_->setVisible(curve);
    points_->setVisible(curve);
    points_->setRowCount(0);
    estimate_.reset();
    diet_.reset();
    write_->setEnabled(false);
    const QString what = kind() == Kind::Diet ? tr("diet") : qs(std::string(tl::paramSymbol(targetParam())));
    write_->setText(tr("&Write %1 of %2").arg(what, compartment_->currentText()));
}

void FieldworkDialog::fillTaxa()
{
    const QString keep = taxon_->currentText();
    taxon_->clear();
    const auto read = readLengths(pathOf(text("lengths")));
    if (!read.value) return;
    std::set<std::string> taxa;
    for (const LengthClass& c : *read.value) taxa.insert(c.taxon);
    for (const std::string& t : taxa) taxon_->addItem(qs(t));
    if (!keep.isEmpty()) taxon_->setCurrentText(keep);
}

void FieldworkDialog::showFailure(const tl::Problems& problems, const QString& what)
{
    QString text = what.isEmpty() ? tr("No estimate:") : what;
    for (const tl::Problem& p : problems)
        text += "\n" + qs(p.describe()) + (p.hint.empty() ? QString() : " (" + qs(p.hint) + ")");
    report_->setPlainText(text);
    headline_->setText(tr("No estimate: see below."));
    estimate_.reset();
    diet_.reset();
    write_->setEnabled(false);
}

void FieldworkDialog::showCatchCurve(const CatchCurveResult& r)
{
    fillingPoints_ = true;
    points_->setRowCount(static_cast<int>(r.points.size()));
    QVector<double> usedX, usedY, otherX, otherY;
    for (int i = 0; i < points_->rowCount(); ++i) {
        const CatchCurvePoint& p = r.points[std::size_t(i)];
        auto* use = new QTableWidgetItem;
        use->setFlags(p.usable ? Qt::ItemIsUserCheckable | Qt::ItemIsEnabled : Qt::ItemIsEnabled);
        use->setCheckState(p.selected ? Qt::Checked : Qt::Unchecked);
        if (!p.usable) use->setText(tr("no"));
        points_->setItem(i, 0, use);
        const auto cell = [&](int col, const QString& s) {
            auto* item = new QTableWidgetItem(s);
            item->setFlags(Qt::ItemIsEnabled);
            item->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
            points_->setItem(i, col, item);
        };
        cell(1, QString("%1–%2").arg(p.fromCm).arg(p.toCm));
        cell(2, QString::number(p.count));
        cell(3, p.dt > 0 ? QString::number(p.age, 'g', 4) : QStringLiteral("–"));
        cell(4, p.usable ? QString::number(p.lnCdt, 'g', 4) : QStringLiteral("–"));
        if (!p.usable) continue;
        (p.selected ? usedX : otherX).push_back(p.age);
        (p.selected ? usedY : otherY).push_back(p.lnCdt);
    }
    points_->resizeColumnsToContents();
    fillingPoints_ = false;

    plot_->clearGraphs();
    const QColor ink = palette().color(QPalette::WindowText);
    auto* used = plot_->addGraph();
    used->setData(usedX, usedY);
    used->setLineStyle(QCPGraph::lsNone);
    used->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssDisc, ink, ink, 7));
    used->setName(tr("used"));
    auto* other = plot_->addGraph();
    other->setData(otherX, otherY);
    other->setLineStyle(QCPGraph::lsNone);
    other->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCircle, ink, 7));
    other->setName(tr("not used"));
    if (r.estimate.valid && !usedX.isEmpty()) {
        const auto [lo, hi] = std::minmax_element(usedX.begin(), usedX.end());
        auto* line = plot_->addGraph();
        line->setData({*lo, *hi}, {r.intercept + r.slope * *lo, r.intercept + r.slope * *hi});
        line->setPen(QPen(QColor(0, 114, 178), 2));  // Okabe-Ito blue
        line->setName(tr("regression, Z = %1").arg(r.estimate.value, 0, 'g', 4));
    }
    plot_->legend->setVisible(true);
    plot_->rescaleAxes();
    plot_->xAxis->scaleRange(1.1);
    plot_->yAxis->scaleRange(1.15);
    plot_->replot();
}

bool FieldworkDialog::preview()
{
    estimate_.reset();
    diet_.reset();
    write_->setEnabled(false);
    QString why;
    const std::string compartment = compartment_->currentText().toStdString();
    std::string extra;  // tables shown above the estimate
    tl::Problems problems;
    std::optional<Estimate> e;

    switch (kind()) {
    case Kind::Biomass: {
        const auto hauls = readHauls(pathOf(text("hauls")));
        const auto taxa = readTaxa(pathOf(text("taxa")));
        problems = hauls.problems;
        problems.insert(problems.end(), taxa.problems.begin(), taxa.problems.end());
        std::vector<Stratum> strata;
        if (!text("strata").isEmpty()) {
            const auto s = readStrata(pathOf(text("strata")));
            problems.insert(problems.end(), s.problems.begin(), s.problems.end());
            if (s.value) strata = *s.value;
        }
        SweptAreaOptions o;
        o.catchability = number("catchability", false, &why).value_or(1.0);
        if (!why.isEmpty()) return showFailure({}, why), false;
        if (tl::hasErrors(problems)) return showFailure(problems, tr("The survey files cannot be used:")), false;
        const SweptAreaResult r = sweptAreaBiomass(*hauls.value, *taxa.value, compartment, strata, o);
        if (!r.estimate.valid) return showFailure(r.estimate.problems, {}), false;
        extra = sweptAreaTable(r);
        e = r.estimate;
        break;
    }
    case Kind::LengthMortality: {
        const auto linf = number("linf", true, &why), k = number("k", true, &why);
        const auto cutoff = number("cutoff", false, &why);
        if (!why.isEmpty()) return showFailure({}, why), false;
        const auto lengths = readLengths(pathOf(text("lengths")));
        if (!lengths.value) return showFailure(lengths.problems, tr("The length file cannot be used:")), false;
        const auto classes = classesOf(*lengths.value, taxon_->currentText().toStdString());
        if (classes.empty()) return showFailure({}, tr("Choose a taxon of the length file.")), false;
        if (lengthMethod_->currentIndex() == 0) {
            std::vector<std::size_t> chosen;
            if (points_->rowCount() == int(classes.size()))  // the user's choice of points, if any
                for (int i = 0; i < points_->rowCount(); ++i)
                    if (points_->item(i, 0) && points_->item(i, 0)->checkState() == Qt::Checked) chosen.push_back(std::size_t(i));
            if (points_->rowCount() == int(classes.size()) && chosen.empty()) chosen.push_back(classes.size());  // none: refused below
            const CatchCurveResult r = lengthConvertedCatchCurve(classes, {*linf, *k}, chosen);
            showCatchCurve(r);
            if (!r.estimate.valid) return showFailure(r.estimate.problems, {}), false;
            const std::string table = catchCurveTable(r);  // the points are in the table above: keep the regression line
            extra = table.substr(table.rfind("regression over"));
            e = r.estimate;
        } else {
            const MeanLengthResult r = meanLengthZ(classes, {*linf, *k}, cutoff);
            if (!r.estimate.valid) return showFailure(r.estimate.problems, {}), false;
            e = r.estimate;
        }
        e->assumptions.push_back("P/B = Z at steady state (Allen 1971)");
        break;
    }
    case Kind::NaturalMortality: {
        const int eq = equation_->currentIndex();
        const auto tmax = number("tmax", eq == 0, &why);
        const auto linf = number("m_linf", eq != 0, &why), k = number("m_k", eq != 0, &why);
        const auto t = number("m_temperature", eq == 2, &why);
        if (!why.isEmpty()) return showFailure({}, why), false;
        e = eq == 0 ? thenMortalityFromMaxAge(*tmax) : eq == 1 ? thenMortalityFromGrowth(*linf, *k)
                                                               : paulyNaturalMortality(*linf, *k, *t);
        if (!e->valid) return showFailure(e->problems, {}), false;
        break;
    }
    case Kind::Consumption: {
        const auto winf = number("winf", true, &why), t = number("q_temperature", true, &why),
                   a = number("aspect", true, &why);
        if (!why.isEmpty()) return showFailure({}, why), false;
        const FeedingType food = food_->currentIndex() == 1   ? FeedingType::Herbivore
                                 : food_->currentIndex() == 2 ? FeedingType::Detritivore
                                                              : FeedingType::Carnivore;
        e = palomaresPaulyConsumption(*winf, *t, *a, food);
        if (!e->valid) return showFailure(e->problems, {}), false;
        break;
    }
    case Kind::Diet: {
        const auto stomachs = readStomachs(pathOf(text("stomachs")));
        const auto taxa = readTaxa(pathOf(text("d_taxa")));
        problems = stomachs.problems;
        problems.insert(problems.end(), taxa.problems.begin(), taxa.problems.end());
        if (tl::hasErrors(problems)) return showFailure(problems, tr("The survey files cannot be used:")), false;
        DietOptions o;
        o.summary = summary_->currentIndex() == 1 ? DietSummary::Pooled : DietSummary::MeanOfProportions;
        StomachDiet d = dietFromStomachs(*stomachs.value, *taxa.value, compartment, o);
        if (!d.valid) return showFailure(d.problems, {}), false;
        headline_->setText(tr("Diet of %1 from %2 stomachs, grade %3")
                               .arg(compartment_->currentText())
                               .arg(d.stomachs - d.emptyStomachs)
                               .arg(qs(std::string(tl::gradeKey(d.grade)))));
        report_->setPlainText(qs(dietText(d)) + "\n" + tr("Write replaces the whole diet row of %1.")
                                                          .arg(compartment_->currentText()));
        diet_ = std::move(d);
        write_->setEnabled(true);
        return true;
    }
    }

    // What will be written: B in the project's unit, M as P/B = M + F.
    param_ = targetParam();
    const auto index = doc_->model().indexOf(compartment);
    Estimate toWrite = *e;
    QString written;
    if (index) {
        const tl::Problems prepared = prepareForParameter(doc_->model(), *index, param_, toWrite);
        if (tl::hasErrors(prepared)) return showFailure(prepared, qs(estimateText(*e)) + "\n" + tr("Cannot be written:")), false;
        if (toWrite.quantity != e->quantity || toWrite.unit != e->unit)
            written = "\n" + tr("To be written:") + "\n" + qs(estimateText(toWrite));
    }
    const QString report = qs(estimateText(*e));
    headline_->setText(report.section('\n', 0, 0));
    report_->setPlainText(report.section('\n', 1) + written + (extra.empty() ? QString() : "\n" + qs(extra)));
    estimate_ = *e;
    write_->setEnabled(index.has_value());
    return true;
}

bool FieldworkDialog::write()
{
    const auto index = doc_->model().indexOf(compartment_->currentText().toStdString());
    if (!index || (!estimate_ && !diet_)) return false;
    const std::string date = tl::utcNowIso8601();
    const QString name = compartment_->currentText();
    QString warning;
    if (diet_) {
        tl::Project after = doc_->project();
        tl::Scenario& s = after.scenarios[std::size_t(doc_->currentIndex())];
        const tl::Problems p = applyDiet(s.model, s.description, *index, *diet_, date);
        if (tl::hasErrors(p)) return showFailure(p, tr("Not written:")), false;
        doc_->editProject(after, doc_->currentIndex(), tr("Set the diet of %1 from stomach contents").arg(name));
    } else {
        tl::Model after = doc_->model();
        const tl::Problems p = applyEstimate(after, *index, param_, *estimate_, date);
        if (tl::hasErrors(p)) return showFailure(p, tr("Not written:")), false;
        doc_->editModel(after, tr("Set %1 of %2 from fieldwork (%3)")
                                   .arg(qs(std::string(tl::paramSymbol(param_))), name, qs(estimate_->method)));
        for (const tl::Problem& w : p) warning += " " + qs(w.message) + ". " + qs(w.hint);
    }
    status_->setText(tr("Written into scenario '%1'. Edit > Undo takes it back.%2 %3")
                         .arg(qs(doc_->scenario().name), warning, decisionSupportNotice()));
    write_->setEnabled(false);
    return true;
}

}  // namespace tl::ui
