#include "addin/texts.hpp"

namespace quadrat::addin {

std::string wizard_text(const Argument& a) {
    std::string text = a.description;
    if (!a.keywords) return text;
    while (!text.empty() && (text.back() == '.' || text.back() == ' ')) text.pop_back();
    text += ": ";
    const auto& words = a.keywords->words();
    for (std::size_t i = 0; i < words.size(); ++i) {
        if (i) text += ", ";
        text += words[i].word;
        if (words[i].word == a.fallback) text += " (default)";
    }
    return text + ".";
}

std::string keyword_appendix() {
    std::string out = "\n## Keywords\n\n"
                      "Generated from the keyword tables of the source (src/core/keywords.cpp and the families' own "
                      "tables); keywords are case-insensitive.\n";
    for (const KeywordTable* table : declared_keyword_tables()) {
        out += "\n### " + table->name() + "\n\nTaken by: ";
        bool first = true;
        for (const Function* f : registry())
            for (const Argument& a : f->arguments)
                if (a.keywords == table) {
                    out += std::string(first ? "" : ", ") + "`" + f->display_name + "` `" + a.name + "`";
                    if (!a.fallback.empty()) out += " (default `" + a.fallback + "`)";
                    first = false;
                }
        out += "\n\n| keyword | meaning |\n| --- | --- |\n";
        for (const Keyword& k : table->words()) out += "| `" + k.word + "` | " + k.meaning + " |\n";
    }
    return out + "\n";
}

std::string with_keyword_appendix(const std::string& document) {
    const std::string begin = appendix_begin, end = appendix_end;
    const std::size_t b = document.find(begin);
    const std::size_t e = b == std::string::npos ? std::string::npos : document.find(end, b);
    if (b == std::string::npos || e == std::string::npos) {
        std::string out = document;
        if (!out.empty() && out.back() != '\n') out += '\n';
        return out + "\n" + begin + keyword_appendix() + end + "\n";
    }
    return document.substr(0, b + begin.size()) + keyword_appendix() + document.substr(e);
}

}  // namespace quadrat::addin
