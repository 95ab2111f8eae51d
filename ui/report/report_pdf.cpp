#include "ui/report/report_pdf.h"

#include <string_view>

#include <QAbstractTextDocumentLayout>
#include <QBuffer>
#include <QFont>
#include <QGuiApplication>
#include <QPainter>
#include <QPdfWriter>
#include <QSvgRenderer>
#include <QTextCursor>
#include <QTextDocument>

#include "core/io/atomic_file.h"
#include "core/io/html_report.h"
#include "ui/report/svg_text_object.h"

namespace tl::ui {
namespace {

void ensureGuiApplication()
{
    if (QCoreApplication::instance()) return;
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
    static int argc = 1;
    static char name[] = "tledger";
    static char* argv[] = {name, nullptr};
    // Never deleted: the process ends right after the export (as figure_export.cpp).
    new QGuiApplication(argc, argv);
}

}  // namespace

std::string writeReportPdf(const tl::HtmlReport& report, const std::string& path)
{
    ensureGuiApplication();
    // Drawn into memory, then written by writeFileAtomically, which checks every write:
    // QPdfWriter on a file reports no write error, so a full disk would leave a cut-short
    // PDF that looked written (issue 12).
    QByteArray pdf;
    {
        QBuffer buffer(&pdf);
        buffer.open(QIODevice::WriteOnly);
        QPdfWriter writer(&buffer);
        writer.setResolution(96);  // layout in CSS pixels, as the HTML's figures are sized
        writer.setPageSize(QPageSize(QPageSize::A4));
        writer.setPageMargins(QMarginsF(15, 15, 15, 18), QPageLayout::Millimeter);
        writer.setTitle(QString::fromStdString(report.title));
        writer.setCreator(QStringLiteral("Trophic Ledger"));

        QTextDocument doc;
        doc.documentLayout()->setPaintDevice(&writer);
        SvgTextObject* svgObjects = new SvgTextObject(&doc);
        doc.documentLayout()->registerHandler(SvgTextObject::kType, svgObjects);
        QFont font(QStringLiteral("DejaVu Sans"));
        font.setPointSizeF(8.5);
        font.setStyleStrategy(QFont::PreferNoShaping);  // no ligatures: the PDF's text reads and searches as typed
        doc.setDefaultFont(font);
        doc.setHtml(QString::fromStdString(report.html));
        placeReportFigures(doc, report);

        const QSizeF page(writer.width(), writer.height());
        const double footer = 22;  // room for the page number under the text
        svgObjects->setMaximumSize(QSizeF(page.width() - 4, page.height() - footer - 40));
        doc.setPageSize(QSizeF(page.width(), page.height() - footer));
        QPainter painter;
        if (!painter.begin(&writer)) return path + ": cannot be written (the PDF could not be started)";
        const int pages = doc.pageCount();
        const double bodyHeight = page.height() - footer;
        for (int p = 0; p < pages; ++p) {
            if (p > 0) writer.newPage();
            painter.save();
            painter.translate(0, -p * bodyHeight);
            doc.drawContents(&painter, QRectF(0, p * bodyHeight, page.width(), bodyHeight));
            painter.restore();
            painter.setFont(font);
            painter.drawText(QRectF(0, page.height() - footer + 6, page.width(), footer - 6), Qt::AlignRight | Qt::AlignVCenter,
                             QStringLiteral("%1 · page %2 of %3").arg(QString::fromStdString(report.title)).arg(p + 1).arg(pages));
        }
        if (!painter.end()) return path + ": cannot be written (the PDF could not be finished)";
    }
    if (pdf.isEmpty()) return path + ": cannot be written (the PDF came out empty)";
    if (const auto error = tl::writeFileAtomically(path, std::string_view(pdf.constData(), static_cast<std::size_t>(pdf.size()))))
        return path + ": cannot be written (" + *error + ")";
    return {};
}

}  // namespace tl::ui
