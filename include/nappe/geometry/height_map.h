#pragma once

#include <nappe/geometry/topography.h>

#include <array>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * Meters per unit for a length unit name: "m", "mm", "um" (also "µm", "micrometer"), "nm"
   * ("nanometer"), "A" (also "Å", "angstrom"), "pm". Throws, listing the accepted names, otherwise.
   */
  double length_unit_from_name(const std::string &unit_name);

  /**
   * A measured (AFM-style) height map: heights z_ij on the regular grid x_i = x₀ + i·Δx, y_j = y₀ + j·Δy
   * (i < n_x, j < n_y), interpolated by bicubic cubic convolution (Keys, IEEE Trans. ASSP 29, 1153 (1981),
   * parameter a = −1/2, i.e. the Catmull–Rom spline in each direction). The interpolant passes through
   * the data, is C1, and for smooth data its error is O(Δ³) in height and O(Δ²) in gradient.
   *
   * Outside the scan (and in the one-cell border the stencil needs) the map is extended by Extension:
   *  - periodic: z_{i+n_x, j} = z_ij; the period is n_x·Δx (the file must not repeat its first row or
   *    column at the end). C1 everywhere if the data are periodic.
   *  - clamped:  even reflection at the edge nodes (z_{−1} = z_1), so the interpolant has zero normal
   *    slope on the scan boundary, and constant continuation beyond it. C1 everywhere; within one cell
   *    of the edge the gradient loses accuracy (the edge slope is forced to zero).
   *  - error:    Keys' cubic extrapolation ghost nodes (z_{−1} = 3z_0 − 3z_1 + z_2, full accuracy up
   *    to the edge); querying a point outside the scan throws.
   *
   * Heights and points are SI [m]. The map owns its data.
   */
  class HeightMap : public Topography
  {
  public:
    enum class Extension
    {
      periodic,
      clamped,
      error
    };

    /// How read() interprets a file.
    struct ReadOptions
    {
      enum class Format
      {
        /// Each non-comment line is one row of heights: row j is y_j, column i is x_i (see first_row_at_top).
        matrix,
        /// Each non-comment line is "x y z"; the points must fill a regular grid, in any order.
        xyz
      };
      Format format = Format::matrix;
      /// Meters per unit of the in-plane coordinates in the file (xyz format).
      double length_unit = 1e-9;
      /// Meters per unit of the heights in the file.
      double height_unit = 1e-9;
      /// Matrix format only: grid spacing (Δx, Δy) [m] and position of node (0, 0) [m].
      dealii::Tensor<1, 2> spacing;
      dealii::Point<2>     origin;
      /// Matrix format only: the first row is the largest y (image convention of most AFM exports).
      bool first_row_at_top = false;
      Extension extension   = Extension::clamped;
    };

    /**
     * Construct from values: `values[j * n_x + i]` = z_ij [m]; spacing > 0 [m]; n_x, n_y ≥ 4.
     * @param source where the data came from, for messages and description().
     */
    HeightMap(const dealii::Point<2> &origin, const dealii::Tensor<1, 2> &spacing, unsigned int n_x,
              unsigned int n_y, std::vector<double> values, Extension extension, std::string source = "values");

    /**
     * Read a plain-text height map. Blank lines and lines whose first non-blank character is '#' or '%'
     * are skipped; numbers are separated by blanks, tabs, commas or semicolons. Throws with the file
     * name, the line and what was expected for a non-numeric or non-finite token, ragged rows, a wrong
     * number of columns, points off the regular grid, or fewer than 4×4 points.
     */
    static HeightMap read(const std::string &filename, const ReadOptions &options);

    /// Sample t on the grid (the nodes are exact values of t), e.g. to resample an STL surface to C1.
    static HeightMap sample(const Topography &t, const dealii::Point<2> &origin, const dealii::Tensor<1, 2> &spacing,
                            unsigned int n_x, unsigned int n_y, Extension extension);

    /**
     * Subtract the least-squares plane c₀ + c₁(x − x̄) + c₂(y − ȳ) from the data (AFM levelling); afterwards
     * the mean height is zero. A tilted plane is removed exactly. Returns (c₀ [m], c₁ [-], c₂ [-]).
     */
    std::array<double, 3> level_plane();

    /**
     * Convolve the data with a normalised Gaussian of standard deviation σ [m] (separable, truncated at
     * 4σ), using the same extension at the edges (reflection unless periodic). σ = 0 does nothing.
     */
    void smooth(double sigma);

    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "height map"; }
    std::string          description() const override;

    unsigned int          n_points_x() const { return nx; }
    unsigned int          n_points_y() const { return ny; }
    const dealii::Point<2> &origin() const { return x0; }
    /// One element per data pixel along the finer spacing (common practice, no source).
    std::vector<TopographyFeature> features() const override
    {
      return {{"pixel", std::min(dx[0], dx[1]), 1.0}};
    }
    const dealii::Tensor<1, 2> &spacing() const { return dx; }
    /// Node (n_x − 1, n_y − 1).
    dealii::Point<2> last_node() const;
    /// z_ij [m].
    double node_value(unsigned int i, unsigned int j) const { return z[j * nx + i]; }
    Extension extension() const { return ext; }

  private:
    /// Value at node (i, j) with i ∈ [−1, n_x], j ∈ [−1, n_y] (ghosts by the extension rule).
    double node(int i, int j) const;
    double ghost_x(int i, int j) const;
    /// Cell index, local coordinate u ∈ [0, 1] and whether the point was clamped, per direction.
    void locate(const dealii::Point<2> &p, int cell[2], double u[2], bool clamped[2]) const;

    dealii::Point<2>     x0;
    dealii::Tensor<1, 2> dx;
    unsigned int         nx, ny;
    std::vector<double>  z;
    Extension            ext;
    std::string          source;
  };
} // namespace nappe
