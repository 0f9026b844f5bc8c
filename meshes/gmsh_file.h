// Reading Gmsh's MSH format, ASCII, versions 2.2 and 4.1 (the two Gmsh writes) into
// plain records with the line of each; no checks beyond the format itself. Used by
// meshes/gmsh_mesh.cc, which checks the mesh and builds the cells.
#pragma once

#include <istream>
#include <map>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lentus::meshes::gmsh
{
  /// A problem with the file at a line; GmshMesh turns it into InvalidParameter("File", ...).
  struct FileProblem
  {
    int         line; ///< 0: not one line's fault
    std::string problem;
    std::string allowed;
  };

  [[noreturn]] inline void fail(const int line, const std::string &problem, const std::string &allowed)
  {
    throw FileProblem{line, problem, allowed};
  }

  /// One element as read: Gmsh type, physical tag (0: none), node tags, line in the file.
  struct Element
  {
    long              tag;
    int               type;
    int               physical;
    bool              several_physicals = false;
    std::vector<long> nodes;
    int               line;
  };

  /// A node's coordinates and line in the file.
  struct Node
  {
    double x, y, z;
    int    line;
  };

  /// The name of a physical group and the line of $PhysicalNames that gives it.
  struct PhysicalName
  {
    std::string name;
    int         line;
  };

  /// Everything read from the file, before checks.
  struct FileContent
  {
    std::string                                    version;
    std::map<std::pair<int, int>, PhysicalName>    physical_names; ///< (dimension, tag) -> name
    std::unordered_map<long, Node>                 nodes;
    std::vector<Element>                           elements;
  };

  /// Reads a whole MSH file; element types other than lines, quadrilaterals and points are
  /// refused as soon as they are met. Throws FileProblem.
  FileContent read_msh(std::istream &input);
} // namespace lentus::meshes::gmsh
