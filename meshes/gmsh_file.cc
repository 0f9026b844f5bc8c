// Gmsh's MSH format, ASCII, versions 2.2 and 4.1: only what a 2D quadrilateral mesh
// needs is read, and every problem names the line of the file.
#include "meshes/gmsh_file.h"

#include <sstream>
#include <utility>

namespace lentus::meshes::gmsh
{
  namespace
  {
    /// The file as lines, read section by section.
    class Reader
    {
    public:
      explicit Reader(std::istream &input)
      {
        std::string text;
        while (std::getline(input, text))
          {
            if (!text.empty() && text.back() == '\r')
              text.pop_back();
            lines.push_back(text);
          }
      }

      bool at_end() const { return next_line >= lines.size(); }
      int  line_number() const { return static_cast<int>(next_line); } ///< of the line last taken (1-based)

      /// The next line as a stream of words; fails at the end of the file.
      std::istringstream take(const std::string &expected)
      {
        if (at_end())
          fail(line_number(), "the file ends where " + expected + " was expected", "a complete MSH file");
        return std::istringstream(lines[next_line++]);
      }

      std::string take_text() { return at_end() ? std::string() : lines[next_line++]; }

      /// Skips to the line after `$End<name>`.
      void skip_section(const std::string &name)
      {
        const int start = line_number();
        while (!at_end())
          if (trimmed(lines[next_line++]) == "$End" + name)
            return;
        fail(start, "section $" + name + " has no $End" + name, "a complete MSH file");
      }

      void expect_end(const std::string &name)
      {
        const std::string text = trimmed(take_text());
        if (text != "$End" + name)
          fail(line_number(), "found '" + text + "' where $End" + name + " was expected",
               "the number of entries the section announces");
      }

      static std::string trimmed(const std::string &text)
      {
        const auto first = text.find_first_not_of(" \t");
        if (first == std::string::npos)
          return "";
        return text.substr(first, text.find_last_not_of(" \t") - first + 1);
      }

    private:
      std::vector<std::string> lines;
      std::size_t              next_line = 0;
    };

    /// Reads one number from `words`, failing with the line otherwise.
    template <typename T>
    T number(std::istringstream &words, const Reader &reader, const std::string &what)
    {
      T value;
      if (!(words >> value))
        fail(reader.line_number(), "expected " + what + ": '" + words.str() + "'", "the MSH 2.2 or 4.1 ASCII format");
      return value;
    }

    /// Which element types we take, and what to say about the others.
    void check_element_type(const Element &element)
    {
      const std::string which = "element " + std::to_string(element.tag);
      switch (element.type)
        {
          case 1:  // 2-node line
          case 3:  // 4-node quadrilateral
          case 15: // point
            return;
          case 2:
          case 9:
          case 20:
          case 21:
          case 22:
          case 23:
          case 24:
          case 25:
            fail(element.line, which + " is a triangle (Gmsh type " + std::to_string(element.type) + ")",
                 "quadrilaterals only: in Gmsh, recombine the triangles into quadrilaterals "
                 "(Mesh.RecombineAll = 1; in the .geo file, or Recombine Surface{...};) and mesh again");
          case 8:
          case 10:
          case 16:
          case 26:
          case 27:
          case 28:
            fail(element.line, which + " is a second- or higher-order element (Gmsh type " +
                                 std::to_string(element.type) + ")",
                 "first-order elements (Mesh.ElementOrder = 1; the solver raises the order itself)");
          case 4:
          case 5:
          case 6:
          case 7:
          case 11:
          case 12:
          case 13:
          case 14:
          case 17:
          case 18:
          case 19:
            fail(element.line, which + " is a volume element (Gmsh type " + std::to_string(element.type) + ")",
                 "a 2D mesh of quadrilaterals in the x-y plane");
          default:
            fail(element.line, which + " has Gmsh type " + std::to_string(element.type) + ", which is not read",
                 "4-node quadrilaterals (type 3), 2-node boundary lines (type 1) and points (type 15)");
        }
    }

    std::size_t nodes_of_type(const int type)
    {
      switch (type)
        {
          case 1: return 2;
          case 2: return 3;
          case 3: return 4;
          case 15: return 1;
          default: return 0; // not read further: check_element_type rejects it
        }
    }

    /// Checks the element's type, then reads its nodes from the rest of its line and keeps it.
    void add_element(Element element, std::istringstream &entry, const Reader &reader, FileContent &content)
    {
      check_element_type(element);
      for (std::size_t n = 0; n < nodes_of_type(element.type); ++n)
        element.nodes.push_back(number<long>(entry, reader, "a node of the element"));
      content.elements.push_back(std::move(element));
    }

    void read_physical_names(Reader &reader, FileContent &content)
    {
      auto        words = reader.take("the number of physical names");
      const int   count = number<int>(words, reader, "the number of physical names");
      for (int i = 0; i < count; ++i)
        {
          auto        entry     = reader.take("a physical name");
          const int   dimension = number<int>(entry, reader, "the dimension of a physical group");
          const int   tag       = number<int>(entry, reader, "the tag of a physical group");
          std::string rest;
          std::getline(entry, rest);
          const auto open = rest.find('"'), close = rest.rfind('"');
          if (open == std::string::npos || close == open)
            fail(reader.line_number(), "a physical name must stand in double quotes", "dimension tag \"name\"");
          content.physical_names[{dimension, tag}] = {rest.substr(open + 1, close - open - 1), reader.line_number()};
        }
      reader.expect_end("PhysicalNames");
    }

    /// x y z of a node, from the rest of its line.
    Node coordinates(std::istringstream &entry, const Reader &reader)
    {
      Node node;
      node.x    = number<double>(entry, reader, "x");
      node.y    = number<double>(entry, reader, "y");
      node.z    = number<double>(entry, reader, "z");
      node.line = reader.line_number();
      return node;
    }

    void read_nodes_2(Reader &reader, FileContent &content)
    {
      auto       words = reader.take("the number of nodes");
      const long count = number<long>(words, reader, "the number of nodes");
      for (long i = 0; i < count; ++i)
        {
          auto       entry = reader.take("a node");
          const long tag   = number<long>(entry, reader, "a node tag");
          content.nodes[tag] = coordinates(entry, reader);
        }
      reader.expect_end("Nodes");
    }

    void read_elements_2(Reader &reader, FileContent &content)
    {
      auto       words = reader.take("the number of elements");
      const long count = number<long>(words, reader, "the number of elements");
      for (long i = 0; i < count; ++i)
        {
          auto    entry = reader.take("an element");
          Element element;
          element.tag    = number<long>(entry, reader, "an element tag");
          element.type   = number<int>(entry, reader, "an element type");
          element.line   = reader.line_number();
          const int tags = number<int>(entry, reader, "the number of element tags");
          std::vector<int> values;
          for (int t = 0; t < tags; ++t)
            values.push_back(number<int>(entry, reader, "an element tag value"));
          element.physical = values.empty() ? 0 : values[0]; // 2.2: physical tag first, then elementary
          add_element(std::move(element), entry, reader, content);
        }
      reader.expect_end("Elements");
    }

    /// 4.1: physical tags belong to entities (points, curves, surfaces).
    using EntityPhysicals = std::map<std::pair<int, int>, std::vector<int>>; // (dimension, entity tag) -> tags

    void read_entities_4(Reader &reader, EntityPhysicals &physicals)
    {
      auto words = reader.take("the entity counts");
      int  counts[4];
      for (int &c : counts)
        c = number<int>(words, reader, "an entity count");
      for (int dimension = 0; dimension < 4; ++dimension)
        for (int i = 0; i < counts[dimension]; ++i)
          {
            auto      entry = reader.take("an entity");
            const int tag   = number<int>(entry, reader, "an entity tag");
            for (int c = 0; c < (dimension == 0 ? 3 : 6); ++c) // point: x y z; else the bounding box
              number<double>(entry, reader, "a coordinate of the entity");
            const int        n = number<int>(entry, reader, "the number of physical tags");
            std::vector<int> tags;
            for (int t = 0; t < n; ++t)
              tags.push_back(std::abs(number<int>(entry, reader, "a physical tag")));
            physicals[{dimension, tag}] = tags;
          }
      reader.expect_end("Entities");
    }

    void read_nodes_4(Reader &reader, FileContent &content)
    {
      auto       words  = reader.take("the node counts");
      const long blocks = number<long>(words, reader, "the number of node blocks");
      for (long b = 0; b < blocks; ++b)
        {
          auto header = reader.take("a node block");
          number<int>(header, reader, "the entity dimension");
          number<int>(header, reader, "the entity tag");
          number<int>(header, reader, "the parametric flag");
          const long        count = number<long>(header, reader, "the number of nodes in the block");
          std::vector<long> tags;
          for (long i = 0; i < count; ++i)
            {
              auto entry = reader.take("a node tag");
              tags.push_back(number<long>(entry, reader, "a node tag"));
            }
          for (long i = 0; i < count; ++i)
            {
              auto entry = reader.take("node coordinates");
              content.nodes[tags[i]] = coordinates(entry, reader);
            }
        }
      reader.expect_end("Nodes");
    }

    void read_elements_4(Reader &reader, FileContent &content, const EntityPhysicals &physicals)
    {
      auto       words  = reader.take("the element counts");
      const long blocks = number<long>(words, reader, "the number of element blocks");
      for (long b = 0; b < blocks; ++b)
        {
          auto        header    = reader.take("an element block");
          const int   dimension = number<int>(header, reader, "the entity dimension");
          const int   entity    = number<int>(header, reader, "the entity tag");
          const int   type      = number<int>(header, reader, "the element type");
          const long  count     = number<long>(header, reader, "the number of elements in the block");
          const auto  found     = physicals.find({dimension, entity});
          const std::vector<int> tags = found == physicals.end() ? std::vector<int>() : found->second;
          for (long i = 0; i < count; ++i)
            {
              auto    entry = reader.take("an element");
              Element element;
              element.tag               = number<long>(entry, reader, "an element tag");
              element.type              = type;
              element.line              = reader.line_number();
              element.physical          = tags.empty() ? 0 : tags[0];
              element.several_physicals = tags.size() > 1;
              add_element(std::move(element), entry, reader, content);
            }
        }
      reader.expect_end("Elements");
    }
  } // namespace

  FileContent read_msh(std::istream &input)
  {
    Reader          reader(input);
    FileContent     content;
    EntityPhysicals entity_physicals;
    bool            has_nodes = false, has_elements = false;
    while (!reader.at_end())
      {
        const std::string line = Reader::trimmed(reader.take_text());
        if (line.empty())
          continue;
        if (line[0] != '$' || line.rfind("$End", 0) == 0)
          fail(reader.line_number(), "unexpected '" + line.substr(0, 40) + "' outside a section",
               "sections $MeshFormat, $PhysicalNames, $Entities, $Nodes, $Elements ... each closed by $End...");
        const std::string section = line.substr(1);
        if (content.version.empty() && section != "MeshFormat")
          fail(reader.line_number(), "the file does not start with $MeshFormat (is it a Gmsh .msh file?)",
               "a mesh saved by Gmsh in MSH format 2.2 or 4.1, ASCII");
        if (section == "MeshFormat")
          {
            auto        words = reader.take("the format version");
            std::string version;
            int         file_type = -1;
            words >> version >> file_type;
            if (file_type != 0)
              fail(reader.line_number(), "a binary MSH file", "ASCII MSH files (in Gmsh: Mesh.Binary = 0)");
            if (version != "4.1" && version.rfind("2.", 0) != 0)
              fail(reader.line_number(), "MSH format version " + version + " is not read",
                   "versions 2.2 and 4.1 (in Gmsh: Mesh.MshFileVersion = 2.2 or 4.1)");
            content.version = version;
            reader.skip_section("MeshFormat");
          }
        else if (section == "PhysicalNames")
          read_physical_names(reader, content);
        else if (section == "Entities" && content.version == "4.1")
          read_entities_4(reader, entity_physicals);
        else if (section == "Nodes")
          {
            content.version == "4.1" ? read_nodes_4(reader, content) : read_nodes_2(reader, content);
            has_nodes = true;
          }
        else if (section == "Elements")
          {
            content.version == "4.1" ? read_elements_4(reader, content, entity_physicals) :
                                       read_elements_2(reader, content);
            has_elements = true;
          }
        else
          reader.skip_section(section);
      }
    if (content.version.empty())
      fail(0, "an empty file", "a mesh saved by Gmsh in MSH format 2.2 or 4.1, ASCII");
    if (!has_nodes || !has_elements)
      fail(0, std::string("no $") + (has_nodes ? "Elements" : "Nodes") + " section", "a complete MSH file");
    return content;
  }
} // namespace lentus::meshes::gmsh
