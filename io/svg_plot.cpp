#include "io/svg_plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <functional>
#include <sstream>

#include "io/table.hpp"

namespace siiplan::io {

namespace {

const char* kPalette[] = {"#1f5fa8", "#c4451c", "#2b8a3e", "#8a3ea8", "#b08800", "#117a8b", "#a8325e", "#555555"};

// Tick spacing of 1, 2 or 5 times a power of ten giving about `target` ticks.
double nice_step(double span, int target) {
  if (!(span > 0)) return 1;
  double raw = span / target;
  double mag = std::pow(10.0, std::floor(std::log10(raw)));
  double f = raw / mag;
  return (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10) * mag;
}

std::string fmt(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", v);
  return buf;
}

}  // namespace

std::string xml_escape(const std::string& text) {
  std::string out;
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string Plot::render(int width, int height) const {
  double xmin = std::numeric_limits<double>::infinity(), xmax = -xmin, ymin = xmin, ymax = -xmin;
  for (auto& s : series)
    for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
      if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) continue;
      double e = (s.style == PlotSeries::Style::PointsWithErrors && i < s.y_err.size()) ? s.y_err[i] : 0;
      xmin = std::min(xmin, s.x[i]); xmax = std::max(xmax, s.x[i]);
      ymin = std::min(ymin, s.y[i] - e); ymax = std::max(ymax, s.y[i] + e);
    }
  for (const auto& sh : shades) { xmin = std::min(xmin, sh.x0); xmax = std::max(xmax, sh.x1); }
  if (!std::isfinite(xmin)) { xmin = 0; xmax = 1; }
  if (!std::isfinite(ymin)) { ymin = 0; ymax = 1; }
  if (x_min) xmin = *x_min;
  if (x_max) xmax = *x_max;
  if (y_min) ymin = *y_min;
  if (y_max) ymax = *y_max;
  if (xmax <= xmin) { xmin -= 0.5; xmax += 0.5; }
  if (ymax <= ymin) { ymin -= 0.5; ymax += 0.5; }

  const double left = 70, right = 20, top = title.empty() ? 20 : 40, bottom = 55;
  double pw = width - left - right, ph = height - top - bottom;
  if (equal_aspect) {
    double sx = pw / (xmax - xmin), sy = ph / (ymax - ymin);
    if (sx > sy) { double c = 0.5 * (xmin + xmax), h = 0.5 * pw / sy; xmin = c - h; xmax = c + h; }
    else { double c = 0.5 * (ymin + ymax), h = 0.5 * ph / sx; ymin = c - h; ymax = c + h; }
  }
  auto X = [&](double x) { return left + (x - xmin) / (xmax - xmin) * pw; };
  auto Y = [&](double y) { return top + (ymax - y) / (ymax - ymin) * ph; };

  std::ostringstream o;
  o << "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" << width << "\" height=\"" << height
    << "\" viewBox=\"0 0 " << width << ' ' << height << "\" font-family=\"sans-serif\" font-size=\"12\">\n";
  o << "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n";
  if (!title.empty())
    o << "<text x=\"" << width / 2 << "\" y=\"22\" text-anchor=\"middle\" font-size=\"14\" font-weight=\"bold\">"
      << xml_escape(title) << "</text>\n";
  // Unique per chart (several charts share one HTML page), yet deterministic.
  const std::string clip_id = "clip" + std::to_string(std::hash<std::string>{}(
      title + '|' + x_label + '|' + y_label + '|' + std::to_string(series.size()) + '|' + std::to_string(width)));
  o << "<clipPath id=\"" << clip_id << "\"><rect x=\"" << left << "\" y=\"" << top << "\" width=\"" << pw << "\" height=\""
    << ph << "\"/></clipPath>\n";
  for (auto& sh : shades) {
    double a = std::max(X(sh.x0), left), b = std::min(X(sh.x1), left + pw);
    if (b <= a) continue;
    o << "<rect x=\"" << fmt(a) << "\" y=\"" << top << "\" width=\"" << fmt(b - a) << "\" height=\"" << ph
      << "\" fill=\"" << sh.color << "\" opacity=\"0.6\"><title>" << xml_escape(sh.label) << "</title></rect>\n";
    if (!sh.label.empty())
      o << "<text x=\"" << fmt(a + 2) << "\" y=\"" << fmt(top + 12) << "\" font-size=\"10\" fill=\"#333\">"
        << xml_escape(sh.label) << "</text>\n";
  }
  // Grid and ticks.
  double xs = nice_step(xmax - xmin, 8), ys = nice_step(ymax - ymin, 6);
  for (double t = std::ceil(xmin / xs) * xs; t <= xmax + 1e-9 * xs; t += xs) {
    o << "<line x1=\"" << fmt(X(t)) << "\" y1=\"" << top << "\" x2=\"" << fmt(X(t)) << "\" y2=\"" << top + ph
      << "\" stroke=\"#eee\"/>";
    o << "<text x=\"" << fmt(X(t)) << "\" y=\"" << top + ph + 16 << "\" text-anchor=\"middle\">"
      << format_number(std::abs(t) < 1e-12 * xs ? 0.0 : t, 6) << "</text>\n";
  }
  for (double t = std::ceil(ymin / ys) * ys; t <= ymax + 1e-9 * ys; t += ys) {
    o << "<line x1=\"" << left << "\" y1=\"" << fmt(Y(t)) << "\" x2=\"" << left + pw << "\" y2=\"" << fmt(Y(t))
      << "\" stroke=\"#eee\"/>";
    o << "<text x=\"" << left - 6 << "\" y=\"" << fmt(Y(t) + 4) << "\" text-anchor=\"end\">"
      << format_number(std::abs(t) < 1e-12 * ys ? 0.0 : t, 6) << "</text>\n";
  }
  o << "<rect x=\"" << left << "\" y=\"" << top << "\" width=\"" << pw << "\" height=\"" << ph
    << "\" fill=\"none\" stroke=\"#333\"/>\n";
  o << "<text x=\"" << left + pw / 2 << "\" y=\"" << height - 12 << "\" text-anchor=\"middle\">"
    << xml_escape(x_label) << "</text>\n";
  o << "<text transform=\"translate(16," << top + ph / 2 << ") rotate(-90)\" text-anchor=\"middle\">"
    << xml_escape(y_label) << "</text>\n";

  o << "<g clip-path=\"url(#" << clip_id << ")\">\n";
  for (auto& m : markers) {
    if (m.vertical) {
      if (m.at < xmin || m.at > xmax) continue;
      o << "<line x1=\"" << fmt(X(m.at)) << "\" y1=\"" << top << "\" x2=\"" << fmt(X(m.at)) << "\" y2=\""
        << top + ph << "\" stroke=\"" << m.color << "\" stroke-dasharray=\"4 3\"/>";
      o << "<text x=\"" << fmt(X(m.at) + 3) << "\" y=\"" << top + 14 << "\" fill=\"" << m.color
        << "\" font-size=\"11\">" << xml_escape(m.label) << "</text>\n";
    } else {
      if (m.at < ymin || m.at > ymax) continue;
      o << "<line x1=\"" << left << "\" y1=\"" << fmt(Y(m.at)) << "\" x2=\"" << left + pw << "\" y2=\""
        << fmt(Y(m.at)) << "\" stroke=\"" << m.color << "\" stroke-dasharray=\"4 3\"/>";
      o << "<text x=\"" << left + 4 << "\" y=\"" << fmt(Y(m.at) - 3) << "\" fill=\"" << m.color
        << "\" font-size=\"11\">" << xml_escape(m.label) << "</text>\n";
    }
  }
  int palette_index = 0;
  std::vector<std::pair<std::string, std::string>> legend;
  for (auto& s : series) {
    std::string color = s.color.empty() ? kPalette[palette_index++ % 8] : s.color;
    if (!s.label.empty()) legend.emplace_back(s.label, color);
    if (s.style == PlotSeries::Style::Line) {
      // Break the polyline at non-finite points.
      std::string pts;
      auto flush = [&] {
        if (!pts.empty())
          o << "<polyline fill=\"none\" stroke=\"" << color << "\" stroke-width=\"1.6\""
            << (s.dashed ? " stroke-dasharray=\"6 4\"" : "") << " points=\"" << pts << "\"/>\n";
        pts.clear();
      };
      for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
        if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) { flush(); continue; }
        pts += fmt(X(s.x[i])) + "," + fmt(Y(s.y[i])) + " ";
      }
      flush();
    } else {
      for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
        if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) continue;
        if (s.style == PlotSeries::Style::PointsWithErrors && i < s.y_err.size())
          o << "<line x1=\"" << fmt(X(s.x[i])) << "\" y1=\"" << fmt(Y(s.y[i] - s.y_err[i])) << "\" x2=\""
            << fmt(X(s.x[i])) << "\" y2=\"" << fmt(Y(s.y[i] + s.y_err[i])) << "\" stroke=\"" << color << "\"/>";
        o << "<circle cx=\"" << fmt(X(s.x[i])) << "\" cy=\"" << fmt(Y(s.y[i])) << "\" r=\"2.5\" fill=\"" << color
          << "\"/>\n";
      }
    }
  }
  o << "</g>\n";
  // Legend in the top-right corner on a white box wide enough for the longest label (~6 px a character).
  std::size_t longest = 0;
  for (const auto& entry : legend) longest = std::max(longest, entry.first.size());
  const double legend_w = 24 + 6.0 * double(longest);
  const double lx = std::max(left, left + pw - legend_w - 6);
  if (!legend.empty())
    o << "<rect x=\"" << fmt(lx - 4) << "\" y=\"" << fmt(top + 3) << "\" width=\"" << fmt(legend_w + 4)
      << "\" height=\"" << fmt(16.0 * double(legend.size()) + 6) << "\" fill=\"white\" opacity=\"0.85\"/>\n";
  for (std::size_t i = 0; i < legend.size(); ++i) {
    double ly = top + 8 + 16 * double(i);
    o << "<rect x=\"" << fmt(lx) << "\" y=\"" << fmt(ly) << "\" width=\"12\" height=\"4\" fill=\"" << legend[i].second
      << "\"/><text x=\"" << fmt(lx + 16) << "\" y=\"" << fmt(ly + 6) << "\" font-size=\"11\">"
      << xml_escape(legend[i].first) << "</text>\n";
  }
  o << "</svg>\n";
  return o.str();
}

std::string palette_color(std::size_t index) { return kPalette[index % 8]; }

std::string combine_svgs(const std::vector<std::string>& svgs, int cell_width, int cell_height, int columns) {
  int rows = int((svgs.size() + columns - 1) / columns);
  std::ostringstream o;
  o << "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" << cell_width * columns << "\" height=\""
    << cell_height * rows << "\">\n";
  for (std::size_t i = 0; i < svgs.size(); ++i) {
    std::string inner = svgs[i];
    // Nest each chart at its cell; an <svg> element inside another accepts x/y attributes.
    auto pos = inner.find("<svg ");
    if (pos != std::string::npos)
      inner.insert(pos + 5, "x=\"" + std::to_string(int(i % columns) * cell_width) + "\" y=\"" +
                                std::to_string(int(i / columns) * cell_height) + "\" ");
    o << inner;
  }
  o << "</svg>\n";
  return o.str();
}

}  // namespace siiplan::io
