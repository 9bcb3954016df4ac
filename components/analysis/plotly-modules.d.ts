// The prebuilt plotly.js bundles Tareline loads (MIT, plotly.js 4.1.1): typed as plotly.js itself (@types/plotly.js).
declare module "plotly.js-cartesian-dist-min" {
  import * as Plotly from "plotly.js";
  export default Plotly;
}
declare module "plotly.js-gl3d-dist-min" {
  import * as Plotly from "plotly.js";
  export default Plotly;
}
