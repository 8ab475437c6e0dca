using System.Text.RegularExpressions;
using System.Xml;
using System.Xml.Linq;
using ScaleGen.Emit.StructuredText;
using static ScaleGen.Emit.PlcOpen.PlcOpenNames;

namespace ScaleGen.Emit.PlcOpen;

/// <summary>A PLCopen XML file ScaleGen cannot read, with the line and column (1-based; 0 when unknown).</summary>
public sealed class PlcOpenFormatException(string message, int line, int column) : Exception(message)
{
    public int Line { get; } = line;
    public int Column { get; } = column;
}

/// <summary>The Structured Text of a PLCopen project: declarations rebuilt from the XML, bodies as the XML holds them.</summary>
public sealed record PlcOpenContent(IReadOnlyList<StDataType> DataTypes, IReadOnlyList<StPou> Blocks, IReadOnlyList<StPou> Programs)
{
    /// <summary>The types and function blocks, laid out as library.st (without its header).</summary>
    public string LibraryText => StWriter.Library(DataTypes, Blocks);

    /// <summary>The programs, laid out as plant.st (without its header).</summary>
    public string PlantText => string.Join("\n", Programs.Select(p => StWriter.Pou(p, StLayout.Plant)));

    /// <summary>Library, then programs: the same code as library.st followed by plant.st.</summary>
    public string Text => string.Join("\n", new[] { LibraryText, PlantText }.Where(t => t.Length > 0));
}

/// <summary>
/// Reads a PLCopen TC6 XML v2.01 project back into Structured Text, for `verify` to run the
/// code a PLCopen file holds. It reads the subset the PLCopen emitter writes: enumerated and
/// structure types; function blocks and programs with input, output, local and constant
/// variables of elementary, STRING[n] and named types, simple and structure initial values;
/// ST bodies. Anything else is a <see cref="PlcOpenFormatException"/> naming its line.
/// </summary>
/// <remarks>
/// Declarations come back through the same <see cref="StWriter"/> as library.st and plant.st,
/// so the code is the same text; comments come from the documentation elements, so notes that
/// plant.st writes between the members of a parameter record come back before the section.
/// The reader does not validate against the schema (the tests do that for every export); it
/// checks names and literals so that nothing in the XML can change the shape of the code
/// outside the bodies.
/// </remarks>
public static class PlcOpenReader
{
    /// <summary>The Structured Text equivalent of library.st followed by plant.st.</summary>
    /// <exception cref="PlcOpenFormatException">The text is not XML, not a TC6 v2.01 project, or outside the subset.</exception>
    public static string ExtractStructuredText(string xml) => Read(xml).Text;

    public static bool TryExtractStructuredText(string xml, out string text, out PlcOpenFormatException? error)
    {
        try
        {
            text = ExtractStructuredText(xml);
            error = null;
            return true;
        }
        catch (PlcOpenFormatException e)
        {
            text = "";
            error = e;
            return false;
        }
    }

    /// <exception cref="PlcOpenFormatException">The text is not XML, not a TC6 v2.01 project, or outside the subset.</exception>
    public static PlcOpenContent Read(string xml)
    {
        var project = Load(xml).Root!;
        if (project.Name != Tc6 + "project")
            throw Error(project, $"the root element is {project.Name.LocalName} in '{project.Name.NamespaceName}', not a PLCopen TC6 XML v2.01 project ({Tc6.NamespaceName})");
        var types = Required(project, "types");
        var dataTypes = Required(types, "dataTypes").Elements(Tc6 + "dataType").Select(DataType).ToList();
        var pous = Required(types, "pous").Elements(Tc6 + "pou").Select(Pou).ToList();
        return new PlcOpenContent(
            dataTypes,
            pous.Where(p => p.Kind == StPouKind.FunctionBlock).ToList(),
            pous.Where(p => p.Kind == StPouKind.Program).ToList());
    }

    private static XDocument Load(string xml)
    {
        var settings = new XmlReaderSettings { DtdProcessing = DtdProcessing.Prohibit, XmlResolver = null };
        try
        {
            using var reader = XmlReader.Create(new StringReader(xml), settings);
            return XDocument.Load(reader, LoadOptions.SetLineInfo);
        }
        catch (XmlException e)
        {
            throw new PlcOpenFormatException("not well-formed XML: " + e.Message, e.LineNumber, e.LinePosition);
        }
    }

    private static StDataType DataType(XElement element)
    {
        var name = Name(element, "name");
        var baseType = OnlyChild(Required(element, "baseType"));
        var comment = DocumentationLines(element);
        if (baseType.Name == Tc6 + "enum")
            return new StEnumType(name,
                Required(baseType, "values").Elements(Tc6 + "value").Select(v => Name(v, "name")).ToList(), comment);
        if (baseType.Name == Tc6 + "struct")
            return new StStructType(name, baseType.Elements(Tc6 + "variable").Select(Variable).ToList(), comment);
        throw Error(baseType, $"data type {name}: only enumerations and structures are read, not {baseType.Name.LocalName}");
    }

    private static StPou Pou(XElement element)
    {
        var name = Name(element, "name");
        var kind = (string?)element.Attribute("pouType") switch
        {
            "functionBlock" => StPouKind.FunctionBlock,
            "program" => StPouKind.Program,
            var other => throw Error(element, $"POU {name}: only function blocks and programs are read, not '{other}'"),
        };
        var sections = new List<StVarSection>();
        foreach (var list in element.Element(Tc6 + "interface")?.Elements() ?? [])
        {
            if (list.Name == Tc6 + "addData" || list.Name == Tc6 + "documentation") continue;
            var sectionKind = list.Name.LocalName switch
            {
                "inputVars" => StVarKind.Input,
                "outputVars" => StVarKind.Output,
                "localVars" when IsTrue(list, "constant") => StVarKind.Constant,
                "localVars" => StVarKind.Local,
                var other => throw Error(list, $"POU {name}: {other} sections are not read"),
            };
            sections.Add(new StVarSection(sectionKind, list.Elements(Tc6 + "variable").Select(Variable).ToList())
            {
                Notes = DocumentationLines(list),
            });
        }
        var bodies = element.Elements(Tc6 + "body").ToList();
        if (bodies.Count != 1) throw Error(element, $"POU {name}: expected one body, found {bodies.Count}");
        var language = OnlyChild(bodies[0]);
        if (language.Name != Tc6 + "ST") throw Error(language, $"POU {name}: only ST bodies are read, not {language.Name.LocalName}");
        var body = OnlyChild(language).Value;
        if (body.Length > 0 && !body.EndsWith('\n')) body += "\n";
        return new StPou(kind, name, sections, body, DocumentationLines(element));
    }

    private static StVariable Variable(XElement element)
    {
        var initial = element.Element(Tc6 + "initialValue");
        return new StVariable(
            Name(element, "name"),
            Type(OnlyChild(Required(element, "type"))),
            initial is null ? null : Value(OnlyChild(initial)),
            DocumentationLines(element) is { Count: > 0 } lines ? string.Join(" ", lines) : null);
    }

    private static readonly HashSet<string> ElementaryTypes =
    [
        "BOOL", "BYTE", "WORD", "DWORD", "LWORD", "SINT", "INT", "DINT", "LINT", "USINT", "UINT", "UDINT", "ULINT",
        "REAL", "LREAL", "TIME", "DATE", "DT", "TOD",
    ];

    private static StType Type(XElement element)
    {
        var local = element.Name.LocalName;
        if (element.Name.Namespace == Tc6 && ElementaryTypes.Contains(local)) return new StElementaryType(local);
        if (element.Name == Tc6 + "string")
        {
            if (int.TryParse((string?)element.Attribute("length"), System.Globalization.NumberStyles.None,
                    System.Globalization.CultureInfo.InvariantCulture, out var length) && length > 0)
                return new StStringType(length);
            throw Error(element, "a string type needs a positive whole length");
        }
        if (element.Name == Tc6 + "derived") return new StDerivedType(Name(element, "name"));
        throw Error(element, $"type {local} is not read");
    }

    /// <summary>One literal: a string in quotes with $ escapes, or one token of letters, digits and # . + - _ :.</summary>
    private static readonly Regex Literal = new(@"\A(?:'(?:[^'$\r\n]|\$[^\r\n])*'|[A-Za-z0-9_#.+\-:]+)\z", RegexOptions.CultureInvariant);

    private static StValue Value(XElement element)
    {
        if (element.Name == Tc6 + "simpleValue")
        {
            var literal = (string?)element.Attribute("value") ?? "";
            if (!Literal.IsMatch(literal)) throw Error(element, $"'{literal}' is not one Structured Text literal");
            return new StSimpleValue(literal);
        }
        if (element.Name == Tc6 + "structValue")
            return new StStructValue(element.Elements(Tc6 + "value")
                .Select(v => new StMemberValue(Name(v, "member"), Value(OnlyChild(v)))).ToList());
        throw Error(element, $"value {element.Name.LocalName} is not read");
    }

    /// <summary>The lines of an element's documentation (the text of its XHTML content), none when it has none.</summary>
    private static IReadOnlyList<string> DocumentationLines(XElement element) =>
        element.Element(Tc6 + "documentation") is { } documentation
            ? documentation.Value.Split('\n').Select(l => l.Trim()).Where(l => l.Length > 0).ToList()
            : [];

    private static readonly Regex Identifier = new(@"\A[A-Za-z_][A-Za-z0-9_]*\z", RegexOptions.CultureInvariant);

    /// <summary>An attribute that must be an IEC 61131-3 identifier, so that it cannot change the code around it.</summary>
    private static string Name(XElement element, string attribute)
    {
        var value = (string?)element.Attribute(attribute);
        if (value is null) throw Error(element, $"{element.Name.LocalName} without {attribute}");
        if (!Identifier.IsMatch(value)) throw Error(element, $"'{value}' is not an IEC 61131-3 identifier");
        return value;
    }

    private static bool IsTrue(XElement element, string attribute) =>
        (string?)element.Attribute(attribute) is "true" or "1";

    private static XElement Required(XElement parent, string name) =>
        parent.Element(Tc6 + name) ?? throw Error(parent, $"{parent.Name.LocalName} without {name}");

    /// <summary>The single element a choice holds, skipping addData and documentation that may follow it.</summary>
    private static XElement OnlyChild(XElement parent)
    {
        var children = parent.Elements().Where(e => e.Name != Tc6 + "addData" && e.Name != Tc6 + "documentation").ToList();
        return children.Count == 1
            ? children[0]
            : throw Error(parent, $"{parent.Name.LocalName} should hold one element, holds {children.Count}");
    }

    private static PlcOpenFormatException Error(XElement element, string message)
    {
        var info = (IXmlLineInfo)element;
        return info.HasLineInfo()
            ? new PlcOpenFormatException(message, info.LineNumber, info.LinePosition)
            : new PlcOpenFormatException(message, 0, 0);
    }
}
