#include "ui/results/flow_map_scene.h"

#include <QFont>
#include <QFontMetricsF>
#include <QGraphicsPathItem>
#include <QGraphicsSceneHoverEvent>
#include <QGraphicsSceneMouseEvent>
#include <QGraphicsSimpleTextItem>
#include <QPainter>
#include <QPainterPath>
#include <QStyleOptionGraphicsItem>
#include <algorithm>
#include <cmath>
#include <map>

#include "ui/style/palette.h"

namespace tl::ui {
namespace {

constexpr double kMinRibbon = 1.0, kMaxRibbon = 12.0;
constexpr double kAxisY = 34.0;
constexpr double kCornerRadius = 7.0;
constexpr qreal kDimmedBox = 0.22, kDimmedRibbon = 0.07;

QFont captionFont() { return QFont(QStringLiteral("DejaVu Sans"), 9); }

QString number(double v) { return QString::number(v, 'g', 3); }

QPainterPath boxPath(const FlowMapNode& node, double w, double h)
{
    QPainterPath path;
    if (node.role == FlowMapRole::Fleet) {  // a hull: wide deck, narrower keel
        path.moveTo(0, 0);
        path.lineTo(w, 0);
        path.lineTo(w * 0.80, h);
        path.lineTo(w * 0.20, h);
        path.closeSubpath();
    } else {
        path.addRoundedRect(QRectF(0, 0, w, h), kCornerRadius, kCornerRadius);
    }
    return path;
}

enum class Side { Left, Right, Top, Bottom };

}  // namespace

// --- items ----------------------------------------------------------------------------

class FlowMapBoxItem : public QGraphicsPathItem {
public:
    FlowMapBoxItem(FlowMapScene* scene, std::size_t node, const FlowMapNode& n, QColor colour, double w, double h)
        : scene_(scene), node_(node), size_(w, h)
    {
        setPath(boxPath(n, w, h));
        setBrush(colour);
        setPen(QPen(colour.darker(150), 1.2));
        setFlags(ItemIsMovable | ItemSendsGeometryChanges);
        setAcceptHoverEvents(true);
        setZValue(2);
        setCursor(Qt::OpenHandCursor);
        // Caption under the box on a faint white plate, so ribbons passing behind it
        // do not cut through the letters.
        caption_ = new QGraphicsSimpleTextItem(QString::fromStdString(n.name), this);
        caption_->setFont(captionFont());
        caption_->setBrush(Qt::black);
        const QRectF r = caption_->boundingRect();
        const QPointF at((w - r.width()) / 2, h + 4);
        QPainterPath plate;
        plate.addRoundedRect(QRectF(at, r.size()).adjusted(-2, 0, 2, 0), 3, 3);
        auto* plateItem = new QGraphicsPathItem(plate, this);
        plateItem->setPen(Qt::NoPen);
        plateItem->setBrush(QColor(255, 255, 255, 215));
        caption_->setPos(at);
        caption_->setZValue(1);
    }
    QSizeF size() const { return size_; }
    QRectF rect() const { return QRectF(pos(), size_); }

protected:
    QVariant itemChange(GraphicsItemChange change, const QVariant& value) override
    {
        if (change == ItemPositionHasChanged) scene_->nodeMoved(node_);
        return QGraphicsPathItem::itemChange(change, value);
    }
    void hoverEnterEvent(QGraphicsSceneHoverEvent* e) override
    {
        scene_->highlight(node_);
        QGraphicsPathItem::hoverEnterEvent(e);
    }
    void hoverLeaveEvent(QGraphicsSceneHoverEvent* e) override
    {
        scene_->highlight(std::nullopt);
        QGraphicsPathItem::hoverLeaveEvent(e);
    }
    void mouseReleaseEvent(QGraphicsSceneMouseEvent* e) override
    {
        QGraphicsPathItem::mouseReleaseEvent(e);
        scene_->nodeReleased(node_);
    }
    void mouseDoubleClickEvent(QGraphicsSceneMouseEvent* e) override
    {
        emit scene_->nodeActivated(QString::fromStdString(scene_->nodes()[node_].name));
        QGraphicsPathItem::mouseDoubleClickEvent(e);
    }

private:
    FlowMapScene* scene_;
    std::size_t node_;
    QSizeF size_;
    QGraphicsSimpleTextItem* caption_;
};

class FlowMapRibbonItem : public QGraphicsPathItem {
public:
    FlowMapRibbonItem(const FlowMapEdge& edge, QColor colour, double width) : edge_(edge)
    {
        colour.setAlphaF(0.5);
        setPen(QPen(colour, width, Qt::SolidLine, Qt::FlatCap, Qt::RoundJoin));
        setBrush(Qt::NoBrush);
        setZValue(1);
        head_ = colour.darker(140);
        head_.setAlphaF(0.9);
    }
    const FlowMapEdge& edge() const { return edge_; }
    void setCurve(const QPainterPath& curve)
    {
        prepareGeometryChange();
        setPath(curve);
    }
    QRectF boundingRect() const override
    {
        const double pad = pen().widthF() / 2 + 8;
        return path().boundingRect().adjusted(-pad, -pad, pad, pad);
    }
    void paint(QPainter* painter, const QStyleOptionGraphicsItem* option, QWidget* widget) override
    {
        QGraphicsPathItem::paint(painter, option, widget);
        // Arrow head at the end, along the curve's last tangent.
        const QPainterPath& p = path();
        if (p.elementCount() < 2) return;
        const QPointF end = p.pointAtPercent(1.0);
        const QPointF before = p.pointAtPercent(0.97);
        QPointF dir = end - before;
        const double len = std::hypot(dir.x(), dir.y());
        if (len <= 0) return;
        dir /= len;
        const QPointF normal(-dir.y(), dir.x());
        const double size = std::max(5.0, pen().widthF() * 0.6 + 4.0);
        const QPointF tip = end;
        const QPointF base = end - dir * size;
        painter->setPen(Qt::NoPen);
        painter->setBrush(head_);
        painter->drawPolygon(QPolygonF({tip, base + normal * size * 0.55, base - normal * size * 0.55}));
    }

private:
    FlowMapEdge edge_;
    QColor head_;
};

// --- scene ----------------------------------------------------------------------------

FlowMapScene::FlowMapScene(QObject* parent) : QGraphicsScene(parent) { setBackgroundBrush(Qt::white); }

FlowMapScene::~FlowMapScene() = default;

void FlowMapScene::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    nodes_.clear();
    edges_.clear();
    kinds_.clear();
    toolTips_.clear();
    unavailable_.clear();
    flowUnit_ = QString::fromStdString(model.units.flow());
    biomassUnit_ = QString::fromStdString(model.units.biomass());
    compartmentCount_ = model.size();
    const QFontMetricsF fm(captionFont());

    if (sheet.status == BalanceStatus::Invalid || sheet.rows.size() != model.size()) {
        unavailable_ = tr("The scenario could not be solved, so there are no flows to map. "
                          "See the balance sheet for the problems.");
        compartmentCount_ = 0;
        rebuild();
        return;
    }
    const FlowNetwork net = buildFlowNetwork(model, sheet);
    for (std::size_t i = 0; i < model.size(); ++i) {
        const CompartmentBalance& row = sheet.rows[i];
        FlowMapNode n;
        n.name = model.compartment(i).name;
        n.role = isLiving(model.compartment(i).kind) ? FlowMapRole::Living : FlowMapRole::Detritus;
        n.trophicLevel = std::isfinite(row.tl) ? row.tl : 1.0;
        n.biomass = row.biomass;
        n.labelWidth = fm.horizontalAdvance(QString::fromStdString(n.name)) + 4;
        n.labelHeight = fm.height();
        nodes_.push_back(n);
        kinds_.push_back(model.compartment(i).kind);
        toolTips_.push_back(tr("<b>%1</b> (%2)<br>TL %3<br>B = %4 %5").arg(QString::fromStdString(n.name).toHtmlEscaped(),
                                                                        kindLabel(model.compartment(i).kind).toLower(),
                                                                        std::isfinite(row.tl) ? QString::number(row.tl, 'f', 2) : "–",
                                                                        number(row.biomass), biomassUnit_));
    }
    for (std::size_t f = 0; f < net.fleetNames.size(); ++f) {
        FlowMapNode n;
        n.name = net.fleetNames[f];
        n.role = FlowMapRole::Fleet;
        n.labelWidth = fm.horizontalAdvance(QString::fromStdString(n.name)) + 4;
        n.labelHeight = fm.height();
        nodes_.push_back(n);
        kinds_.push_back(CompartmentKind::Consumer);  // unused for fleets
        toolTips_.push_back(tr("<b>%1</b> (fleet)").arg(QString::fromStdString(n.name).toHtmlEscaped()));
    }
    const auto size = static_cast<Eigen::Index>(net.size());
    for (Eigen::Index i = 0; i < size; ++i)
        for (Eigen::Index j = 0; j < size; ++j)
            if (net.flows(i, j) > 0)
                edges_.push_back({static_cast<std::size_t>(i), static_cast<std::size_t>(j), net.flows(i, j)});
    for (Eigen::Index f = 0; f < net.fleetLandings.rows(); ++f)
        for (Eigen::Index i = 0; i < net.fleetLandings.cols() && i < size; ++i) {
            const double c = net.fleetLandings(f, i) + (f < net.fleetDeadDiscards.rows() && i < net.fleetDeadDiscards.cols()
                                                            ? net.fleetDeadDiscards(f, i) : 0.0);
            if (c > 0) edges_.push_back({static_cast<std::size_t>(i), compartmentCount_ + static_cast<std::size_t>(f), c});
        }
    rebuild();
}

double FlowMapScene::ribbonWidth(double flow) const
{
    if (!(flow > 0) || !(maxFlow_ > 0)) return kMinRibbon;
    if (maxFlow_ <= minFlow_ * (1 + 1e-12)) return (kMinRibbon + kMaxRibbon) / 2;
    const double t = (std::log(flow) - std::log(minFlow_)) / (std::log(maxFlow_) - std::log(minFlow_));
    return kMinRibbon + (kMaxRibbon - kMinRibbon) * std::clamp(t, 0.0, 1.0);
}

void FlowMapScene::rebuild()
{
    rebuilding_ = true;
    highlighted_.reset();
    clear();
    boxes_.clear();
    ribbons_.clear();
    maxBiomass_ = 0;
    if (!unavailable_.isEmpty() || nodes_.empty()) {
        auto* text = addSimpleText(unavailable_.isEmpty() ? tr("No compartments to map.") : unavailable_, captionFont());
        text->setPos(20, 20);
        setSceneRect(text->sceneBoundingRect().adjusted(-20, -20, 20, 20));
        rebuilding_ = false;
        return;
    }

    FlowMapLayoutOptions options;
    options.margin = 60;
    layout_ = layoutFlowMap(nodes_, edges_, options);
    minFlow_ = 0;
    maxFlow_ = 0;
    for (const auto& e : edges_) {
        minFlow_ = minFlow_ > 0 ? std::min(minFlow_, e.flow) : e.flow;
        maxFlow_ = std::max(maxFlow_, e.flow);
    }
    for (const auto& n : nodes_)
        if (n.role != FlowMapRole::Fleet && std::isfinite(n.biomass)) maxBiomass_ = std::max(maxBiomass_, n.biomass);

    addDecorations();
    for (std::size_t i = 0; i < nodes_.size(); ++i) {
        const BoxGeometry& g = layout_.boxes[i];
        const QColor colour = nodes_[i].role == FlowMapRole::Fleet ? fleetColour() : kindColour(kinds_[i]);
        auto* box = new FlowMapBoxItem(this, i, nodes_[i], colour, g.width, g.height);
        box->setPos(g.x, g.y);
        box->setToolTip(toolTips_[i]);
        addItem(box);
        boxes_.push_back(box);
    }
    for (const auto& e : edges_) {
        const QColor colour = e.to >= compartmentCount_ ? fleetColour() : kindColour(kinds_[e.from]);
        auto* ribbon = new FlowMapRibbonItem(e, colour, ribbonWidth(e.flow));
        ribbon->setToolTip(tr("%1 → %2: %3 %4").arg(QString::fromStdString(nodes_[e.from].name).toHtmlEscaped(),
                                                     QString::fromStdString(nodes_[e.to].name).toHtmlEscaped(),
                                                     number(e.flow), flowUnit_));
        addItem(ribbon);
        ribbons_.push_back(ribbon);
    }
    for (auto it = overrides_.cbegin(); it != overrides_.cend(); ++it)
        for (std::size_t i = 0; i < boxes_.size(); ++i)
            if (positionKey(i) == it.key()) boxes_[i]->setPos(it.value());
    rebuilding_ = false;
    setThreshold(threshold_);
    updateRibbons();
    addLegend(itemsBoundingRect().bottom());
    setSceneRect(itemsBoundingRect().adjusted(-20, -20, 20, 20));
}

void FlowMapScene::addDecorations()
{
    const QFont font = captionFont();
    const QColor grey(0x88, 0x88, 0x88);
    // Trophic-level axis along the top, with faint guides at each integer level.
    const int lastLevel = std::max(2, static_cast<int>(std::floor(layout_.maxLevel + 0.5)));
    const double x0 = layout_.levelToX(1.0), x1 = layout_.levelToX(std::max<double>(lastLevel, layout_.maxLevel));
    addLine(x0, kAxisY, x1, kAxisY, QPen(Qt::black, 1.0));
    for (int level = 1; level <= lastLevel; ++level) {
        const double x = layout_.levelToX(level);
        addLine(x, kAxisY, x, kAxisY + 6, QPen(Qt::black, 1.0));
        auto* guide = addLine(x, kAxisY + 8, x, layout_.detritusLaneTop - 6, QPen(QColor(0xdd, 0xdd, 0xdd), 1.0, Qt::DashLine));
        guide->setZValue(-1);
        auto* label = addSimpleText(QString::number(level), font);
        label->setPos(x - label->boundingRect().width() / 2, kAxisY - label->boundingRect().height() - 2);
    }
    auto* axisTitle = addSimpleText(tr("Trophic level"), font);
    axisTitle->setPos(x1 + 12, kAxisY - axisTitle->boundingRect().height() / 2);
    if (nodes_.size() > compartmentCount_) {  // the fleets' column has no trophic level
        double left = 1e300, right = -1e300;
        for (std::size_t i = compartmentCount_; i < nodes_.size(); ++i) {
            left = std::min(left, layout_.boxes[i].x);
            right = std::max(right, layout_.boxes[i].right());
        }
        auto* fleets = addSimpleText(tr("Fleets"), font);
        fleets->setPos(std::max((left + right) / 2 - fleets->boundingRect().width() / 2, axisTitle->sceneBoundingRect().right() + 16),
                       kAxisY - fleets->boundingRect().height() / 2);
    }

    bool hasDetritus = false;
    for (const auto& n : nodes_) hasDetritus |= n.role == FlowMapRole::Detritus;
    if (hasDetritus) {
        auto* lane = addRect(QRectF(10, layout_.detritusLaneTop, layout_.width - 20,
                                    layout_.detritusLaneBottom - layout_.detritusLaneTop),
                             Qt::NoPen, QColor(0xf3, 0xef, 0xe6));
        lane->setZValue(-2);
        QFont italic = font;
        italic.setItalic(true);
        auto* laneTitle = addSimpleText(tr("Detritus lane"), italic);
        laneTitle->setBrush(grey.darker(130));
        laneTitle->setPos(14, layout_.detritusLaneTop - laneTitle->boundingRect().height() - 2);
    }
}

void FlowMapScene::addLegend(double top)
{
    const QFont font = captionFont();
    double x = 20;
    const double y = top + 24;
    auto swatch = [&](const FlowMapNode& shape, QColor colour, const QString& text) {
        auto* item = addPath(boxPath(shape, 26, 17), QPen(colour.darker(150), 1.0), colour);
        item->setPos(x, y);
        auto* label = addSimpleText(text, font);
        label->setPos(x + 32, y + (17 - label->boundingRect().height()) / 2);
        x += 32 + label->boundingRect().width() + 22;
    };
    FlowMapNode boxShape, fleetShape;
    fleetShape.role = FlowMapRole::Fleet;
    swatch(boxShape, kindColour(CompartmentKind::Producer), kindLabel(CompartmentKind::Producer));
    swatch(boxShape, kindColour(CompartmentKind::Consumer), kindLabel(CompartmentKind::Consumer));
    swatch(boxShape, kindColour(CompartmentKind::Detritus), kindLabel(CompartmentKind::Detritus));
    if (nodes_.size() > compartmentCount_) swatch(fleetShape, fleetColour(), tr("Fleet (catch)"));

    // Ribbon widths for three flows, and what box area means.
    x = 20;
    const double y2 = y + 36;
    auto* what = addSimpleText(tr("Ribbon width ∝ log(flow), %1:").arg(flowUnit_), font);
    what->setPos(x, y2 - what->boundingRect().height() / 2);
    x += what->boundingRect().width() + 14;
    if (maxFlow_ > 0) {
        const double samples[] = {minFlow_, std::sqrt(minFlow_ * maxFlow_), maxFlow_};
        for (double f : samples) {
            addLine(x, y2, x + 36, y2, QPen(QColor(0x55, 0x55, 0x55, 150), ribbonWidth(f), Qt::SolidLine, Qt::FlatCap));
            auto* label = addSimpleText(number(f), font);
            label->setPos(x + 42, y2 - label->boundingRect().height() / 2);
            x += 42 + label->boundingRect().width() + 20;
        }
    }
    x += 10;
    auto* area = addSimpleText(tr("Box area ∝ biomass; largest B = %1 %2 (smallest boxes at a legible minimum)")
                                   .arg(number(maxBiomass_), biomassUnit_), font);
    area->setPos(x, y2 - area->boundingRect().height() / 2);
    auto* notice = addSimpleText(decisionSupportNotice(), font);
    notice->setBrush(QColor(0x55, 0x55, 0x55));
    notice->setPos(20, y2 + 18);
}

QRectF FlowMapScene::boxRect(std::size_t node) const
{
    return node < boxes_.size() ? boxes_[node]->rect() : QRectF();
}

QRectF FlowMapScene::footprintRect(std::size_t node) const
{
    if (node >= boxes_.size()) return {};
    const QRectF box = boxRect(node);
    const double w = std::max(box.width(), nodes_[node].labelWidth);
    return QRectF(box.center().x() - w / 2, box.top(), w, box.height() + 4 + nodes_[node].labelHeight);
}

QRectF FlowMapScene::figureRect() const { return itemsBoundingRect().adjusted(-12, -12, 12, 12); }

void FlowMapScene::setThreshold(double flow)
{
    threshold_ = std::max(0.0, flow);
    for (auto* r : ribbons_) r->setVisible(r->edge().flow >= threshold_);
}

int FlowMapScene::visibleRibbonCount() const
{
    return static_cast<int>(std::count_if(ribbons_.begin(), ribbons_.end(), [](auto* r) { return r->isVisible(); }));
}

// Ribbon ends: each leaves and enters a box side; ends sharing a side are spread along
// it in the order of their other ends, so that ribbons do not start on top of each other.
void FlowMapScene::updateRibbons()
{
    if (rebuilding_) return;
    struct Port { std::size_t ribbon; bool start; double key; };
    std::map<std::pair<std::size_t, int>, std::vector<Port>> ports;
    std::vector<std::pair<Side, Side>> sides(ribbons_.size());
    for (std::size_t k = 0; k < ribbons_.size(); ++k) {
        const FlowMapEdge& e = ribbons_[k]->edge();
        const QRectF a = boxRect(e.from), b = boxRect(e.to);
        const bool aLane = nodes_[e.from].role == FlowMapRole::Detritus, bLane = nodes_[e.to].role == FlowMapRole::Detritus;
        Side s = Side::Right, t = Side::Left;
        if (e.from == e.to) { s = Side::Top; t = Side::Top; }
        else if (!aLane && bLane) { s = Side::Right; t = Side::Top; }
        else if (aLane && !bLane) { s = Side::Top; t = Side::Left; }
        else if (aLane && bLane) { s = Side::Bottom; t = Side::Bottom; }
        sides[k] = {s, t};
        auto key = [](Side side, const QRectF& other) {
            return (side == Side::Left || side == Side::Right) ? other.center().y() : other.center().x();
        };
        ports[{e.from, static_cast<int>(s)}].push_back({k, true, key(s, b)});
        ports[{e.to, static_cast<int>(t)}].push_back({k, false, key(t, a)});
    }
    std::vector<QPointF> starts(ribbons_.size()), ends(ribbons_.size());
    for (auto& [where, list] : ports) {
        std::stable_sort(list.begin(), list.end(), [](const Port& p, const Port& q) { return p.key < q.key; });
        const QRectF r = boxRect(where.first);
        const auto side = static_cast<Side>(where.second);
        const double n = static_cast<double>(list.size());
        for (std::size_t k = 0; k < list.size(); ++k) {
            const double t = (static_cast<double>(k) + 1.0) / (n + 1.0);
            QPointF p;
            switch (side) {
            case Side::Left: p = QPointF(r.left(), r.top() + t * r.height()); break;
            case Side::Right: p = QPointF(r.right(), r.top() + t * r.height()); break;
            case Side::Top: p = QPointF(r.left() + t * r.width(), r.top()); break;
            case Side::Bottom: p = QPointF(r.left() + t * r.width(), r.bottom()); break;
            }
            (list[k].start ? starts : ends)[list[k].ribbon] = p;
        }
    }
    for (std::size_t k = 0; k < ribbons_.size(); ++k) {
        const FlowMapEdge& e = ribbons_[k]->edge();
        const QPointF s = starts[k], t = ends[k];
        const QRectF a = boxRect(e.from);
        QPainterPath path(s);
        const double reach = std::max(40.0, std::abs(t.x() - s.x()) * 0.45);
        switch (sides[k].first) {
        case Side::Top:
            if (sides[k].second == Side::Top) {  // cannibalism: a small loop off the top-right corner
                const QPointF from(a.right(), a.top() + a.height() * 0.3), into(a.right() - a.width() * 0.2, a.top());
                path = QPainterPath(from);
                path.cubicTo(from + QPointF(30, -4), into + QPointF(4, -30), into);
            } else {
                path.cubicTo(s + QPointF(0, -std::max(40.0, std::abs(s.y() - t.y()) * 0.5)), t - QPointF(reach, 0), t);
            }
            break;
        case Side::Bottom:
            path.cubicTo(s + QPointF(0, 40), t + QPointF(0, 40), t);
            break;
        default:
            if (sides[k].second == Side::Top)
                path.cubicTo(s + QPointF(std::max(30.0, a.width() * 0.6), 0),
                             t - QPointF(0, std::max(40.0, std::abs(t.y() - s.y()) * 0.5)), t);
            else if (t.x() > s.x() + 20)
                path.cubicTo(s + QPointF(reach, 0), t - QPointF(reach, 0), t);
            else  // against the level order: swing out right, come back into the left side
                path.cubicTo(s + QPointF(90, 0), t - QPointF(90, 0), t);
            break;
        }
        ribbons_[k]->setCurve(path);
    }
}

void FlowMapScene::nodeMoved(std::size_t) { updateRibbons(); }

void FlowMapScene::nodeReleased(std::size_t node)
{
    if (node >= boxes_.size()) return;
    const QPointF laid(layout_.boxes[node].x, layout_.boxes[node].y);
    if (boxes_[node]->pos() != laid || overrides_.contains(positionKey(node))) {
        overrides_[positionKey(node)] = boxes_[node]->pos();
        emit positionsChanged();
    }
}

QString FlowMapScene::positionKey(std::size_t node) const
{
    const QString name = QString::fromStdString(nodes_[node].name);
    return node >= compartmentCount_ ? QStringLiteral("fleet:") + name : name;
}

QHash<QString, QPointF> FlowMapScene::positions() const
{
    QHash<QString, QPointF> out;
    for (std::size_t i = 0; i < boxes_.size(); ++i) out.insert(positionKey(i), boxes_[i]->pos());
    return out;
}

void FlowMapScene::setPositions(const QHash<QString, QPointF>& positions)
{
    for (auto it = positions.cbegin(); it != positions.cend(); ++it) overrides_.insert(it.key(), it.value());
    rebuilding_ = true;
    for (std::size_t i = 0; i < boxes_.size(); ++i)
        if (auto it = positions.find(positionKey(i)); it != positions.end()) boxes_[i]->setPos(*it);
    rebuilding_ = false;
    updateRibbons();
}

void FlowMapScene::replaceMovedPositions(const QHash<QString, QPointF>& moved)
{
    if (moved == overrides_) return;
    overrides_ = moved;
    rebuild();
}

void FlowMapScene::resetLayout()
{
    overrides_.clear();
    rebuild();
}

bool FlowMapScene::isDimmed(std::size_t node) const
{
    return node < boxes_.size() && boxes_[node]->opacity() < 0.5;
}

void FlowMapScene::highlight(std::optional<std::size_t> node)
{
    highlighted_ = node;
    std::vector<bool> bright(boxes_.size(), !node.has_value());
    if (node && *node < bright.size()) {
        bright[*node] = true;
        for (auto* r : ribbons_) {
            if (r->edge().from == *node) bright[r->edge().to] = true;
            if (r->edge().to == *node) bright[r->edge().from] = true;
        }
    }
    for (std::size_t i = 0; i < boxes_.size(); ++i) boxes_[i]->setOpacity(bright[i] ? 1.0 : kDimmedBox);
    for (auto* r : ribbons_) {
        const bool touches = !node || r->edge().from == *node || r->edge().to == *node;
        r->setOpacity(touches ? 1.0 : kDimmedRibbon);
        r->setZValue(touches && node ? 1.5 : 1.0);
    }
}

}  // namespace tl::ui
