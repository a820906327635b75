using System.Globalization;
using System.Net;
using System.Text;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>A tiny writer of inline SVG for the digest's charts.</summary>
/// <remarks>
/// Why hand-drawn and not a charting library: ScottPlot 5 (the maintained .NET plotting library on the package
/// list) was tried. Its SVG carries a process-wide counter in its clip-path ids (the same chart rendered twice
/// differs, and ids could clash inside one page), bakes per-glyph positions measured with whatever font the
/// server has installed, has no &lt;title&gt;, starts with an XML declaration, and pulls in about 11 MB of native
/// SkiaSharp libraries. The digest needs three simple chart kinds; drawing them here keeps the output
/// deterministic, self-contained, escaped and accessible. Every text from data goes through <see cref="Text"/>,
/// which HTML-encodes it.
/// </remarks>
internal sealed class Svg
{
    // Neutral palette: readable in grey-scale print, no traffic-light colours.
    public const string Ink = "#222222";
    public const string Mid = "#6b6b6b";
    public const string Light = "#d9d9d9";
    public const string Faint = "#efefef";
    public const string Accent = "#3d5a80";
    public const string AccentLight = "#b8c4d6";

    private readonly StringBuilder _body = new();
    private readonly StringBuilder _attributes = new();

    public Svg(double width, double height, string title, string description)
    {
        if (!(width > 0 && height > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(width), "A chart has a non-zero size.");
        }

        Width = width;
        Height = height;
        Title = title;
        Description = description;
    }

    public double Width { get; }

    public double Height { get; }

    public string Title { get; }

    public string Description { get; }

    public static string N(double value) => Math.Round(value, 1).ToString("0.#", CultureInfo.InvariantCulture);

    public static string Encode(string text) => WebUtility.HtmlEncode(text);

    /// <summary>An attribute of the svg element itself (e.g. data-panel); the value is encoded.</summary>
    public Svg Attribute(string name, string value)
    {
        _attributes.Append(' ').Append(name).Append("=\"").Append(Encode(value)).Append('"');
        return this;
    }

    public Svg Rect(
        double x, double y, double w, double h, string fill, string? stroke = null, bool dashed = false, string? tooltip = null,
        IReadOnlyList<(string Name, string Value)>? attributes = null)
    {
        _body.Append("<rect x=\"").Append(N(x)).Append("\" y=\"").Append(N(y))
            .Append("\" width=\"").Append(N(Math.Max(w, 0))).Append("\" height=\"").Append(N(Math.Max(h, 0)))
            .Append("\" fill=\"").Append(fill).Append('"');
        foreach (var (name, value) in attributes ?? [])
        {
            _body.Append(' ').Append(name).Append("=\"").Append(Encode(value)).Append('"');
        }

        AppendStroke(stroke, dashed);
        return CloseShape("rect", tooltip);
    }

    /// <param name="pattern">A stroke-dasharray other than the dashed "4 3" (e.g. "1 2" dotted); null for none.</param>
    public Svg Line(double x1, double y1, double x2, double y2, string stroke, double width = 1, bool dashed = false, string? pattern = null, string? role = null)
    {
        _body.Append("<line x1=\"").Append(N(x1)).Append("\" y1=\"").Append(N(y1))
            .Append("\" x2=\"").Append(N(x2)).Append("\" y2=\"").Append(N(y2))
            .Append("\" stroke=\"").Append(stroke).Append("\" stroke-width=\"").Append(N(width)).Append('"');
        if (pattern is not null)
        {
            _body.Append(" stroke-dasharray=\"").Append(Encode(pattern)).Append('"');
        }
        else if (dashed)
        {
            _body.Append(" stroke-dasharray=\"4 3\"");
        }

        if (role is not null)
        {
            _body.Append(" data-line=\"").Append(Encode(role)).Append('"');
        }

        _body.Append("/>\n");
        return this;
    }

    public Svg Polyline(IReadOnlyList<(double X, double Y)> points, string stroke)
    {
        if (points.Count < 2)
        {
            return this;
        }

        _body.Append("<polyline fill=\"none\" stroke=\"").Append(stroke).Append("\" stroke-width=\"1\" points=\"");
        _body.AppendJoin(' ', points.Select(p => N(p.X) + "," + N(p.Y)));
        _body.Append("\"/>\n");
        return this;
    }

    public Svg Circle(double cx, double cy, double r, string fill, string stroke, string? tooltip = null, IReadOnlyList<(string Name, string Value)>? attributes = null)
    {
        _body.Append("<circle cx=\"").Append(N(cx)).Append("\" cy=\"").Append(N(cy)).Append("\" r=\"").Append(N(r))
            .Append("\" fill=\"").Append(fill).Append('"');
        foreach (var (name, value) in attributes ?? [])
        {
            _body.Append(' ').Append(name).Append("=\"").Append(Encode(value)).Append('"');
        }

        AppendStroke(stroke, dashed: false);
        return CloseShape("circle", tooltip);
    }

    /// <summary>Text at a point; <paramref name="anchor"/> is start, middle or end. The text is HTML-encoded here.</summary>
    public Svg Text(
        double x, double y, string text, string anchor = "start", double size = 11, string fill = Ink, bool bold = false, double rotate = 0,
        IReadOnlyList<(string Name, string Value)>? attributes = null)
    {
        _body.Append("<text x=\"").Append(N(x)).Append("\" y=\"").Append(N(y))
            .Append("\" font-size=\"").Append(N(size)).Append("\" text-anchor=\"").Append(anchor)
            .Append("\" fill=\"").Append(fill).Append('"');
        foreach (var (name, value) in attributes ?? [])
        {
            _body.Append(' ').Append(name).Append("=\"").Append(Encode(value)).Append('"');
        }

        if (bold)
        {
            _body.Append(" font-weight=\"600\"");
        }

        if (rotate != 0)
        {
            _body.Append(" transform=\"rotate(").Append(N(rotate)).Append(' ').Append(N(x)).Append(' ').Append(N(y)).Append(")\"");
        }

        _body.Append('>').Append(Encode(text)).Append("</text>\n");
        return this;
    }

    /// <summary>The finished element: explicit width and height plus a viewBox so CSS can scale it down on paper.</summary>
    public string ToMarkup()
    {
        var head = new StringBuilder();
        head.Append("<svg class=\"chart\" xmlns=\"http://www.w3.org/2000/svg\" role=\"img\" width=\"").Append(N(Width))
            .Append("\" height=\"").Append(N(Height)).Append("\" viewBox=\"0 0 ").Append(N(Width)).Append(' ').Append(N(Height))
            .Append("\" font-family=\"Helvetica, Arial, 'DejaVu Sans', sans-serif\"").Append(_attributes).Append(">\n")
            .Append("<title>").Append(Encode(Title)).Append("</title>\n")
            .Append("<desc>").Append(Encode(Description)).Append("</desc>\n");
        return head.Append(_body).Append("</svg>").ToString();
    }

    private void AppendStroke(string? stroke, bool dashed)
    {
        if (stroke is null)
        {
            return;
        }

        _body.Append(" stroke=\"").Append(stroke).Append("\" stroke-width=\"1\"");
        if (dashed)
        {
            _body.Append(" stroke-dasharray=\"4 3\"");
        }
    }

    private Svg CloseShape(string element, string? tooltip)
    {
        if (tooltip is null)
        {
            _body.Append("/>\n");
        }
        else
        {
            _body.Append("><title>").Append(Encode(tooltip)).Append("</title></").Append(element).Append(">\n");
        }

        return this;
    }
}
