#include "solver/report/caution_text.h"

#include "solver/report/caution.h"

#include <sstream>

namespace lentus::report
{
  std::string caution_lines(const std::string &prefix, const std::size_t width)
  {
    std::istringstream words(std::string("Caution: ") + caution);
    std::string        text, line, word;
    while (words >> word)
      {
        if (!line.empty() && prefix.size() + line.size() + 1 + word.size() > width)
          {
            text += prefix + line + "\n";
            line.clear();
          }
        line += (line.empty() ? "" : " ") + word;
      }
    return text + prefix + line + "\n";
  }
} // namespace lentus::report
