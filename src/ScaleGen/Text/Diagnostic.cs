using System.Globalization;

namespace ScaleGen.Text;

public enum Severity { Error, Warning }

/// <summary>One finding about the input, in the style of a compiler message.</summary>
public sealed record Diagnostic(string Code, Severity Severity, SourceLocation Location, string Message)
{
    public bool IsError => Severity == Severity.Error;

    /// <summary>The compiler convention: <c>path(line,col): error SG1234: message</c>.</summary>
    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture,
            $"{Location.Path}({Location.Line},{Location.Column}): {(IsError ? "error" : "warning")} {Code}: {Message}");
}
