using System.Globalization;
using System.Text;
using System.Xml;
using CsCheck;
using ScaleGen.Emit;
using ScaleGen.Emit.PlcOpen;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.PlcOpen;

/// <summary>
/// The hand-written XML writer of the PLCopen export must write what XmlWriter wrote before
/// it (indented, '\n' line ends), byte for byte, escapes included: plant.xml keeps its bytes.
/// </summary>
public class IndentedXmlWriterTests
{
    // ---- a random document, written both ways -----------------------------------------

    private abstract record Node;

    /// <summary>An element; <paramref name="Full"/>: an empty one is written as &lt;a&gt;&lt;/a&gt;.</summary>
    private sealed record Element(string Name, (string Name, string Value)[] Attributes, Node[] Children, bool Full) : Node;

    private sealed record Text(string Value) : Node;

    private sealed record CData(string Value) : Node;

    /// <summary>Pieces of text: markup and quote characters, every kind of line break, tabs, non-ASCII, a surrogate pair, "]]&gt;".</summary>
    private static readonly string[] Pieces =
    [
        "a", "Value", " ", "  ", "0.5", "<", ">", "&", "&amp;", "\"", "'", "\t", "\n", "\r", "\r\n", "\n\r",
        "]]>", "]", "]]", "\u00FC", "\u00B0C", "\u20AC", "\U0001F600", "\u0085", "\u2028", "\u2029", "\u00A0", "=", "/", "-",
    ];

    private static readonly string[] Names = ["a", "value", "simpleValue", "documentation", "x1"];

    private static string RandomText(Random random, bool forComment = false)
    {
        var text = new StringBuilder();
        for (var n = random.Next(6); n > 0; n--)
        {
            var piece = Pieces[random.Next(Pieces.Length)];
            // A comment never holds "--" or ends in '-' (XmlSafeText.CommentLine sees to that).
            if (forComment && piece == "-") piece = "b";
            text.Append(piece);
        }
        return text.ToString();
    }

    private static Element RandomElement(Random random, int depth)
    {
        var attributes = Enumerable.Range(0, random.Next(3))
            .Select(i => ("at" + i.ToString(CultureInfo.InvariantCulture), RandomText(random))).ToArray();
        Node[] children = random.Next(depth >= 4 ? 2 : 4) switch
        {
            0 => [],
            1 => Enumerable.Range(0, 1 + random.Next(2))
                .Select(_ => random.Next(3) == 0 ? (Node)new CData(RandomText(random)) : new Text(RandomText(random))).ToArray(),
            _ => Enumerable.Range(0, 1 + random.Next(3)).Select(_ => (Node)RandomElement(random, depth + 1)).ToArray(),
        };
        return new Element(Names[random.Next(Names.Length)], attributes, children, random.Next(2) == 0);
    }

    private static string WithXmlWriter(string? comment, Element root)
    {
        var text = new StringWriter(CultureInfo.InvariantCulture);
        using (var xml = XmlWriter.Create(text, new XmlWriterSettings
               {
                   OmitXmlDeclaration = true,
                   Indent = true,
                   IndentChars = "  ",
                   NewLineChars = "\n",
                   NewLineHandling = NewLineHandling.Replace,
               }))
        {
            if (comment is not null) xml.WriteComment(comment);
            Write(root);

            void Write(Element element)
            {
                xml.WriteStartElement(element.Name);
                foreach (var (name, value) in element.Attributes) xml.WriteAttributeString(name, value);
                foreach (var child in element.Children)
                {
                    switch (child)
                    {
                        case Element e: Write(e); break;
                        case Text t: xml.WriteString(t.Value); break;
                        case CData c: xml.WriteCData(c.Value); break;
                    }
                }
                if (element.Full) xml.WriteFullEndElement();
                else xml.WriteEndElement();
            }
        }
        return text.ToString();
    }

    private static string WithIndentedWriter(string? comment, Element root) => TextChunks.Render(output =>
    {
        var xml = new IndentedXmlWriter(output);
        if (comment is not null) xml.WriteComment(comment);
        Write(root);
        xml.Flush();

        void Write(Element element)
        {
            if (element.Attributes.Length == 1 && element.Children.Length == 0 && !element.Full)
            {
                xml.WriteEmptyElement(element.Name, element.Attributes[0].Name, element.Attributes[0].Value);
                return;
            }
            xml.WriteStartElement(element.Name);
            foreach (var (name, value) in element.Attributes) xml.WriteAttributeString(name, value);
            foreach (var child in element.Children)
            {
                switch (child)
                {
                    case Element e: Write(e); break;
                    case Text t: xml.WriteString(t.Value); break;
                    case CData c: xml.WriteCData(c.Value); break;
                }
            }
            if (element.Full) xml.WriteFullEndElement();
            else xml.WriteEndElement();
        }
    });

    [Fact]
    public void Random_documents_come_out_as_XmlWriter_writes_them() =>
        Gen.Int.Sample(seed =>
        {
            var random = new Random(seed);
            var comment = random.Next(2) == 0 ? RandomText(random, forComment: true) : null;
            var root = RandomElement(random, 0);
            Assert.Equal(WithXmlWriter(comment, root), WithIndentedWriter(comment, root));
        }, iter: 2000);

    [Theory]
    [InlineData("a\0b")]
    [InlineData("bell\u0007")]
    [InlineData("ffff\uFFFF")]
    [InlineData("fffe\uFFFE")]
    public void Characters_XML_cannot_hold_throw_as_with_XmlWriter(string text)
    {
        var root = new Element("a", [], [new Text(text)], false);
        Assert.ThrowsAny<ArgumentException>(() => WithXmlWriter(null, root));
        Assert.ThrowsAny<ArgumentException>(() => WithIndentedWriter(null, root));
        var attribute = new Element("a", [("v", text)], [], false);
        Assert.ThrowsAny<ArgumentException>(() => WithXmlWriter(null, attribute));
        Assert.ThrowsAny<ArgumentException>(() => WithIndentedWriter(null, attribute));
    }

    [Fact]
    public void A_lone_surrogate_throws_as_with_XmlWriter()
    {
        // Not as InlineData: the test runner cannot carry a lone surrogate in a theory's data.
        foreach (var text in new[] { "lone \uD800 high", "lone \uDC00 low", "ends high \uD800" })
        {
            var root = new Element("a", [("v", text)], [], false);
            Assert.ThrowsAny<ArgumentException>(() => WithXmlWriter(null, root));
            Assert.ThrowsAny<ArgumentException>(() => WithIndentedWriter(null, root));
        }
    }

    [Fact]
    public void Mixed_content_and_unclosed_elements_are_refused()
    {
        var xml = new IndentedXmlWriter(TextWriter.Null);
        xml.WriteStartElement("a");
        xml.WriteString("text");
        Assert.Throws<InvalidOperationException>(() => xml.WriteStartElement("b"));
        Assert.Throws<InvalidOperationException>(() => xml.WriteAttributeString("c", "d"));
        Assert.Throws<InvalidOperationException>(xml.Flush);
        xml.WriteEndElement();
        Assert.Throws<InvalidOperationException>(xml.WriteEndElement);
    }

    // ---- the export, streamed ---------------------------------------------------------------

    [Fact]
    public void Streamed_file_is_the_project_text_and_says_utf_8()
    {
        var context = EmitContext.From(TestInputs.CompileExample());
        var file = Assert.Single(new PlcOpenEmitter().Emit(context));
        // A writer that takes the text in small pieces, as a file does: the same text comes out.
        var streamed = new StringWriter(CultureInfo.InvariantCulture);
        file.WriteTo(streamed);
        Assert.Equal(PlcOpenEmitter.Project(context), streamed.ToString());
        // The declaration does not follow the writer's encoding (a StringWriter's is UTF-16).
        Assert.StartsWith("<?xml version=\"1.0\" encoding=\"utf-8\"?>\n<!--\n", streamed.ToString());
        Assert.EndsWith("</project>\n", streamed.ToString());
    }
}
