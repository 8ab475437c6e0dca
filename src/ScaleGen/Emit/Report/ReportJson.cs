using System.Collections;
using System.Reflection;
using System.Text;
using Newtonsoft.Json.Linq;

namespace ScaleGen.Emit.Report;

/// <summary>
/// The report data as JSON, for the snapshot test and for anyone who wants the numbers
/// behind the page. Property names in snake_case, in declaration order; numbers through
/// <see cref="JsonOutput.Number(double)"/>.
/// </summary>
public static class ReportJson
{
    public static string Write(ReportData data) => JsonOutput.Write(ToJson(data));

    private static JToken ToJson(object? value) => value switch
    {
        null => JValue.CreateNull(),
        string s => new JValue(s),
        bool b => new JValue(b),
        int i => new JValue(i),
        long l => new JValue(l),
        double d => JsonOutput.Number(d),
        IEnumerable items => new JArray(items.Cast<object?>().Select(ToJson)),
        _ => Record(value),
    };

    private static JObject Record(object value)
    {
        var json = new JObject();
        foreach (var property in value.GetType().GetProperties(BindingFlags.Public | BindingFlags.Instance).OrderBy(p => p.MetadataToken))
            json[SnakeCase(property.Name)] = ToJson(property.GetValue(value));
        return json;
    }

    private static string SnakeCase(string name)
    {
        var text = new StringBuilder();
        for (var i = 0; i < name.Length; i++)
        {
            if (char.IsUpper(name[i]) && i > 0) text.Append('_');
            text.Append(char.ToLowerInvariant(name[i]));
        }
        return text.ToString();
    }
}
