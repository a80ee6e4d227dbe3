// Small self-contained SVG charts (no scripts, no external fonts or links), used by --plot options and
// the night report. Axes with "nice" ticks, line and point series, error bars, vertical/horizontal
// markers and shaded x-ranges.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace siiplan::io {

struct PlotSeries {
  enum class Style { Line, Points, PointsWithErrors };
  std::string label;          // shown in the legend when not empty
  std::vector<double> x, y;
  std::vector<double> y_err;  // for PointsWithErrors
  Style style = Style::Line;
  std::string color;          // CSS colour; empty = next of the palette
  bool dashed = false;
};

struct PlotMarker {           // a vertical (x) or horizontal (y) reference line with a label
  double at = 0;
  std::string label;
  bool vertical = true;
  std::string color = "#777";
};

struct PlotShade {            // a shaded x-range (e.g. a scheduled block, twilight)
  double x0 = 0, x1 = 0;
  std::string color = "#ddd";
  std::string label;
};

struct Plot {
  std::string title, x_label, y_label;
  std::optional<double> x_min, x_max, y_min, y_max;   // default: from the data
  bool equal_aspect = false;                          // same scale on both axes ((u,v) planes)
  std::vector<PlotSeries> series;
  std::vector<PlotMarker> markers;
  std::vector<PlotShade> shades;
  // Render as a standalone <svg> element of the given size in pixels.
  std::string render(int width = 720, int height = 440) const;
};

// Several charts side by side / stacked into one SVG document (columns per row).
std::string combine_svgs(const std::vector<std::string>& svgs, int cell_width, int cell_height, int columns);
// The colour the plot gives its index-th series without a colour (for series that must share a colour).
std::string palette_color(std::size_t index);
// XML text escaping for labels.
std::string xml_escape(const std::string& text);

}  // namespace siiplan::io
