// Nonlinear solver/Mesh sequencing = automatic: how many coarser meshes are solved first. These
// check the rule the key's help and the README state (not physics): none up to 30000 unknowns;
// above, at least 2 and as many as bring the first mesh to about 15000 unknowns or fewer, at
// most 4 and never more than Geometry/Refinement. Unknown counts of the Bingham cavity (Q2-Q1 on
// the unit square, 2 (2^(L+1) + 1)^2 + (2^L + 1)^2 at level L) are exact.
#include <gtest/gtest.h>

#include "solver/flow/mesh_sequencing.h"

using lentus::flow::automatic_coarser_levels;

TEST(AutomaticMeshSequencing, NoneForSmallMeshes)
{
  EXPECT_EQ(automatic_coarser_levels(9539, 5), 0u);  // cavity level 5
  EXPECT_EQ(automatic_coarser_levels(30000, 6), 0u); // at the threshold
}

TEST(AutomaticMeshSequencing, TwoLevelsAtLeastAboveTheThreshold)
{
  EXPECT_EQ(automatic_coarser_levels(37507, 6), 2u);  // first mesh 2467 unknowns
  EXPECT_EQ(automatic_coarser_levels(148739, 7), 2u); // first mesh 9539
}

TEST(AutomaticMeshSequencing, MoreLevelsBringTheFirstMeshToAbout15000Unknowns)
{
  EXPECT_EQ(automatic_coarser_levels(592387, 8), 3u);  // 2 levels would start at 37507; 3 at 9539
  EXPECT_EQ(automatic_coarser_levels(2364419, 9), 4u); // 4 levels start at 9539
  EXPECT_EQ(automatic_coarser_levels(1e9, 12), 4u);    // never more than 4
}

TEST(AutomaticMeshSequencing, NeverMoreThanTheRefinement)
{
  EXPECT_EQ(automatic_coarser_levels(592387, 2), 2u);
  EXPECT_EQ(automatic_coarser_levels(592387, 1), 1u);
  EXPECT_EQ(automatic_coarser_levels(592387, 0), 0u);
}
