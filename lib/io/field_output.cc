#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <nappe/analysis/sheet_quantities.h>
#include <nappe/base/collective.h>
#include <nappe/base/units.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/field_output.h>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// Every field of the quantity table that applies to the model, in its reported unit.
    class QuantityFields : public DataPostprocessor<2>
    {
    public:
      QuantityFields(const SheetModel &model, const LoadLevel &level) : model_(model), level_(level)
      {
        for (const SheetQuantity *q : quantities_for(model))
          if (q->field)
            quantities_.push_back(q);
      }

      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &in,
                                 std::vector<dealii::Vector<double>>      &out) const override
      {
        std::vector<double> values(3);
        for (unsigned int q = 0; q < in.solution_values.size(); ++q)
          {
            for (unsigned int c = 0; c < 3; ++c)
              values[c] = in.solution_values[q][c];
            const PointState point = make_point_state(model_, level_, in.evaluation_points[q], values,
                                                      in.solution_gradients[q], in.solution_hessians[q]);
            for (unsigned int k = 0; k < quantities_.size(); ++k)
              out[q][k] = quantities_[k]->reported(point);
          }
      }

      std::vector<std::string> get_names() const override
      {
        std::vector<std::string> names;
        for (const SheetQuantity *q : quantities_)
          names.push_back(q->name + q->unit_suffix());
        return names;
      }

      UpdateFlags get_needed_update_flags() const override
      {
        return update_values | update_gradients | update_hessians | update_quadrature_points;
      }

    private:
      const SheetModel                  &model_;
      const LoadLevel                    level_;
      std::vector<const SheetQuantity *> quantities_;
    };
    /// DataOut whose point coordinates are written in nm, the unit of the deflection field, so that
    /// ParaView's "warp by scalar" with w_nm needs no scale factor.
    class DataOutInNm : public DataOut<2>
    {
    public:
      /// Rescales the vertices of the patches built by build_patches() from m to nm.
      void scale_to_nm()
      {
        for (auto &patch : patches)
          {
            for (auto &vertex : patch.vertices)
              vertex /= units::nanometer;
            if (patch.points_are_available) // then the last two rows of data hold x and y
              for (unsigned int row = patch.data.n_rows() - 2; row < patch.data.n_rows(); ++row)
                for (unsigned int k = 0; k < patch.data.n_cols(); ++k)
                  patch.data(row, k) /= units::nanometer;
          }
      }
    };
  } // namespace

  std::string write_fields(const SheetSystem &system, const Vector &state, const LoadLevel &level,
                           const std::string &directory, const std::string &name)
  {
    const QuantityFields fields(system.model(), level);
    DataOutInNm          data_out;
    data_out.attach_dof_handler(system.dof_handler());
    data_out.add_data_vector(state, fields);
    dealii::Vector<float> rank(system.dof_handler().get_triangulation().n_active_cells());
    rank = Utilities::MPI::this_mpi_process(system.communicator());
    data_out.add_data_vector(rank, "mpi_rank");
    data_out.build_patches(system.mapping(), system.model().discretization.degree);
    data_out.scale_to_nm();

    const MPI_Comm     comm  = system.communicator();
    const unsigned int me    = Utilities::MPI::this_mpi_process(comm);
    const unsigned int ranks = Utilities::MPI::n_mpi_processes(comm);
    auto piece = [&](unsigned int r) { return name + "_" + Utilities::int_to_string(r, 4) + ".vtu"; };
    run_collectively(comm, [&] {
      write_atomically(directory + "/" + piece(me), [&](std::ostream &out) { data_out.write_vtu(out); });
    });
    const std::string record = directory + "/" + name + ".pvtu";
    run_collectively(comm, [&] {
      if (me != 0)
        return;
      std::vector<std::string> pieces;
      for (unsigned int r = 0; r < ranks; ++r)
        pieces.push_back(piece(r));
      write_atomically(record, [&](std::ostream &out) { data_out.write_pvtu_record(out, pieces); });
    });
    return record;
  }
} // namespace nappe
