// Draws one weighted cloud on a QCustomPlot: one marker per point, its area proportional to
// the point's share of the cloud's mass (uniform weights give the base size), selected
// points ringed. Thousands of points get smaller, translucent markers (adaptToCrowd). Faster than one QCPGraph per size class and keeps indices aligned with the
// cloud, which the editing tools rely on.
#pragma once

#include <Eigen/Core>
#include <QColor>
#include <qcustomplot.h>
#include <map>
#include <vector>

namespace barrow::ui {

enum class MarkerShape { Disc, Triangle, Diamond, Square };

class CloudLayer : public QCPAbstractPlottable {
  Q_OBJECT
 public:
  CloudLayer(QCPAxis* keyAxis, QCPAxis* valueAxis);

  /// Points (n x 2) and weights (n, >= 0, any total).
  void setData(const Eigen::MatrixX2d& points, const Eigen::VectorXd& weights);
  void setStyle(const QColor& color, MarkerShape shape, double baseSize);
  void setSelectedPoints(const std::vector<bool>& selected);
  void setHighlighted(int index);  // -1 = none
  /// Hollow markers (used for the cloud's unmoved position while a θ preview is shown).
  void setHollow(bool hollow);

  Eigen::Index pointCount() const { return points_.rows(); }
  const Eigen::MatrixX2d& points() const { return points_; }
  /// Index of the point nearest to pixel `pos` within `radiusPx`, or -1.
  int pointAt(const QPointF& pos, double radiusPx) const;
  /// Marker diameter in pixels for point i.
  double markerSize(Eigen::Index i) const;
  /// Opacity of the marker fill at the last draw: 0.78 for a few hundred points, lower when the
  /// markers would cover each pixel of the cloud several times over (see draw()).
  double fillAlpha() const { return alpha_; }

  double selectTest(const QPointF& pos, bool onlySelectable, QVariant* details = nullptr) const override;
  QCPRange getKeyRange(bool& foundRange, QCP::SignDomain inSignDomain = QCP::sdBoth) const override;
  QCPRange getValueRange(bool& foundRange, QCP::SignDomain inSignDomain = QCP::sdBoth,
                         const QCPRange& inKeyRange = QCPRange()) const override;

 protected:
  void draw(QCPPainter* painter) override;
  void drawLegendIcon(QCPPainter* painter, const QRectF& rect) const override;

 private:
  void drawMarker(QPainter* painter, const QPointF& c, double size) const;
  /// A pre-rendered marker of this diameter (screen drawing; vector exports draw shapes).
  const QPixmap& markerPixmap(double size, double dpr);
  /// Marker scale and fill opacity for the points now on screen: large clouds get smaller,
  /// fainter markers without outlines, so a cloud drawn first still shows through one drawn
  /// over it and dense regions read as denser.
  void adaptToCrowd();
  /// Raster screens, very large clouds: all markers blended into one image (see .cpp).
  void stampAll(QCPPainter* painter, const QRectF& clip, double dpr);
  QColor ringColor() const;

  Eigen::MatrixX2d points_;
  Eigen::VectorXd share_;  // weight × n / total: 1 for uniform weights
  std::vector<bool> selected_;
  int highlighted_ = -1;
  QColor color_;
  MarkerShape shape_ = MarkerShape::Disc;
  double baseSize_ = 7;
  bool hollow_ = false;
  std::map<int, QPixmap> sprites_;  // by diameter in quarter pixels
  double spriteDpr_ = 0;
  double alpha_ = 0.78;
  Eigen::Index visible_ = 0;  // points inside the clip rectangle at the last adaptToCrowd()
  double crowdScale_ = 1.0;
  bool outlined_ = true;
};

}  // namespace barrow::ui
