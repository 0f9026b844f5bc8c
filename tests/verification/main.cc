// GoogleTest main for solver tests: PETSc needs MPI even on one rank.
#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  ::testing::InitGoogleTest(&argc, argv);
  return RUN_ALL_TESTS();
}
