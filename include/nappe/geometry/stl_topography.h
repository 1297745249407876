#pragma once

#include <nappe/geometry/topography.h>

#include <memory>
#include <string>

namespace nappe
{
  /**
   * A triangulated surface (STL, ASCII or binary) read as a height field, so that a CAD design can be
   * checked against nappe: s(x, y) is the z of the topmost facet hit by the vertical line through
   * (x, y), and ∇s = −(n_x, n_y)/n_z from that facet's normal (computed from its vertices; the normal
   * stored in the file is ignored). Vertical facets (|n_z| ≈ 0) are skipped. Facets are located through
   * a CGAL AABB tree (kept out of this header).
   *
   * A triangulation is only C0: the gradient is piecewise constant and jumps across edges. For a
   * C1 substrate resample it, e.g. HeightMap::sample(stl, …) (bicubic), with a spacing comparable to
   * the facet size.
   *
   * Outside the footprint (no facet above or below the point): Outside::error throws, naming the point;
   * Outside::constant returns `outside_height` [m] with zero gradient (a flat substrate around the design;
   * not smooth across the footprint's edge unless the design meets that plane tangentially).
   *
   * Binary STL is read as little-endian IEEE floats (the format's definition). A file whose size is
   * 84 + 50·n bytes with n from its header is read as binary, otherwise a file starting with "solid" as
   * ASCII. Evaluation is thread-safe.
   */
  class StlTopography : public Topography
  {
  public:
    enum class Outside
    {
      error,
      constant
    };

    struct Options
    {
      /// Meters per STL coordinate unit (1e-9: the CAD model is in nm).
      double  length_unit    = 1e-9;
      Outside outside        = Outside::error;
      double  outside_height = 0.0; ///< [m], used with Outside::constant
    };

    /// Read `filename`; throws with the file name (and line, for ASCII) on malformed input.
    StlTopography(const std::string &filename, const Options &options);
    /// As above with the default Options (nm, error outside the footprint).
    explicit StlTopography(const std::string &filename);
    ~StlTopography() override;
    StlTopography(StlTopography &&) noexcept;
    StlTopography &operator=(StlTopography &&) noexcept;

    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "stl"; }
    std::string          description() const override;

    /// Number of facets read (vertical and degenerate ones included).
    std::size_t n_triangles() const;
    /// Corners of the footprint's bounding box [m].
    dealii::Point<2> footprint_lower() const;
    dealii::Point<2> footprint_upper() const;

  private:
    struct Impl;
    std::unique_ptr<Impl> impl;
  };
} // namespace nappe
