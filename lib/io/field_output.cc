#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <nappe/analysis/sheet_measures.h>
#include <nappe/base/units.h>
#include <nappe/io/field_output.h>
#include <nappe/io/atomic_file.h>
#include <nappe/physics/fvk_kinematics.h>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    const std::vector<std::string> derived_names = {
      "u_x_nm",      "u_y_nm",         "strain_xx",      "strain_yy", "strain_xy", "principal_strain_1",
      "principal_strain_2", "areal_strain", "shear_strain", "N_xx_N_per_m", "N_yy_N_per_m", "N_xy_N_per_m",
      "curvature_xx_per_nm", "curvature_yy_per_nm", "curvature_xy_per_nm"};

    /// Strains, stress resultants and curvatures from the (ũ, w) field.
    class SheetPostprocessor : public DataPostprocessor<2>
    {
    public:
      SheetPostprocessor(const SheetModel &model, double load_factor) : model_(model), load_factor_(load_factor) {}

      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &in,
                                 std::vector<dealii::Vector<double>>      &out) const override
      {
        for (unsigned int q = 0; q < in.solution_values.size(); ++q)
          {
            Tensor<2, 2> grad_u;
            Tensor<1, 2> grad_w;
            for (unsigned int d = 0; d < 2; ++d)
              {
                grad_u[d] = in.solution_gradients[q][d];
                grad_w[d] = in.solution_gradients[q][2][d];
              }
            const SymTensor strain  = membrane_strain(model_, load_factor_, grad_u, grad_w);
            const SymTensor stress  = membrane_stress(strain, model_.material);
            const auto [e1, e2]     = principal_values(strain);
            const Tensor<2, 2> hess = in.solution_hessians[q][2];
            const Point<2>    &x    = in.evaluation_points[q];
            const auto         E    = load_factor_ * model_.loads.mean_strain;
            const double       nm   = units::nanometer;
            const double       values[] = {(E[0][0] * x[0] + E[0][1] * x[1] + in.solution_values[q][0]) / nm,
                                     (E[1][0] * x[0] + E[1][1] * x[1] + in.solution_values[q][1]) / nm,
                                     strain[0][0], strain[1][1], strain[0][1], e1, e2, e1 + e2, 0.5 * (e1 - e2),
                                     stress[0][0], stress[1][1], stress[0][1], hess[0][0] * nm, hess[1][1] * nm,
                                     hess[0][1] * nm};
            for (unsigned int k = 0; k < derived_names.size(); ++k)
              out[q][k] = values[k];
          }
      }
      std::vector<std::string> get_names() const override { return derived_names; }
      UpdateFlags get_needed_update_flags() const override
      {
        return update_values | update_gradients | update_hessians | update_quadrature_points;
      }

    private:
      const SheetModel &model_;
      const double      load_factor_;
    };

    /// A scaled copy of the deflection in nm, so ParaView shows w in the trade's unit.
    class DeflectionInNm : public DataPostprocessorScalar<2>
    {
    public:
      DeflectionInNm() : DataPostprocessorScalar<2>("w_nm", update_values) {}
      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &in,
                                 std::vector<dealii::Vector<double>>      &out) const override
      {
        for (unsigned int q = 0; q < in.solution_values.size(); ++q)
          out[q](0) = in.solution_values[q][2] / units::nanometer;
      }
    };

    /// The substrate potential's own fields (gap, contact indicator, traction…).
    class SubstrateFields : public DataPostprocessor<2>
    {
    public:
      explicit SubstrateFields(const SurfacePotential &substrate) : substrate_(substrate) {}
      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &in,
                                 std::vector<dealii::Vector<double>>      &out) const override
      {
        std::vector<double> values;
        for (unsigned int q = 0; q < in.solution_values.size(); ++q)
          {
            substrate_.fields(in.evaluation_points[q], in.solution_values[q][2], values);
            for (unsigned int k = 0; k < values.size(); ++k)
              out[q][k] = values[k];
          }
      }
      std::vector<std::string> get_names() const override { return substrate_.field_names(); }
      UpdateFlags get_needed_update_flags() const override { return update_values | update_quadrature_points; }

    private:
      const SurfacePotential &substrate_;
    };
  } // namespace

  std::string write_fields(const SheetSystem &system, const Vector &state, double load_factor,
                           const std::string &directory, const std::string &name)
  {
    const SheetPostprocessor derived(system.model(), load_factor);
    const DeflectionInNm     deflection;
    DataOut<2>               data_out;
    data_out.attach_dof_handler(system.dof_handler());
    data_out.add_data_vector(state, deflection);
    data_out.add_data_vector(state, derived);
    std::unique_ptr<SubstrateFields> substrate;
    if (system.model().substrate && !system.model().substrate->field_names().empty())
      {
        substrate = std::make_unique<SubstrateFields>(*system.model().substrate);
        data_out.add_data_vector(state, *substrate);
      }
    dealii::Vector<float> rank(system.dof_handler().get_triangulation().n_active_cells());
    rank = Utilities::MPI::this_mpi_process(system.communicator());
    data_out.add_data_vector(rank, "mpi_rank");
    data_out.build_patches(system.mapping(), system.model().discretization.degree);

    const MPI_Comm     comm  = system.communicator();
    const unsigned int me    = Utilities::MPI::this_mpi_process(comm);
    const unsigned int ranks = Utilities::MPI::n_mpi_processes(comm);
    auto piece = [&](unsigned int r) { return name + "_" + Utilities::int_to_string(r, 4) + ".vtu"; };
    write_atomically(directory + "/" + piece(me), [&](std::ostream &out) { data_out.write_vtu(out); });
    const std::string record = directory + "/" + name + ".pvtu";
    MPI_Barrier(comm);
    if (me == 0)
      {
        std::vector<std::string> pieces;
        for (unsigned int r = 0; r < ranks; ++r)
          pieces.push_back(piece(r));
        write_atomically(record, [&](std::ostream &out) { data_out.write_pvtu_record(out, pieces); });
      }
    MPI_Barrier(comm);
    return record;
  }
} // namespace nappe
